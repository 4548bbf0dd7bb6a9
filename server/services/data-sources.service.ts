import type { DataSource, EntityManager } from 'typeorm';
import type { DataSourceDto } from '@shared/api/extracts';
import type { ColumnMapping } from '@shared/schemas/extract';
import { ExtractSource } from '../entities/extract-source.entity';
import { SavedMapping } from '../entities/saved-mapping.entity';
import { conflict, notFound } from '../lib/errors';
import { recordAudit, type AuditActor } from './audit.service';

/** The program's data sources with their saved mappings, by name. */
export async function listDataSources(ds: DataSource, programId: number): Promise<DataSourceDto[]> {
  const sources = await ds.getRepository(ExtractSource).find({ where: { programId }, order: { name: 'ASC' } });
  const mappings = await ds.getRepository(SavedMapping).find({ where: { programId }, order: { savedAt: 'DESC' } });
  return sources.map((s) => ({
    id: s.id,
    name: s.name,
    createdAt: s.createdAt.toISOString(),
    mappings: mappings
      .filter((m) => m.sourceId === s.id)
      .map((m) => ({
        id: m.id,
        headerFingerprint: m.headerFingerprint,
        columns: m.columns,
        mapping: m.mapping,
        saved: { at: m.savedAt.toISOString(), by: m.savedByLabel },
      })),
  }));
}

/** Creates a data source. @throws conflict when the program already has one of that name */
export async function createDataSource(manager: EntityManager, programId: number, name: string): Promise<ExtractSource> {
  const repo = manager.getRepository(ExtractSource);
  const existing = await repo.createQueryBuilder('s').where('s.programId = :programId AND LOWER(s.name) = LOWER(:name)', { programId, name }).getOne();
  if (existing) throw conflict(`This program already has a data source called "${existing.name}".`);
  return repo.save(repo.create({ programId, name }));
}

/** A data source of the program. @throws not_found */
export async function findDataSource(manager: EntityManager, programId: number, sourceId: number): Promise<ExtractSource> {
  const source = await manager.getRepository(ExtractSource).findOneBy({ id: sourceId, programId });
  if (!source) throw notFound('Data source');
  return source;
}

/**
 * Saves (or replaces) the mapping of a source for one header fingerprint, so the next file with
 * the same columns maps itself. Audited as `mapping.save`.
 */
export async function saveMapping(
  manager: EntityManager,
  args: { programId: number; sourceId: number; fingerprint: string; columns: string[]; mapping: ColumnMapping; actor: AuditActor },
): Promise<void> {
  const repo = manager.getRepository(SavedMapping);
  const existing = await repo.findOneBy({ sourceId: args.sourceId, headerFingerprint: args.fingerprint });
  const row = existing ?? repo.create({ programId: args.programId, sourceId: args.sourceId, headerFingerprint: args.fingerprint });
  Object.assign(row, { columns: args.columns, mapping: args.mapping, savedByLabel: args.actor.label, savedByUserId: args.actor.userId });
  const saved = await repo.save(row);
  await recordAudit(manager, {
    actor: args.actor,
    action: 'mapping.save',
    programId: args.programId,
    subjectType: 'mapping',
    subjectId: saved.id,
    details: { sourceId: args.sourceId, headerFingerprint: args.fingerprint, replaced: existing !== null },
  });
}
