import type { Writable } from 'node:stream';
import ExcelJS from 'exceljs';
import { displayedText, fittedWidths, type SheetBuilder, type SheetRow } from './sheet-model';

const FONT = 'Calibri';
const HEADER_FILL: ExcelJS.Fill = { type: 'pattern', pattern: 'solid', fgColor: { argb: 'FFE8EEF2' } };

export interface WorkbookInfo {
  /** Shown as the file's author (the person who generated it). */
  creator: string;
  created: Date;
  title: string;
}

/**
 * Streams the sheets as one .xlsx to `output` (exceljs's streaming writer: rows are written and
 * released as they go, so a large annex never sits in memory as a workbook). Resolves when the
 * last byte has been handed to the stream.
 */
export async function writeSheets(output: Writable, info: WorkbookInfo, sheets: readonly SheetBuilder[]): Promise<void> {
  const workbook = new ExcelJS.stream.xlsx.WorkbookWriter({ stream: output, useStyles: true, useSharedStrings: false });
  workbook.creator = info.creator;
  workbook.lastModifiedBy = info.creator;
  workbook.created = info.created;
  workbook.modified = info.created;
  workbook.title = info.title;
  for (const sheet of sheets) writeSheet(workbook, sheet);
  await workbook.commit();
}

function writeSheet(workbook: ExcelJS.stream.xlsx.WorkbookWriter, sheet: SheetBuilder): void {
  const freeze = sheet.freeze;
  const worksheet = workbook.addWorksheet(sheet.name, {
    views: freeze ? [{ state: 'frozen', xSplit: freeze.columns, ySplit: freeze.rows }] : [{}],
  });
  const widths = fittedWidths(sheet);
  worksheet.columns = widths.map((width) => ({ width }));
  if (sheet.filter) worksheet.autoFilter = { from: { row: sheet.filter.row, column: 1 }, to: { row: sheet.filter.row, column: sheet.filter.columns } };
  for (const row of sheet.rows) writeRow(worksheet, row, widths, sheet.wrapNotes);
  worksheet.commit();
}

/**
 * Style objects shared by every cell that looks the same. exceljs looks a cell's style up by the
 * object's identity first, so handing it the same object is what keeps a 100,000-cell annex fast;
 * the objects are never changed after they are made (no `cell.font = …`, which would mutate them).
 */
const sharedStyles = new Map<string, Partial<ExcelJS.Style>>();

function styleFor(kind: SheetRow['kind'], numFmt: string | undefined, wrap: boolean): Partial<ExcelJS.Style> {
  const key = `${kind}|${numFmt ?? ''}|${wrap ? 'wrap' : ''}`;
  let style = sharedStyles.get(key);
  if (!style) {
    style = {};
    if (numFmt) style.numFmt = numFmt;
    if (wrap) style.alignment = { wrapText: true, vertical: 'top' };
    if (kind === 'title') style.font = { name: FONT, size: 14, bold: true };
    if (kind === 'heading') style.font = { name: FONT, size: 12, bold: true };
    if (kind === 'header') {
      style.font = { name: FONT, bold: true };
      style.fill = HEADER_FILL;
      style.border = { bottom: { style: 'thin' } };
      style.alignment = { wrapText: true, vertical: 'bottom' };
    }
    sharedStyles.set(key, Object.freeze(style));
  }
  return style;
}

function writeRow(worksheet: ExcelJS.Worksheet, model: SheetRow, widths: readonly number[], wrapNotes: boolean): void {
  // Values only ever numbers, text or empty (SheetBuilder guarantees it): no formula is written.
  const row = worksheet.addRow(model.cells.map((c) => c.value));
  model.cells.forEach((cell, i) => {
    const long = typeof cell.value === 'string' && displayedText(cell).length > (widths[i] ?? 10);
    const wrap = long && (model.kind === 'body' || (model.kind === 'note' && wrapNotes));
    // Every cell gets a shared object, plain ones too (a fresh `{}` per cell is a lookup miss each).
    row.getCell(i + 1).style = styleFor(model.kind, cell.numFmt, wrap);
  });
  row.commit();
}
