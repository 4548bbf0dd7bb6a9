import { IsNull } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { installDemoScenario } from '@server/demo/install-demo';
import { RoleGrant } from '@server/entities/role-grant.entity';
import { User } from '@server/entities/user.entity';
import type { UserDto } from '@shared/api/auth';
import { DEMO_PEOPLE } from '@shared/demo/people';
import { signIn, type SignedInAgent } from '../support/sign-in';
import { buildTestApp, type TestApp } from '../support/test-app';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

describe('people and role grants (admin API)', () => {
  let db: TestDatabase;
  let t: TestApp;
  let programId: number;
  let admin: SignedInAgent;
  beforeAll(async () => {
    db = await createTestDatabase();
    programId = (await installDemoScenario(db.dataSource)).programId;
    t = buildTestApp(db);
    admin = await signIn(t, { role: 'admin', displayName: 'Acting Admin' });
  });
  afterAll(async () => {
    await db.drop();
  });

  it('lists people with their grants, by name, paged and searchable', async () => {
    const all = await admin.get('/api/admin/users?pageSize=3').expect(200);
    expect(all.body).toMatchObject({ page: 1, pageSize: 3, total: DEMO_PEOPLE.length + 1 });
    expect(all.body.items).toHaveLength(3);
    const found = await admin.get('/api/admin/users').query({ q: 'rourke' }).expect(200);
    expect(found.body.items).toEqual([
      expect.objectContaining({
        displayName: 'Della Rourke',
        active: true,
        grants: [expect.objectContaining({ role: 'manager', programId, programName: 'Winter Heating Credit', source: 'admin' })],
      }),
    ]);
    expect((await admin.get('/api/admin/users').query({ q: '%' }).expect(200)).body.total).toBe(0);
  });

  it('adds a person ahead of their first sign-in, once', async () => {
    const res = await admin.post('/api/admin/users').send({ email: '  New.Person@Agency.Example ', displayName: 'New Person' }).expect(201);
    expect(res.body).toMatchObject({ email: 'new.person@agency.example', displayName: 'New Person', active: true, lastSignInAt: null, grants: [] });
    const again = await admin.post('/api/admin/users').send({ email: 'new.person@agency.example', displayName: 'Again' }).expect(409);
    expect(again.body.error.code).toBe('conflict');
    const bad = await admin.post('/api/admin/users').send({ email: 'not an address', displayName: '' }).expect(400);
    expect(bad.body.error.code).toBe('validation_failed');
  });

  it('grants and revokes roles, refusing duplicates and unknown programs', async () => {
    const person = (await admin.post('/api/admin/users').send({ email: 'grantee@agency.example', displayName: 'Grantee' }).expect(201)).body as UserDto;
    const grant = await admin.post(`/api/admin/users/${person.id}/grants`).send({ role: 'evaluator', programId }).expect(201);
    expect(grant.body).toMatchObject({ role: 'evaluator', programId, programName: 'Winter Heating Credit', source: 'admin' });
    await admin.post(`/api/admin/users/${person.id}/grants`).send({ role: 'evaluator', programId }).expect(409);
    const agencyWide = await admin.post(`/api/admin/users/${person.id}/grants`).send({ role: 'evaluator', programId: null }).expect(201);
    await admin.post(`/api/admin/users/${person.id}/grants`).send({ role: 'evaluator', programId: null }).expect(409);
    await admin.post(`/api/admin/users/${person.id}/grants`).send({ role: 'analyst', programId: 999999 }).expect(404);
    await admin.post('/api/admin/users/999999/grants').send({ role: 'analyst', programId }).expect(404);
    await admin.post(`/api/admin/users/${person.id}/grants`).send({ role: 'owner', programId }).expect(400);

    await admin.delete(`/api/admin/grants/${grant.body.id}`).expect(204);
    await admin.delete(`/api/admin/grants/${grant.body.id}`).expect(404);
    const after = (await admin.get(`/api/admin/users/${person.id}`).expect(200)).body as UserDto;
    expect(after.grants.map((g) => g.id)).toEqual([agencyWide.body.id]);
  });

  it('takes effect for the grantee at their next request', async () => {
    const grantee = await signIn(t, {});
    await grantee.get(`/api/programs/${programId}`).expect(403);
    const grant = await admin.post(`/api/admin/users/${grantee.me.user.id}/grants`).send({ role: 'director', programId }).expect(201);
    await grantee.get(`/api/programs/${programId}`).expect(200);
    await admin.delete(`/api/admin/grants/${grant.body.id}`).expect(204);
    await grantee.get(`/api/programs/${programId}`).expect(403);
  });

  it('keeps at least one agency-wide administrator', async () => {
    const repo = db.dataSource.getRepository(RoleGrant);
    const others = await repo.findBy({ role: 'admin', programId: IsNull() });
    // Leave only the acting admin as agency-wide admin.
    for (const g of others) if (g.userId !== admin.me.user.id) await repo.delete({ id: g.id });
    const own = await repo.findOneByOrFail({ userId: admin.me.user.id, role: 'admin' });
    const res = await admin.delete(`/api/admin/grants/${own.id}`).expect(409);
    expect(res.body.error.message).toMatch(/at least one agency-wide administrator/);
    await admin.patch(`/api/admin/users/${admin.me.user.id}`).send({ active: false }).expect(409);
  });

  it('switches accounts off and on, ending their sessions', async () => {
    const person = await signIn(t, { role: 'manager', programId });
    const off = await admin.patch(`/api/admin/users/${person.me.user.id}`).send({ active: false }).expect(200);
    expect(off.body.active).toBe(false);
    expect((await person.get('/api/me').expect(401)).body.error.code).toBe('session_expired');
    await admin.patch(`/api/admin/users/${person.me.user.id}`).send({ active: true }).expect(200);
    expect(await db.dataSource.getRepository(User).findOneByOrFail({ id: person.me.user.id })).toMatchObject({ active: true });
    await admin.patch(`/api/admin/users/${person.me.user.id}`).send({}).expect(400);
  });

  it('records every change in the audit trail, readable with filters and pages', async () => {
    const grants = await admin.get('/api/admin/audit').query({ action: 'grant.add', pageSize: 2 }).expect(200);
    expect(grants.body.total).toBe(3);
    expect(grants.body.items).toHaveLength(2);
    expect(grants.body.items[0]).toMatchObject({ action: 'grant.add', actorLabel: 'Acting Admin', actorUserId: admin.me.user.id, subjectType: 'user' });
    const times = grants.body.items.map((e: { occurredAt: string }) => e.occurredAt);
    expect([...times].sort().reverse()).toEqual(times);

    const signIns = await admin.get('/api/admin/audit').query({ action: 'auth.sign-in', actorUserId: admin.me.user.id }).expect(200);
    expect(signIns.body.total).toBe(1);
    const inProgram = await admin.get('/api/admin/audit').query({ programId }).expect(200);
    expect(inProgram.body.items.every((e: { programId: number }) => e.programId === programId)).toBe(true);
    const today = new Date().toISOString().slice(0, 10);
    expect((await admin.get('/api/admin/audit').query({ from: today, to: today }).expect(200)).body.total).toBeGreaterThan(0);
    expect((await admin.get('/api/admin/audit').query({ to: '2000-01-01' }).expect(200)).body.total).toBe(0);
    await admin.get('/api/admin/audit').query({ from: '2026-02-01', to: '2026-01-01' }).expect(400);
    await admin.get('/api/admin/audit').query({ action: 'no.such' }).expect(400);
    const switched = await admin.get('/api/admin/audit').query({ action: 'user.update' }).expect(200);
    expect(switched.body.items.map((e: { details: { change: string } }) => e.details.change)).toEqual(expect.arrayContaining(['added', 'switched-off', 'switched-on']));
  });
});
