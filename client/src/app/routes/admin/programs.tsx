import { Link } from 'react-router-dom';
import { PageHeader } from '@/components/ui/page-header';
import { buttonPrimary } from '@/components/ui/styles';
import { AgencyAdminOnly } from '@/features/auth/components/agency-admin-only';
import { ProgramAdminList } from '@/features/program-admin/components/program-admin-list';

export default function AdminProgramsRoute() {
  return (
    <AgencyAdminOnly>
      <PageHeader
        title="Program settings"
        lead="Each program’s details, cutoff schedule, outcomes and covariates."
        actions={
          <Link to="/admin/programs/new" className={buttonPrimary}>
            New program
          </Link>
        }
      />
      <ProgramAdminList />
    </AgencyAdminOnly>
  );
}
