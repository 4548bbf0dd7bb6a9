import { z } from 'zod';

/** Everything the audit trail records. Append new actions; never rename one already recorded. */
export const AUDIT_ACTIONS = [
  'auth.sign-in',
  'auth.sign-out',
  'auth.sign-in-refused',
  'grant.add',
  'grant.revoke',
  'user.update',
  'program.create',
  'program.update',
  'extract.upload',
  'extract.accept',
  'extract.reject',
  'extract.supersede',
  'extract.restore',
  'observations.purge',
  'mapping.save',
  'design.create',
  'design.version',
  'design.lock',
  'design.deviation',
  'run.trigger',
  'caveat.acknowledge',
  'annex.download',
  'export.download',
  'email.send',
  'subscription.update',
] as const;
export const AuditActionSchema = z.enum(AUDIT_ACTIONS);
export type AuditAction = z.infer<typeof AuditActionSchema>;
