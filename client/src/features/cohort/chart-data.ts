import type { BinDto, SideLimitsDto } from '@shared/api/results';
import type { DensityView, Fit } from './diagnostics-view';

/** Pure transforms from one month's stored bins and fits to the cohort charts, in score units (cutoff added back). */

export interface XY {
  x: number;
  y: number;
}
export interface BinPoint extends XY {
  n: number;
}
export interface Sides<T> {
  ineligible: T[];
  eligible: T[];
}

/** Bin means at the bins' mid-score; shares scaled by `scale` (100 → percent). Empty bins are left out. */
export function binPoints(bins: readonly BinDto[], which: 'outcome' | 'takeUp', cutoff: number, scale = 1): Sides<BinPoint> {
  const out: Sides<BinPoint> = { ineligible: [], eligible: [] };
  for (const b of bins) {
    const mean = which === 'outcome' ? b.outcomeMean : b.takeUpMean;
    if (mean === null || b.n === 0) continue;
    out[b.side].push({ x: cutoff + (b.low + b.high) / 2, y: mean * scale, n: b.n });
  }
  out.ineligible.sort((a, b) => a.x - b.x);
  out.eligible.sort((a, b) => a.x - b.x);
  return out;
}

/** The estimate's local polynomial on each side, in score units. */
export function fitLines(fit: Fit | null, cutoff: number, scale = 1): Sides<XY> {
  if (!fit) return { ineligible: [], eligible: [] };
  const side = (pts: Fit['eligible']) => pts.map((p) => ({ x: cutoff + p.score, y: p.value * scale })).sort((a, b) => a.x - b.x);
  return { ineligible: side(fit.ineligible), eligible: side(fit.eligible) };
}

/** The fitted values at the cutoff from each side (the two ends of the jump). */
export function limitPoints(limits: SideLimitsDto | null | undefined, which: 'outcome' | 'takeUp', cutoff: number, scale = 1): { ineligible: XY | null; eligible: XY | null } {
  const at = (v: number | null | undefined) => (v === null || v === undefined ? null : { x: cutoff, y: v * scale });
  return { ineligible: at(limits?.ineligible[which]), eligible: at(limits?.eligible[which]) };
}

/** The density histogram and curves in score units. */
export function densitySeries(density: DensityView, cutoff: number): { bars: Array<{ x: number; height: number; side: 'ineligible' | 'eligible' }>; curves: Sides<XY>; binWidth: number } {
  const bars = density.histogram.map((b) => ({ x: cutoff + b.score, height: b.height, side: b.side })).sort((a, b) => a.x - b.x);
  const widths = bars.slice(1).map((b, i) => b.x - bars[i]!.x).filter((w) => w > 0);
  const binWidth = density.mccrary?.binWidth && Number.isFinite(density.mccrary.binWidth) ? density.mccrary.binWidth : widths.length ? Math.min(...widths) : 1;
  const curve = (pts: DensityView['curves']['eligible']) => pts.map((p) => ({ x: cutoff + p.score, y: p.density })).sort((a, b) => a.x - b.x);
  return { bars, curves: { ineligible: curve(density.curves.ineligible), eligible: curve(density.curves.eligible) }, binWidth };
}
