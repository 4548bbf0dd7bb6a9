import type { OutcomeResultDetailDto } from '@shared/api/results';
import { createColumnHelper } from '@tanstack/react-table';
import { lazy, Suspense, type ReactNode } from 'react';
import { DataTable } from '@/components/ui/data-table';
import { Loading } from '@/components/ui/states';
import { formatCount, formatInterval, formatJump, formatNumber, formatP } from '@/lib/format';
import type { BalanceView, DiagnosticsView } from '../diagnostics-view';

const DensityPlot = lazy(() => import('./cohort-charts').then((m) => ({ default: m.DensityPlot })));
const AlternativesPlot = lazy(() => import('./cohort-charts').then((m) => ({ default: m.AlternativesPlot })));

/** Every diagnostic of the month, each with its test and numbers, or a plain "not run". */
export function DiagnosticsPanels({ diagnostics, result, cutoff, scoreLabel, covariateLabels }: { diagnostics: DiagnosticsView; result: OutcomeResultDetailDto; cutoff: number; scoreLabel: string; covariateLabels: Record<string, { label: string; unit: string }> }) {
  const d = diagnostics;
  const o = result.outcome;
  return (
    <div className="grid gap-6 lg:grid-cols-2">
      <Panel title="Scores around the cutoff (density test)" why="A pile-up just on one side would suggest scores were nudged across the cutoff.">
        {d.density ? (
          <>
            <Suspense fallback={<Loading label="Drawing…" />}>
              <DensityPlot density={d.density} cutoff={cutoff} scoreLabel={scoreLabel} />
            </Suspense>
            <p className="figures text-sm text-ink-700">
              {d.density.mccrary ? `McCrary test: log difference θ = ${formatNumber(d.density.mccrary.theta, 3)} (se ${formatNumber(d.density.mccrary.se, 3)}), p ${formatP(d.density.mccrary.p)}. ` : ''}
              {d.density.localPolynomial ? `Local-polynomial density test: p ${formatP(d.density.localPolynomial.p)}.` : ''}
            </p>
          </>
        ) : (
          <NotRun />
        )}
      </Panel>
      <Panel title="Balance of characteristics fixed before applying" why="Households just either side should look alike; a jump here weakens the comparison.">
        {d.balance.length ? <BalanceTable rows={d.balance} labels={covariateLabels} /> : <NotRun />}
      </Panel>
      <Panel title="Placebo cutoffs" why="At false cutoffs, where nothing changes, the outcome should not jump. Open, ringed points: p below 0.05 after Holm adjustment.">
        {d.placebo.length ? (
          <Suspense fallback={<Loading label="Drawing…" />}>
            <AlternativesPlot kind="placebo" diagnostics={d} result={result} cutoff={cutoff} />
          </Suspense>
        ) : (
          <NotRun />
        )}
      </Panel>
      <Panel title="Other bandwidths" why="The estimate should not hinge on one bandwidth. Accent square: the chosen one.">
        {d.sensitivity.length ? (
          <Suspense fallback={<Loading label="Drawing…" />}>
            <AlternativesPlot kind="sensitivity" diagnostics={d} result={result} cutoff={cutoff} />
          </Suspense>
        ) : (
          <NotRun />
        )}
      </Panel>
      <Panel title="Leaving out scores closest to the cutoff (donut)" why="If scores right at the cutoff were manipulated, dropping them should not move the estimate much.">
        {d.donut.length ? (
          <>
            <Suspense fallback={<Loading label="Drawing…" />}>
              <AlternativesPlot kind="donut" diagnostics={d} result={result} cutoff={cutoff} />
            </Suspense>
            <p className="figures text-sm text-ink-700">
              {d.donut.map((r) => `radius ${formatNumber(r.radius, 1)}: ${formatCount(r.dropped)} left out, effect ${formatJump(r.estimate, o)}`).join('; ')}.
            </p>
          </>
        ) : (
          <NotRun />
        )}
      </Panel>
      <Panel title="Is the take-up jump strong enough?" why="With a weak take-up jump the effect on participants is unreliable and its usual interval too narrow.">
        {d.weakFirstStage ? (
          <dl className="figures grid grid-cols-2 gap-3 text-sm">
            <Fact term="First-stage F" value={`${formatNumber(d.weakFirstStage.f, 1)} ${d.weakFirstStage.belowRuleOfThumb ? '(below 10: weak)' : d.weakFirstStage.belowStockYogo ? '(below 16.4)' : '(strong)'}`} />
            <Fact term="Take-up jump" value={formatJump(d.weakFirstStage.firstStage, { unit: 'share' })} />
            <Fact
              term="tF-adjusted 95% interval"
              value={d.weakFirstStage.tfCiLow === null && d.weakFirstStage.tfCiHigh === null ? 'unbounded: too weak for any interval' : formatInterval(d.weakFirstStage.tfCiLow, d.weakFirstStage.tfCiHigh, o)}
            />
            <Fact
              term="Anderson–Rubin set"
              value={
                d.weakFirstStage.arShape === 'everything'
                  ? 'every value (uninformative)'
                  : d.weakFirstStage.arShape === 'two-rays'
                    ? `everything outside ${formatInterval(d.weakFirstStage.arCiLow, d.weakFirstStage.arCiHigh, o)}`
                    : formatInterval(d.weakFirstStage.arCiLow, d.weakFirstStage.arCiHigh, o)
              }
            />
          </dl>
        ) : result.firstStage ? (
          <p className="text-sm text-ink-700">
            First-stage F = {formatNumber(result.firstStage.f, 1)}
            {result.firstStage.weak ? ', below 10: the take-up jump is weak.' : ', at or above 10 (rule of thumb).'} The fuller check (tF and Anderson–Rubin intervals) appears once the diagnostics are stored.
          </p>
        ) : (
          <NotRun />
        )}
      </Panel>
      <Panel title="Power for the next month" why="How large an effect a month of this size could detect.">
        {d.power ? (
          <p className="figures text-sm text-ink-700">
            With {formatCount(d.power.n)} applicants near the cutoff, a month like this detects, with {formatNumber(d.power.power * 100, 0)}% power at the {formatNumber(d.power.alpha * 100, 0)}% level, an effect of being eligible of{' '}
            {formatJump(d.power.mdeItt, o, { sign: false })}
            {d.power.mdeEffect !== null ? ` and an effect on participants of ${formatJump(d.power.mdeEffect, o, { sign: false })}` : ''}.
            {d.power.nForTarget !== null && d.power.targetEffect !== null ? ` Detecting ${formatJump(d.power.targetEffect, o)} needs about ${formatCount(d.power.nForTarget)} applicants near the cutoff.` : ''}
          </p>
        ) : (
          <NotRun />
        )}
      </Panel>
    </div>
  );
}

