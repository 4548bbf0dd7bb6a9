import type { ProgramSummaryDto } from '@shared/api/programs';
import type { CaveatDto, OutcomeOverviewDto } from '@shared/api/results';
import { headline } from '@shared/results/headline';
import { Link } from 'react-router-dom';
import { SeverityBadge } from '@/components/ui/severity-badge';
import { Sparkline } from '@/components/ui/sparkline';
import { ErrorState } from '@/components/ui/states';
import { useCohortTrend } from '@/features/results/api/get-cohort-trend';
import { useResultsOverview } from '@/features/results/api/get-results-overview';
import { ApiError } from '@/lib/api-client';
import { formatDateTime, formatInterval, formatJump, formatPeriod } from '@/lib/format';

const RANK = { info: 0, caution: 1, serious: 2 } as const;

/** The latest month's headline of the program's first outcome, a trend line of its effect, and how fresh the figures are. */
export function ProgramHeadline({ program }: { program: ProgramSummaryDto }) {
  const overview = useResultsOverview(program.id);
  const first = overview.data?.outcomes[0] ?? null;
  const trend = useCohortTrend(program.id, first?.outcome.key ?? null);
  if (overview.isPending) return <p className="mt-5 text-sm text-ink-500" role="status">Loading the latest figures…</p>;
  if (overview.isError) {
    if (overview.error instanceof ApiError && overview.error.status === 403) return null;
    return (
      <div className="mt-5">
        <ErrorState error={overview.error} onRetry={() => void overview.refetch()} />
      </div>
    );
  }
  const o = overview.data;
  if (!o.design || !first || !first.latest) {
    return <p className="mt-5 text-sm text-ink-500">No results yet: they appear after an analyst sets up the evaluation design and the first recompute has run.</p>;
  }
  const latest = first.latest;
  const fs = headline(latest.firstStage);
  const effect = headline(latest.effect);
  const worst = worstCaveat(o.outcomes);
  const points = trend.data?.points ?? [];
  const effects = points.map((p) => (p.effect ? p.effect.estimate * (first.outcome.unit === 'share' ? 100 : 1) : null));
  const flagged = points.flatMap((p, i) => (p.worstCaveat === 'serious' ? [i] : []));
  return (
    <div className="mt-5 grid gap-6 border-t border-rule pt-5 md:grid-cols-[1fr_1fr_auto]">
      <dl className="figures grid grid-cols-2 gap-4 text-sm">
        <div className="col-span-2 text-ink-500">
          {first.outcome.label}, {formatPeriod(latest.scope.lastPeriod, undefined, true)}
        </div>
        <div>
          <dt className="text-ink-500">Take-up jump at the cutoff</dt>
          <dd className="mt-1 text-lg font-medium text-ink-900" data-figure="first-stage">
            {formatJump(fs?.estimate, { unit: 'share' })}
          </dd>
        </div>
        <div>
          <dt className="text-ink-500">Effect on participants at the cutoff</dt>
          <dd className="mt-1 text-lg font-medium text-ink-900" data-figure="effect">
            {latest.status === 'ok' ? formatJump(effect?.estimate, first.outcome) : 'Not estimable'}
          </dd>
          {effect ? (
            <dd className="text-xs text-ink-500">
              {Math.round(latest.level * 100)}% interval {formatInterval(effect.ciLow, effect.ciHigh, first.outcome)}
            </dd>
          ) : null}
        </div>
      </dl>
      <div className="text-sm">
        <p className="text-ink-500">Effect on participants, month by month</p>
        <div className="mt-2">
          <Sparkline
            values={effects}
            flagged={flagged}
            label={`Effect on participants over ${points.length} months${flagged.length ? `; ${flagged.length} with a serious caveat (ringed)` : ''}.`}
          />
        </div>
        <p className="mt-3 text-ink-500">Most serious caveat this month</p>
        <div className="mt-1">{worst ? <WorstCaveat caveat={worst} /> : <span className="text-ink-700">None</span>}</div>
      </div>
      <div className="flex flex-col items-start gap-3 text-sm md:items-end">
        <Link to={`/programs/${program.id}`} className="rounded bg-accent-700 px-4 py-2 font-medium text-white hover:bg-accent-900">
          Open the trends
        </Link>
        <p className="text-ink-500 md:text-right">
          Figures computed {formatDateTime(latest.provenance.computedAt)}
          {o.stale ? (
            <>
              <br />
              <span className="text-ink-900">Some are out of date.</span>
            </>
          ) : null}
        </p>
      </div>
    </div>
  );
}

function WorstCaveat({ caveat }: { caveat: CaveatDto }) {
  return (
    <span className="inline-flex items-start gap-2">
      <SeverityBadge severity={caveat.severity} />
      <span className="text-ink-700">{caveat.message}</span>
    </span>
  );
}

/** The most serious caveat of any outcome's latest month. */
function worstCaveat(outcomes: readonly OutcomeOverviewDto[]): CaveatDto | null {
  let worst: CaveatDto | null = null;
  for (const o of outcomes) for (const c of o.latest?.caveats ?? []) if (!worst || RANK[c.severity] > RANK[worst.severity]) worst = c;
  return worst;
}
