import { Link, useParams } from 'react-router-dom';
import { Empty } from '@/components/ui/states';
import { UserDetail } from '@/features/admin/components/user-detail';
import { AgencyAdminOnly } from '@/features/auth/components/agency-admin-only';
import { useSignedInUser } from '@/features/auth/me-context';

export default function AdminUserRoute() {
  const userId = Number(useParams().userId);
  const me = useSignedInUser();
  return (
    <AgencyAdminOnly>
      <p className="mb-4 text-sm">
        <Link to="/admin/users" className="text-accent-700 underline-offset-4 hover:underline">
          ← People and roles
        </Link>
      </p>
      {Number.isSafeInteger(userId) && userId > 0 ? <UserDetail userId={userId} currentUserId={me.user.id} /> : <Empty title="This address names nobody">Go back to the list of people.</Empty>}
    </AgencyAdminOnly>
  );
}
