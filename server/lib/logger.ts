import pino, { type Logger } from 'pino';

/**
 * Structured logs without personal data: log ids, counts and codes, never names, e-mail
 * addresses, subject identifiers, raw rows or query strings. The redaction list is a backstop.
 */
export function createLogger(level: string, destination?: pino.DestinationStream): Logger {
  const options: pino.LoggerOptions = {
    level,
    base: { app: 'cutline' },
    redact: {
      paths: ['req.headers.cookie', 'req.headers.authorization', '*.email', '*.password', '*.nameId', '*.subjectId', '*.row'],
      censor: '[redacted]',
    },
  };
  return destination ? pino(options, destination) : pino(options);
}

export type { Logger };
