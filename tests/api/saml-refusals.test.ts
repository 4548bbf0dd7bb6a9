import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEvent } from '@server/entities/audit-event.entity';
import { User } from '@server/entities/user.entity';
import type { AnswerDeviations, LocalIdentityProvider } from '@server/dev/local-idp/local-idp';
import { impostorIdentityProvider, testIdentityProvider } from '../support/local-idp';
import { postAnswer, startSignIn } from '../support/sign-in';
import { buildTestApp, type TestApp } from '../support/test-app';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

const PERSON = { email: 'refusal.probe@test.example', displayName: 'Refusal Probe', groups: [] };
const MINUTES = 60_000;

describe('SAML answers Cutline refuses', () => {
  let db: TestDatabase;
  let t: TestApp;
  beforeAll(async () => {
    db = await createTestDatabase();
    t = buildTestApp(db);
  });
  afterAll(async () => {
    await db.drop();
  });

  /** Runs one sign-in with a deviant answer; returns where the browser was sent and whether a session exists. */
  async function attempt(options: { deviations?: AnswerDeviations; idp?: LocalIdentityProvider; alter?: (xml: string) => string; app?: TestApp }) {
    const agent = request.agent((options.app ?? t).app);
    const pending = await startSignIn(agent);
    const answer = await (options.idp ?? testIdentityProvider()).answer(pending, PERSON, options.deviations);
    if (options.alter) answer.SAMLResponse = Buffer.from(options.alter(Buffer.from(answer.SAMLResponse, 'base64').toString('utf8'))).toString('base64');
    const res = await postAnswer(agent, answer);
    const me = await agent.get('/api/me');
    return { status: res.status, location: String(res.headers.location), signedIn: me.status === 200, answer, agent };
  }

  it('accepts an honest answer (the baseline for the cases below)', async () => {
    const result = await attempt({});
    expect(result).toMatchObject({ status: 303, location: '/', signedIn: true });
  });

  it.each([
    ['an unsigned answer', { deviations: { unsigned: true } }, 'signature_invalid'],
    ['an answer signed with another key', { idp: impostorIdentityProvider() }, 'signature_invalid'],
    ['an answer whose attribute was changed after signing', { alter: (xml: string) => xml.replace('Refusal Probe', 'Someone Else') }, 'signature_invalid'],
    ['an answer for another audience', { deviations: { audience: 'https://another-app.example/saml' } }, 'wrong_audience'],
    ['an expired answer', { deviations: { notBefore: new Date(Date.now() - 20 * MINUTES), notOnOrAfter: new Date(Date.now() - 10 * MINUTES) } }, 'expired'],
    ['an answer not valid yet', { deviations: { notBefore: new Date(Date.now() + 10 * MINUTES), notOnOrAfter: new Date(Date.now() + 20 * MINUTES) } }, 'not_yet_valid'],
    ['an answer from an unknown issuer', { deviations: { issuer: 'https://rogue-idp.example/' } }, 'wrong_issuer'],
  ] as const)('refuses %s with a clear reason and no session', async (_name, options, reason) => {
    const result = await attempt(options);
    expect(result).toMatchObject({ status: 303, location: `/sign-in?error=${reason}`, signedIn: false });
  });

  it('refuses an answer posted a second time', async () => {
    const first = await attempt({});
    expect(first.signedIn).toBe(true);
    const again = await postAnswer(request.agent(t.app), first.answer);
    expect(again.headers.location).toBe('/sign-in?error=replayed');
  });

  it('refuses a replay at another app instance sharing the database', async () => {
    const first = await attempt({});
    const otherInstance = buildTestApp(db);
    const again = await postAnswer(request.agent(otherInstance.app), first.answer);
    expect(again.headers.location).toBe('/sign-in?error=replayed');
  });

  it('refuses an assertion ID seen before even inside an answer to a fresh request', async () => {
    const first = await attempt({ deviations: { assertionId: '_reused-assertion-id' } });
    expect(first.signedIn).toBe(true);
    const second = await attempt({ deviations: { assertionId: '_reused-assertion-id' } });
    expect(second.location).toBe('/sign-in?error=replayed');
  });

  it('accepts an answer at another instance than the one that sent the request', async () => {
    const agent = request.agent(t.app);
    const pending = await startSignIn(agent);
    const answer = await testIdentityProvider().answer(pending, PERSON);
    const res = await postAnswer(request.agent(buildTestApp(db).app), answer);
    expect(res.headers.location).toBe('/');
  });

  it('refuses an answer without an e-mail address', async () => {
    const agent = request.agent(t.app);
    const pending = await startSignIn(agent);
    const answer = await testIdentityProvider().answer(pending, { email: 'not-an-address', displayName: 'No Mail', groups: [] });
    expect((await postAnswer(agent, answer)).headers.location).toBe('/sign-in?error=missing_email');
  });

  it('refuses a switched-off account', async () => {
    await attempt({});
    await db.dataSource.getRepository(User).update({ email: PERSON.email }, { active: false });
    const result = await attempt({});
    expect(result).toMatchObject({ location: '/sign-in?error=account_disabled', signedIn: false });
    await db.dataSource.getRepository(User).update({ email: PERSON.email }, { active: true });
  });

  it('refuses a callback without any answer, and an answer that is not XML', async () => {
    const agent = request.agent(t.app);
    expect((await agent.post('/auth/saml/callback').type('form').send({})).headers.location).toMatch(/^\/sign-in\?error=/);
    const junk = await agent.post('/auth/saml/callback').type('form').send({ SAMLResponse: Buffer.from('not xml').toString('base64') });
    expect(junk.headers.location).toMatch(/^\/sign-in\?error=/);
  });

  it('records each refusal in the audit trail with its reason only', async () => {
    const refused = await db.dataSource.getRepository(AuditEvent).findBy({ action: 'auth.sign-in-refused' });
    const reasons = new Set(refused.map((e) => e.details.reason));
    for (const reason of ['signature_invalid', 'wrong_audience', 'expired', 'not_yet_valid', 'replayed', 'wrong_issuer', 'missing_email', 'account_disabled']) {
      expect(reasons).toContain(reason);
    }
    expect(JSON.stringify(refused.map((e) => e.details))).not.toContain('@');
  });

  it('sends people back where they started, and never to another site', async () => {
    const agent = request.agent(t.app);
    const pending = await startSignIn(agent, '/programs/7?tab=trend');
    expect(pending.relayState).toBe('/programs/7?tab=trend');
    const answer = await testIdentityProvider().answer(pending, PERSON);
    expect((await postAnswer(agent, answer)).headers.location).toBe('/programs/7?tab=trend');
    const evil = await startSignIn(request.agent(t.app), 'https://elsewhere.example/');
    expect(evil.relayState).toBe('/');
    const forged = await testIdentityProvider().answer(await startSignIn(agent), PERSON);
    forged.RelayState = '//elsewhere.example/';
    expect((await postAnswer(request.agent(t.app), forged)).headers.location).toBe('/');
  });

  it('publishes service-provider metadata naming the callback', async () => {
    const res = await request(t.app).get('/auth/saml/metadata').expect(200);
    expect(res.type).toBe('application/samlmetadata+xml');
    expect(res.text).toContain(t.ctx.config.auth.callbackUrl);
    expect(res.text).toContain(`entityID="${t.ctx.config.auth.spEntityId}"`);
  });
});
