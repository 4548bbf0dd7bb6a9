import type { CaveatDto, ChangeAlertDto, OutcomeOverviewDto, ResultsOverviewDto, TrendPointDto } from '@shared/api/results';
import { monthLabel } from '@shared/results/format-figures';

/** One program's part of a director's summary. */
export interface ProgramSummary {
  overview: ResultsOverviewDto;
  /** Per outcome key, the last 12 cohorts' points (oldest first). */
  trends: Record<string, TrendPointDto[]>;
  dashboardUrl: string;
}

export interface SummaryContent {
  recipientName: string;
  programs: ProgramSummary[];
  /** Where the subscription settings live. */
  settingsUrl: string;
}

/** Cohorts in the trend of the e-mail. */
export const TREND_COHORTS = 12;

const SEVERITY_RANK = { serious: 2, caution: 1, info: 0 } as const;

/**
 * The subject: the latest month on record and the program names, led by "Change alert" when any
 * program has an alert.
 * @example summarySubject(content) // => 'Cutline summary for October 2026: Winter Heating Credit'
 */
export function summarySubject(content: SummaryContent): string {
  const names = content.programs.map((p) => p.overview.programName).join(', ');
  const periods = content.programs.map((p) => p.overview.latestPeriod).filter((p): p is string => p !== null).sort();
  const alert = content.programs.some((p) => p.overview.alerts.length > 0) ? 'Change alert — ' : '';
  const latest = periods.at(-1);
  return latest ? `${alert}Cutline summary for ${monthLabel(latest)}: ${names}` : `Cutline summary: ${names} (no results yet)`;
}

/** The most serious caveats of a program's latest cohort, each once, worst first (at most `limit`). */
export function leadingCaveats(overview: ResultsOverviewDto, limit = 3): Array<CaveatDto & { outcomeLabel: string }> {
  const seen = new Set<string>();
  const all = overview.outcomes.flatMap((o: OutcomeOverviewDto) => (o.latest?.caveats ?? []).map((c) => ({ ...c, outcomeLabel: o.outcome.label })));
  return all
    .sort((a, b) => SEVERITY_RANK[b.severity] - SEVERITY_RANK[a.severity])
    .filter((c) => (seen.has(c.code) ? false : (seen.add(c.code), true)))
    .filter((c) => c.severity !== 'info')
    .slice(0, limit);
}

/** An alert in one plain sentence. */
export function alertSentence(alert: ChangeAlertDto, overview: ResultsOverviewDto): string {
  const outcome = overview.outcomes.find((o) => o.outcome.key === alert.outcomeKey)?.outcome.label ?? alert.outcomeKey;
  if (alert.kind === 'new-caveat') return `${monthLabel(alert.period)}, ${outcome}: ${alert.caveat.message}`;
  const what = alert.quantity === 'effect' ? 'the effect on participants' : 'the take-up jump';
  const direction = alert.difference > 0 ? 'higher' : 'lower';
  return `${monthLabel(alert.period)}, ${outcome}: ${what} is ${direction} than in the previous three months by more than chance readily explains (z = ${alert.z.toFixed(2)}, p = ${alert.p < 0.001 ? '< 0.001' : alert.p.toFixed(3)}).`;
}
