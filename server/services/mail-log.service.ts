import fs from 'node:fs';
import type { DataSource } from 'typeorm';
import type { EmailMessageDetailDto, EmailMessageDto } from '@shared/api/mail';
import type { ListDto } from '@shared/api/programs';
import type { PageQuery } from '@shared/schemas/paging';
import type { Config } from '../config/env';
import { emlPath } from '../dev/local-smtp/local-smtp';
import { EmailMessage } from '../entities/email-message.entity';
import { notFound } from '../lib/errors';

/** The e-mail log, newest first, with whether the local fake SMTP server kept a copy. */
export async function listSentMail(ds: DataSource, config: Config, page: PageQuery): Promise<ListDto<EmailMessageDto>> {
  const [rows, total] = await ds.getRepository(EmailMessage).findAndCount({
    order: { sentAt: 'DESC', id: 'DESC' },
    skip: (page.page - 1) * page.pageSize,
    take: page.pageSize,
    select: { id: true, kind: true, toAddress: true, subject: true, messageId: true, status: true, error: true, sentAt: true, programIds: true },
  });
  return { items: rows.map((r) => toDto(r, config)), total, page: page.page, pageSize: page.pageSize };
}

/** One message as sent, with the raw `.eml` when the local server kept it. */
export async function getSentMail(ds: DataSource, config: Config, id: number): Promise<EmailMessageDetailDto> {
  const row = await ds.getRepository(EmailMessage).findOneBy({ id });
  if (!row) throw notFound('Message');
  const file = emlPath(config.mail.mailDir, row.messageId);
  return { ...toDto(row, config), html: row.html, text: row.text, raw: fs.existsSync(file) ? fs.readFileSync(file, 'utf8') : null };
}

function toDto(r: EmailMessage, config: Config): EmailMessageDto {
  return {
    id: r.id,
    kind: r.kind,
    to: r.toAddress,
    subject: r.subject,
    messageId: r.messageId,
    status: r.status,
    error: r.error,
    sentAt: r.sentAt.toISOString(),
    programIds: r.programIds,
    hasLocalCopy: config.mail.transport.kind === 'local' && fs.existsSync(emlPath(config.mail.mailDir, r.messageId)),
  };
}
