import { createColumnHelper } from '@tanstack/react-table';
import type { GrantDto, UserDto } from '@shared/api/auth';
import { DataTable } from '@/components/ui/data-table';
import { PageHeader } from '@/components/ui/page-header';
import { Empty, ErrorState, Loading } from '@/components/ui/states';
import { buttonDanger, buttonSecondary, fieldError } from '@/components/ui/styles';
import { ROLE_LABELS } from '@/lib/roles';
import { formatDateTime } from '@/lib/format';
import { useRevokeGrant, useSetUserActive, useUser } from '../api/users';
import { GrantForm } from './grant-form';

/** One person: account state, roles (revoke) and a form to grant more. `currentUserId` is the administrator looking. */
export function UserDetail({ userId, currentUserId }: { userId: number; currentUserId: number }) {
  const user = useUser(userId);
  if (user.isPending) return <Loading label="Loading this person…" />;
  if (user.isError) return <ErrorState error={user.error} onRetry={() => void user.refetch()} />;
  return <UserDetailLoaded user={user.data} currentUserId={currentUserId} />;
}

function UserDetailLoaded({ user, currentUserId }: { user: UserDto; currentUserId: number }) {
  const setActive = useSetUserActive(user.id);
  const revoke = useRevokeGrant();
  const column = createColumnHelper<GrantDto>();
  const columns = [
    column.accessor('role', { header: 'Role', cell: (c) => <span className="font-medium">{ROLE_LABELS[c.getValue()]}</span> }),
    column.accessor('programName', { header: 'Where', cell: (c) => c.getValue() ?? 'Agency-wide' }),
    column.accessor('source', {
      header: 'Given by',
      cell: (c) => (c.getValue() === 'group' ? `Identity-provider group “${c.row.original.group}”` : 'An administrator'),
    }),
    column.accessor('createdAt', { header: 'Since', cell: (c) => formatDateTime(c.getValue()) }),
    column.display({
      id: 'revoke',
      header: () => <span className="sr-only">Revoke</span>,
      cell: (c) =>
        c.row.original.source === 'group' ? (
          <span className="text-xs text-ink-500">Changes at the identity provider</span>
        ) : (
          <button
            type="button"
            className={buttonDanger}
            disabled={revoke.isPending}
            onClick={() => {
              if (window.confirm(`Revoke ${ROLE_LABELS[c.row.original.role]} (${c.row.original.programName ?? 'agency-wide'}) from ${user.displayName}?`)) {
                revoke.mutate(c.row.original.id);
              }
            }}
          >
            Revoke
          </button>
        ),
    }),
  ];
  const isSelf = currentUserId === user.id;
  return (
    <>
      <PageHeader
        title={user.displayName}
        lead={`${user.email} · ${user.active ? 'Active' : 'Switched off'} · last sign-in ${user.lastSignInAt ? formatDateTime(user.lastSignInAt) : 'never'}`}
        actions={
          isSelf ? null : (
            <button
              type="button"
              className={user.active ? buttonDanger : buttonSecondary}
              disabled={setActive.isPending}
              onClick={() => {
                if (!user.active || window.confirm(`Switch off ${user.displayName}'s account? Their sessions end at once and they cannot sign in.`)) {
                  setActive.mutate(!user.active);
                }
              }}
            >
              {user.active ? 'Switch account off' : 'Switch account on'}
            </button>
          )
        }
      />
      {setActive.isError ? <p className={fieldError} role="alert">{setActive.error.message}</p> : null}
      <h2 className="mb-3 text-lg font-semibold text-ink-900">Roles</h2>
      {revoke.isError ? (
        <p className={`${fieldError} mb-3`} role="alert">
          {revoke.error.message}
        </p>
      ) : null}
      {user.grants.length === 0 ? (
        <Empty title="No roles yet">Until they have a role, they see no programs.</Empty>
      ) : (
        <DataTable columns={columns} rows={user.grants} label={`Roles of ${user.displayName}`} rowKey={(g) => g.id} />
      )}
      <div className="mt-8 max-w-3xl">
        <GrantForm userId={user.id} />
      </div>
    </>
  );
}
