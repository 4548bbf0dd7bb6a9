import { isConstant, standardDeviation, subtractScaled } from './array-passes';
import { ikBandwidth } from './bandwidth-ik';
import { mseBandwidths, PLUG_IN_STAGES } from './bandwidth-mse';
import { EstimationError } from './errors';
import { fitsUsable } from './fit-checks';
import { fitSides } from './local-polynomial';
import { withColumns, type OrientedData } from './oriented-data';
import type { BandwidthPilot, BandwidthRule, KernelName, VarianceKind } from './types';

/** Bandwidths chosen by a rule, per side (ineligible, eligible), score units. */
export interface BandwidthChoice {
  rule: BandwidthRule;
  h: [number, number];
  b: [number, number];
  pilot: BandwidthPilot;
}

export interface BandwidthSettings {
  rule: BandwidthRule;
  order: number;
  kernel: KernelName;
  variance: VarianceKind;
  /** Nearest-neighbour residuals of each data column (nearest-neighbour variance only). */
  neighbourResiduals: readonly Float64Array[] | null;
}

/**
 * Shrink factor of the coverage-error-optimal rule of thumb, h_CER = h_MSE·n^(−p/((3+p)(3+2p)))
 * (Calonico, Cattaneo & Farrell; METHODS §3d: verified for p = 1 — 500^(−1/20) = 0.733 is their
 * 27% — and derived for other p).
 */
export function coverageShrink(n: number, order: number): number {
  return Math.pow(n, -order / ((3 + order) * (3 + 2 * order)));
}

/**
 * Pilot bandwidth 1.84·S·n^(−1/5) (Imbens & Kalyanaraman's step 1, METHODS §3b; S the standard
 * deviation of the score), widened by half at a time until both sides have enough observations for
 * the deepest local fit of the MSE rule, order p + PLUG_IN_STAGES (common practice, no source).
 */
export function pilotBandwidth(data: OrientedData, order: number, kernel: KernelName): number {
  const { t, n } = data;
  const sd = standardDeviation(t);
  const cap = Math.max(data.sideRanges[0], data.sideRanges[1]);
  let h = Math.min(cap, 1.84 * sd * Math.pow(n, -0.2));
  const probe = withColumns(data, []);
  for (let attempt = 0; attempt < 60; attempt++) {
    if (h > 0 && fitsUsable(fitSides(probe, order + PLUG_IN_STAGES, kernel, [h, h]))) return h;
    if (h >= cap) break;
    h = Math.min(cap, h > 0 ? h * 1.5 : cap);
  }
  throw new EstimationError(
    'too_few_observations',
    'A side of the cutoff has too few observations with distinct scores to choose a bandwidth from the data.',
  );
}

/**
 * Chooses (h, b) by a rule. A fuzzy design (columns [outcome, takeUp]) is reduced to the
 * pseudo-outcome y − τ̃·d with τ̃ the ratio at the pilot bandwidth: the MSE of the ratio's
 * linearisation (â − τb̂)/b is the MSE of that combination's jump over b², and b² does not move the
 * minimiser (METHODS §3b, fuzzy IK) [derived]. Any single outcome (a covariate, a placebo outcome)
 * can be passed alone.
 */
export function chooseBandwidths(data: OrientedData, settings: BandwidthSettings): BandwidthChoice {
  const { rule, order, kernel } = settings;
  if (!data.complete) throw new RangeError('chooseBandwidths: needs every observation, not a window copy');
  const pilot = pilotBandwidth(data, order, kernel);
  let single = data;
  let residuals = settings.neighbourResiduals;
  let ratio: number | null = null;
  if (data.columns.length === 2) {
    const fits = fitSides(data, order, kernel, [pilot, pilot]);
    const ittJump = fits[1].coefficients[0]![0]! - fits[0].coefficients[0]![0]!;
    const firstStage = fits[1].coefficients[1]![0]! - fits[0].coefficients[1]![0]!;
    if (!(Math.abs(firstStage) > 1e-12)) {
      throw new EstimationError('no_first_stage', 'Take-up does not jump at the cutoff within the pilot bandwidth, so no bandwidth can be chosen for the ratio.');
    }
    ratio = ittJump / firstStage;
    const [y, d] = data.columns as [Float64Array, Float64Array];
    single = withColumns(data, [subtractScaled(y, d, ratio, new Float64Array(data.n))]);
    if (residuals) {
      const [ey, ed] = residuals as [Float64Array, Float64Array];
      residuals = [subtractScaled(ey, ed, ratio, new Float64Array(data.n))];
    }
  } else if (data.columns.length !== 1) {
    throw new RangeError('chooseBandwidths: expected one or two columns');
  }
  if (isConstant(single.columns[0]!)) {
    throw new EstimationError(
      'bandwidth_undefined',
      'The outcome does not vary, so no bandwidth can be chosen from the data; give a bandwidth instead.',
    );
  }
  const variance = { kind: settings.variance, neighbourResiduals: residuals };
  const mse = mseBandwidths(single, order, kernel, variance, pilot);
  const both = (v: number): [number, number] => [v, v];
  const pilotInfo = { h: pilot, ratio };
  switch (rule) {
    case 'mse':
      return { rule, h: both(mse.common.h), b: both(mse.common.b), pilot: pilotInfo };
    case 'mse-per-side':
      return { rule, h: mse.perSide.h, b: mse.perSide.b, pilot: pilotInfo };
    case 'coverage':
      return { rule, h: both(mse.common.h * coverageShrink(data.n, order)), b: both(mse.common.b), pilot: pilotInfo };
    case 'ik':
      if (order !== 1) throw new RangeError('chooseBandwidths: the Imbens–Kalyanaraman rule is for local linear fits (order 1)');
      return { rule, h: both(ikBandwidth(single, kernel, pilot)), b: both(mse.common.b), pilot: pilotInfo };
  }
}

