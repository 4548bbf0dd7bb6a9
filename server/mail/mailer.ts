import { randomUUID } from 'node:crypto';
import nodemailer, { type Transporter } from 'nodemailer';
import type { Config } from '../config/env';

/** What is handed to the SMTP server. */
export interface OutgoingMail {
  to: string;
  subject: string;
  html: string;
  text: string;
  images: Array<{ cid: string; filename: string; content: Buffer }>;
  attachments?: Array<{ filename: string; content: Buffer; contentType: string }>;
}

const transports = new WeakMap<Config['mail'], Transporter>();

/** The SMTP transport of a configuration: the local fake server (plain, loopback) or the agency's. */
function transportOf(mail: Config['mail']): Transporter {
  let t = transports.get(mail);
  if (t) return t;
  const cfg = mail.transport;
  t =
    cfg.kind === 'local'
      ? nodemailer.createTransport({ host: '127.0.0.1', port: cfg.port, secure: false, ignoreTLS: true })
      : nodemailer.createTransport({
          host: cfg.host,
          port: cfg.port,
          secure: cfg.secure,
          // Without implicit TLS, STARTTLS is required when the server offers it (nodemailer's default is opportunistic).
          requireTLS: !cfg.secure,
          auth: cfg.user ? { user: cfg.user, pass: cfg.password ?? '' } : undefined,
        });
  transports.set(mail, t);
  return t;
}

/** A Message-ID under the app's host name, e.g. `<5f0c…@cutline.agency.example>`. */
export function newMessageId(publicUrl: string): string {
  return `<${randomUUID()}@${new URL(publicUrl).hostname || 'cutline.local'}>`;
}

/**
 * Sends one message with the given Message-ID (so the log and the mailbox agree).
 * @throws the transport's error when the server refuses or cannot be reached
 */
export async function sendMail(config: Config, messageId: string, mail: OutgoingMail): Promise<void> {
  await transportOf(config.mail).sendMail({
    from: config.mail.from,
    to: mail.to,
    subject: mail.subject,
    messageId,
    html: mail.html,
    text: mail.text,
    attachments: [
      ...mail.images.map((i) => ({ filename: i.filename, content: i.content, cid: i.cid, contentType: 'image/png', contentDisposition: 'inline' as const })),
      ...(mail.attachments ?? []),
    ],
  });
}
