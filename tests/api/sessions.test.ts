import { Writable } from 'node:stream';
import request from 'supertest';
import type TestAgent from 'supertest/lib/agent';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { installDemoScenario } from '@server/demo/install-demo';
import { TOUCH_INTERVAL_MS } from '@server/auth/session';
import { REUSE_READS_MS } from '@server/http/reused-reads';
import { HttpSession } from '@server/entities/http-session.entity';
import { Program } from '@server/entities/program.entity';
import { RoleGrant } from '@server/entities/role-grant.entity';
import { User } from '@server/entities/user.entity';
import { createLogger } from '@server/lib/logger';
import { signIn, signInThroughIdp } from '../support/sign-in';
import { buildTestApp, type TestApp } from '../support/test-app';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

/**
 * Runs `check` with the clock moved past the window in which a process reuses its reads of the
 * session and grants (the app runs in this process, so its clock can be moved). The tests below
 * change the database directly, as another instance or the jobs process would; changes made
 * through this app apply at once (`admin-users.test.ts`).
 */
async function afterReuseWindow(check: () => Promise<void>): Promise<void> {
  vi.useFakeTimers({ toFake: ['Date'], now: Date.now() + REUSE_READS_MS });
  try {
    await check();
  } finally {
    vi.useRealTimers();
  }
}

const sessionIdOf = (setCookie: string[] | string | undefined): string | null => {
  const line = [setCookie ?? []].flat().find((c) => c.startsWith('cutline.sid='));
  return line ? line.split(';')[0]!.slice('cutline.sid='.length).split('.')[0]! : null;
};

