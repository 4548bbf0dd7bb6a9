import { exportColumns, type ExportColumn } from '../deidentified-export/export-columns';
import type { AnnexContent, ExtractMapping } from './annex-content';
import { NUMBER_FORMATS as F, SheetBuilder, type ColumnSpec } from './sheet-model';

const ROLE_NAMES: Record<ExportColumn['role'], string> = {
  period: 'cohort',
  cutoff: 'cutoff',
  score: 'score (running variable)',
  'score-centred': 'score measured from the cutoff',
  'take-up': 'take-up (treatment received)',
  outcome: 'outcome',
  covariate: 'covariate (pre-determined)',
  cluster: 'cluster',
};

/**
 * Data dictionary: each column of the de-identified export (the same definitions the export is
 * written from), then, per cohort, which column of the uploaded extract fed each export column.
 */
export function dataDictionarySheet(content: AnnexContent): SheetBuilder {
  const sheet = new SheetBuilder('Data dictionary');
  sheet.printFitToWidth = true;
  const columns = exportColumns(content.program, { cluster: content.exportHasCluster });
  sheet.title('Data dictionary of the de-identified export');
  sheet.note('One row per applicant of each accepted extract, in the order period, score, then the other columns (never the order of the uploaded file). Missing values are empty cells; numbers are written in full precision with a dot as decimal separator.');
  sheet.note('No identifier is exported: not the subject identifier, not its pseudonym, not row numbers, dates of application or office names. The file is de-identified, not anonymous: combinations of characteristics can still single out a person, so keep it under the agency’s data-protection rules. Every download is recorded in the audit trail.');
  sheet.blank();
  sheet.table<ExportColumn>(
    [
      { header: 'Column', value: (c) => c.name },
      { header: 'Holds', value: (c) => ROLE_NAMES[c.role] },
      { header: 'Definition key', value: (c) => c.key },
      { header: 'Label', value: (c) => c.label },
      { header: 'Unit', value: (c) => c.unit },
      { header: 'Description', value: (c) => c.description, wrap: true },
    ],
    columns,
  );

  sheet.blank().heading('Column mapping used for each cohort (extract column → export column)');
  if (content.mappings.length === 0) {
    sheet.note('No extract mapping is recorded for these cohorts.');
    return sheet;
  }
  const mapped = columns.filter((c) => c.role === 'score' || c.role === 'take-up' || c.role === 'outcome' || c.role === 'covariate' || c.role === 'cluster');
  sheet.table<ExtractMapping>(
    [
      { header: 'Cohort', value: (m) => m.period },
      { header: 'Extract id', value: (m) => m.extractId, numFmt: F.integer },
      { header: 'File', value: (m) => m.fileName },
      ...mapped.map<ColumnSpec<ExtractMapping>>((c) => ({ header: c.name, value: (m) => m.sourceColumns[c.name] ?? 'not mapped' })),
      { header: 'Take-up codes (yes / no)', value: (m) => m.takeUpCodes },
      { header: 'Not exported', value: (m) => m.notExported.join(', ') || null },
    ],
    content.mappings,
  );
  return sheet;
}
