/**
 * A sheet of the annex as plain data, built completely before it is written: the streaming
 * workbook writer needs column widths before the first row, and widths that fit need every cell.
 *
 * Cell values are only numbers, text or empty. Text is always written as a text cell, whatever it
 * begins with: a label such as `=HYPERLINK(…)`, `+1`, `-x` or `@SUM(…)` from an extract or a
 * definition stays literal text and never becomes a formula (no formula is ever written).
 */
export type CellValue = number | string | null;

/** Number formats of the annex (display only: the stored value keeps full double precision). */
export const NUMBER_FORMATS = {
  /** Estimates, standard errors, interval ends, in outcome or take-up units. */
  estimate: '0.0000',
  /** p-values. */
  p: '0.0000',
  /** F statistics, t and z statistics, ratios. */
  statistic: '0.00',
  /** Bandwidths and other score distances, score units. */
  score: '0.000',
  /** Counts of applicants, bins, permutations. */
  count: '#,##0',
  /** Shares shown as percentages. */
  share: '0.0%',
  /** Confidence levels. */
  level: '0%',
  /** Small whole numbers (orders, versions, ids). */
  integer: '0',
} as const;
export type NumberFormat = (typeof NUMBER_FORMATS)[keyof typeof NUMBER_FORMATS];

export interface SheetCell {
  value: CellValue;
  numFmt?: NumberFormat;
  /** Long text wraps inside the column (otherwise it runs on into empty cells to its right). */
  wrap?: boolean;
  /** Numbers against the left edge, beside their label (key–value lists). */
  alignLeft?: boolean;
}

export type RowKind = 'title' | 'heading' | 'header' | 'body' | 'note';

export interface SheetRow {
  kind: RowKind;
  cells: SheetCell[];
}

/** One column of a table: its header, how to read a row's value, and how to show it. */
export interface ColumnSpec<R> {
  header: string;
  value: (row: R) => unknown;
  /** How numbers of the column are shown; a function when it depends on the row. */
  numFmt?: NumberFormat | ((row: R) => NumberFormat | undefined);
  /** A column of sentences: long text wraps (rows grow) instead of running on. */
  wrap?: boolean;
}

/** Widest column the fitting gives (characters); longer text wraps. */
export const MAX_COLUMN_WIDTH = 60;
/** The widest a column holding paragraphs gets. */
export const PROSE_COLUMN_WIDTH = 110;

/**
 * A value as a cell: finite numbers stay numbers, text stays text, yes/no for booleans, empty for
 * null, undefined and non-finite numbers (an unbounded interval end is an empty cell).
 * @throws TypeError for anything else (objects are never written, so no formula can slip in)
 */
export function cellValue(value: unknown): CellValue {
  if (value === null || value === undefined) return null;
  if (typeof value === 'number') return Number.isFinite(value) ? value : null;
  if (typeof value === 'string') return value;
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  throw new TypeError(`cellValue: cannot write a ${typeof value} to the annex`);
}

export class SheetBuilder {
  readonly rows: SheetRow[] = [];
  /** Rows and columns kept in view while scrolling (the table header, the identifying columns). */
  freeze: { rows: number; columns: number } | null = null;
  /** The header row (1-based) and column count of the filtered table. */
  filter: { row: number; columns: number } | null = null;
  /** Printed on as many landscape pages as it needs, or scaled to one page across (sheets of prose and key–value lists). */
  printFitToWidth = false;
  /** Notes wrap inside column A (prose sheets); otherwise they run across the empty cells to their right. */
  wrapNotes = false;
  /** Column widths forced by the sheet (characters), by 0-based column. */
  readonly fixedWidths = new Map<number, number>();

  constructor(readonly name: string) {}

  title(text: string): this {
    return this.push('title', [{ value: text }]);
  }

  heading(text: string): this {
    return this.push('heading', [{ value: text }]);
  }

  /** A paragraph or a line of notes in the first column. */
  note(text: string): this {
    return this.push('note', [{ value: text }]);
  }

  /** A label and its value (and more values), e.g. "Engine version" | "0.1.0": long values wrap, numbers sit beside the label. */
  pair(label: string, ...values: Array<unknown | SheetCell>): this {
    return this.push('body', [{ value: label }, ...values.map((v) => ({ ...asCell(v), wrap: true, alignLeft: true }))]);
  }

  blank(): this {
    return this.push('body', []);
  }

  /**
   * A table: a header row, then one row per item.
   * @returns the 1-based row number of the header (for freezing and filters)
   */
  table<R>(columns: ReadonlyArray<ColumnSpec<R>>, items: readonly R[]): number {
    this.push('header', columns.map((c) => ({ value: c.header })));
    const headerRow = this.rows.length;
    for (const item of items) {
      this.push(
        'body',
        columns.map((c) => {
          const value = cellValue(c.value(item));
          const numFmt = typeof c.numFmt === 'function' ? c.numFmt(item) : c.numFmt;
          const cell: SheetCell = typeof value === 'number' && numFmt ? { value, numFmt } : { value };
          if (c.wrap) cell.wrap = true;
          return cell;
        }),
      );
    }
    return headerRow;
  }

  /** A sheet that is one table: header frozen with the first `frozenColumns` columns, filters on. */
  singleTable<R>(columns: ReadonlyArray<ColumnSpec<R>>, items: readonly R[], frozenColumns: number): this {
    const header = this.table(columns, items);
    this.freeze = { rows: header, columns: frozenColumns };
    this.filter = { row: header, columns: columns.length };
    return this;
  }

  private push(kind: RowKind, cells: SheetCell[]): this {
    this.rows.push({ kind, cells });
    return this;
  }
}

function asCell(v: unknown): SheetCell {
  if (v !== null && typeof v === 'object' && 'value' in v) {
    const cell = v as SheetCell;
    return { ...cell, value: cellValue(cell.value) };
  }
  return { value: cellValue(v) };
}

/** A number as the cell format shows it (approximately), for fitting column widths. */
export function displayedText(cell: SheetCell): string {
  const v = cell.value;
  if (v === null) return '';
  if (typeof v === 'string') return v;
  const fmt = cell.numFmt;
  if (!fmt) return String(v);
  const decimals = fmt.split('.')[1]?.replace(/[^0]/g, '').length ?? 0;
  const shown = fmt.endsWith('%') ? `${(v * 100).toFixed(decimals)}%` : v.toFixed(decimals);
  return fmt.startsWith('#,##') ? shown.replace(/\B(?=(\d{3})+(?!\d))/g, ',') : shown;
}

/** Column widths (characters) that fit the header and the values, within the caps. */
export function fittedWidths(sheet: SheetBuilder): number[] {
  const widths: number[] = [];
  for (const row of sheet.rows) {
    // Titles, headings and notes run across empty cells to their right; they do not widen column A.
    if (row.kind === 'title' || row.kind === 'heading' || row.kind === 'note') continue;
    row.cells.forEach((cell, i) => {
      const longestLine = Math.max(...displayedText(cell).split('\n').map((l) => l.length));
      widths[i] = Math.max(widths[i] ?? 0, longestLine + (row.kind === 'header' ? 4 : 2));
    });
  }
  return widths.map((w, i) => sheet.fixedWidths.get(i) ?? Math.min(MAX_COLUMN_WIDTH, Math.max(8, w)));
}
