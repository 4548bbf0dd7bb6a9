import type { DataSource, EntityManager } from 'typeorm';
import type { CaveatAcknowledgementDto } from '@shared/api/results';
import type { CaveatAcknowledgeInput } from '@shared/schemas/caveat-acknowledgement';
import { CaveatAcknowledgement } from '../entities/caveat-acknowledgement.entity';
import { EstimateResult } from '../entities/estimate-result.entity';
import { AppError, notFound } from '../lib/errors';
import { recordAudit, type AuditActor } from './audit.service';

/**
 * A manager acknowledges one caveat of a result, with a comment; recorded in the audit trail.
 * @throws not_found | bad_request when the result has no caveat with that code
 */
export async function acknowledgeCaveat(ds: DataSource, programId: number, resultId: number, actor: AuditActor, input: CaveatAcknowledgeInput): Promise<CaveatAcknowledgementDto> {
  return ds.transaction(async (tx) => {
    const result = await tx.getRepository(EstimateResult).findOneBy({ id: resultId, programId });
    if (!result) throw notFound('Result');
    if (!result.caveats.some((c) => c.code === input.caveatCode)) throw new AppError('bad_request', 'This result has no such caveat (it may have gone with a recompute). Reload the page.');
    const row = await tx.getRepository(CaveatAcknowledgement).save(
      tx.getRepository(CaveatAcknowledgement).create({
        programId,
        designId: result.designId,
        scopeKey: result.scopeKey,
        outcomeKey: result.outcomeKey,
        caveatCode: input.caveatCode,
        resultId,
        comment: input.comment,
        acknowledgedByUserId: actor.userId,
        acknowledgedByLabel: actor.label,
      }),
    );
    await recordAudit(tx, { actor, action: 'caveat.acknowledge', programId, subjectType: 'result', subjectId: resultId, details: { caveat: input.caveatCode, scope: result.scopeKey, outcome: result.outcomeKey } });
    return toDto(row);
  });
}

/** Acknowledgements of the given results' scopes and outcomes, by result id. */
export async function acknowledgementsFor(manager: EntityManager, rows: ReadonlyArray<Pick<EstimateResult, 'id' | 'designId' | 'scopeKey' | 'outcomeKey'>>): Promise<Map<number, CaveatAcknowledgementDto[]>> {
  const out = new Map<number, CaveatAcknowledgementDto[]>();
  if (rows.length === 0) return out;
  const designIds = [...new Set(rows.map((r) => r.designId))];
  const acks = await manager.getRepository(CaveatAcknowledgement).createQueryBuilder('a').where('a.designId IN (:...designIds)', { designIds }).orderBy('a.acknowledgedAt', 'ASC').getMany();
  for (const r of rows) out.set(r.id, acks.filter((a) => a.scopeKey === r.scopeKey && a.outcomeKey === r.outcomeKey).map(toDto));
  return out;
}

function toDto(a: CaveatAcknowledgement): CaveatAcknowledgementDto {
  return { id: a.id, caveatCode: a.caveatCode, comment: a.comment, acknowledgedBy: a.acknowledgedByLabel, acknowledgedAt: a.acknowledgedAt.toISOString() };
}
