import { chooseBandwidths } from './bandwidth';
import { biasCorrectedLimit, conventionalLimit } from './bias-correction';
import { EstimationError } from './errors';
import { firstStageF, weakFirstStageFlags } from './first-stage';
import { formatBandwidth, requireUsableFits } from './fit-checks';
import { fitSides, type SideFit } from './local-polynomial';
import { nearestNeighbourResiduals } from './nearest-neighbour';
import { normalQuantile, twoSidedP } from './normal-distribution';
import { prepareData, type OrientedData } from './oriented-data';
import { resolveOptions, validateData } from './resolve-options';
import type {
  BandwidthResult,
  DiscontinuityData,
  DiscontinuityEstimate,
  DiscontinuityOptions,
  Inference,
  JumpResult,
  ResolvedOptions,
} from './types';
import { functionalCovariance } from './variance';
import { ENGINE_VERSION } from './version';

const SIDE_WORD = ['ineligible', 'eligible'] as const;

/**
 * Sharp or fuzzy regression-discontinuity estimate at a cutoff.
 *
 * - Each side is fitted by weighted local polynomial regression of order p within bandwidth h
 *   (METHODS §1a); the ITT is the jump in the outcome, the first stage the jump in take-up, both
 *   signed eligible minus ineligible. The fuzzy effect is their ratio (Hahn, Todd & van der Klaauw
 *   2001), which equals just-identified weighted 2SLS with side-specific slopes (Imbens & Lemieux
 *   2008 §4.3; checked against R's AER::ivreg in tests/reference).
 * - Conventional variance: HC0–HC3, nearest-neighbour or cluster-robust (see `variance.ts`); the
 *   fuzzy variance is the delta method with the ITT/first-stage covariance,
 *   V(τ̂) = V(â)/b̂² − 2âC(â,b̂)/b̂³ + â²V(b̂)/b̂⁴ (METHODS §2b), identical to the structural-residual form.
 * - Robust bias-corrected inference (Calonico, Cattaneo & Titiunik 2014): each limit is corrected with
 *   an order p + 1 fit at the bias bandwidth b and its variance includes the correction's noise
 *   (`bias-correction.ts`); the fuzzy robust effect is â_bc/b̂_bc with the same delta method.
 * - Bandwidths: given, or chosen by a rule (`bandwidth.ts`).
 * - First-stage F = (b̂/se)², flagged below 10 (Staiger–Stock) and 16.38 (Stock–Yogo, from memory).
 *
 * A score exactly at the cutoff is eligible. Intervals are normal at `level`.
 *
 * @throws TypeError / RangeError for malformed data or options (message starts with the function name).
 * @throws EstimationError when the data admit no estimate (too few observations inside h, singular
 *   fit, no take-up variation, no first stage, no bandwidth).
 * @example
 * estimateDiscontinuity({ score, outcome, takeUp }, { cutoff: 60, eligibleSide: 'at-or-above' })
 */
