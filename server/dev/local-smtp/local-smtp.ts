import fs from 'node:fs';
import path from 'node:path';
import { SMTPServer } from 'smtp-server';

export interface LocalSmtp {
  port: number;
  /** Folder the messages are kept in, one `.eml` file each. */
  mailDir: string;
  close: () => Promise<void>;
}

/** Largest message accepted, bytes (a summary with an annex attached is far below). */
const MAX_MESSAGE_BYTES = 25 * 1024 * 1024;

/**
 * A fake SMTP server for development and tests: it accepts every message on 127.0.0.1 (no
 * authentication, no TLS: loopback only) and keeps it as `<Message-ID>.eml` in `mailDir`, where the
 * admin page *Sent mail* finds it. Port 0 picks a free port.
 */
export function startLocalSmtp(options: { port: number; mailDir: string }): Promise<LocalSmtp> {
  fs.mkdirSync(options.mailDir, { recursive: true });
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    size: MAX_MESSAGE_BYTES,
    banner: 'Cutline local mail (development only)',
    logger: false,
    onData(stream, _session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('error', callback);
      stream.on('end', () => {
        try {
          const raw = Buffer.concat(chunks);
          fs.writeFileSync(path.join(options.mailDir, emlFileName(raw)), raw);
          callback();
        } catch (err) {
          callback(err as Error);
        }
      });
    },
  });
  return new Promise((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port, '127.0.0.1', () => {
      const address = server.server.address();
      const port = typeof address === 'object' && address ? address.port : options.port;
      resolve({ port, mailDir: options.mailDir, close: () => new Promise<void>((done) => server.close(() => done())) });
    });
  });
}

/** File name of a message: its Message-ID made safe for a file system, or the time when it has none. */
export function emlFileName(raw: Buffer): string {
  const id = messageIdOf(raw);
  return `${id ? safeName(id) : `no-id-${Date.now()}`}.eml`;
}

/** The file a message with this Message-ID is kept in. */
export function emlPath(mailDir: string, messageId: string): string {
  return path.join(mailDir, `${safeName(messageId)}.eml`);
}

function safeName(messageId: string): string {
  return messageId.replace(/^<|>$/g, '').replace(/[^A-Za-z0-9._@-]/g, '_').slice(0, 180);
}

/** The Message-ID header of a raw message (headers end at the first empty line; folded lines joined). */
function messageIdOf(raw: Buffer): string | null {
  const text = raw.subarray(0, Math.min(raw.length, 64 * 1024)).toString('utf8');
  const end = text.search(/\r?\n\r?\n/);
  const headers = (end >= 0 ? text.slice(0, end) : text).replace(/\r?\n[ \t]+/g, ' ');
  const match = /^message-id:\s*(<[^>\r\n]+>)/im.exec(headers);
  return match ? match[1]! : null;
}
