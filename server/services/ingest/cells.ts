/** A cell as the readers hand it over: CSV gives strings, XLSX also numbers, booleans and dates. */
export type Cell = string | number | boolean | Date | null;

export function isBlank(cell: Cell | undefined): boolean {
  return cell === null || cell === undefined || (typeof cell === 'string' && cell.trim() === '');
}

/** A cell as text, for headers, codes and messages. Dates become `YYYY-MM-DD`. */
export function cellText(cell: Cell | undefined): string {
  if (cell === null || cell === undefined) return '';
  if (cell instanceof Date) return Number.isNaN(cell.getTime()) ? '' : cell.toISOString().slice(0, 10);
  return String(cell).trim();
}

/** A cell shortened for the rejected-rows table (at most 100 characters). */
export function cellPreview(cell: Cell | undefined): string | null {
  const text = cellText(cell);
  if (text === '') return null;
  return text.length > 100 ? `${text.slice(0, 99)}…` : text;
}

/**
 * An exceljs cell value reduced to a plain cell: rich text to its text, formulas to their cached
 * result, hyperlinks to their text, errors (`#N/A`) to their code.
 */
export function fromExcelValue(value: unknown): Cell {
  if (value === null || value === undefined) return null;
  if (typeof value === 'string' || typeof value === 'number' || typeof value === 'boolean') return value;
  if (value instanceof Date) return value;
  if (typeof value === 'object') {
    const v = value as Record<string, unknown>;
    if (Array.isArray(v.richText)) return (v.richText as Array<{ text?: string }>).map((r) => r.text ?? '').join('');
    if ('result' in v) return fromExcelValue(v.result);
    if ('formula' in v || 'sharedFormula' in v) return null;
    if (typeof v.text === 'string') return v.text;
    if (typeof v.error === 'string') return v.error;
  }
  return String(value);
}
