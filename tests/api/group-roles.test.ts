import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { installDemoScenario } from '@server/demo/install-demo';
import type { MeDto } from '@shared/api/auth';
import { signIn, signInThroughIdp } from '../support/sign-in';
import { buildTestApp, type TestApp } from '../support/test-app';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

describe('roles from identity-provider groups, and the sign-in rate limit', () => {
  let db: TestDatabase;
  let t: TestApp;
  let programId: number;
  beforeAll(async () => {
    db = await createTestDatabase();
    programId = (await installDemoScenario(db.dataSource)).programId;
    const groupRoles = 'hv-research=analyst@winter-heating-credit; CN=Leaders,OU=Groups=director; hv-ghost=manager@no-such-program';
    t = buildTestApp(db, { config: { ...db.config, auth: { ...db.config.auth, groupRoles } } });
  });
  afterAll(async () => {
    await db.drop();
  });

  async function signInWithGroups(groups: string[]): Promise<MeDto> {
    const agent = request.agent(t.app);
    const res = await signInThroughIdp(agent, { email: 'grouped@test.example', displayName: 'Grouped Person', groups });
    expect(res.headers.location).toBe('/');
    return (await agent.get('/api/me').expect(200)).body as MeDto;
  }

  it('grants what the groups map to, and skips rules for unknown programs', async () => {
    const me = await signInWithGroups(['hv-staff', 'hv-research', 'CN=Leaders,OU=Groups', 'hv-ghost']);
    expect(me.grants.map((g) => [g.role, g.programId, g.source, g.group])).toEqual([
      ['analyst', programId, 'group', 'hv-research'],
      ['director', null, 'group', 'CN=Leaders,OU=Groups'],
    ]);
  });

  it('follows group changes at the next sign-in and leaves administrator grants alone', async () => {
    const admin = await signIn(t, { role: 'admin' });
    const me = await signInWithGroups(['hv-research']);
    await admin.post(`/api/admin/users/${me.user.id}/grants`).send({ role: 'evaluator', programId }).expect(201);
    const groupGrant = me.grants.find((g) => g.source === 'group')!;
    const refused = await admin.delete(`/api/admin/grants/${groupGrant.id}`).expect(409);
    expect(refused.body.error.message).toContain('hv-research');
    const later = await signInWithGroups([]);
    expect(later.grants.map((g) => [g.role, g.source])).toEqual([['evaluator', 'admin']]);
    const audit = await admin.get('/api/admin/audit').query({ action: 'grant.revoke', actorUserId: me.user.id }).expect(200);
    expect(audit.body.items[0].details).toMatchObject({ source: 'group', role: 'analyst' });
  });

  it('limits sign-in attempts per address and explains it', async () => {
    const limited = buildTestApp(db, { config: { ...db.config, auth: { ...db.config.auth, signInRateLimit: 3 } } });
    for (let i = 0; i < 3; i++) await request(limited.app).get('/auth/saml/login').expect(302);
    const over = await request(limited.app).get('/auth/saml/login').expect(303);
    expect(over.headers.location).toBe('/sign-in?error=rate_limited');
    const callback = await request(limited.app).post('/auth/saml/callback').type('form').send({ SAMLResponse: 'x' }).expect(303);
    expect(callback.headers.location).toBe('/sign-in?error=rate_limited');
  });
});
