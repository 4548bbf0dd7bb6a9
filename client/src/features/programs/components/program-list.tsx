import type { ProgramSummaryDto } from '@shared/api/programs';
import { Empty, ErrorState, Loading } from '@/components/ui/states';
import { Link } from 'react-router-dom';
import { useSignedInUser } from '@/features/auth/me-context';
import { holdsRoleForProgram } from '@/features/auth/permissions';
import { formatNumber, formatPeriod } from '@/lib/format';
import { usePrograms } from '../api/get-programs';

export function ProgramList() {
  const programs = usePrograms();
  if (programs.isPending) return <Loading label="Loading programs…" />;
  if (programs.isError) return <ErrorState error={programs.error} onRetry={() => void programs.refetch()} />;
  if (programs.data.items.length === 0) {
    return <Empty title="No programs yet">When an administrator adds a program, or grants you access to one, it appears here.</Empty>;
  }
  return (
    <ul className="grid gap-5 md:grid-cols-2" aria-label="Programs">
      {programs.data.items.map((p) => (
        <ProgramCard key={p.id} program={p} />
      ))}
    </ul>
  );
}

function ProgramCard({ program }: { program: ProgramSummaryDto }) {
  const me = useSignedInUser();
  const analysis = holdsRoleForProgram(me, ['admin', 'analyst'], program.id);
  const who = program.eligibleSide === 'at-or-above' ? 'at or above' : 'at or below';
  return (
    <li className="rounded-lg border border-rule bg-panel p-6 shadow-[0_1px_0_var(--color-rule)]">
      <h2 className="text-lg font-semibold text-ink-900">{program.name}</h2>
      <p className="mt-2 text-sm text-ink-700">{program.description}</p>
      <dl className="figures mt-5 grid grid-cols-3 gap-4 text-sm">
        <div>
          <dt className="text-ink-500">Who qualifies</dt>
          <dd className="mt-1 font-medium">
            {program.scoreLabel} {who} {formatNumber(program.currentCutoff, 0)}
          </dd>
        </div>
        <div>
          <dt className="text-ink-500">Months on record</dt>
          <dd className="mt-1 font-medium">{program.cohortCount}</dd>
        </div>
        <div>
          <dt className="text-ink-500">Latest month</dt>
          <dd className="mt-1 font-medium">{formatPeriod(program.latestPeriod)}</dd>
        </div>
      </dl>
      {analysis ? (
        <p className="mt-5 flex gap-4 border-t border-rule pt-4 text-sm">
          <Link className="text-accent-700 underline" to={`/programs/${program.id}/designs`}>
            Evaluation designs
          </Link>
          <Link className="text-accent-700 underline" to={`/programs/${program.id}/runs`}>
            Recompute runs
          </Link>
        </p>
      ) : null}
    </li>
  );
}
