import { PageHeader } from '@/components/ui/page-header';
import { AuditTable } from '@/features/admin/components/audit-table';
import { AgencyAdminOnly } from '@/features/auth/components/agency-admin-only';

export default function AdminAuditRoute() {
  return (
    <AgencyAdminOnly>
      <PageHeader title="Audit trail" lead="Who did what, and when: sign-ins, roles, uploads, decisions on extracts, design changes, downloads and e-mails. Newest first." />
      <AuditTable />
    </AgencyAdminOnly>
  );
}
