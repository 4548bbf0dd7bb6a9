import type { Config } from '../../config/env';
import { startLocalSmtp, type LocalSmtp } from './local-smtp';

/**
 * Starts the local fake SMTP server when mail is configured to go to it. When its port is taken
 * (the app already runs one, e.g. beside `npm run jobs`) the running one is used.
 * @returns the server, or null when mail goes to a real server or another process serves the port
 */
export async function startLocalMailIfConfigured(config: Config, say: (line: string) => void): Promise<LocalSmtp | null> {
  if (config.mail.transport.kind !== 'local') return null;
  try {
    const smtp = await startLocalSmtp({ port: config.mail.transport.port, mailDir: config.mail.mailDir });
    say(`Local mail server (keeps every message under ${config.mail.mailDir}): 127.0.0.1:${smtp.port}`);
    return smtp;
  } catch (err) {
    if ((err as { code?: string }).code === 'EADDRINUSE') return null;
    throw err;
  }
}
