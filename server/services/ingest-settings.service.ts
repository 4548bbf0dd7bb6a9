import type { DataSource } from 'typeorm';
import type { IngestSettingsDto } from '@shared/api/extracts';
import type { IngestSettings } from '@shared/schemas/extract';
import { Program } from '../entities/program.entity';
import { notFound } from '../lib/errors';
import { recordAudit, type AuditActor } from './audit.service';

/** The program's rejection limit and retention. @throws not_found */
export async function getIngestSettings(ds: DataSource, programId: number): Promise<IngestSettingsDto> {
  const program = await ds.getRepository(Program).findOneBy({ id: programId });
  if (!program) throw notFound('Program');
  return { maxRejectedShare: Number(program.maxRejectedShare), retentionMonths: program.retentionMonths };
}

/** Changes them (admins), audited as `program.update` with the old and new values. @throws not_found */
export async function updateIngestSettings(ds: DataSource, programId: number, actor: AuditActor, settings: IngestSettings): Promise<IngestSettingsDto> {
  return ds.transaction(async (tx) => {
    const repo = tx.getRepository(Program);
    const program = await repo.findOneBy({ id: programId });
    if (!program) throw notFound('Program');
    const before = { maxRejectedShare: Number(program.maxRejectedShare), retentionMonths: program.retentionMonths };
    await repo.update({ id: programId }, settings);
    await recordAudit(tx, { actor, action: 'program.update', programId, subjectType: 'program', subjectId: programId, details: { ingestSettings: { before, after: settings } } });
    return settings;
  });
}
