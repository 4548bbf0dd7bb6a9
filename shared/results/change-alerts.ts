import type { ChangeAlertDto, OutcomeResultDto } from '../api/results';
import { twoSidedP } from '../estimation';

/** The test behind a difference alert, in the words the e-mail and dashboards show. */
export const DIFFERENCE_TEST_STATEMENT =
  'Two-sided z-test of the difference between the latest month and the pooled previous months, using the robust standard errors: z = (latest − previous) / √(se_latest² + se_previous²). It assumes the two estimates are independent (different applicants in different months).';

/**
 * Alerts for the latest cohort of one outcome:
 * - `difference`: the complier effect or the take-up jump differs from the baseline window's
 *   (`window:previous-3`) by more than their joint uncertainty allows — |z| beyond the two-sided
 *   critical value at α = 1 − the design's level. Independent samples assumed (see the statement);
 *   robust bias-corrected estimates and standard errors are compared, as their intervals are the
 *   ones reported (Calonico, Cattaneo & Titiunik 2014).
 * - `new-caveat`: a serious caveat on the latest cohort that the previous cohort did not have.
 * @example changeAlerts(latest, baseline, previousCohort) // => [] when nothing stands out
 */
export function changeAlerts(latest: OutcomeResultDto | null, baseline: OutcomeResultDto | null, previousCohort: OutcomeResultDto | null): ChangeAlertDto[] {
  if (!latest || latest.status !== 'ok') return [];
  const alerts: ChangeAlertDto[] = [];
  if (baseline && baseline.status === 'ok') {
    const alpha = 1 - latest.level;
    for (const quantity of ['effect', 'firstStage'] as const) {
      const a = latest[quantity]?.robust;
      const b = baseline[quantity]?.robust;
      if (!a || !b) continue;
      const seDifference = Math.sqrt(a.se ** 2 + b.se ** 2);
      if (!(seDifference > 0)) continue;
      const difference = a.estimate - b.estimate;
      const z = difference / seDifference;
      const p = twoSidedP(z);
      if (p < alpha) {
        alerts.push({
          kind: 'difference',
          outcomeKey: latest.outcome.key,
          quantity,
          period: latest.scope.lastPeriod,
          baselineKey: baseline.scope.key,
          cohortEstimate: a.estimate,
          baselineEstimate: b.estimate,
          difference,
          seDifference,
          z,
          p,
          alpha,
          test: DIFFERENCE_TEST_STATEMENT,
        });
      }
    }
  }
  const before = new Set((previousCohort?.caveats ?? []).filter((c) => c.severity === 'serious').map((c) => c.code));
  for (const caveat of latest.caveats) {
    if (caveat.severity === 'serious' && !before.has(caveat.code)) alerts.push({ kind: 'new-caveat', outcomeKey: latest.outcome.key, period: latest.scope.lastPeriod, caveat });
  }
  return alerts;
}
