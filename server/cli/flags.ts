/**
 * Command-line flags for Cutline's commands (`estimate`, and later `diagnose`): `--name value` or
 * `--name=value`, each flag at most once, declared up front so help text and checks come from one
 * place.
 */
export interface FlagSpec {
  name: string;
  /** Placeholder shown in the usage line, e.g. FILE or COL. */
  placeholder: string;
  description: string;
  required?: boolean;
  /** Allowed values; anything else is a usage error. */
  choices?: readonly string[];
  /** Parse as a finite number. */
  numeric?: boolean;
}

/** A mistake in how the command was called; the message is one sentence for stderr. */
export class UsageError extends Error {
  override name = 'UsageError';
}

export type FlagValues = Record<string, string | number | undefined>;

/** Parses argv (without node and script) against the specs. `--help` returns null. */
export function parseFlags(argv: readonly string[], specs: readonly FlagSpec[]): FlagValues | null {
  const byName = new Map(specs.map((s) => [s.name, s]));
  const values: FlagValues = {};
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i]!;
    if (arg === '--help' || arg === '-h') return null;
    if (!arg.startsWith('--')) throw new UsageError(`Unexpected argument "${arg}"; every option is written --name value.`);
    const eq = arg.indexOf('=');
    const name = arg.slice(2, eq < 0 ? undefined : eq);
    const spec = byName.get(name);
    if (!spec) throw new UsageError(`Unknown option --${name}; run with --help to see the options.`);
    if (name in values) throw new UsageError(`Option --${name} is given twice.`);
    let raw: string | undefined;
    if (eq >= 0) raw = arg.slice(eq + 1);
    else {
      raw = argv[i + 1];
      i++;
    }
    if (raw === undefined || raw === '' || (eq < 0 && raw.startsWith('--'))) throw new UsageError(`Option --${name} needs a value (${spec.placeholder}).`);
    if (spec.choices && !spec.choices.includes(raw)) {
      throw new UsageError(`Option --${name} must be one of ${spec.choices.join(', ')}; got "${raw}".`);
    }
    if (spec.numeric) {
      const v = parseNumber(raw);
      if (v === null) throw new UsageError(`Option --${name} must be a number; got "${raw}".`);
      values[name] = v;
    } else values[name] = raw;
  }
  for (const spec of specs) {
    if (spec.required && values[spec.name] === undefined) throw new UsageError(`Option --${spec.name} ${spec.placeholder} is required.`);
  }
  return values;
}

/** A decimal or scientific number, surrounding spaces allowed; null for anything else. */
export function parseNumber(text: string): number | null {
  const s = text.trim();
  if (!/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(s)) return null;
  const v = Number(s);
  return Number.isFinite(v) ? v : null;
}

/** Usage text: one line per flag. */
export function usageText(command: string, summary: string, specs: readonly FlagSpec[]): string {
  const width = Math.max(...specs.map((s) => s.name.length + s.placeholder.length + 3));
  const lines = specs.map((s) => {
    const flag = `--${s.name} ${s.placeholder}`.padEnd(width);
    const choices = s.choices ? ` (${s.choices.join(' | ')})` : '';
    return `  ${flag}  ${s.description}${choices}${s.required ? ' [required]' : ''}`;
  });
  return [`Usage: npm run --silent ${command} -- [options]`, '', summary, '', ...lines, ''].join('\n');
}
