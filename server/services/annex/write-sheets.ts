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

function writeRow(worksheet: ExcelJS.Worksheet, model: SheetRow, widths: readonly number[], wrapNotes: boolean): void {
  // Values only ever numbers, text or empty (SheetBuilder guarantees it): no formula is written.
  const row = worksheet.addRow(model.cells.map((c) => c.value));
  model.cells.forEach((cell, i) => {
    const target = row.getCell(i + 1);
    if (cell.numFmt) target.numFmt = cell.numFmt;
    const width = widths[i] ?? 10;
    if (typeof cell.value === 'string' && model.kind === 'body' && displayedText(cell).length > width) {
      target.alignment = { wrapText: true, vertical: 'top' };
    }
    if (model.kind === 'note' && wrapNotes && typeof cell.value === 'string' && cell.value.length > width) {
      target.alignment = { wrapText: true, vertical: 'top' };
    }
  });
  if (model.kind === 'title') row.font = { name: FONT, size: 14, bold: true };
  if (model.kind === 'heading') row.font = { name: FONT, size: 12, bold: true };
  if (model.kind === 'header') {
    model.cells.forEach((_c, i) => {
      const target = row.getCell(i + 1);
      target.font = { name: FONT, bold: true };
      target.fill = HEADER_FILL;
      target.border = { bottom: { style: 'thin' } };
      target.alignment = { wrapText: true, vertical: 'bottom' };
    });
  }
  row.commit();
}
