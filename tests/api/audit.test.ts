import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEvent } from '@server/entities/audit-event.entity';
import { recordAudit, SYSTEM_ACTOR } from '@server/services/audit.service';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

describe('recordAudit', () => {
  let db: TestDatabase;
  beforeAll(async () => {
    db = await createTestDatabase();
  });
  afterAll(async () => {
    await db.drop();
  });

  it('stores who, what and when, and rolls back with the change it belongs to', async () => {
    await recordAudit(db.dataSource.manager, { actor: SYSTEM_ACTOR, action: 'observations.purge', details: { rows: 12 } });
    await db.dataSource
      .transaction(async (tx) => {
        await recordAudit(tx, { actor: { userId: 7, label: 'Test User' }, action: 'extract.accept', programId: 1, subjectType: 'extract', subjectId: 3 });
        throw new Error('the change failed');
      })
      .catch(() => undefined);
    const rows = await db.dataSource.getRepository(AuditEvent).find();
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ actorUserId: null, actorLabel: 'system', action: 'observations.purge', details: { rows: 12 } });
    expect(rows[0]!.occurredAt).toBeInstanceOf(Date);
  });
});
