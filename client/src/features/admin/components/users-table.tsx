import { createColumnHelper } from '@tanstack/react-table';
import { useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import type { UserDto } from '@shared/api/auth';
import { DataTable } from '@/components/ui/data-table';
import { Pager } from '@/components/ui/pager';
import { Empty, ErrorState, Loading } from '@/components/ui/states';
import { buttonSecondary, field } from '@/components/ui/styles';
import { formatDateTime } from '@/lib/format';
import { useUsers } from '../api/users';
import { GrantChips } from './grant-chips';

const column = createColumnHelper<UserDto>();
const columns = [
  column.accessor('displayName', {
    header: 'Name',
    cell: (c) => (
      <Link to={`/admin/users/${c.row.original.id}`} className="font-medium text-accent-700 underline-offset-4 hover:underline">
        {c.getValue()}
      </Link>
    ),
  }),
  column.accessor('email', { header: 'E-mail address', cell: (c) => <span className="text-ink-700">{c.getValue()}</span> }),
  column.accessor('grants', { header: 'Roles', cell: (c) => <GrantChips grants={c.getValue()} /> }),
  column.accessor('active', { header: 'Account', cell: (c) => (c.getValue() ? 'Active' : <span className="font-medium text-serious">Switched off</span>) }),
  column.accessor('lastSignInAt', { header: 'Last sign-in', cell: (c) => (c.getValue() ? formatDateTime(c.getValue()) : 'Never') }),
];

export function UsersTable() {
  const [page, setPage] = useState(1);
  const [q, setQ] = useState('');
  const [draft, setDraft] = useState('');
  const users = useUsers(page, q);
  const search = (e: FormEvent) => {
    e.preventDefault();
    setPage(1);
    setQ(draft.trim());
  };
  return (
    <section aria-label="People">
      <form onSubmit={search} className="mb-4 flex max-w-md gap-2" role="search">
        <label htmlFor="people-search" className="sr-only">
          Find by name or e-mail
        </label>
        <input id="people-search" className={field} placeholder="Find by name or e-mail" value={draft} onChange={(e) => setDraft(e.target.value)} />
        <button type="submit" className={buttonSecondary}>
          Find
        </button>
      </form>
      {users.isPending ? (
        <Loading label="Loading people…" />
      ) : users.isError ? (
        <ErrorState error={users.error} onRetry={() => void users.refetch()} />
      ) : users.data.items.length === 0 ? (
        <Empty title={q ? 'Nobody matches this search' : 'Nobody yet'}>{q ? 'Try part of the name or the e-mail address.' : 'People appear here after their first sign-in, or when you add them.'}</Empty>
      ) : (
        <>
          <DataTable columns={columns} rows={users.data.items} label="People and their roles" rowKey={(u) => u.id} />
          <Pager page={page} pageSize={users.data.pageSize} total={users.data.total} onPage={setPage} label="Pages of people" />
        </>
      )}
    </section>
  );
}
