import type { ChangeAlertDto, OutcomeRefDto } from '@shared/api/results';
import { SeverityBadge } from '@/components/ui/severity-badge';
import { formatJump, formatP, formatPeriod } from '@/lib/format';

const QUANTITY = { effect: 'effect on participants', firstStage: 'take-up jump' } as const;

/** Changes the latest month brought: a difference beyond the joint uncertainty, or a new serious caveat. */
export function ChangeAlerts({ alerts, outcome }: { alerts: readonly ChangeAlertDto[]; outcome: OutcomeRefDto }) {
  if (alerts.length === 0) return null;
  return (
    <section aria-label="Changes this month" className="mb-6 rounded-md border-l-4 border-caution bg-caution-50 px-5 py-3 text-sm">
      <h2 className="font-medium text-ink-900">What changed in the latest month</h2>
      <ul className="mt-1 list-disc space-y-1 pl-5 text-ink-700">
        {alerts.map((a, i) =>
          a.kind === 'difference' ? (
            <li key={i}>
              In {formatPeriod(a.period, undefined, true)} the {QUANTITY[a.quantity]} was {formatJump(a.cohortEstimate, a.quantity === 'firstStage' ? { unit: 'share' } : outcome)}, against{' '}
              {formatJump(a.baselineEstimate, a.quantity === 'firstStage' ? { unit: 'share' } : outcome)} over the three months before (difference test p {formatP(a.p)}). <span className="text-ink-500">{a.test}</span>
            </li>
          ) : (
            <li key={i} className="flex items-start gap-2">
              <SeverityBadge severity={a.caveat.severity} />
              <span>
                New in {formatPeriod(a.period, undefined, true)}: {a.caveat.message}
              </span>
            </li>
          ),
        )}
      </ul>
    </section>
  );
}