export function estimateDiscontinuity(data: DiscontinuityData, options: DiscontinuityOptions): DiscontinuityEstimate {
  const fn = 'estimateDiscontinuity';
  validateData(fn, data);
  const resolved = resolveOptions(fn, options, data.cluster !== undefined);
  const fuzzy = data.takeUp !== undefined;
  const oriented = orientData(fn, data, resolved);
  const neighbourResiduals = residualsFor(oriented, resolved);
  const bandwidth = resolveBandwidths(oriented, resolved, neighbourResiduals);
  const p = resolved.order;
  const h: [number, number] = [bandwidth.sides.ineligible.h, bandwidth.sides.eligible.h];
  const b: [number, number] = [bandwidth.sides.ineligible.b, bandwidth.sides.eligible.b];

  const pFits = fitSides(oriented, p, resolved.kernel, h);
  requireUsableFits(pFits, formatBandwidth('h', Math.min(...h)));
  const qFits = fitSides(oriented, p + 1, resolved.kernel, b);
  requireUsableFits(qFits, formatBandwidth('b', Math.min(...b)));
  if (fuzzy) requireTakeUpVariation(pFits);

  const conventional = [conventionalLimit(pFits[0]), conventionalLimit(pFits[1])] as const;
  const corrected = [biasCorrectedLimit(pFits[0], qFits[0]), biasCorrectedLimit(pFits[1], qFits[1])] as const;
  const settings = { kind: resolved.variance, neighbourResiduals };
  const convCov = functionalCovariance(oriented, [conventional[0].functional, conventional[1].functional], settings);
  const rbcCov = functionalCovariance(oriented, [corrected[0].functional, corrected[1].functional], settings);
  const z = normalQuantile(1 - (1 - resolved.level) / 2);
  const cols = fuzzy ? 2 : 1;
  const jumpOf = (limits: typeof conventional, col: number) => limits[1].values[col]! - limits[0].values[col]!;
  const covOf = (cov: Float64Array, a: number, c: number) => cov[a * cols + c]!;

  const itt = jumpResult(jumpOf(conventional, 0), covOf(convCov.jump, 0, 0), jumpOf(corrected, 0), covOf(rbcCov.jump, 0, 0), z);
  let firstStage: DiscontinuityEstimate['firstStage'] = null;
  let effect: DiscontinuityEstimate['effect'];
  let ittFirstStageCovariance = 0;
  if (fuzzy) {
    const fs = jumpResult(jumpOf(conventional, 1), covOf(convCov.jump, 1, 1), jumpOf(corrected, 1), covOf(rbcCov.jump, 1, 1), z);
    const f = firstStageF(fs.jump, fs.se);
    firstStage = { ...fs, f, ...weakFirstStageFlags(f) };
    for (const jump of [fs.jump, fs.robust.estimate]) {
      if (!(Math.abs(jump) > 1e-12)) {
        throw new EstimationError('no_first_stage', 'Take-up does not jump at the cutoff, so the effect on participants (ITT divided by the take-up jump) is undefined.');
      }
    }
    ittFirstStageCovariance = covOf(convCov.jump, 0, 1);
    const conv = ratioInference(itt.jump, fs.jump, convCov.jump, z);
    const robust = ratioInference(itt.robust.estimate, fs.robust.estimate, rbcCov.jump, z);
    effect = { estimate: conv.estimate, se: conv.se, ciLow: conv.ciLow, ciHigh: conv.ciHigh, p: conv.p, robust };
  } else {
    effect = { estimate: itt.jump, se: itt.se, ciLow: itt.ciLow, ciHigh: itt.ciHigh, p: itt.p, robust: itt.robust };
  }

  return {
    engineVersion: ENGINE_VERSION,
    design: fuzzy ? 'fuzzy' : 'sharp',
    options: resolved,
    n: {
      ineligible: oriented.sideCounts[0],
      eligible: oriented.sideCounts[1],
      usedIneligible: pFits[0].used,
      usedEligible: pFits[1].used,
      usedBiasIneligible: qFits[0].used,
      usedBiasEligible: qFits[1].used,
      clusters: oriented.cluster ? rbcCov.clusters : null,
    },
    bandwidth,
    limits: {
      ineligible: { outcome: conventional[0].values[0]!, takeUp: fuzzy ? conventional[0].values[1]! : null },
      eligible: { outcome: conventional[1].values[0]!, takeUp: fuzzy ? conventional[1].values[1]! : null },
    },
    firstStage,
    itt,
    effect,
    ittFirstStageCovariance,
  };
}

/**
 * The bandwidths a rule chooses for one outcome (and take-up, in a fuzzy design), without
 * estimating: for diagnostics that need an outcome's own bandwidth (covariate balance, placebo
 * outcomes). Same options as `estimateDiscontinuity`; a numeric `bandwidth` is returned as given.
 * @throws like `estimateDiscontinuity`.
 */
export function selectBandwidth(data: DiscontinuityData, options: DiscontinuityOptions): BandwidthResult {
  const fn = 'selectBandwidth';
  validateData(fn, data);
  const resolved = resolveOptions(fn, options, data.cluster !== undefined);
  const oriented = orientData(fn, data, resolved);
  return resolveBandwidths(oriented, resolved, residualsFor(oriented, resolved));
}

/**
 * Orients and checks the data. A given bandwidth with a residual-based variance needs only the
 * observations inside max(h, b): those are copied out and every later pass is over them alone.
 * A bandwidth rule needs every observation, binned by distance from the cutoff; the
 * nearest-neighbour variance needs them sorted.
 */
