import fs from 'node:fs';
import { pipeline, Transform } from 'node:stream';
import { CsvError, Parser } from 'csv-parse';
import ExcelJS from 'exceljs';
import type { ExtractFormat } from '@shared/schemas/extract';
import { AppError } from '../../lib/errors';
import { fromExcelValue, isBlank, type Cell } from './cells';
import { sniffCsv } from './csv-sniff';

/** One data row: its line (CSV) or row number (XLSX) and its cells in column order. */
export interface TableRow {
  line: number;
  cells: Cell[];
}

/** An extract file opened for one streaming pass: the header first, then the rows. */
export interface OpenedTable {
  /** Header cells as text, in file order (blank ones included). */
  headerCells: string[];
  headerLine: number;
  /** Data rows after the header, in batches (fewer promises a row); rows whose cells are all blank are skipped. */
  batches: AsyncGenerator<TableRow[], void, undefined>;
  sheet: string | null;
  delimiter: string | null;
  /** Bytes of the file read so far and in all, for progress. */
  bytesRead: () => number;
  totalBytes: number;
  /** Stops reading early and releases the file. */
  close: () => Promise<void>;
}

export interface OpenOptions {
  sheet?: string | null;
  delimiter?: string | null;
}

/** Longest CSV record, in characters: stops a never-closed quote from swallowing the whole file into memory. */
const MAX_RECORD_CHARS = 1_000_000;

/**
 * Opens a CSV (any of , ; tab |, UTF-8 with or without BOM, quoted fields) or XLSX (a chosen or the
 * first worksheet) file and reads up to its header. Nothing but the current row is held in memory
 * (XLSX keeps the workbook's shared-strings table, which exceljs needs to resolve text cells).
 * @throws AppError extract_empty | extract_encoding_invalid | extract_unreadable | extract_sheet_not_found
 */
export async function openTable(file: string, format: ExtractFormat, options: OpenOptions = {}): Promise<OpenedTable> {
  const totalBytes = fs.statSync(file).size;
  if (totalBytes === 0) throw new AppError('extract_empty', 'The file is empty. Export the month again and upload the new file.');
  const source = format === 'csv' ? openCsv(file, options.delimiter ?? null) : openXlsx(file, options.sheet ?? null);
  let first: IteratorResult<TableRow[], void>;
  try {
    first = await source.batches.next();
  } catch (err) {
    await source.close();
    throw err;
  }
  if (first.done) {
    await source.close();
    throw new AppError('extract_empty', 'The file has no rows at all: not even a header. Export the month again and upload the new file.');
  }
  const [header, ...rest] = first.value;
  async function* batches(): AsyncGenerator<TableRow[], void, undefined> {
    if (rest.length > 0) yield rest;
    yield* source.batches;
  }
  return {
    headerCells: header!.cells.map((c) => (c === null ? '' : c instanceof Date ? c.toISOString().slice(0, 10) : String(c).trim())),
    headerLine: header!.line,
    batches: batches(),
    sheet: source.sheet(),
    delimiter: source.delimiter,
    bytesRead: source.bytesRead,
    totalBytes,
    close: source.close,
  };
}

const BATCH_ROWS = 2048;

interface RowSource {
  batches: AsyncGenerator<TableRow[], void, undefined>;
  sheet: () => string | null;
  delimiter: string | null;
  bytesRead: () => number;
  close: () => Promise<void>;
}

/** csv-parse with the line on which each record starts (appended to the record, cheaper than its `info` objects). */
class LineNumberingParser extends Parser {
  override push(chunk: unknown, encoding?: BufferEncoding): boolean {
    if (Array.isArray(chunk)) chunk.push(this.info.lines);
    return super.push(chunk, encoding);
  }
}

function openCsv(file: string, knownDelimiter: string | null): RowSource {
  const delimiter = knownDelimiter ?? sniffCsv(file).delimiter;
  let bytes = 0;
  const decoder = new TextDecoder('utf-8', { fatal: true });
  const utf8Check = new Transform({
    transform(chunk: Buffer, _encoding, done) {
      try {
        decoder.decode(chunk, { stream: true });
      } catch {
        return done(notUtf8(bytes));
      }
      bytes += chunk.length;
      done(null, chunk);
    },
    flush(done) {
      try {
        decoder.decode();
        done();
      } catch {
        done(notUtf8(bytes));
      }
    },
  });
  const parser = new LineNumberingParser({
    delimiter,
    bom: true,
    relax_column_count: true,
    skip_empty_lines: false,
    max_record_size: MAX_RECORD_CHARS,
  });
  const input = fs.createReadStream(file, { highWaterMark: 256 * 1024 });
  pipeline(input, utf8Check, parser, () => undefined);

  async function* batches(): AsyncGenerator<TableRow[], void, undefined> {
    // A record's start line is the line after the previous record ended.
    let previousEnd = 0;
    try {
      for (;;) {
        const batch: TableRow[] = [];
        let record: Array<string | number> | null;
        while (batch.length < BATCH_ROWS && (record = parser.read() as Array<string | number> | null) !== null) {
          const endLine = record.pop() as number;
          const line = previousEnd + 1;
          previousEnd = endLine;
          const cells = record as string[];
          if (cells.every((c) => c.trim() === '')) continue;
          batch.push({ line, cells });
        }
        if (batch.length > 0) yield batch;
        else if (!(await readable(parser))) return;
      }
    } catch (err) {
      throw csvReadError(err, previousEnd + 1);
    }
  }
  return {
    batches: batches(),
    sheet: () => null,
    delimiter,
    bytesRead: () => bytes,
    close: async () => {
      input.destroy();
      parser.destroy();
    },
  };
}

