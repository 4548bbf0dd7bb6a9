import type { ProgramSummaryDto } from '@shared/api/programs';
import { Link } from 'react-router-dom';
import { Pager } from '@/components/ui/pager';
import { Empty, ErrorState, Loading } from '@/components/ui/states';
import { useSignedInUser } from '@/features/auth/me-context';
import { holdsRoleForProgram } from '@/features/auth/permissions';
import { formatNumber, formatPeriod } from '@/lib/format';
import { useState } from 'react';
import { usePrograms } from '../api/get-programs';
import { qualifyRule } from '../program-words';
import { ProgramHeadline } from './program-headline';

/** Every program the signed-in person may see, each with its latest headline and a small trend line. */
export function ProgramList() {
  const [page, setPage] = useState(1);
  const programs = usePrograms(page);
  if (programs.isPending) return <Loading label="Loading programs…" />;
  if (programs.isError) return <ErrorState error={programs.error} onRetry={() => void programs.refetch()} />;
  if (programs.data.items.length === 0) {
    return <Empty title="No programs yet">When an administrator adds a program, or grants you access to one, it appears here.</Empty>;
  }
  return (
    <>
      <ul className="grid gap-6" aria-label="Programs">
        {programs.data.items.map((p) => (
          <ProgramCard key={p.id} program={p} />
        ))}
      </ul>
      <Pager page={page} pageSize={programs.data.pageSize} total={programs.data.total} onPage={setPage} label="Pages of programs" />
    </>
  );
}

function ProgramCard({ program }: { program: ProgramSummaryDto }) {
  const me = useSignedInUser();
  const analysis = holdsRoleForProgram(me, ['admin', 'analyst'], program.id);
  const extracts = holdsRoleForProgram(me, ['admin', 'analyst', 'evaluator'], program.id);
  return (
    <li className="break-inside-avoid rounded-lg border border-rule bg-panel p-6">
      <div className="flex flex-wrap items-baseline justify-between gap-3">
        <h2 className="text-lg font-semibold text-ink-900">
          <Link to={`/programs/${program.id}`} className="underline-offset-4 hover:underline">
            {program.name}
          </Link>
        </h2>
        <p className="text-sm text-ink-500">
          Who qualifies: <span className="text-ink-900">{qualifyRule(program, (n) => formatNumber(n, 0))}</span>
        </p>
      </div>
      <p className="mt-2 max-w-3xl text-sm text-ink-700">{program.description}</p>
      {program.cohortCount === 0 ? (
        <p className="mt-5 text-sm text-ink-500">No months on record yet: results appear once the first monthly extract is accepted.</p>
      ) : (
        <>
          <p className="figures mt-4 text-sm text-ink-500">
            {program.cohortCount} {program.cohortCount === 1 ? 'month' : 'months'} on record, the latest {formatPeriod(program.latestPeriod, undefined, true)}.
          </p>
          <ProgramHeadline program={program} />
        </>
      )}
      {analysis || extracts ? (
        <p className="no-print mt-5 flex flex-wrap gap-4 border-t border-rule pt-4 text-sm">
          {extracts ? (
            <Link className="text-accent-700 underline" to={`/programs/${program.id}/extracts`}>
              Monthly extracts
            </Link>
          ) : null}
          {analysis ? (
            <>
              <Link className="text-accent-700 underline" to={`/programs/${program.id}/designs`}>
                Evaluation designs
              </Link>
              <Link className="text-accent-700 underline" to={`/programs/${program.id}/runs`}>
                Recompute runs
              </Link>
            </>
          ) : null}
        </p>
      ) : null}
    </li>
  );
}
