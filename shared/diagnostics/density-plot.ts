import type { EligibleSide } from '../schemas/program';
import { scoreAt } from './centred-score';
import { densityHistogram, smoothHistogram } from './density-mccrary';
import type { DensityPlot, DensityPoint } from './types';

/** Points per side of the plotted density curve. */
const CURVE_POINTS = 30;

/**
 * What the density chart draws: McCrary's histogram and its local-linear smooth on each side
 * (each side smoothed from its own bins only, so the curve may jump at the cutoff), evaluated at
 * evenly spaced points from the cutoff to the side's last bin. Score units throughout.
 */
export function densityPlot(t: Float64Array, h: number, placement: { cutoff: number; eligibleSide: EligibleSide }, minimumBinWidth = 0): DensityPlot {
  const histogram = densityHistogram(t, minimumBinWidth);
  const at = (v: number) => scoreAt(v, placement.cutoff, placement.eligibleSide);
  const curve = (bins: typeof histogram.eligible, direction: 1 | -1): DensityPoint[] => {
    const reach = bins.length * histogram.binWidth;
    const points: DensityPoint[] = [];
    for (let k = 0; k < CURVE_POINTS; k++) {
      const position = direction * (k / (CURVE_POINTS - 1)) * reach;
      const density = smoothHistogram(bins, position, h);
      if (density !== null) points.push({ score: at(position), density: Math.max(0, density) });
    }
    return points;
  };
  const cells = [
    ...histogram.ineligible.map((b) => ({ score: at(b.t), height: b.height, count: b.count, side: 'ineligible' as const })),
    ...histogram.eligible.map((b) => ({ score: at(b.t), height: b.height, count: b.count, side: 'eligible' as const })),
  ].sort((a, b) => a.score - b.score);
  return { histogram: cells, binWidth: histogram.binWidth, ineligible: curve(histogram.ineligible, -1), eligible: curve(histogram.eligible, 1) };
}
