import type { ChartSeries } from '@shared/diagnostics';
import { BINS_PER_SIDE } from '../recompute/plot-bins';
import type { AnnexContent, AnnexResult } from './annex-content';
import { NUMBER_FORMATS as F, SheetBuilder, type ColumnSpec } from './sheet-model';

/** One point of a chart: a bin, a point of a fitted line, or a density point. */
export interface ChartPoint {
  r: AnnexResult;
  /** Which chart the point belongs to, e.g. `outcome, evenly spaced bins`. */
  chart: string;
  /** `bin`, `fit` or `density`. */
  kind: 'bin' | 'fit' | 'density';
  side: 'ineligible' | 'eligible';
  scoreLow: number | null;
  scoreHigh: number | null;
  /** Where the point is drawn: bin mean score or midpoint, or the fit's position. */
  score: number | null;
  n: number | null;
  outcomeMean: number | null;
  takeUpMean: number | null;
  /** A binned mean of the chart's variable, a fitted value, or a density height (per score unit). */
  value: number | null;
}

const COLUMNS: Array<ColumnSpec<ChartPoint>> = [
  { header: 'Scope', value: (p) => p.r.result.scope.key },
  { header: 'Outcome', value: (p) => p.r.result.outcome.key },
  { header: 'Chart', value: (p) => p.chart },
  { header: 'Point', value: (p) => p.kind },
  { header: 'Side', value: (p) => p.side },
  { header: 'Score low (score − cutoff)', value: (p) => p.scoreLow, numFmt: F.score },
  { header: 'Score high (score − cutoff)', value: (p) => p.scoreHigh, numFmt: F.score },
  { header: 'Score drawn at (score − cutoff)', value: (p) => p.score, numFmt: F.score },
  { header: 'Observations', value: (p) => p.n, numFmt: F.count },
  { header: 'Mean outcome', value: (p) => p.outcomeMean, numFmt: F.estimate },
  { header: 'Mean take-up', value: (p) => p.takeUpMean, numFmt: F.estimate },
  { header: 'Value (binned mean, fitted value or density)', value: (p) => p.value, numFmt: F.estimate },
];

/**
 * Binned data: every point and line the charts draw, one row each, so a reader can redraw every
 * chart with a filter on Scope, Outcome and Chart. Positions are measured from the cohort's cutoff.
 */
export function binnedDataSheet(content: AnnexContent): SheetBuilder {
  return new SheetBuilder('Binned data').singleTable(COLUMNS, content.results.flatMap(chartPoints), 3);
}

/** The chart points of one result, in chart order. */
export function chartPoints(r: AnnexResult): ChartPoint[] {
  const none = { scoreLow: null, scoreHigh: null, score: null, n: null, outcomeMean: null, takeUpMean: null, value: null };
  const out: ChartPoint[] = r.bins.map((b) => ({
    ...none,
    r,
    chart: `plot bins (evenly spaced, ${BINS_PER_SIDE} a side)`,
    kind: 'bin',
    side: b.side,
    scoreLow: b.low,
    scoreHigh: b.high,
    score: (b.low + b.high) / 2,
    n: b.n,
    outcomeMean: b.outcomeMean,
    takeUpMean: b.takeUpMean,
  }));
  const d = r.diagnostics;
  const series = (variable: 'outcome' | 'take-up', s: ChartSeries | null | undefined) => {
    if (!s) return;
    for (const spaced of [s.evenlySpaced, s.quantileSpaced]) {
      const chart = `${variable}, ${spaced.spacing.replace('-', ' ')} bins`;
      for (const b of spaced.bins) {
        out.push({ ...none, r, chart, kind: 'bin', side: b.side, scoreLow: b.scoreLow, scoreHigh: b.scoreHigh, score: b.scoreMean, n: b.n, value: b.mean });
      }
    }
    for (const side of ['ineligible', 'eligible'] as const) {
      for (const f of s.fit[side]) out.push({ ...none, r, chart: `${variable}, fitted line`, kind: 'fit', side, score: f.score, value: f.value });
    }
  };
  series('outcome', d?.bins?.outcome);
  series('take-up', d?.bins?.takeUp);
  const plot = d?.density?.plot;
  if (plot) {
    for (const h of plot.histogram) {
      out.push({ ...none, r, chart: 'score density, histogram', kind: 'bin', side: h.side, scoreLow: h.score - plot.binWidth / 2, scoreHigh: h.score + plot.binWidth / 2, score: h.score, n: h.count, value: h.height });
    }
    for (const side of ['ineligible', 'eligible'] as const) {
      for (const p of plot[side]) out.push({ ...none, r, chart: 'score density, smoothed', kind: 'density', side, score: p.score, value: p.density });
    }
  }
  return out;
}
