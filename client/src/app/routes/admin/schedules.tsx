import { PageHeader } from '@/components/ui/page-header';
import { AgencyAdminOnly } from '@/features/auth/components/agency-admin-only';
import { SchedulesPage } from '@/features/schedules/components/schedules-page';

export default function AdminSchedulesRoute() {
  return (
    <AgencyAdminOnly>
      <PageHeader title="Schedules" lead="What Cutline does by itself, and when." />
      <SchedulesPage />
    </AgencyAdminOnly>
  );
}
