import type { ProgramDetailDto } from '@shared/api/programs';
import { NavLink } from 'react-router-dom';
import { useSignedInUser } from '@/features/auth/me-context';
import { holdsRoleForProgram, isAgencyAdmin } from '@/features/auth/permissions';
import { formatNumber } from '@/lib/format';
import { qualifyRule } from '../program-words';

const tab = ({ isActive }: { isActive: boolean }) =>
  `border-b-2 px-1 pb-2 text-sm ${isActive ? 'border-accent-700 font-medium text-ink-900' : 'border-transparent text-ink-700 hover:text-ink-900'}`;

/** The program's pages a person may open, under the page title. */
export function ProgramNav({ program }: { program: ProgramDetailDto }) {
  const me = useSignedInUser();
  const items = [
    { to: `/programs/${program.id}`, label: 'Trends', end: true, show: true },
    { to: `/programs/${program.id}/designs`, label: 'Evaluation designs', end: false, show: holdsRoleForProgram(me, ['admin', 'analyst', 'manager', 'evaluator'], program.id) },
    { to: `/programs/${program.id}/runs`, label: 'Recompute runs', end: false, show: holdsRoleForProgram(me, ['admin', 'analyst'], program.id) },
    { to: `/admin/programs/${program.id}`, label: 'Program settings', end: false, show: isAgencyAdmin(me) || holdsRoleForProgram(me, ['admin'], program.id) },
  ].filter((i) => i.show);
  return (
    <div className="no-print -mt-4 mb-8 flex flex-wrap items-end justify-between gap-4 border-b border-rule">
      <nav aria-label={`Pages of ${program.name}`} className="flex gap-6">
        {items.map((i) => (
          <NavLink key={i.to} to={i.to} end={i.end} className={tab}>
            {i.label}
          </NavLink>
        ))}
      </nav>
      <p className="pb-2 text-sm text-ink-500">Who qualifies: {qualifyRule(program, (n) => formatNumber(n, 0))}</p>
    </div>
  );
}
