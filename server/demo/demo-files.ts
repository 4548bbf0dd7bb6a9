import fs from 'node:fs';
import type { Writable } from 'node:stream';
import ExcelJS from 'exceljs';
import type { DemoHousehold } from '@shared/demo/heating-credit';
import { generateDemoCohort } from '@shared/demo/heating-credit';
import type { ColumnMapping } from '@shared/schemas/extract';

/**
 * The files the demo scenario's agency would send: the county's case-management CSV export (one a
 * month, loaded through the real ingest path) and a regional office's workbook for trying an upload
 * by hand. Every household in them is invented (shared/demo/heating-credit.ts).
 */
export const CASE_MANAGEMENT_SOURCE = 'Case-management export';

/** Columns of the county's monthly case-management export. */
export const CASE_MANAGEMENT_HEADER = [
  'case_number',
  'application_date',
  'office',
  'hardship_index',
  'credit_taken',
  'shutoff_within_6m',
  'arrears_months_6m',
  'household_size',
  'prior_year_arrears_months',
] as const;

/** How the case-management export maps to the demo program's roles (saved once, then recognised). */
export const CASE_MANAGEMENT_MAPPING: ColumnMapping = {
  subjectId: 'case_number',
  score: 'hardship_index',
  takeUp: 'credit_taken',
  takeUpValues: { yes: ['yes'], no: ['no'] },
  applicationDate: 'application_date',
  dateFormat: 'YYYY-MM-DD',
  cluster: 'office',
  outcomes: { shutoff_6m: 'shutoff_within_6m', arrears_months: 'arrears_months_6m' },
  covariates: { household_size: 'household_size', prior_arrears: 'prior_year_arrears_months' },
  decimalSeparator: '.',
};

/** Writes one month's case-management export as CSV. */
export function writeCaseManagementCsv(file: string, period: string): void {
  const { households } = generateDemoCohort(period);
  const lines = [CASE_MANAGEMENT_HEADER.join(',')];
  for (const h of households) {
    lines.push(
      [h.caseNumber, h.applicationDate, h.office, h.score, h.takeUp ? 'yes' : 'no', h.shutoff_6m, h.arrears_months, h.household_size, h.prior_arrears].join(','),
    );
  }
  fs.writeFileSync(file, `${lines.join('\n')}\n`, { mode: 0o600 });
}

/** The month of the regional office's workbook: the one after the demo's last cohort. */
export const REGIONAL_OFFICE_PERIOD = '2026-11';

const XLSX_HEADER = ['Case no.', 'Date applied', 'Office', 'Hardship index', 'Heating credit received', 'Shut-off within 6 months', 'Months in arrears (6 months)', 'People in household', 'Arrears months, last year'];

/**
 * The regional office's workbook for November 2026: other column names than the county export,
 * real Excel dates, "Yes"/"No" for take-up and a notes sheet after the data, so an analyst trying
 * Cutline meets the mapping form. Streamed, so it can go straight into an HTTP response.
 */
export async function writeRegionalOfficeWorkbook(output: Writable): Promise<void> {
  const workbook = new ExcelJS.stream.xlsx.WorkbookWriter({ stream: output, useStyles: true, useSharedStrings: true });
  const sheet = workbook.addWorksheet('Applications');
  sheet.columns = XLSX_HEADER.map((header, i) => ({ header, key: String(i), width: i === 0 ? 14 : 18, style: i === 1 ? { numFmt: 'yyyy-mm-dd' } : {} }));
  const { households } = generateDemoCohort(REGIONAL_OFFICE_PERIOD);
  for (const h of households) sheet.addRow(workbookRow(h)).commit();
  sheet.commit();
  const notes = workbook.addWorksheet('Notes');
  notes.addRow(['Harrow Vale County (fictional): regional office applications for the winter heating credit, November 2026.']).commit();
  notes.addRow(['Invented demo data: no real household is described.']).commit();
  notes.commit();
  await workbook.commit();
}

function workbookRow(h: DemoHousehold): unknown[] {
  const [y, m, d] = h.applicationDate.split('-').map(Number);
  return [h.caseNumber, new Date(Date.UTC(y!, m! - 1, d!)), h.office, h.score, h.takeUp ? 'Yes' : 'No', h.shutoff_6m, h.arrears_months, h.household_size, h.prior_arrears];
}
