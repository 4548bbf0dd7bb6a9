import type { DataSource } from 'typeorm';
import type { Config } from '../config/env';
import { EmailMessage } from '../entities/email-message.entity';
import { SummarySubscription } from '../entities/summary-subscription.entity';
import { User } from '../entities/user.entity';
import type { Logger } from '../lib/logger';
import { newMessageId, sendMail } from '../mail/mailer';
import { renderSummary } from '../mail/render-summary';
import { TREND_COHORTS, type ProgramSummary, type SummaryContent } from '../mail/summary-content';
import { annexAttachments } from './annex/annex-attachments';
import { recordAudit, SYSTEM_ACTOR } from './audit.service';
import { getCohortTrend, getResultsOverview } from './results.service';
import { directorPrograms } from './subscriptions.service';

export interface SummaryDeps {
  dataSource: DataSource;
  config: Config;
  logger: Logger;
}

/**
 * The content of one person's summary, from the same read services (and DTOs) the dashboards use,
 * so every figure in the e-mail is the API's figure for the same cohort.
 */
export async function buildSummaryContent(deps: SummaryDeps, sub: SummarySubscription): Promise<SummaryContent> {
  const ds = deps.dataSource;
  const user = await ds.getRepository(User).findOneByOrFail({ id: sub.userId });
  const granted = await directorPrograms(ds.manager, sub.userId);
  const chosen = sub.programIds.length > 0 ? granted.filter((p) => sub.programIds.includes(p.id)) : granted;
  const base = deps.config.app.publicUrl;
  const programs: ProgramSummary[] = [];
  for (const program of chosen) {
    const overview = await getResultsOverview(ds, program.id);
    const trends: ProgramSummary['trends'] = {};
    if (overview.design) {
      for (const o of overview.outcomes) trends[o.outcome.key] = (await getCohortTrend(ds, program.id, o.outcome.key)).points.slice(-TREND_COHORTS);
    }
    programs.push({ overview, trends, dashboardUrl: `${base}/programs/${program.id}` });
  }
  return { recipientName: user.displayName, programs, settingsUrl: `${base}/me/summary` };
}

/**
 * Renders and sends one person's summary and records it (e-mail log and audit trail), whether the
 * server took it or not. @returns the log row
 */
export async function sendSummary(deps: SummaryDeps, sub: SummarySubscription, now: Date): Promise<EmailMessage> {
  const ds = deps.dataSource;
  const user = await ds.getRepository(User).findOneByOrFail({ id: sub.userId });
  const content = await buildSummaryContent(deps, sub);
  const mail = renderSummary(content);
  const programIds = content.programs.map((p) => p.overview.programId);
  // The director opted in to the technical annex of each program (the workbook evaluators download).
  const annexes = sub.attachAnnex ? await annexAttachments(ds, programIds, user.displayName, now) : { attachments: [], programIds: [] };
  const messageId = newMessageId(deps.config.app.publicUrl);
  let error: string | null = null;
  try {
    await sendMail(deps.config, messageId, { to: user.email, subject: mail.subject, html: mail.html, text: mail.text, images: mail.images, attachments: annexes.attachments });
  } catch (err) {
    error = 'The mail server did not accept the message; it will be tried again at the next check.';
    deps.logger.warn({ subscriptionId: sub.id, code: (err as { code?: unknown }).code ?? null }, 'summary e-mail not sent');
  }
  return ds.transaction(async (tx) => {
    const row = await tx.getRepository(EmailMessage).save(
      tx.getRepository(EmailMessage).create({
        kind: 'director-summary',
        userId: user.id,
        subscriptionId: sub.id,
        toAddress: user.email,
        subject: mail.subject,
        messageId,
        status: error ? 'failed' : 'sent',
        error,
        programIds,
        html: mail.html,
        text: mail.text,
        sentAt: now,
      }),
    );
    if (!error) await tx.getRepository(SummarySubscription).update({ id: sub.id }, { lastSentAt: now });
    await recordAudit(tx, { actor: SYSTEM_ACTOR, action: 'email.send', subjectType: 'email', subjectId: row.id, details: { kind: 'director-summary', status: row.status, programs: programIds.length, userId: user.id, annexesAttached: annexes.programIds } });
    return row;
  });
}

/**
 * Sends every summary due at `now`, each at most once per slot even with several app instances:
 * a subscription's slot is claimed by a conditional update before sending. A message the server
 * refused gives its slot back, so the next check tries again.
 * @returns the log rows of the messages tried
 */
export async function sendDueSummaries(deps: SummaryDeps, now: Date, due: Array<{ sub: SummarySubscription; slot: Date }>, cap = 200): Promise<EmailMessage[]> {
  const repo = deps.dataSource.getRepository(SummarySubscription);
  const out: EmailMessage[] = [];
  for (const { sub, slot } of due.slice(0, cap)) {
    const claimed = await repo
      .createQueryBuilder()
      .update(SummarySubscription)
      .set({ lastDueAt: slot })
      .where('id = :id AND (last_due_at IS NULL OR last_due_at < :slot)', { id: sub.id, slot })
      .execute();
    if (claimed.affected !== 1) continue;
    const row = await sendSummary(deps, { ...sub, lastDueAt: slot }, now);
    if (row.status === 'failed') await repo.update({ id: sub.id, lastDueAt: slot }, { lastDueAt: sub.lastDueAt });
    out.push(row);
  }
  return out;
}
