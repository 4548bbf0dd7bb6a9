import type { ProgramDetailDto } from '@shared/api/programs';
import { exportColumns, exportFileName, outcomeColumn } from '../deidentified-export/export-columns';
import type { AnnexResult } from './annex-content';

/**
 * The command line that recomputes a result from the de-identified export of its cohorts, with the
 * settings of the design version that produced it (what the analyzer passes to the engine):
 * a cohort on its raw score and cutoff, a pooled window on `score_centred` at cutoff 0 (each
 * cohort measured from its own cutoff, as the recompute does). Rows with a missing value in a
 * column the estimate uses are left out (`--missing skip`), as Cutline leaves them out.
 * @returns null when the result was not estimated or its design version is unknown
 */
export function reproduceCommand(program: ProgramDetailDto, r: AnnexResult): string | null {
  const s = r.settings;
  if (!s || r.result.status !== 'ok') return null;
  // Clustered only when the estimate was (a design may cluster while no extract maps a cluster column).
  const clustered = s.cluster === 'cluster-column' && r.result.n?.clusters != null;
  // Only the outcome's column name is needed here, and it does not depend on the cluster column.
  const columns = exportColumns(program, { cluster: false });
  const outcome = outcomeColumn(columns, r.result.outcome.key);
  if (!outcome) return null;
  const scope = r.result.scope;
  const cohort = scope.kind === 'cohort' ? scope.periods[0] : undefined;
  const args: Array<[string, string | number]> = [
    ['input', exportFileName(program.slug, scope.firstPeriod, scope.lastPeriod)],
    ['score', cohort ? 'score' : 'score_centred'],
    ['cutoff', cohort ? cohort.cutoff : 0],
    ['eligible', program.eligibleSide],
    ['outcome', outcome],
    ['takeup', 'take_up'],
    ['kernel', s.kernel],
    ['order', s.order],
    s.bandwidthRule === 'fixed' ? ['bandwidth', s.bandwidthValue!] : ['bandwidth-rule', s.bandwidthRule],
    ['variance', s.variance],
    ['level', s.level],
    ['missing', 'skip'],
  ];
  if (clustered) args.push(['cluster', 'cluster']);
  if (s.donutRadius > 0) args.push(['donut', s.donutRadius]);
  return `npm run --silent estimate -- ${args.map(([k, v]) => `--${k} ${String(v)}`).join(' ')}`;
}
