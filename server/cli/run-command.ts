import { EstimationError } from '@shared/estimation';
import { InputError } from './csv-columns';
import { UsageError } from './flags';

/** Exit statuses of Cutline's commands. */
export const EXIT = { ok: 0, badInput: 1, usage: 2 } as const;

/**
 * Runs a command's main function: prints what it returns on stdout, and turns every expected
 * failure into one sentence on stderr with a non-zero exit (usage mistakes 2, bad data 1).
 */
export async function runCommand(main: (argv: string[]) => Promise<string>): Promise<never> {
  try {
    const output = await main(process.argv.slice(2));
    process.stdout.write(output);
    process.exit(EXIT.ok);
  } catch (err) {
    if (err instanceof UsageError) {
      process.stderr.write(`${err.message}\n`);
      process.exit(EXIT.usage);
    }
    if (err instanceof InputError || err instanceof EstimationError) {
      process.stderr.write(`${err.message}\n`);
      process.exit(EXIT.badInput);
    }
    if (err instanceof RangeError || err instanceof TypeError) {
      // The engine's argument checks read "fn: detail"; the detail is the sentence that matters.
      process.stderr.write(`${sentence(err.message.replace(/^\w+: /, ''))}\n`);
      process.exit(EXIT.badInput);
    }
    process.stderr.write(`Unexpected failure: ${err instanceof Error ? err.message : String(err)}\n`);
    process.exit(EXIT.badInput);
  }
}

function sentence(text: string): string {
  const s = text.charAt(0).toUpperCase() + text.slice(1);
  return /[.!?]$/.test(s) ? s : `${s}.`;
}
