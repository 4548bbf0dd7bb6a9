import type { DataSource } from 'typeorm';
import { AppError } from '../../lib/errors';
import { DesignVersion } from '../../entities/design-version.entity';
import { primaryDesign } from '../designs.service';
import { loadObservations, type ObservationArrays } from '../observations.service';
import { getProgram } from '../programs.service';
import { acceptedExtracts } from '../recompute/accepted-extracts';
import { clusterExported, exportColumns, exportFileName, type ExportColumn } from './export-columns';
import { exportOrder } from './export-order';

/** Rows written per chunk (a chunk is a few hundred kilobytes at most). */
const ROWS_PER_CHUNK = 2_000;

export interface DeidentifiedExport {
  fileName: string;
  columns: ExportColumn[];
  periods: string[];
  rows: number;
  /** Writes the CSV, chunk by chunk; resolves when the last chunk is taken. */
  write: (sink: (chunk: string) => Promise<void>) => Promise<void>;
}

/**
 * The row-level de-identified export of a program's accepted cohorts (all, or `from`…`to`): one
 * row per applicant with the cohort, its cutoff, the score (raw and measured from the cutoff),
 * take-up, every outcome and covariate, and, when the primary design clusters (`clusterExported`), a cluster number
 * given afresh in each file. Nothing that identifies anyone is read or written: no subject
 * identifier or pseudonym, no row numbers, dates or office names. Rows are listed in score order
 * within each cohort (`exportOrder`), never in the order of the uploaded file.
 * @throws export_no_observations when no cohort in the range has visible rows
 */
export async function prepareDeidentifiedExport(ds: DataSource, programId: number, range: { from: string; to: string } | null): Promise<DeidentifiedExport> {
  const program = await getProgram(ds, programId);
  const primary = await primaryDesign(ds.manager, programId);
  const periods = (await acceptedExtracts(ds.manager, programId)).map((e) => e.period).filter((p) => !range || (p >= range.from && p <= range.to));
  const data = periods.length > 0 ? await loadObservations(ds, programId, periods) : null;
  if (!data || data.n === 0) {
    throw new AppError('export_no_observations', range ? `There are no visible observations for ${range.from === range.to ? range.from : `${range.from} to ${range.to}`}. The month’s extract may not be accepted yet, or its rows were removed under the retention rules.` : 'There are no visible observations for this program yet. They appear once an extract is accepted.');
  }
  const versions = primary ? await ds.getRepository(DesignVersion).findBy({ designId: primary.design.id }) : [];
  const clustered = clusterExported(versions) && data.cluster !== undefined;
  const columns = exportColumns(program, { cluster: clustered });
  const loaded = data.cohorts.map((c) => c.period);
  return {
    fileName: exportFileName(program.slug, loaded[0]!, loaded[loaded.length - 1]!),
    columns,
    periods: loaded,
    rows: data.n,
    write: (sink) => writeCsv(data, columns, sink),
  };
}

async function writeCsv(data: ObservationArrays, columns: readonly ExportColumn[], sink: (chunk: string) => Promise<void>): Promise<void> {
  await sink(`${columns.map((c) => c.name).join(',')}\n`);
  const clusterNumber = new Map<number, number>();
  let lines: string[] = [];
  for (const cohort of data.cohorts) {
    const cutoff = cohort.cutoff ?? Number.NaN;
    for (const i of exportOrder(data, cohort)) {
      const cells = columns.map((c) => {
        switch (c.role) {
          case 'period':
            return cohort.period;
          case 'cutoff':
            return number(cutoff);
          case 'score':
            return number(data.score[i]!);
          case 'score-centred':
            // The same subtraction the recompute's loader makes, so the doubles are identical.
            return number(data.score[i]! - cutoff);
          case 'take-up':
            return number(data.takeUp ? data.takeUp[i]! : Number.NaN);
          case 'outcome':
            return number(data.outcomes[c.key!]?.[i] ?? Number.NaN);
          case 'covariate':
            return number(data.covariates[c.key!]?.[i] ?? Number.NaN);
          case 'cluster': {
            const code = data.cluster?.[i] ?? -1;
            if (code < 1) return '';
            let n = clusterNumber.get(code);
            if (n === undefined) clusterNumber.set(code, (n = clusterNumber.size + 1));
            return String(n);
          }
        }
      });
      lines.push(cells.join(','));
      if (lines.length === ROWS_PER_CHUNK) {
        await sink(`${lines.join('\n')}\n`);
        lines = [];
      }
    }
  }
  if (lines.length > 0) await sink(`${lines.join('\n')}\n`);
}

/** Shortest text that reads back as the same double; empty for a missing value. */
function number(v: number): string {
  return Number.isFinite(v) ? String(v) : '';
}