/** Waits until the stream has data again. @returns false at its end. @throws its error */
function readable(stream: Parser): Promise<boolean> {
  if (stream.errored) return Promise.reject(stream.errored);
  if (stream.readableEnded || stream.destroyed) return Promise.resolve(false);
  return new Promise((resolve, reject) => {
    const done = (result: boolean | Error) => {
      stream.off('readable', onReadable);
      stream.off('end', onEnd);
      stream.off('error', onError);
      stream.off('close', onEnd);
      if (result instanceof Error) reject(result);
      else resolve(result);
    };
    const onReadable = () => done(true);
    const onEnd = () => done(stream.errored ? (stream.errored as Error) : false);
    const onError = (err: Error) => done(err);
    stream.on('readable', onReadable);
    stream.on('end', onEnd);
    stream.on('error', onError);
    stream.on('close', onEnd);
  });
}

function notUtf8(offset: number): AppError {
  return new AppError(
    'extract_encoding_invalid',
    `The file is not UTF-8 text (a byte near position ${offset.toLocaleString('en')} is not valid UTF-8). ` +
      'Save it as "CSV UTF-8" and upload it again.',
  );
}

function csvReadError(err: unknown, line: number): unknown {
  if (err instanceof AppError) return err;
  if (!(err instanceof CsvError)) return err;
  const near = `near line ${line.toLocaleString('en')}`;
  const reason: Record<string, string> = {
    CSV_QUOTE_NOT_CLOSED: `a quoted field opened ${near} is never closed`,
    CSV_INVALID_CLOSING_QUOTE: `a closing quote ${near} is followed by more text in the same field`,
    CSV_NON_TRIMABLE_CHAR_AFTER_CLOSING_QUOTE: `a closing quote ${near} is followed by more text in the same field`,
    INVALID_OPENING_QUOTE: `a quote appears inside an unquoted field ${near}`,
    CSV_MAX_RECORD_SIZE: `one row ${near} is longer than ${MAX_RECORD_CHARS.toLocaleString('en')} characters (a quote is probably never closed)`,
  };
  return new AppError(
    'extract_unreadable',
    `The file cannot be read as CSV: ${reason[err.code] ?? `its layout is broken ${near}`}. Fix the quoting or export the file again.`,
    { cause: err },
  );
}

function openXlsx(file: string, wantedSheet: string | null): RowSource {
  let bytes = 0;
  const input = fs.createReadStream(file, { highWaterMark: 256 * 1024 });
  input.on('data', (chunk) => (bytes += chunk.length));
  const reader = new ExcelJS.stream.xlsx.WorkbookReader(input, {
    worksheets: 'emit',
    sharedStrings: 'cache',
    styles: 'cache', // needed to tell date cells from numbers
    hyperlinks: 'ignore',
    entries: 'ignore',
  });
  let chosen: string | null = null;
  const sheetNames = (): string[] => ((reader as unknown as { model?: { sheets?: Array<{ name: string }> } }).model?.sheets ?? []).map((s) => s.name);

  async function* batches(): AsyncGenerator<TableRow[], void, undefined> {
    let found = false;
    let batch: TableRow[] = [];
    try {
      for await (const worksheet of reader) {
        const name = (worksheet as unknown as { name?: string }).name ?? null;
        const target = wantedSheet ?? sheetNames()[0] ?? name;
        if (found || name !== target) continue;
        found = true;
        chosen = name;
        for await (const row of worksheet) {
          const values = row.values as unknown[];
          const cells: Cell[] = [];
          for (let i = 1; i < values.length; i++) cells.push(fromExcelValue(values[i]));
          if (cells.every((c) => isBlank(c))) continue;
          batch.push({ line: row.number, cells });
          if (batch.length >= BATCH_ROWS) {
            yield batch;
            batch = [];
          }
        }
      }
      if (batch.length > 0) yield batch;
    } catch (err) {
      if (err instanceof AppError) throw err;
      throw new AppError(
        'extract_unreadable',
        'The workbook cannot be opened: it may be damaged or not a real .xlsx file. Save it again from the spreadsheet program (or export CSV) and upload it again.',
        { cause: err },
      );
    }
    if (!found) {
      const names = sheetNames();
      throw new AppError(
        'extract_sheet_not_found',
        wantedSheet
          ? `The workbook has no worksheet named "${wantedSheet}". Its worksheets: ${names.map((n) => `"${n}"`).join(', ') || 'none'}.`
          : 'The workbook has no worksheet to read.',
      );
    }
  }
  return {
    batches: batches(),
    sheet: () => chosen,
    delimiter: null,
    bytesRead: () => bytes,
    close: async () => {
      input.destroy();
    },
  };
}
