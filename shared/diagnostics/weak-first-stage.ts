import { normalQuantile, weakFirstStageFlags, type DiscontinuityEstimate } from '../estimation';
import { tfInterval } from './tf-adjustment';
import type { WeakFirstStageResult } from './types';

/**
 * Weak take-up jump (METHODS §6), from a fuzzy engine result:
 * - F, and the Staiger–Stock (10) and Stock–Yogo (16.38, Table 5.2 of Stock & Yogo 2005, one
 *   instrument, 10% maximal size; from memory) flags — the engine's;
 * - the tF interval of Lee, McCrary, Moreira & Porter (2022): conventional estimate ± c(F)·SE at 5%
 *   (the procedure adjusts the conventional Wald t-test, and F is the engine's conventional one);
 * - the Anderson–Rubin interval, valid at any F: {τ₀ : (â − τ₀b̂)² ≤ z²·(V(â) − 2τ₀C(â,b̂) + τ₀²V(b̂))}
 *   with the conventional ITT â, take-up jump b̂, their variances and covariance, at the analysis
 *   level. Solving the quadratic gives an interval when b̂² > z²V(b̂) (F > z²), else two rays or
 *   the whole line [derived].
 * @returns null for a sharp design.
 */
export function weakFirstStage(result: DiscontinuityEstimate): WeakFirstStageResult | null {
  const fs = result.firstStage;
  if (!fs) return null;
  const tf = tfInterval(result.effect.estimate, result.effect.se, fs.f);
  const z = normalQuantile(1 - (1 - result.options.level) / 2);
  const ar = andersonRubin(result.itt.jump, fs.jump, result.itt.se ** 2, fs.se ** 2, result.ittFirstStageCovariance, z);
  const flags = weakFirstStageFlags(fs.f);
  return {
    f: fs.f,
    firstStage: fs.jump,
    tfCiLow: tf.ciLow,
    tfCiHigh: tf.ciHigh,
    tfCritical: tf.critical,
    tfFactor: tf.factor,
    tfBasis: tf.basis,
    arCiLow: ar.low,
    arCiHigh: ar.high,
    arShape: ar.shape,
    belowRuleOfThumb: flags.belowRuleOfThumb,
    belowStockYogo: flags.belowStockYogo,
  };
}

/**
 * Anderson–Rubin set for τ from the reduced form a, first stage b, their variances va, vb and
 * covariance c: solve A τ² − 2B τ + C ≤ 0 with A = b² − z²vb, B = ab − z²c, C = a² − z²va.
 * For `two-rays`, low and high are the inner ends: the set is (−∞, low] ∪ [high, ∞).
 */
export function andersonRubin(a: number, b: number, va: number, vb: number, c: number, z: number): { low: number | null; high: number | null; shape: 'interval' | 'two-rays' | 'everything' } {
  const z2 = z * z;
  const qa = b * b - z2 * vb;
  const qb = a * b - z2 * c;
  const qc = a * a - z2 * va;
  const disc = qb * qb - qa * qc;
  if (qa > 0) {
    // τ̂ = a/b makes the left side 0, so the discriminant is non-negative here.
    const root = Math.sqrt(Math.max(0, disc));
    return { low: (qb - root) / qa, high: (qb + root) / qa, shape: 'interval' };
  }
  if (disc > 0 && qa < 0) {
    const root = Math.sqrt(disc);
    const r1 = (qb + root) / qa;
    const r2 = (qb - root) / qa;
    return { low: Math.min(r1, r2), high: Math.max(r1, r2), shape: 'two-rays' };
  }
  return { low: null, high: null, shape: 'everything' };
}
