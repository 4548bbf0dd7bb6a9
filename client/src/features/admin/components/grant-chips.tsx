import type { GrantDto } from '@shared/api/auth';
import { ROLE_LABELS } from '@/lib/roles';

/** Roles as small labels: "Analyst · Winter Heating Credit". */
export function GrantChips({ grants }: { grants: GrantDto[] }) {
  if (grants.length === 0) return <span className="text-ink-500">No roles</span>;
  return (
    <ul className="flex flex-wrap gap-1.5">
      {grants.map((g) => (
        <li key={g.id} className="rounded border border-rule bg-paper px-2 py-0.5 text-xs text-ink-700">
          <span className="font-medium text-ink-900">{ROLE_LABELS[g.role]}</span> · {g.programId === null ? 'agency-wide' : g.programName}
        </li>
      ))}
    </ul>
  );
}
