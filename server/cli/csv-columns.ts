import fs from 'node:fs';
import path from 'node:path';
import { parse } from 'csv-parse';
import { parseNumber } from './flags';

/** A problem with the input file; the message is one sentence naming the file, line and column. */
export class InputError extends Error {
  override name = 'InputError';
}

export interface ColumnRequest {
  /** Header name in the file. */
  name: string;
  /** `number`: finite numbers; `binary`: 0 or 1; `label`: any non-empty text, coded 0…G−1. */
  kind: 'number' | 'binary' | 'label';
}

export interface CsvColumns {
  /** Rows kept. */
  rows: number;
  /** Rows left out because a requested cell was empty (`skipIncomplete` only). */
  skipped: number;
  numbers: Map<string, Float64Array>;
  labels: Map<string, Int32Array>;
}

/**
 * Streams a CSV file with a header row (csv-parse) and keeps only the requested columns, checking
 * every cell: numbers must be finite decimals, binary columns 0 or 1, labels non-empty.
 * With `skipIncomplete`, a row with an empty requested cell is left out and counted instead (as
 * Cutline leaves out applicants with a missing value in a column an estimate uses).
 * @throws InputError for a missing file or column, a short row or a bad cell (with its line number).
 */
export async function readCsvColumns(file: string, requests: readonly ColumnRequest[], options: { skipIncomplete?: boolean } = {}): Promise<CsvColumns> {
  const shown = path.basename(file);
  try {
    await fs.promises.access(file, fs.constants.R_OK);
  } catch {
    throw new InputError(`Cannot read the input file ${file}: it does not exist or is not readable.`);
  }
  const parser = fs.createReadStream(file).pipe(parse({ bom: true, trim: true, skip_empty_lines: true, relax_column_count: true, info: true }));
  let header: string[] | null = null;
  let positions: number[] = [];
  const numbers = requests.map(() => [] as number[]);
  const labelCodes = requests.map(() => new Map<string, number>());
  let rows = 0;
  let skipped = 0;
  try {
    for await (const item of parser as AsyncIterable<{ record: string[]; info: { lines: number } }>) {
      const { record, info } = item;
      if (!header) {
        header = record;
        positions = requests.map((r) => {
          const at = record.indexOf(r.name);
          if (at < 0) throw new InputError(`Column "${r.name}" is not in ${shown}; its columns are ${record.map((c) => `"${c}"`).join(', ')}.`);
          return at;
        });
        continue;
      }
      if (options.skipIncomplete && positions.some((at) => record[at] === undefined || record[at] === '')) {
        skipped++;
        continue;
      }
      rows++;
      requests.forEach((request, k) => {
        const cell = record[positions[k]!];
        const where = `Line ${info.lines} of ${shown}, column "${request.name}"`;
        if (cell === undefined || cell === '') throw new InputError(`${where} is empty.`);
        if (request.kind === 'label') {
          const codes = labelCodes[k]!;
          let code = codes.get(cell);
          if (code === undefined) {
            code = codes.size;
            codes.set(cell, code);
          }
          numbers[k]!.push(code);
          return;
        }
        const value = parseNumber(cell);
        // Cell contents are not echoed: a wrongly mapped column could hold personal data.
        if (value === null) throw new InputError(`${where} is not a number.`);
        if (request.kind === 'binary' && value !== 0 && value !== 1) throw new InputError(`${where} is neither 0 nor 1; take-up must be 0 or 1.`);
        numbers[k]!.push(value);
      });
    }
  } catch (err) {
    if (err instanceof InputError) throw err;
    throw new InputError(`${shown} is not a readable CSV file: ${err instanceof Error ? err.message : String(err)}.`);
  }
  if (!header) throw new InputError(`${shown} is empty; it needs a header row and data rows.`);
  const out: CsvColumns = { rows, skipped, numbers: new Map(), labels: new Map() };
  requests.forEach((r, k) => {
    if (r.kind === 'label') out.labels.set(r.name, Int32Array.from(numbers[k]!));
    else out.numbers.set(r.name, Float64Array.from(numbers[k]!));
  });
  return out;
}
