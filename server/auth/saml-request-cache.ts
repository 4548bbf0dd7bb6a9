import type { CacheItem, CacheProvider } from '@node-saml/node-saml';
import { LessThan, MoreThan, type DataSource } from 'typeorm';
import { SamlRequest } from '../entities/saml-request.entity';
import { affectedRows } from './assertion-replay';

/**
 * node-saml's memory of the sign-in requests it sent (for the InResponseTo check), kept in MariaDB
 * so that an answer is accepted by whichever app instance it reaches, and refused by all of them
 * once used. A request is good for `lifetimeMs` after it was sent.
 */
export class MariaDbSamlRequestCache implements CacheProvider {
  constructor(
    private readonly dataSource: DataSource,
    private readonly lifetimeMs: number,
  ) {}

  async saveAsync(key: string, value: string): Promise<CacheItem | null> {
    const createdAt = new Date();
    const repo = this.dataSource.getRepository(SamlRequest);
    // Forget requests nobody answered; the index on created_at keeps this cheap.
    await repo.createQueryBuilder().delete().where({ createdAt: LessThan(new Date(createdAt.getTime() - this.lifetimeMs)) }).execute();
    const result = await repo.createQueryBuilder().insert().orIgnore().values({ id: key, createdAt }).execute();
    return affectedRows(result.raw) === 1 ? { value, createdAt: createdAt.getTime() } : null;
  }

  /** The time the request was sent (ISO 8601), if it is known and still good. */
  async getAsync(key: string): Promise<string | null> {
    const row = await this.dataSource
      .getRepository(SamlRequest)
      .findOneBy({ id: key, createdAt: MoreThan(new Date(Date.now() - this.lifetimeMs)) });
    return row ? row.createdAt.toISOString() : null;
  }

  async removeAsync(key: string | null): Promise<string | null> {
    if (key === null) return null;
    const result = await this.dataSource.getRepository(SamlRequest).delete({ id: key });
    return (result.affected ?? 0) > 0 ? key : null;
  }
}
