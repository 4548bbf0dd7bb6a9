import fs from 'node:fs';
import path from 'node:path';
import { simpleParser } from 'mailparser';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { directorSummaryJob } from '@jobs/director-summary.job';
import type { Config } from '@server/config/env';
import { installDemoScenario } from '@server/demo/install-demo';
import { emlPath, startLocalSmtp, type LocalSmtp } from '@server/dev/local-smtp/local-smtp';
import { EmailMessage } from '@server/entities/email-message.entity';
import { createLogger } from '@server/lib/logger';
import { outcomeFigures } from '@server/mail/render-summary';
import { processRecomputeQueue } from '@server/services/recompute/run-recompute';
import type { CohortTrendDto, ResultsOverviewDto } from '@shared/api/results';
import { monthLabel } from '@shared/results/format-figures';
import { signIn, type SignedInAgent } from '../support/sign-in';
import { buildTestApp, type TestApp } from '../support/test-app';
import { createDemoDesign, testRecomputeDeps } from '../support/recompute';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

describe('director summary e-mail', { timeout: 240_000 }, () => {
  let db: TestDatabase;
  let smtp: LocalSmtp;
  let config: Config;
  let t: TestApp;
  let programId: number;
  let director: SignedInAgent;
  const mailDir = path.join(process.env.CUTLINE_VAR_DIR ?? 'var/test', `mail-${process.pid}-${Date.now()}`);
  // The director's subscription starts on 20 Oct 2026; the first working day of November 2026 is Monday the 2nd
  // (1 Nov is a Sunday), and 07:00 in Chicago that day (CST, UTC−6 after the 1 Nov change) is 13:00 UTC.
  const due = new Date('2026-11-02T13:00:00.000Z');
  const ctx = (now: Date) => ({ dataSource: db.dataSource, config, logger: createLogger('silent'), now: () => now });

  beforeAll(async () => {
    db = await createTestDatabase();
    smtp = await startLocalSmtp({ port: 0, mailDir });
    config = { ...db.config, mail: { ...db.config.mail, transport: { kind: 'local', port: smtp.port }, mailDir } };
    programId = (await installDemoScenario(db.dataSource, { config })).programId;
    await createDemoDesign(db, programId);
    await processRecomputeQueue(testRecomputeDeps(db));
    t = buildTestApp({ ...db, config });
    director = await signIn(t, { role: 'director', programId, displayName: 'Dana Director' });
    await directorSummaryJob.run(ctx(new Date('2026-10-20T09:00:00Z')));
  }, 300_000);
  afterAll(async () => {
    await smtp.close();
    fs.rmSync(mailDir, { recursive: true, force: true });
    await db.drop();
  });

  it('is not sent a minute early, is sent at 07:00 on the first working day, and once only', async () => {
    await directorSummaryJob.run(ctx(new Date(due.getTime() - 60_000)));
    expect(await db.dataSource.getRepository(EmailMessage).count()).toBe(0);
    await directorSummaryJob.run(ctx(due));
    await directorSummaryJob.run(ctx(new Date(due.getTime() + 60_000)));
    const sent = await db.dataSource.getRepository(EmailMessage).find();
    // Two directors: the demo scenario's and this test's; one message each.
    expect(sent.filter((m) => m.toAddress === director.me.user.email).map((m) => m.status)).toEqual(['sent']);
    expect(sent).toHaveLength(2);
  });

  it('arrives at the local SMTP server with the API’s subject, program name and figures, in HTML and plain text', async () => {
    const row = await db.dataSource.getRepository(EmailMessage).findOneBy({ toAddress: director.me.user.email });
    const file = emlPath(mailDir, row!.messageId);
    expect(fs.existsSync(file)).toBe(true);
    const mail = await simpleParser(fs.readFileSync(file), { keepCidLinks: true });
    const overview: ResultsOverviewDto = (await director.get(`/api/programs/${programId}/results`).expect(200)).body;
    expect(mail.messageId).toBe(row!.messageId);
    expect(mail.subject).toBe(`${overview.alerts.length > 0 ? 'Change alert — ' : ''}Cutline summary for ${monthLabel(overview.latestPeriod!)}: ${overview.programName}`);
    expect(mail.subject).toBe(row!.subject);
    const html = String(mail.html);
    const text = mail.text ?? '';
    expect(html).not.toMatch(/<script/i);
    for (const part of [html, text]) expect(part).toContain('Winter Heating Credit');
    for (const o of overview.outcomes) {
      const trend: CohortTrendDto = (await director.get(`/api/programs/${programId}/results/trend?outcome=${o.outcome.key}`).expect(200)).body;
      const f = outcomeFigures(o, trend.points.slice(-12));
      // The same numbers as the API's, formatted once (shared/results/format-figures.ts).
      const want = [f.label, f.takeUpJump, f.takeUpInterval, f.itt, f.effect, f.effectInterval, f.changeFromPrevious].filter((x): x is string => x !== null);
      expect(want.length).toBeGreaterThanOrEqual(6);
      for (const w of want) {
        expect(html, `HTML has ${w}`).toContain(escapeHtml(w));
        expect(text, `text has ${w}`).toContain(w);
      }
      expect(text).toContain(f.sparkline);
    }
    const images = mail.attachments.filter((a) => a.contentType === 'image/png');
    expect(images.length).toBe(overview.outcomes.length);
    expect(images[0]!.content.subarray(1, 4).toString('ascii')).toBe('PNG');
    expect(html).toContain(`cid:${images[0]!.cid}`);
  });

  it('shows in the admin Sent mail list with its local copy', async () => {
    const admin = await signIn(t, { role: 'admin' });
    const list = (await admin.get('/api/admin/mail').expect(200)).body;
    expect(list.items).toHaveLength(2);
    expect(list.items[0]).toMatchObject({ status: 'sent', hasLocalCopy: true, kind: 'director-summary' });
    const one = (await admin.get(`/api/admin/mail/${list.items[0].id}`).expect(200)).body;
    expect(one.raw).toContain(`Message-ID: ${list.items[0].messageId}`);
    expect(one.text).toContain('Read with care');
    await director.get('/api/admin/mail').expect(403);
  });

  it('sends nothing while paused', async () => {
    const current = (await director.get('/api/me/subscription').expect(200)).body;
    await director.put('/api/me/subscription').send({ paused: true, schedule: current.schedule, programIds: [], attachAnnex: false }).expect(200);
    await directorSummaryJob.run(ctx(new Date('2026-12-01T13:00:00Z')));
    expect(await db.dataSource.getRepository(EmailMessage).countBy({ toAddress: director.me.user.email })).toBe(1);
  });
});

function escapeHtml(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
}
