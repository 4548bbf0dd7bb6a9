import { runDiagnostics, type DiagnosticsOptions, type NamedColumn } from '@shared/diagnostics';
import type { BandwidthRule, KernelName, VarianceKind } from '@shared/estimation';
import { pathToFileURL } from 'node:url';
import { readCsvColumns, type ColumnRequest } from './csv-columns';
import { ESTIMATE_FLAGS } from './estimate';
import { parseFlags, UsageError, usageText, type FlagSpec } from './flags';
import { applyDonut, rowSelection } from './row-selection';
import { runCommand } from './run-command';

/**
 * `npm run --silent diagnose -- --input FILE.csv --score COL --outcome COL [--takeup COL] --cutoff C
 * --eligible at-or-above|at-or-below [--covariates COL,COL] [estimation options as for estimate]`
 *
 * Reads a CSV file and prints one JSON object: every diagnostic of `runDiagnostics` (density,
 * heaping, balance, placebo, sensitivity, donut, weakFirstStage, localRandomization, bins, power,
 * caveats) plus `input` (file, columns, rows) for provenance. The estimation options are the
 * `estimate` command's own flags. Bad input exits non-zero with one sentence on stderr.
 */
export const DIAGNOSE_FLAGS: readonly FlagSpec[] = [
  ...ESTIMATE_FLAGS,
  { name: 'covariates', placeholder: 'COL,COL', description: 'pre-determined covariates to check for balance, comma-separated' },
  { name: 'population', placeholder: 'WORD', description: 'plural word for the people in caveat messages, default "applicants"' },
  { name: 'outcomes-tested', placeholder: 'N', description: 'outcomes analysed in the same run (multiple-testing caveat), default 1', numeric: true },
  { name: 'target-effect', placeholder: 'E', description: 'effect on participants the power calculation finds the sample size for', numeric: true },
  { name: 'permutations', placeholder: 'M', description: 'permutations of the local-randomization analysis, default 2000', numeric: true },
  { name: 'start', placeholder: 'S', description: 'start value of the permutations’ random stream, default 1', numeric: true },
];

const SUMMARY =
  'Runs every diagnostic of a cutoff analysis (density, heaping, balance, placebo cutoffs, bandwidth sensitivity, donut, ' +
  'weak take-up, local randomization, chart bins, power) and prints one JSON object with the caveats they imply.';

export async function diagnoseCommand(argv: string[]): Promise<string> {
  const flags = parseFlags(argv, DIAGNOSE_FLAGS);
  if (!flags) return usageText('diagnose', SUMMARY, DIAGNOSE_FLAGS);
  const text = (name: string) => flags[name] as string | undefined;
  const num = (name: string) => flags[name] as number | undefined;
  if (num('bandwidth') !== undefined && text('bandwidth-rule') !== undefined) throw new UsageError('Give either --bandwidth or --bandwidth-rule, not both.');
  for (const name of ['bandwidth', 'bias-bandwidth'] as const) {
    const v = num(name);
    if (v !== undefined && !(v > 0)) throw new UsageError(`Option --${name} must be a positive number of score units.`);
  }
  const level = num('level');
  if (level !== undefined && !(level > 0 && level < 1)) throw new UsageError('Option --level must be between 0 and 1, e.g. 0.95.');
  for (const name of ['outcomes-tested', 'permutations'] as const) {
    const v = num(name);
    if (v !== undefined && !(Number.isInteger(v) && v >= 1)) throw new UsageError(`Option --${name} must be a whole number of at least 1.`);
  }
  const permutations = num('permutations');
  if (permutations !== undefined && permutations < 100) throw new UsageError('Option --permutations must be at least 100.');
  const target = num('target-effect');
  if (target !== undefined && target === 0) throw new UsageError('Option --target-effect must not be zero.');

  const covariateNames = (text('covariates') ?? '')
    .split(',')
    .map((c) => c.trim())
    .filter((c) => c !== '');
  if (new Set(covariateNames).size !== covariateNames.length) throw new UsageError('Option --covariates names a column twice.');
  const columns = {
    score: text('score')!,
    outcome: text('outcome')!,
    takeUp: text('takeup') ?? null,
    cluster: text('cluster') ?? null,
    covariates: covariateNames,
  };
  const requests: ColumnRequest[] = [
    { name: columns.score, kind: 'number' },
    { name: columns.outcome, kind: 'number' },
    ...covariateNames.map((name) => ({ name, kind: 'number' as const })),
  ];
  if (columns.takeUp) requests.push({ name: columns.takeUp, kind: 'binary' });
  if (columns.cluster) requests.push({ name: columns.cluster, kind: 'label' });
  const file = text('input')!;
  const selection = rowSelection(flags);
  const read = await readCsvColumns(file, requests, { skipIncomplete: selection.skipIncomplete });
  const { csv, dropped } = applyDonut(read, columns.score, num('cutoff')!, selection.donutRadius);
  const covariates: NamedColumn[] = covariateNames.map((name) => ({ name, values: csv.numbers.get(name)! }));
  const rule = text('bandwidth-rule') as BandwidthRule | undefined;
  const options: DiagnosticsOptions = {
    cutoff: num('cutoff')!,
    eligibleSide: text('eligible') as DiagnosticsOptions['eligibleSide'],
    kernel: text('kernel') as KernelName | undefined,
    order: text('order') === undefined ? undefined : (Number(text('order')) as 0 | 1 | 2),
    bandwidth: num('bandwidth') ?? (rule ? { rule } : undefined),
    biasBandwidth: num('bias-bandwidth'),
    variance: text('variance') as VarianceKind | undefined,
    level,
    population: text('population'),
    outcomesTested: num('outcomes-tested'),
    targetEffect: target,
    permutations,
    start: num('start'),
  };
  const report = runDiagnostics(
    {
      score: csv.numbers.get(columns.score)!,
      outcome: csv.numbers.get(columns.outcome)!,
      ...(columns.takeUp ? { takeUp: csv.numbers.get(columns.takeUp)! } : {}),
      ...(columns.cluster ? { cluster: csv.labels.get(columns.cluster)! } : {}),
      covariates,
    },
    options,
  );
  return `${JSON.stringify({ input: { file, columns, rows: csv.rows, skippedIncomplete: csv.skipped, droppedByDonut: dropped }, ...report }, null, 2)}\n`;
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) void runCommand(diagnoseCommand);