const bcol = createColumnHelper<BalanceView>();

function BalanceTable({ rows, labels }: { rows: BalanceView[]; labels: Record<string, { label: string; unit: string }> }) {
  const columns = [
    bcol.accessor('covariate', { header: 'Characteristic', cell: (c) => labels[c.getValue()]?.label ?? c.getValue() }),
    bcol.accessor('estimate', { header: 'Jump', cell: (c) => formatJump(c.getValue(), { unit: labels[c.row.original.covariate]?.unit ?? '' }) }),
    bcol.display({ id: 'ci', header: '95% interval', cell: ({ row }) => formatInterval(row.original.ciLow, row.original.ciHigh, { unit: labels[row.original.covariate]?.unit ?? '' }) }),
    bcol.accessor('p', { header: 'p', cell: (c) => formatP(c.getValue()) }),
    bcol.accessor('pAdjusted', { header: 'p (Holm)', cell: (c) => <span>{formatP(c.getValue())}{(c.getValue() ?? 1) < 0.05 ? ' — imbalanced' : ''}</span> }),
  ];
  return <DataTable columns={columns} rows={rows} label="Balance of characteristics at the cutoff" rowKey={(r) => r.covariate} />;
}

function Panel({ title, why, children }: { title: string; why: string; children: ReactNode }) {
  return (
    <section className="break-inside-avoid rounded-lg border border-rule bg-panel p-5" aria-label={title}>
      <h3 className="font-medium text-ink-900">{title}</h3>
      <p className="mt-1 mb-3 text-sm text-ink-500">{why}</p>
      {children}
    </section>
  );
}

function Fact({ term, value }: { term: string; value: string }) {
  return (
    <div>
      <dt className="text-ink-500">{term}</dt>
      <dd className="text-ink-900">{value}</dd>
    </div>
  );
}

function NotRun() {
  return <p className="text-sm text-ink-500">Not run for this month: the stored results do not include this diagnostic yet (it appears after the next recompute that runs the diagnostics).</p>;
}
