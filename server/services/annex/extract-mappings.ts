import { In, type DataSource } from 'typeorm';
import { Extract } from '../../entities/extract.entity';
import type { ExportColumn } from '../deidentified-export/export-columns';
import type { ExtractMapping } from './annex-content';

/**
 * For each extract behind the results, which of its columns fed each column of the de-identified
 * export, and which mapped columns are never exported (identifier, dates, period column; the
 * cluster column too when the export has none). Column names are headers of the agency's files,
 * not their contents.
 */
export async function extractMappings(ds: DataSource, programId: number, extractIds: readonly number[], columns: readonly ExportColumn[]): Promise<ExtractMapping[]> {
  if (extractIds.length === 0) return [];
  const extracts = await ds.getRepository(Extract).find({ where: { programId, id: In([...extractIds]) }, order: { period: 'ASC', id: 'ASC' } });
  const out: ExtractMapping[] = [];
  for (const e of extracts) {
    const m = e.mapping;
    if (!m) continue;
    const sourceColumns: Record<string, string> = {};
    for (const c of columns) {
      const source =
        c.role === 'score' ? m.score
        : c.role === 'take-up' ? m.takeUp
        : c.role === 'outcome' ? m.outcomes[c.key!]
        : c.role === 'covariate' ? m.covariates[c.key!]
        : c.role === 'cluster' ? m.cluster
        : undefined;
      if (source) sourceColumns[c.name] = source;
    }
    const exportsCluster = columns.some((c) => c.role === 'cluster');
    out.push({
      period: e.period,
      extractId: e.id,
      fileName: e.fileName,
      sourceColumns,
      takeUpCodes: m.takeUp ? `${m.takeUpValues.yes.join(', ')} / ${m.takeUpValues.no.join(', ')}` : null,
      notExported: [m.subjectId, m.periodColumn, m.applicationDate, exportsCluster ? undefined : m.cluster].filter((c): c is string => typeof c === 'string' && c !== ''),
    });
  }
  return out;
}
