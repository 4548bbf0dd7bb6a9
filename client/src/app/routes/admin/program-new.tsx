import { useNavigate } from 'react-router-dom';
import { PageHeader } from '@/components/ui/page-header';
import { AgencyAdminOnly } from '@/features/auth/components/agency-admin-only';
import { useSignedInUser } from '@/features/auth/me-context';
import { NewProgramForm } from '@/features/program-admin/components/new-program-form';

export default function AdminProgramNewRoute() {
  const navigate = useNavigate();
  const me = useSignedInUser();
  return (
    <AgencyAdminOnly>
      <PageHeader title="New program" lead="A program rations help by a score cutoff. Give it a name, how its score works, its first cutoff and what it should change." />
      <NewProgramForm defaultTimeZone={me.agency?.timeZone ?? 'UTC'} onCreated={(id) => navigate(`/admin/programs/${id}`)} />
    </AgencyAdminOnly>
  );
}