describe('sessions, CSRF and cross-program access', () => {
  let db: TestDatabase;
  let t: TestApp;
  let programA: number;
  let programB: number;
  const logLines: string[] = [];

  beforeAll(async () => {
    db = await createTestDatabase();
    programA = (await installDemoScenario(db.dataSource)).programId;
    const repo = db.dataSource.getRepository(Program);
    programB = (
      await repo.save(
        repo.create({ slug: 'other-program', name: 'Other Program', description: '', scoreLabel: 'Score', scoreUnit: 'points', scoreMin: 0, scoreMax: 1, eligibleSide: 'at-or-above', timeZone: 'UTC' }),
      )
    ).id;
    const sink = new Writable({ write: (chunk: Buffer, _enc, done) => void (logLines.push(chunk.toString()), done()) });
    t = buildTestApp(db, { logger: createLogger('info', sink) });
  });
  afterAll(async () => {
    await db.drop();
  });

  describe('session fixation', () => {
    it('gives a new session id at sign-in and voids the one the browser brought', async () => {
      // The attacker's own valid session cookie, planted in the victim's browser.
      const attacker = await signIn(t, { role: 'director', programId: programA });
      const victim = request.agent(t.app);
      const planted = attacker.jar.getCookie('cutline.sid', { domain: '127.0.0.1', path: '/', secure: false, script: false });
      expect(planted).toBeTruthy();
      victim.jar.setCookie(planted!.toString(), '127.0.0.1', '/');
      const res = await signInThroughIdp(victim, { email: 'victim@test.example', displayName: 'Victim', groups: [] });
      const fresh = sessionIdOf(res.headers['set-cookie']);
      expect(fresh).toBeTruthy();
      expect(fresh).not.toBe(planted!.value.split('.')[0]);
      expect((await victim.get('/api/me').expect(200)).body.user.email).toBe('victim@test.example');
      // The planted (attacker's) session was replaced, so it is signed in as nobody now.
      const after = await attacker.get('/api/me');
      expect(after.status).toBe(401);
    });

    it('gives a new session id when someone signs in again', async () => {
      const agent = request.agent(t.app);
      const person = { email: 'twice@test.example', displayName: 'Twice', groups: [] };
      const first = sessionIdOf((await signInThroughIdp(agent, person)).headers['set-cookie']);
      const second = sessionIdOf((await signInThroughIdp(agent, person)).headers['set-cookie']);
      expect(first && second && first !== second).toBe(true);
      expect(await db.dataSource.getRepository(HttpSession).existsBy({ sessionId: first! })).toBe(false);
    });
  });

  describe('cookies and timeouts', () => {
    it('sets an HttpOnly, SameSite=Lax session cookie, Secure behind https', async () => {
      const plain = await signInThroughIdp(request.agent(t.app), { email: 'cookie@test.example', displayName: 'Cookie', groups: [] });
      const cookie = [plain.headers['set-cookie']].flat().find((c) => c?.startsWith('cutline.sid='))!;
      expect(cookie).toMatch(/HttpOnly/);
      expect(cookie).toMatch(/SameSite=Lax/);
      expect(cookie).not.toMatch(/Secure/);
      // A browser-session cookie, set at sign-in only: the idle timeout is the stored expiry's.
      expect(cookie).not.toMatch(/Max-Age|Expires/i);
      const sessionId = sessionIdOf(cookie)!;
      const stored = await db.dataSource.getRepository(HttpSession).findOneByOrFail({ sessionId });
      expect(Math.abs(stored.expires - (Date.now() / 1000 + db.config.auth.session.idleMinutes * 60))).toBeLessThan(30);
      const again = await request(t.app).get('/api/me').set('Cookie', cookie.split(';')[0]!).expect(200);
      expect(again.headers['set-cookie']).toBeUndefined();
      const https = buildTestApp(db, { config: { ...db.config, auth: { ...db.config.auth, session: { ...db.config.auth.session, cookieSecure: true } } } });
      const agent = request.agent(https.app);
      const login = await agent.get('/auth/saml/login').set('X-Forwarded-Proto', 'https');
      const url = new URL(String(login.headers.location));
      const { testIdentityProvider } = await import('../support/local-idp');
      const pending = testIdentityProvider().readRequest({ SAMLRequest: url.searchParams.get('SAMLRequest') ?? '' });
      const answer = await testIdentityProvider().answer(pending, { email: 'secure@test.example', displayName: 'Secure', groups: [] });
      const res = await agent.post('/auth/saml/callback').set('X-Forwarded-Proto', 'https').type('form').send({ SAMLResponse: answer.SAMLResponse });
      expect([res.headers['set-cookie']].flat().find((c) => c?.startsWith('cutline.sid='))).toMatch(/; Secure/);
    });

    it('ends a session after the idle timeout and says so', async () => {
      const agent = await signIn(t, { role: 'manager', programId: programA });
      const sessionId = await currentSessionId(agent);
      await db.dataSource.getRepository(HttpSession).update({ sessionId }, { expires: Math.floor(Date.now() / 1000) - 5 });
      await afterReuseWindow(async () => {
        const res = await agent.get('/api/me').expect(401);
        expect(res.body.error.code).toBe('session_expired');
      });
    });

    it('renews the stored idle expiry on use, writing it at most once a minute per session', async () => {
      const agent = await signIn(t, { role: 'manager', programId: programA });
      const sessionId = await currentSessionId(agent);
      const sessions = db.dataSource.getRepository(HttpSession);
      const soon = Math.floor(Date.now() / 1000) + 100;
      // Signing in used the session a moment ago, so this request does not write the expiry again.
      await sessions.update({ sessionId }, { expires: soon });
      await agent.get('/api/me').expect(200);
      expect((await sessions.findOneByOrFail({ sessionId })).expires).toBe(soon);
      // A minute later (the app runs in this process, so its clock can be moved) it does.
      vi.useFakeTimers({ toFake: ['Date'], now: Date.now() + TOUCH_INTERVAL_MS + 1000 });
      try {
        await agent.get('/api/me').expect(200);
        expect((await sessions.findOneByOrFail({ sessionId })).expires).toBeGreaterThan(soon + 60);
      } finally {
        vi.useRealTimers();
      }
    });

    it('ends a session at the absolute timeout even while it is in use', async () => {
      const agent = await signIn(t, { role: 'manager', programId: programA });
      const sessionId = await currentSessionId(agent);
      const row = await db.dataSource.getRepository(HttpSession).findOneByOrFail({ sessionId });
      const data = JSON.parse(row.data!);
      data.signedInAt = Date.now() - (db.config.auth.session.absoluteHours * 3_600_000 + 60_000);
      await db.dataSource.getRepository(HttpSession).update({ sessionId }, { data: JSON.stringify(data) });
      await afterReuseWindow(async () => {
        expect((await agent.get('/api/programs').expect(401)).body.error.code).toBe('session_expired');
        expect((await agent.get('/api/me').expect(401)).body.error.code).toBe('session_expired');
      });
    });

    it('ends the sessions of an account switched off elsewhere within a second', async () => {
      const agent = await signIn(t, { role: 'analyst', programId: programA });
      await db.dataSource.getRepository(User).update({ id: agent.me.user.id }, { active: false });
      await afterReuseWindow(async () => {
        expect((await agent.get('/api/me').expect(401)).body.error.code).toBe('session_expired');
      });
    });

    it('applies a grant revoked elsewhere within a second, and one revoked through this process at once', async () => {
      const agent = await signIn(t, { role: 'analyst', programId: programA });
      await agent.get(`/api/programs/${programA}`).expect(200);
      await db.dataSource.getRepository(RoleGrant).delete({ userId: agent.me.user.id });
      await afterReuseWindow(() => agent.get(`/api/programs/${programA}`).expect(403).then(() => undefined));

      const other = await signIn(t, { role: 'analyst', programId: programA });
      await other.get(`/api/programs/${programA}`).expect(200);
      await db.dataSource.getRepository(RoleGrant).delete({ userId: other.me.user.id });
      // Any state-changing request through this process forgets the reused reads.
      await other.post('/api/me/nothing-here').expect(404);
      await other.get(`/api/programs/${programA}`).expect(403);
    });

    it('turns away a real session id under a wrong signature, and counts a damaged stored session as ended', async () => {
      const agent = await signIn(t, { role: 'manager', programId: programA });
      const sessionId = await currentSessionId(agent);
      const forged = await request(t.app).get('/api/me').set('Cookie', `cutline.sid=${sessionId}.${'A'.repeat(43)}`).expect(401);
      expect(forged.body.error.code).toBe('session_expired');
      await agent.get('/api/me').expect(200);
      await db.dataSource.getRepository(HttpSession).update({ sessionId }, { data: '{not json' });
      await afterReuseWindow(async () => {
        expect((await agent.get('/api/me').expect(401)).body.error.code).toBe('session_expired');
      });
    });

    it('tells a request without any session to sign in', async () => {
      const res = await request(t.app).get('/api/me').expect(401);
      expect(res.body.error).toEqual({ code: 'unauthenticated', message: 'Please sign in first.' });
    });
  });

  describe('signing out', () => {
    it('needs the CSRF token, then ends the session and clears the cookie', async () => {
      const agent = await signIn(t, { role: 'director', programId: programA });
      const sessionId = await currentSessionId(agent);
      const forged = await request.agent(t.app).post('/auth/logout').type('form').send({});
      expect(forged.headers.location).toBe('/sign-in?signedOut=1');
      const noToken = await agent.post('/auth/logout').unset('X-CSRF-Token').type('form').send({});
      expect(noToken.status).toBe(403);
      await agent.get('/api/me').expect(200);
      const res = await agent.post('/auth/logout').unset('X-CSRF-Token').type('form').send({ _csrf: agent.me.csrfToken }).expect(303);
      expect(res.headers.location).toBe('/sign-in?signedOut=1');
      expect(res.headers['set-cookie']).toEqual([expect.stringMatching(/^cutline\.sid=;.*Expires=Thu, 01 Jan 1970/)]);
      expect(await db.dataSource.getRepository(HttpSession).existsBy({ sessionId })).toBe(false);
      expect((await agent.get('/api/me').expect(401)).body.error.code).toBe('unauthenticated');
    });
  });

  describe('CSRF on state-changing API requests', () => {
    const body = () => ({ email: `csrf-${Math.random().toString(36).slice(2)}@test.example`, displayName: 'CSRF probe' });

    it('refuses a request without the token, with a wrong one, or with another session’s', async () => {
      const admin = await signIn(t, { role: 'admin', csrf: false });
      const other = await signIn(t, { role: 'admin' });
      const missing = await admin.post('/api/admin/users').send(body()).expect(403);
      expect(missing.body.error.code).toBe('csrf_invalid');
      await admin.post('/api/admin/users').set('X-CSRF-Token', 'not-the-token').send(body()).expect(403);
      await admin.post('/api/admin/users').set('X-CSRF-Token', other.me.csrfToken).send(body()).expect(403);
      await admin.post('/api/admin/users').set('X-CSRF-Token', admin.me.csrfToken).send(body()).expect(201);
    });

    it('lets reads through without a token', async () => {
      const admin = await signIn(t, { role: 'admin', csrf: false });
      await admin.get('/api/admin/users').expect(200);
    });
  });

  describe('cross-program access (IDOR)', () => {
    it('keeps a program grant inside its program', async () => {
      const manager = await signIn(t, { role: 'manager', programId: programA });
      await manager.get(`/api/programs/${programA}`).expect(200);
      const res = await manager.get(`/api/programs/${programB}`).expect(403);
      expect(res.body.error.code).toBe('forbidden');
      const list = await manager.get('/api/programs').expect(200);
      expect(list.body.items.map((p: { id: number }) => p.id)).toEqual([programA]);
    });

    it('does not let a program administrator act agency-wide', async () => {
      const programAdmin = await signIn(t, { role: 'admin', programId: programA });
      await programAdmin.get('/api/admin/users').expect(403);
      await programAdmin.post(`/api/admin/users/${programAdmin.me.user.id}/grants`).send({ role: 'admin', programId: null }).expect(403);
    });

    it('lets an agency-wide grant reach every program', async () => {
      const director = await signIn(t, { role: 'director' });
      await director.get(`/api/programs/${programB}`).expect(200);
      expect((await director.get('/api/programs').expect(200)).body.total).toBe(2);
    });
  });

  it('sends security headers', async () => {
    const res = await request(t.app).get('/api/health');
    expect(res.headers['content-security-policy']).toContain("form-action 'self' http://127.0.0.1:");
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['x-frame-options']).toBe('SAMEORIGIN');
  });

  it('writes no e-mail addresses or names to the logs', async () => {
    await signInThroughIdp(request.agent(t.app), { email: 'refused@test.example', displayName: 'Refused', groups: [] }, { deviations: { unsigned: true } });
    const text = logLines.join('');
    expect(text).toContain('signed in');
    expect(text).toContain('sign-in refused');
    expect(text).not.toMatch(/@test\.example|Victim|Twice|Refused/);
  });

  async function currentSessionId(agent: TestAgent): Promise<string> {
    const cookie = agent.jar.getCookie('cutline.sid', { domain: '127.0.0.1', path: '/', secure: false, script: false });
    return cookie!.value.split('.')[0]!;
  }
});
