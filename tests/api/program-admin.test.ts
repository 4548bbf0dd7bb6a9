import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { installDemoScenario } from '@server/demo/install-demo';
import { AuditEvent } from '@server/entities/audit-event.entity';
import { RecomputeRun } from '@server/entities/recompute-run.entity';
import type { ProgramDetailDto } from '@shared/api/programs';
import { DEMO_PROGRAM } from '@shared/demo/heating-credit';
import { installDemoResults } from '../support/demo-results';
import { signIn } from '../support/sign-in';
import { buildTestApp, type TestApp } from '../support/test-app';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

describe('program administration', () => {
  let db: TestDatabase;
  let t: TestApp;
  let programId: number;
  beforeAll(async () => {
    db = await createTestDatabase();
    programId = (await installDemoScenario(db.dataSource)).programId;
    await installDemoResults(db.dataSource, programId);
    t = buildTestApp(db);
  });
  afterAll(async () => {
    await db.drop();
  });

  const NEW = {
    program: { ...DEMO_PROGRAM, slug: 'summer-tutoring', name: 'Summer Tutoring', eligibleSide: 'at-or-below', populationLabel: 'pupils', takeUpPhrase: 'join the tutoring' },
    cutoffSchedule: [{ cutoff: 40, firstPeriod: '2026-01' }],
    covariates: [],
    outcomes: [{ key: 'reading_score', label: 'Reading score', unit: 'points', kind: 'continuous', goodDirection: 'higher' }],
  };

  it('an agency-wide administrator creates a program; it is audited and listed', async () => {
    const admin = await signIn(t, { role: 'admin' });
    const created: ProgramDetailDto = (await admin.post('/api/admin/programs').send(NEW).expect(201)).body;
    expect(created).toMatchObject({ slug: 'summer-tutoring', populationLabel: 'pupils', takeUpPhrase: 'join the tutoring', currentCutoff: 40, covariates: [] });
    expect(created.outcomes.map((o) => o.key)).toEqual(['reading_score']);
    expect((await admin.post('/api/admin/programs').send(NEW).expect(409)).body.error.code).toBe('conflict');
    expect(await db.dataSource.getRepository(AuditEvent).countBy({ action: 'program.create', programId: created.id })).toBe(1);
    const list = (await admin.get('/api/programs').expect(200)).body;
    expect(list.items.map((p: { slug: string }) => p.slug)).toContain('summer-tutoring');
  });

  it('a program administrator edits details and the cutoff schedule; the schedule queues a recompute and shows in results', async () => {
    const admin = await signIn(t, { role: 'admin', programId });
    const detail: ProgramDetailDto = (await admin.get(`/api/programs/${programId}`).expect(200)).body;
    expect(detail.populationLabel).toBe('households');
    const { slug, name, description, scoreLabel, scoreUnit, scoreMin, scoreMax, eligibleSide, timeZone } = detail;
    const edited: ProgramDetailDto = (await admin.put(`/api/programs/${programId}`).send({ slug, name, description, scoreLabel, scoreUnit, scoreMin, scoreMax, eligibleSide, timeZone, populationLabel: 'households', takeUpPhrase: 'claim the credit' }).expect(200)).body;
    expect(edited.takeUpPhrase).toBe('claim the credit');
    // Nothing queued before (a queued run would be joined rather than a new one added).
    await db.dataSource.getRepository(RecomputeRun).update({ programId, status: 'queued' }, { status: 'succeeded', queuedProgramId: null });
    const schedule = [...detail.cutoffSchedule.map((c) => ({ cutoff: c.cutoff, firstPeriod: c.firstPeriod })), { cutoff: 57, firstPeriod: '2027-01' }];
    const after: ProgramDetailDto = (await admin.put(`/api/programs/${programId}/cutoff-schedule`).send({ changes: schedule }).expect(200)).body;
    expect(after.cutoffSchedule.map((c) => c.cutoff)).toEqual([60, 58, 57]);
    expect(await db.dataSource.getRepository(RecomputeRun).countBy({ programId, status: 'queued' })).toBe(1);
    expect((await admin.put(`/api/programs/${programId}/cutoff-schedule`).send({ changes: [{ cutoff: 1, firstPeriod: '2025-01' }, { cutoff: 2, firstPeriod: '2025-01' }] }).expect(400)).body.error.code).toBe('validation_failed');
    const events = await db.dataSource.getRepository(AuditEvent).findBy({ action: 'program.update', programId });
    expect(events.map((e) => e.details.part).sort()).toEqual(['cutoff-schedule', 'details']);
    const results = (await admin.get(`/api/programs/${programId}/results`).expect(200)).body;
    expect(results.programName).toBe(name);
  });

  it('refuses to drop an outcome or covariate a design still uses, and takes new ones', async () => {
    const admin = await signIn(t, { role: 'admin', programId });
    const detail: ProgramDetailDto = (await admin.get(`/api/programs/${programId}`).expect(200)).body;
    const outcomes = detail.outcomes.map(({ key, label, unit, kind, goodDirection }) => ({ key, label, unit, kind, goodDirection }));
    const refused = (await admin.put(`/api/programs/${programId}/outcomes`).send({ outcomes: outcomes.slice(0, 1) }).expect(409)).body;
    expect(refused.error.message).toContain('arrears_months');
    const more = [...outcomes, { key: 'moved_home', label: 'Moved home within 6 months', unit: 'share', kind: 'binary', goodDirection: 'lower' }];
    const saved: ProgramDetailDto = (await admin.put(`/api/programs/${programId}/outcomes`).send({ outcomes: more }).expect(200)).body;
    expect(saved.outcomes.map((o) => o.key)).toEqual(['shutoff_6m', 'arrears_months', 'moved_home']);
    expect((await admin.put(`/api/programs/${programId}/covariates`).send({ covariates: [] }).expect(409)).body.error.code).toBe('conflict');
  });

  it('is closed to other roles', async () => {
    const manager = await signIn(t, { role: 'manager', programId });
    await manager.post('/api/admin/programs').send(NEW).expect(403);
    await manager.put(`/api/programs/${programId}/cutoff-schedule`).send({ changes: [{ cutoff: 1, firstPeriod: '2025-01' }] }).expect(403);
    const programAdmin = await signIn(t, { role: 'admin', programId });
    await programAdmin.post('/api/admin/programs').send({ ...NEW, program: { ...NEW.program, slug: 'other' } }).expect(403);
  });
});
