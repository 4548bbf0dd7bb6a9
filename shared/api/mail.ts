import type { SubscriptionUpdateInput } from '../schemas/subscription';

/** `GET /api/me/subscription` — a director's summary e-mail settings. */
export interface SubscriptionDto extends SubscriptionUpdateInput {
  id: number;
  /** The next time the summary will be sent (ISO 8601), or null while paused. */
  nextDueAt: string | null;
  lastSentAt: string | null;
  /** The schedule in words, e.g. "07:00 on the first working day of each month (America/Chicago)". */
  scheduleText: string;
  /** Programs the director may choose from. */
  availablePrograms: Array<{ id: number; name: string }>;
}

export const EMAIL_KINDS = ['director-summary'] as const;
export type EmailKind = (typeof EMAIL_KINDS)[number];

/** A row of the e-mail log (`GET /api/admin/mail`). */
export interface EmailMessageDto {
  id: number;
  kind: EmailKind;
  to: string;
  subject: string;
  /** The Message-ID header, e.g. `<…@cutline.local>`. */
  messageId: string;
  status: 'sent' | 'failed';
  error: string | null;
  sentAt: string;
  programIds: number[];
  /** The local fake SMTP server kept a copy under var/mail/ (development and tests only). */
  hasLocalCopy: boolean;
}

/** `GET /api/admin/mail/:messageId` — one message as sent. */
export interface EmailMessageDetailDto extends EmailMessageDto {
  html: string;
  text: string;
  /** The raw message as the local SMTP server received it (.eml), or null. */
  raw: string | null;
}
