/**
 * Column names are matched without regard to case, surrounding spaces or runs of spaces, so
 * "Hardship Index " and "hardship index" are the same column.
 * @example normaliseColumnName('  Hardship   Index ') // => 'hardship index'
 */
export function normaliseColumnName(name: string): string {
  return name.trim().replace(/\s+/g, ' ').toLowerCase();
}

/** Finds a column by name among the header's columns; returns its position or -1. */
export function findColumn(columns: readonly string[], name: string): number {
  const wanted = normaliseColumnName(name);
  return columns.findIndex((c) => normaliseColumnName(c) === wanted);
}
