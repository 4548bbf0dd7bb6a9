import {
  BANDWIDTH_RULES,
  KERNELS,
  VARIANCE_KINDS,
  estimateDiscontinuity,
  type BandwidthRule,
  type DiscontinuityOptions,
  type KernelName,
  type VarianceKind,
} from '@shared/estimation';
import { pathToFileURL } from 'node:url';
import { readCsvColumns, type ColumnRequest } from './csv-columns';
import { parseFlags, UsageError, usageText, type FlagSpec } from './flags';
import { applyDonut, ROW_SELECTION_FLAGS, rowSelection } from './row-selection';
import { runCommand } from './run-command';

/**
 * `npm run --silent estimate -- --input FILE.csv --score COL --outcome COL [--takeup COL] …`
 *
 * Reads a CSV file, runs the estimation engine once and prints one JSON object: the engine's
 * result plus `input` (file, columns, rows) so an evaluator can reproduce any figure Cutline shows.
 * Bad input exits non-zero with one sentence on stderr.
 */
export const ESTIMATE_FLAGS: readonly FlagSpec[] = [
  { name: 'input', placeholder: 'FILE.csv', description: 'CSV file with a header row', required: true },
  { name: 'score', placeholder: 'COL', description: 'column of the score (running variable)', required: true },
  { name: 'outcome', placeholder: 'COL', description: 'column of the outcome', required: true },
  { name: 'takeup', placeholder: 'COL', description: 'column of take-up (0/1); makes the design fuzzy' },
  { name: 'cutoff', placeholder: 'C', description: 'score at which eligibility changes', required: true, numeric: true },
  { name: 'eligible', placeholder: 'SIDE', description: 'which side qualifies (the cutoff itself is eligible)', required: true, choices: ['at-or-above', 'at-or-below'] },
  { name: 'kernel', placeholder: 'K', description: 'kernel, default triangular', choices: KERNELS },
  { name: 'order', placeholder: 'P', description: 'local polynomial order, default 1', choices: ['0', '1', '2'] },
  { name: 'bandwidth', placeholder: 'H', description: 'bandwidth in score units (instead of a rule)', numeric: true },
  { name: 'bias-bandwidth', placeholder: 'B', description: 'bias bandwidth in score units', numeric: true },
  { name: 'bandwidth-rule', placeholder: 'RULE', description: 'bandwidth rule, default mse', choices: BANDWIDTH_RULES },
  { name: 'variance', placeholder: 'V', description: 'variance estimator, default hc3 (hc1 with --cluster)', choices: VARIANCE_KINDS },
  { name: 'cluster', placeholder: 'COL', description: 'column of cluster labels (e.g. office) for cluster-robust variance' },
  { name: 'level', placeholder: 'L', description: 'confidence level, default 0.95', numeric: true },
  ...ROW_SELECTION_FLAGS,
];

const SUMMARY = 'Estimates the jump at a score cutoff (sharp, or fuzzy with --takeup) and prints one JSON object.';

export async function estimateCommand(argv: string[]): Promise<string> {
  const flags = parseFlags(argv, ESTIMATE_FLAGS);
  if (!flags) return usageText('estimate', SUMMARY, ESTIMATE_FLAGS);
  const text = (name: string) => flags[name] as string | undefined;
  const num = (name: string) => flags[name] as number | undefined;
  if (num('bandwidth') !== undefined && text('bandwidth-rule') !== undefined) {
    throw new UsageError('Give either --bandwidth or --bandwidth-rule, not both.');
  }
  for (const name of ['bandwidth', 'bias-bandwidth'] as const) {
    const v = num(name);
    if (v !== undefined && !(v > 0)) throw new UsageError(`Option --${name} must be a positive number of score units.`);
  }
  const level = num('level');
  if (level !== undefined && !(level > 0 && level < 1)) throw new UsageError('Option --level must be between 0 and 1, e.g. 0.95.');

  const columns = {
    score: text('score')!,
    outcome: text('outcome')!,
    takeUp: text('takeup') ?? null,
    cluster: text('cluster') ?? null,
  };
  const requests: ColumnRequest[] = [
    { name: columns.score, kind: 'number' },
    { name: columns.outcome, kind: 'number' },
  ];
  if (columns.takeUp) requests.push({ name: columns.takeUp, kind: 'binary' });
  if (columns.cluster) requests.push({ name: columns.cluster, kind: 'label' });
  const file = text('input')!;
  const selection = rowSelection(flags);
  const read = await readCsvColumns(file, requests, { skipIncomplete: selection.skipIncomplete });
  const { csv, dropped } = applyDonut(read, columns.score, num('cutoff')!, selection.donutRadius);
  const data = {
    score: csv.numbers.get(columns.score)!,
    outcome: csv.numbers.get(columns.outcome)!,
    ...(columns.takeUp ? { takeUp: csv.numbers.get(columns.takeUp)! } : {}),
    ...(columns.cluster ? { cluster: csv.labels.get(columns.cluster)! } : {}),
  };
  const rule = text('bandwidth-rule') as BandwidthRule | undefined;
  const options: DiscontinuityOptions = {
    cutoff: num('cutoff')!,
    eligibleSide: text('eligible') as DiscontinuityOptions['eligibleSide'],
    kernel: text('kernel') as KernelName | undefined,
    order: text('order') === undefined ? undefined : (Number(text('order')) as 0 | 1 | 2),
    bandwidth: num('bandwidth') ?? (rule ? { rule } : undefined),
    biasBandwidth: num('bias-bandwidth'),
    variance: text('variance') as VarianceKind | undefined,
    level,
  };
  const result = estimateDiscontinuity(data, options);
  return `${JSON.stringify({ input: { file, columns, rows: csv.rows, skippedIncomplete: csv.skipped, droppedByDonut: dropped }, ...result }, null, 2)}\n`;
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) void runCommand(estimateCommand);
