import type { ProgramDetailDto } from '@shared/api/programs';
import type { OutcomeResultDto, ResultsOverviewDto } from '@shared/api/results';
import { lazy, Suspense } from 'react';
import { useSearchParams } from 'react-router-dom';
import { StaleNotice } from '@/components/ui/stale-notice';
import { Empty, ErrorState, Loading } from '@/components/ui/states';
import { useSignedInUser } from '@/features/auth/me-context';
import { holdsRoleForProgram } from '@/features/auth/permissions';
import { programWords } from '@/features/programs/program-words';
import { useCohortTrend } from '@/features/results/api/get-cohort-trend';
import { formatPeriod } from '@/lib/format';
import { seriousPeriods } from '../trend-series';
import { summaryParagraph } from '../summary-paragraph';
import { ChangeAlerts } from './change-alerts';
import { TrendTable } from './trend-table';
import { ViewControls, type TrendView } from './view-controls';
import { WindowTable } from './window-table';

const TrendCharts = lazy(() => import('./trend-charts'));
const WindowChart = lazy(() => import('./window-chart'));

/** The window the summary paragraph speaks about: the last 6 months, else the longest there is. */
function summaryWindow(windows: readonly OutcomeResultDto[]): OutcomeResultDto | null {
  const last = windows.filter((w) => w.scope.key.startsWith('window:last-'));
  return last.find((w) => w.scope.key === 'window:last-6') ?? [...last].sort((a, b) => b.scope.cohortCount - a.scope.cohortCount)[0] ?? null;
}

/** The manager's main screen: one outcome month by month (or pooled), in words, charts and a table. */
export function TrendDashboard({ program, overview }: { program: ProgramDetailDto; overview: ResultsOverviewDto }) {
  const me = useSignedInUser();
  const [params, setParams] = useSearchParams();
  const outcomes = overview.outcomes.map((o) => o.outcome);
  const outcomeKey = outcomes.find((o) => o.key === params.get('outcome'))?.key ?? outcomes[0]?.key ?? null;
  const view: TrendView = params.get('view') === 'pooled' ? 'pooled' : 'months';
  const trend = useCohortTrend(program.id, outcomeKey);
  const canOpenMonths = holdsRoleForProgram(me, ['admin', 'analyst', 'manager', 'evaluator'], program.id);

  if (!overview.design) {
    return <Empty title="No results yet">An analyst sets up the evaluation design; the months are then estimated by themselves.</Empty>;
  }
  if (!outcomeKey) return <Empty title="No outcomes">The evaluation design names no outcome yet.</Empty>;
  const set = (next: { outcome?: string; view?: TrendView }) => {
    const p = new URLSearchParams(params);
    if (next.outcome) p.set('outcome', next.outcome);
    if (next.view) p.set('view', next.view);
    setParams(p, { replace: true });
  };
  const outcome = outcomes.find((o) => o.key === outcomeKey)!;
  return (
    <>
      <StaleNotice stale={overview.stale} lastRun={overview.lastRun} timeZone={program.timeZone} />
      <ViewControls outcomes={outcomes} outcome={outcomeKey} view={view} onChange={set} />
      <ChangeAlerts alerts={overview.alerts.filter((a) => a.outcomeKey === outcomeKey)} outcome={outcome} />
      {trend.isPending ? (
        <Loading label="Loading the months…" />
      ) : trend.isError ? (
        <ErrorState error={trend.error} onRetry={() => void trend.refetch()} />
      ) : trend.data.points.length === 0 ? (
        <Empty title="No months estimated yet">Months appear here after their extract is accepted and the recompute has run.</Empty>
      ) : (
        <DashboardBody
          program={program}
          view={view}
          canOpenMonths={canOpenMonths}
          data={trend.data}
          level={overview.outcomes.find((o) => o.outcome.key === outcomeKey)?.latest?.level ?? 0.95}
        />
      )}
    </>
  );
}

function DashboardBody({ program, view, data, level, canOpenMonths }: { program: ProgramDetailDto; view: TrendView; data: NonNullable<ReturnType<typeof useCohortTrend>['data']>; level: number; canOpenMonths: boolean }) {
  const summary = summaryParagraph({ words: programWords(program), outcome: data.outcome, window: summaryWindow(data.windows), points: data.points });
  const serious = seriousPeriods(data.points);
  return (
    <>
      <section aria-labelledby="summary-heading" className={`mb-8 rounded-lg border bg-panel px-6 py-5 ${summary.hedged ? 'border-dashed border-caution' : 'border-rule'}`}>
        <h2 id="summary-heading" className="text-sm font-medium tracking-wide text-ink-500 uppercase">
          In plain words{summary.hedged ? ' — read with care' : ''}
        </h2>
        <p className="mt-2 max-w-4xl leading-relaxed text-ink-900" data-testid="summary-paragraph">
          {summary.text}
        </p>
      </section>
      {serious.length > 0 ? (
        <p className="mb-4 text-sm text-ink-700">
          <span aria-hidden className="mr-1 font-semibold text-serious">
            (!)
          </span>
          Ringed and marked “!” on the charts: months with a serious caveat — {serious.map((p) => formatPeriod(p, undefined, true)).join(', ')}.
        </p>
      ) : null}
      {view === 'months' ? (
        <>
          <Suspense fallback={<Loading label="Drawing the charts…" />}>
            <TrendCharts points={data.points} outcome={data.outcome} level={level} scoreUnit={program.scoreUnit} />
          </Suspense>
          <h2 className="mt-10 mb-3 text-lg font-semibold text-ink-900">Month by month</h2>
          <TrendTable programId={program.id} points={data.points} outcome={data.outcome} canOpenMonths={canOpenMonths} level={level} />
        </>
      ) : (
        <>
          <Suspense fallback={<Loading label="Drawing the chart…" />}>
            <WindowChart windows={data.windows} outcome={data.outcome} level={level} />
          </Suspense>
          <h2 className="mt-10 mb-3 text-lg font-semibold text-ink-900">Pooled months</h2>
          <WindowTable windows={data.windows} outcome={data.outcome} level={level} />
        </>
      )}
    </>
  );
}
