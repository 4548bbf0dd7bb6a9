import { createHash } from 'node:crypto';
import { normaliseColumnName } from '@shared/ingest/column-names';
import { AppError } from '../../lib/errors';

/**
 * The header as column names: blank header cells become "Column N" (they can still be left
 * unmapped); two columns with the same name make mapping by name ambiguous and are refused.
 * @throws AppError extract_header_invalid
 */
export function headerColumns(cells: readonly string[]): string[] {
  const columns = cells.map((c, i) => (c.trim() === '' ? `Column ${i + 1}` : c.trim()));
  const seen = new Map<string, number>();
  columns.forEach((name, i) => {
    const key = normaliseColumnName(name);
    const first = seen.get(key);
    if (first !== undefined) {
      throw new AppError(
        'extract_header_invalid',
        `The header names the column "${name}" twice (columns ${first + 1} and ${i + 1}). Give every column its own name and upload the file again.`,
      );
    }
    seen.set(key, i);
  });
  if (columns.length < 2) {
    throw new AppError(
      'extract_header_invalid',
      `The header has only one column ("${columns[0] ?? ''}"). If the file uses a delimiter other than comma, semicolon, tab or pipe, export it again as ordinary CSV.`,
    );
  }
  return columns;
}

/**
 * SHA-256 (hex) of the sorted, normalised column names: the same columns in another order or
 * capitalisation give the same fingerprint, so a saved mapping still applies; a column added,
 * removed or renamed gives another one and the analyst is asked again.
 */
export function headerFingerprint(columns: readonly string[]): string {
  const names = columns.map(normaliseColumnName).sort();
  return createHash('sha256').update(JSON.stringify(names)).digest('hex');
}
