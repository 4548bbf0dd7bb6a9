import type { CsvColumns } from './csv-columns';
import { UsageError, type FlagSpec, type FlagValues } from './flags';

/**
 * Which rows of the file an estimate uses, as the recompute chooses them: rows with a missing
 * value can be left out (`--missing skip`), and a donut leaves out scores closer to the cutoff than
 * a radius. With these, the commands reproduce Cutline's stored figures from a de-identified export.
 */
export const ROW_SELECTION_FLAGS: readonly FlagSpec[] = [
  { name: 'missing', placeholder: 'WHAT', description: 'a row with an empty cell in a used column: refuse the file (default) or skip the row', choices: ['refuse', 'skip'] },
  { name: 'donut', placeholder: 'R', description: 'leave out scores with |score − cutoff| < R (score units), default 0', numeric: true },
];

export interface RowSelection {
  skipIncomplete: boolean;
  donutRadius: number;
}

/** @throws UsageError for a negative donut radius */
export function rowSelection(flags: FlagValues): RowSelection {
  const radius = (flags.donut as number | undefined) ?? 0;
  if (!(radius >= 0)) throw new UsageError('Option --donut must be zero or a positive number of score units.');
  return { skipIncomplete: flags.missing === 'skip', donutRadius: radius };
}

/**
 * Leaves out the rows whose score lies strictly within `radius` of the cutoff, from every column.
 * @returns the columns kept and how many rows were left out
 */
export function applyDonut(csv: CsvColumns, scoreColumn: string, cutoff: number, radius: number): { csv: CsvColumns; dropped: number } {
  if (radius === 0) return { csv, dropped: 0 };
  const score = csv.numbers.get(scoreColumn)!;
  const keep: number[] = [];
  for (let i = 0; i < score.length; i++) if (!(Math.abs(score[i]! - cutoff) < radius)) keep.push(i);
  const pick = <T extends Float64Array | Int32Array>(column: T, make: (n: number) => T): T => {
    const out = make(keep.length);
    keep.forEach((from, to) => (out[to] = column[from]!));
    return out;
  };
  return {
    csv: {
      rows: keep.length,
      skipped: csv.skipped,
      numbers: new Map([...csv.numbers].map(([k, v]) => [k, pick(v, (n) => new Float64Array(n))])),
      labels: new Map([...csv.labels].map(([k, v]) => [k, pick(v, (n) => new Int32Array(n))])),
    },
    dropped: score.length - keep.length,
  };
}
