import ExcelJS from 'exceljs';
import type { Response } from 'supertest';

/** Collects a binary response body (supertest's default parser keeps only text). */
export function binaryBody(response: unknown, done: (err: Error | null, body: Buffer) => void): void {
  const res = response as NodeJS.ReadableStream;
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(Buffer.from(c)));
  res.on('end', () => done(null, Buffer.concat(chunks)));
  res.on('error', (err: Error) => done(err, Buffer.alloc(0)));
}

/** Opens a downloaded workbook with exceljs, as an evaluator's spreadsheet program would read it. */
export async function openWorkbook(res: Response): Promise<ExcelJS.Workbook> {
  const workbook = new ExcelJS.Workbook();
  await workbook.xlsx.load(res.body as ExcelJS.Buffer);
  return workbook;
}

/** A sheet's rows as { header → cell }, for the table whose header is on `headerRow`. */
export function tableRows(sheet: ExcelJS.Worksheet, headerRow = 1): Array<Map<string, ExcelJS.Cell>> {
  const headers = (sheet.getRow(headerRow).values as unknown[]).slice(1).map((v) => String(v));
  const out: Array<Map<string, ExcelJS.Cell>> = [];
  for (let r = headerRow + 1; r <= sheet.rowCount; r++) {
    const row = sheet.getRow(r);
    if (row.cellCount === 0) break;
    out.push(new Map(headers.map((h, i) => [h, row.getCell(i + 1)])));
  }
  return out;
}
