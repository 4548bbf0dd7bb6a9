import type { AuditAction } from '@shared/schemas/audit';

/** How each audit action reads on screen. */
export const AUDIT_ACTION_LABELS: Record<AuditAction, string> = {
  'auth.sign-in': 'Signed in',
  'auth.sign-out': 'Signed out',
  'auth.sign-in-refused': 'Sign-in refused',
  'grant.add': 'Role granted',
  'grant.revoke': 'Role revoked',
  'user.update': 'Account changed',
  'program.create': 'Program added',
  'program.update': 'Program changed',
  'extract.upload': 'Extract uploaded',
  'extract.accept': 'Extract accepted',
  'extract.reject': 'Extract rejected',
  'extract.supersede': 'Extract superseded',
  'extract.restore': 'Extract restored',
  'observations.purge': 'Observations purged',
  'mapping.save': 'Column mapping saved',
  'design.create': 'Design created',
  'design.version': 'Design changed',
  'design.lock': 'Design locked',
  'design.deviation': 'Deviation from design recorded',
  'run.trigger': 'Recompute started',
  'caveat.acknowledge': 'Caveat acknowledged',
  'annex.download': 'Annex downloaded',
  'export.download': 'Data downloaded',
  'email.send': 'E-mail sent',
  'subscription.update': 'Subscription changed',
};

/** Details as short "key: value" pairs (ids, counts, reasons; never personal data). */
export function describeDetails(details: Record<string, unknown>): string {
  return Object.entries(details)
    .map(([k, v]) => `${k}: ${typeof v === 'object' ? JSON.stringify(v) : String(v)}`)
    .join(' · ');
}
