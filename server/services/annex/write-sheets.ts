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
  const workbook = new ExcelJS.stream.xlsx.WorkbookWriter({ stream: output, useStyles: true, useSharedStrings: true });
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
    pageSetup: { orientation: 'landscape', ...(sheet.printFitToWidth ? { fitToPage: true, fitToWidth: 1, fitToHeight: 0 } : {}) },
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

function styleFor(kind: SheetRow['kind'], numFmt: string | undefined, wrap: boolean, alignLeft: boolean, top: boolean): Partial<ExcelJS.Style> {
  const key = `${kind}|${numFmt ?? ''}|${wrap ? 'wrap' : ''}|${alignLeft ? 'left' : ''}|${top ? 'top' : ''}`;
  let style = sharedStyles.get(key);
  if (!style) {
    style = {};
    if (numFmt) style.numFmt = numFmt;
    // In a row that grows for wrapped text, everything reads from the top (a label level with the first line).
    if (wrap || alignLeft || top) style.alignment = { ...(top ? { vertical: 'top' } : {}), ...(wrap ? { wrapText: true } : {}), ...(alignLeft ? { horizontal: 'left' } : {}) };
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

/** Height of one line of 11-point text, points (Excel's default row height). */
const LINE_HEIGHT_PT = 15;

function writeRow(worksheet: ExcelJS.Worksheet, model: SheetRow, widths: readonly number[], wrapNotes: boolean): void {
  // Values only ever numbers, text or empty (SheetBuilder guarantees it): no formula is written,
  // and text goes to the shared-strings table (`t="s"` cells: text, whatever it begins with).
  const row = worksheet.addRow(model.cells.map((c) => c.value));
  let lines = 1;
  const wraps = model.cells.map((cell, i) => {
    const width = widths[i] ?? 10;
    const length = typeof cell.value === 'string' ? displayedText(cell).length : 0;
    const wrap = length > width && ((model.kind === 'body' && cell.wrap === true) || (model.kind === 'note' && wrapNotes));
    // Spreadsheet programs do not grow rows for wrapped text by themselves: estimate the lines (a
    // column of width w holds about w characters of text; common practice, no source).
    if (wrap) lines = Math.max(lines, Math.ceil(length / Math.max(1, width - 1)));
    return wrap;
  });
  model.cells.forEach((cell, i) => {
    // Every cell gets a shared object, plain ones too (a fresh `{}` per cell is a lookup miss each).
    row.getCell(i + 1).style = styleFor(model.kind, cell.numFmt, wraps[i]!, cell.alignLeft === true && typeof cell.value === 'number', lines > 1);
  });
  if (lines > 1) row.height = lines * LINE_HEIGHT_PT;
  row.commit();
}
