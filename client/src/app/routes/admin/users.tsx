import { useNavigate } from 'react-router-dom';
import { PageHeader } from '@/components/ui/page-header';
import { AddPersonForm } from '@/features/admin/components/add-person-form';
import { UsersTable } from '@/features/admin/components/users-table';
import { AgencyAdminOnly } from '@/features/auth/components/agency-admin-only';

export default function AdminUsersRoute() {
  const navigate = useNavigate();
  return (
    <AgencyAdminOnly>
      <PageHeader title="People and roles" lead="Who may use Cutline, and what for. Roles apply to one program or to every program (agency-wide)." />
      <UsersTable />
      <div className="mt-10 max-w-3xl">
        <AddPersonForm onAdded={(id) => navigate(`/admin/users/${id}`)} />
      </div>
    </AgencyAdminOnly>
  );
}
