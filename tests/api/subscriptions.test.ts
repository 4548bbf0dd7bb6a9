import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { installDemoScenario } from '@server/demo/install-demo';
import { AuditEvent } from '@server/entities/audit-event.entity';
import { signIn, type SignedInAgent } from '../support/sign-in';
import { buildTestApp, type TestApp } from '../support/test-app';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

describe('director subscription API', () => {
  let db: TestDatabase;
  let t: TestApp;
  let programId: number;
  let director: SignedInAgent;
  beforeAll(async () => {
    db = await createTestDatabase();
    programId = (await installDemoScenario(db.dataSource)).programId;
    t = buildTestApp(db);
    director = await signIn(t, { role: 'director', programId });
  });
  afterAll(async () => {
    await db.drop();
  });

  it('subscribes a director by default: 07:00 on the first working day, in the program’s time zone', async () => {
    const res = await director.get('/api/me/subscription').expect(200);
    expect(res.body).toMatchObject({
      paused: false,
      schedule: { cadence: 'first-working-day', hour: 7, minute: 0, timeZone: 'America/Chicago' },
      programIds: [],
      attachAnnex: false,
      scheduleText: '07:00 on the first working day of each month (America/Chicago)',
      availablePrograms: [{ id: programId, name: 'Winter Heating Credit' }],
    });
    expect(res.body.nextDueAt).toMatch(/T1[23]:00:00\.000Z$/);
  });

  it('pauses and changes the schedule, recorded in the audit trail', async () => {
    const current = (await director.get('/api/me/subscription').expect(200)).body;
    const paused = await director
      .put('/api/me/subscription')
      .send({ paused: true, schedule: { ...current.schedule, cadence: 'weekly', weekday: 1, hour: 8 }, programIds: [programId], attachAnnex: false })
      .expect(200);
    expect(paused.body).toMatchObject({ paused: true, nextDueAt: null, programIds: [programId], scheduleText: '08:00 every Monday (America/Chicago)' });
    const audit = await db.dataSource.getRepository(AuditEvent).findBy({ action: 'subscription.update' });
    expect(audit).toHaveLength(1);
    expect(audit[0]!.details).toMatchObject({ paused: true, cadence: 'weekly' });
  });

  it('refuses programs the director is not granted and unknown time zones, in plain words', async () => {
    const current = (await director.get('/api/me/subscription').expect(200)).body;
    const outside = await director.put('/api/me/subscription').send({ ...pick(current), programIds: [999] }).expect(400);
    expect(outside.body.error.message).toBe('You can only choose programs you are a director of.');
    const zone = await director.put('/api/me/subscription').send({ ...pick(current), schedule: { ...current.schedule, timeZone: 'Mars/Olympus' } }).expect(400);
    expect(zone.body.error.code).toBe('validation_failed');
  });

  it('has no summary settings for people who are not directors', async () => {
    const manager = await signIn(t, { role: 'manager', programId });
    const res = await manager.get('/api/me/subscription').expect(404);
    expect(res.body.error.message).toMatch(/Only directors/);
  });
});

function pick(s: { paused: boolean; schedule: unknown; programIds: number[]; attachAnnex: boolean }) {
  return { paused: s.paused, schedule: s.schedule, programIds: s.programIds, attachAnnex: s.attachAnnex };
}
