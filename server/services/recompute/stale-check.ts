import type { DataSource } from 'typeorm';
import { cutoffForPeriod } from '@shared/domain/cutoff-schedule';
import { CutoffChange } from '../../entities/cutoff-change.entity';
import { EstimateResult } from '../../entities/estimate-result.entity';
import { Program } from '../../entities/program.entity';
import { primaryDesign } from '../designs.service';
import { acceptedExtracts } from './accepted-extracts';
import type { Analyzer } from './analyzer';
import { planScopes, type CohortInput } from './scope-plan';

/**
 * Whether a program's stored results of its primary design are behind its inputs: a scope without
 * a current result for every outcome, a result whose input signature changed, a result for a scope
 * that no longer exists, or one marked stale by a failed run. Cheap (no observation is read).
 */
export async function programNeedsRecompute(ds: DataSource, programId: number, analyzer: Pick<Analyzer, 'engineVersion' | 'diagnosticsVersion'>): Promise<boolean> {
  const program = await ds.getRepository(Program).findOneBy({ id: programId });
  const primary = program ? await primaryDesign(ds.manager, programId) : null;
  if (!program || !primary) return false;
  const schedule = await ds.getRepository(CutoffChange).findBy({ programId });
  const cohorts: CohortInput[] = [];
  for (const e of await acceptedExtracts(ds.manager, programId)) {
    const cutoff = cutoffForPeriod(schedule, e.period);
    if (cutoff !== null) cohorts.push({ ...e, cutoff });
  }
  const planned = planScopes(cohorts, {
    designVersionId: primary.version.id,
    settings: primary.version.settings,
    eligibleSide: program.eligibleSide,
    engineVersion: analyzer.engineVersion,
    diagnosticsVersion: analyzer.diagnosticsVersion,
  });
  const rows = await ds.getRepository(EstimateResult).find({ where: { designId: primary.design.id }, select: { scopeKey: true, outcomeKey: true, inputSignature: true, stale: true } });
  if (rows.some((r) => r.stale)) return true;
  const signatures = new Map(planned.map((p) => [p.scope.key, p.signature]));
  if (rows.some((r) => signatures.get(r.scopeKey) !== r.inputSignature)) return true;
  return planned.some((p) => primary.version.settings.outcomes.some((o) => !rows.some((r) => r.scopeKey === p.scope.key && r.outcomeKey === o)));
}
