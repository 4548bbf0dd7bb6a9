import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

/**
 * Runs an R script with Rscript (Debian's r-base-core, AER and sandwich; installed by `npm test`'s
 * set-up) and parses lines of the form `key value` it prints with `cat(sprintf("%s %.17g\n", …))`.
 * @throws Error with R's stderr when R fails.
 */
export function runRScript(script: string, timeoutMs = 300_000): Map<string, number> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cutline-r-'));
  try {
    const file = path.join(dir, 'script.R');
    fs.writeFileSync(file, script);
    const result = spawnSync('Rscript', ['--vanilla', file], { encoding: 'utf8', timeout: timeoutMs });
    if (result.status !== 0) throw new Error(`Rscript failed (${result.status}): ${result.stderr || result.error?.message}`);
    const values = new Map<string, number>();
    for (const line of result.stdout.split('\n')) {
      const m = /^(\S+) (\S+)$/.exec(line.trim());
      if (m) values.set(m[1]!, Number(m[2]));
    }
    return values;
  } finally {
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

/** Writes columns to a CSV file with every double in shortest round-trip form (R reads them exactly). */
export function writeCsv(file: string, columns: Record<string, ArrayLike<number>>): void {
  const names = Object.keys(columns);
  const n = columns[names[0]!]!.length;
  const lines = [names.join(',')];
  for (let i = 0; i < n; i++) lines.push(names.map((name) => String(columns[name]![i])).join(','));
  fs.writeFileSync(file, `${lines.join('\n')}\n`);
}
