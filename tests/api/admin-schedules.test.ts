import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { installDemoScenario } from '@server/demo/install-demo';
import { AuditEvent } from '@server/entities/audit-event.entity';
import type { SchedulesDto } from '@shared/api/schedules';
import { demoPersonFor } from '@shared/demo/people';
import { signIn } from '../support/sign-in';
import { buildTestApp, type TestApp } from '../support/test-app';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

describe('schedules for administrators', () => {
  let db: TestDatabase;
  let t: TestApp;
  beforeAll(async () => {
    db = await createTestDatabase();
    await installDemoScenario(db.dataSource);
    t = buildTestApp(db);
  });
  afterAll(async () => {
    await db.drop();
  });

  it('lists the demo director’s summary with its next send, and pauses and resumes it (audited)', async () => {
    const admin = await signIn(t, { role: 'admin' });
    const list: SchedulesDto = (await admin.get('/api/admin/schedules').expect(200)).body;
    const row = list.summaries.find((s) => s.person === demoPersonFor('director').displayName)!;
    // Default schedule (shared/schemas/subscription.ts): 07:00 on the first working day, in the program's zone.
    expect(row).toMatchObject({ paused: false, active: true, programs: [] });
    expect(row.scheduleText).toContain('first working day');
    expect(Date.parse(row.nextDueAt!)).toBeGreaterThan(Date.now());
    const paused: SchedulesDto = (await admin.patch(`/api/admin/schedules/${row.subscriptionId}`).send({ paused: true }).expect(200)).body;
    expect(paused.summaries.find((s) => s.subscriptionId === row.subscriptionId)).toMatchObject({ paused: true, nextDueAt: null });
    await admin.patch(`/api/admin/schedules/${row.subscriptionId}`).send({ paused: false }).expect(200);
    expect(await db.dataSource.getRepository(AuditEvent).countBy({ action: 'subscription.update', subjectId: String(row.subscriptionId) })).toBe(2);
    await admin.patch('/api/admin/schedules/999999').send({ paused: true }).expect(404);
  });

  it('is for agency-wide administrators only', async () => {
    const director = await signIn(t, { role: 'director' });
    await director.get('/api/admin/schedules').expect(403);
  });
});
