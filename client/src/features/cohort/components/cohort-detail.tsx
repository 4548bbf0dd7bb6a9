import type { ProgramDetailDto } from '@shared/api/programs';
import type { CohortDetailDto, OutcomeResultDetailDto } from '@shared/api/results';
import { lazy, Suspense, useMemo, type ReactNode } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { SeverityBadge } from '@/components/ui/severity-badge';
import { Loading } from '@/components/ui/states';
import { useSignedInUser } from '@/features/auth/me-context';
import { holdsRoleForProgram } from '@/features/auth/permissions';
import { formatCount, formatDateTime, formatNumber } from '@/lib/format';
import { readDiagnostics } from '../diagnostics-view';
import { CaveatList } from './caveat-list';
import { DiagnosticsPanels } from './diagnostics-panels';
import { EstimatesTable } from './estimates-table';

const OutcomeScatter = lazy(() => import('./cohort-charts').then((m) => ({ default: m.OutcomeScatter })));
const TakeUpScatter = lazy(() => import('./cohort-charts').then((m) => ({ default: m.TakeUpScatter })));

/** One month in full: caveats first, then the charts, the estimates and every diagnostic, and where the figures came from. */
export function CohortDetail({ program, detail }: { program: ProgramDetailDto; detail: CohortDetailDto }) {
  const me = useSignedInUser();
  const [params, setParams] = useSearchParams();
  const result = detail.outcomes.find((o) => o.outcome.key === params.get('outcome')) ?? detail.outcomes[0]!;
  const diagnostics = useMemo(() => readDiagnostics(result.diagnostics), [result.diagnostics]);
  const cutoff = detail.cutoff ?? 0;
  const canAcknowledge = holdsRoleForProgram(me, ['manager'], program.id);
  const scoreLabel = `${program.scoreLabel}${program.scoreUnit ? ` (${program.scoreUnit})` : ''}`;
  const covariateLabels = Object.fromEntries(program.covariates.map((c) => [c.key, { label: c.label, unit: c.unit }]));
  return (
    <>
      <p className="figures mb-6 text-sm text-ink-700">
        Cutoff {formatNumber(detail.cutoff, 0)} {program.scoreUnit}
        {result.n ? ` · ${formatCount(result.n.ineligible + result.n.eligible)} applicants, ${formatCount(result.n.usedIneligible + result.n.usedEligible)} near the cutoff` : ''}
        {result.stale ? ` · out of date: ${result.staleReason ?? 'the inputs changed'}` : ''}
      </p>
      <nav aria-label="Outcomes" className="no-print mb-8 flex flex-wrap gap-2">
        {detail.outcomes.map((o) => (
          <button
            key={o.outcome.key}
            type="button"
            aria-pressed={o.id === result.id}
            onClick={() => setParams({ outcome: o.outcome.key }, { replace: true })}
            className={`rounded border px-3 py-1.5 text-sm ${o.id === result.id ? 'border-accent-700 bg-accent-50 font-medium text-accent-900' : 'border-ink-300 bg-panel text-ink-700 hover:border-ink-500'}`}
          >
            {o.outcome.label}
            {worst(o) ? (
              <span className="ml-2">
                <SeverityBadge severity={worst(o)!} />
              </span>
            ) : null}
          </button>
        ))}
      </nav>
      {result.status !== 'ok' ? (
        <p role="status" className="mb-8 rounded-md border-l-4 border-double border-serious bg-serious-50 px-4 py-3 text-sm text-ink-900">
          <strong className="font-medium">No estimate this month.</strong> {result.problem?.message}
        </p>
      ) : null}
      <Section title="Caveats" id="caveats">
        <CaveatList result={result} period={detail.period} programId={program.id} canAcknowledge={canAcknowledge} timeZone={program.timeZone} />
      </Section>
      <Section title="Around the cutoff" id="charts" lead="Each point is the average of applicants in a score interval: open circles below the cutoff, filled squares at or above. Lines: the fitted local polynomials; large points at the cutoff: the fitted values whose gap is the jump.">
        <div className="grid gap-6 lg:grid-cols-2">
          <figure className="break-inside-avoid rounded-lg border border-rule bg-panel p-4">
            <figcaption className="font-medium text-ink-900">{result.outcome.label}</figcaption>
            <Suspense fallback={<Loading label="Drawing…" />}>
              <OutcomeScatter result={result} cutoff={cutoff} scoreLabel={scoreLabel} fit={diagnostics.fits.outcome} />
            </Suspense>
          </figure>
          <figure className="break-inside-avoid rounded-lg border border-rule bg-panel p-4">
            <figcaption className="font-medium text-ink-900">Took part</figcaption>
            <Suspense fallback={<Loading label="Drawing…" />}>
              <TakeUpScatter result={result} cutoff={cutoff} scoreLabel={scoreLabel} fit={diagnostics.fits.takeUp} />
            </Suspense>
          </figure>
        </div>
      </Section>
      <Section title="Estimates" id="estimates">
        <EstimatesTable result={result} />
      </Section>
      <Section title="Diagnostics" id="diagnostics">
        <DiagnosticsPanels diagnostics={diagnostics} result={result} cutoff={cutoff} scoreLabel={scoreLabel} covariateLabels={covariateLabels} />
      </Section>
      <Section title="Where these figures come from" id="provenance">
        <Provenance result={result} timeZone={program.timeZone} />
      </Section>
      <p className="no-print mt-10 text-sm">
        <Link to={`/programs/${program.id}?outcome=${result.outcome.key}`} className="text-accent-700 underline underline-offset-2">
          Back to the trends
        </Link>
      </p>
    </>
  );
}

function worst(o: OutcomeResultDetailDto) {
  if (o.caveats.some((c) => c.severity === 'serious')) return 'serious' as const;
  if (o.caveats.some((c) => c.severity === 'caution')) return 'caution' as const;
  return null;
}

function Section({ title, id, lead, children }: { title: string; id: string; lead?: string; children: ReactNode }) {
  return (
    <section aria-labelledby={`${id}-heading`} className="mb-10">
      <h2 id={`${id}-heading`} className="mb-1 text-lg font-semibold text-ink-900">
        {title}
      </h2>
      {lead ? <p className="mb-4 max-w-4xl text-sm text-ink-500">{lead}</p> : <div className="mb-3" />}
      {children}
    </section>
  );
}

function Provenance({ result, timeZone }: { result: OutcomeResultDetailDto; timeZone: string }) {
  const p = result.provenance;
  return (
    <dl className="figures grid gap-3 text-sm sm:grid-cols-2">
      <div>
        <dt className="text-ink-500">Computed</dt>
        <dd>
          {formatDateTime(p.computedAt, timeZone)} (run {p.runId})
        </dd>
      </div>
      <div>
        <dt className="text-ink-500">Evaluation design</dt>
        <dd>
          version {p.designVersion}
          {result.preRegistered ? ', pre-registered (the month arrived after the plan was locked)' : ''}
          {result.deviationCount > 0 ? `, ${result.deviationCount} deviation${result.deviationCount === 1 ? '' : 's'} from the locked plan` : ''}
        </dd>
      </div>
      <div>
        <dt className="text-ink-500">Engine / diagnostics</dt>
        <dd>
          {p.engineVersion} / {p.diagnosticsVersion ?? 'not run'}
        </dd>
      </div>
      <div>
        <dt className="text-ink-500">Extract</dt>
        <dd className="break-all">{p.extracts.map((e) => `${e.period} #${e.extractId}, SHA-256 ${e.sha256.slice(0, 16)}…`).join('; ')}</dd>
      </div>
    </dl>
  );
}
