import { createHash } from 'node:crypto';
import { LessThan, type DataSource } from 'typeorm';
import { UsedAssertion } from '../entities/used-assertion.entity';

/**
 * Records an accepted assertion until it expires. Returns false when the same assertion (issuer
 * and ID) was accepted before: the primary key makes the check and the record one atomic step
 * (INSERT IGNORE), so two app instances cannot both accept it.
 */
export async function rememberAssertion(dataSource: DataSource, issuer: string, assertionId: string, expiresAt: Date): Promise<boolean> {
  const repo = dataSource.getRepository(UsedAssertion);
  await repo.createQueryBuilder().delete().where({ expiresAt: LessThan(new Date()) }).execute();
  const idHash = createHash('sha256').update(`${issuer}\n${assertionId}`).digest('hex');
  const result = await repo.createQueryBuilder().insert().orIgnore().values({ idHash, expiresAt }).execute();
  return affectedRows(result.raw) === 1;
}

/** Rows an INSERT IGNORE really inserted (0 when the key existed). */
export function affectedRows(raw: unknown): number {
  return Number((raw as { affectedRows?: number } | undefined)?.affectedRows ?? 0);
}