function orientData(fn: string, data: DiscontinuityData, resolved: ResolvedOptions): OrientedData {
  const columns = data.takeUp ? [data.outcome, data.takeUp] : [data.outcome];
  const spec = resolved.bandwidth;
  const neighbours = resolved.variance === 'nearest-neighbour';
  const window = typeof spec === 'number' && !neighbours ? Math.max(spec, resolved.biasBandwidth ?? spec) : null;
  const raw = { score: data.score, columns, cluster: data.cluster ?? null };
  const oriented = prepareData(fn, raw, resolved.cutoff, resolved.eligibleSide, data.takeUp ? 1 : null, window, neighbours ? 'sorted' : 'bucketed');
  for (const s of [0, 1] as const) {
    if (oriented.sideCounts[s] === 0) {
      throw new EstimationError('too_few_observations', `No observation lies on the ${SIDE_WORD[s]} side of the cutoff.`, { side: SIDE_WORD[s], used: 0 });
    }
  }
  return oriented;
}

function residualsFor(oriented: OrientedData, resolved: ResolvedOptions): Float64Array[] | null {
  if (resolved.variance !== 'nearest-neighbour') return null;
  return nearestNeighbourResiduals(oriented, resolved.neighbours);
}

function resolveBandwidths(oriented: OrientedData, resolved: ResolvedOptions, neighbourResiduals: Float64Array[] | null): BandwidthResult {
  const spec = resolved.bandwidth;
  const given = resolved.biasBandwidth;
  if (typeof spec === 'number') {
    const b = given ?? spec;
    return { rule: 'given', h: spec, b, sides: { ineligible: { h: spec, b }, eligible: { h: spec, b } }, pilot: null };
  }
  const choice = chooseBandwidths(oriented, {
    rule: spec.rule,
    order: resolved.order,
    kernel: resolved.kernel,
    variance: resolved.variance,
    neighbourResiduals,
  });
  const b: [number, number] = given === null ? choice.b : [given, given];
  return {
    rule: choice.rule,
    h: Math.min(choice.h[0], choice.h[1]),
    b: Math.min(b[0], b[1]),
    sides: { ineligible: { h: choice.h[0], b: b[0] }, eligible: { h: choice.h[1], b: b[1] } },
    pilot: choice.pilot,
  };
}

/**
 * Throws `no_take_up_variation` when take-up is one value for everyone with weight inside h: for a
 * 0/1 column, Σwd = 0 (all 0) or Σw(1 − d) = 0 (all 1), read from the fits' sums (relative 1e-12
 * for rounding).
 */
function requireTakeUpVariation(fits: readonly [SideFit, SideFit]): void {
  let weight = 0;
  let ones = 0;
  for (const f of fits) {
    weight += f.gram[0]!;
    ones += f.weightedTotals[1]!;
  }
  if (ones > 1e-12 * weight && weight - ones > 1e-12 * weight) return;
  throw new EstimationError('no_take_up_variation', 'Everyone near the cutoff has the same take-up, so there is no first stage to estimate.');
}

function inference(estimate: number, variance: number, z: number): Inference {
  const se = Math.sqrt(Math.max(0, variance));
  const stat = se > 0 ? estimate / se : estimate === 0 ? 0 : Math.sign(estimate) * Number.MAX_VALUE;
  return { estimate, se, ciLow: estimate - z * se, ciHigh: estimate + z * se, z: stat, p: twoSidedP(stat) };
}

function jumpResult(jump: number, variance: number, robustJump: number, robustVariance: number, z: number): JumpResult {
  const conv = inference(jump, variance, z);
  return { jump, se: conv.se, ciLow: conv.ciLow, ciHigh: conv.ciHigh, p: conv.p, robust: inference(robustJump, robustVariance, z) };
}

/**
 * τ̂ = â/b̂ with V(τ̂) = (V(â) − 2τ̂C(â,b̂) + τ̂²V(b̂))/b̂² — the delta method of METHODS §2b; it is
 * algebraically the variance of the structural residual ε̂ʸ − τ̂ε̂ᵈ over b̂² [derived].
 */
function ratioInference(a: number, b: number, cov: Float64Array, z: number): Inference {
  const tau = a / b;
  const variance = (cov[0]! - 2 * tau * cov[1]! + tau * tau * cov[3]!) / (b * b);
  return inference(tau, variance, z);
}
