import type { SideFit } from './local-polynomial';
import { dot, matrixRow } from './small-matrix';
import type { SideFunctional } from './variance';

/** A side's limit at the cutoff as a linear functional, with its value per column. */
export interface SideLimit {
  /** Per column, the estimated limit at the cutoff. */
  values: number[];
  functional: SideFunctional;
}

/** The conventional limit: the intercept of the order p fit at h; residuals from that fit. */
export function conventionalLimit(fit: SideFit): SideLimit {
  const k = fit.order + 1;
  const row = matrixRow(fit.inverse!, 0, k);
  return {
    values: fit.coefficients.map((c) => c[0]!),
    functional: { terms: [{ fit, row }], residualFit: fit },
  };
}

/**
 * The bias-corrected limit of Calonico, Cattaneo & Titiunik (2014, METHODS §3c): the order p
 * intercept at h minus its estimated leading bias, with the (p+1)-th coefficient taken from an
 * order q = p + 1 fit at the bias bandwidth b:
 *
 *   μ̂_bc = μ̂_p(h) − ρ^(p+1) · [e₀ᵀΓ_p⁻¹ϑ_p] · γ̂_(q,p+1)(b),   ρ = h/b,
 *
 * where Γ_p⁻¹ϑ_p regresses u^(p+1) on (1, …, uᵖ) under the h-weights (all sums in scaled units, so
 * γ̂_(q,p+1)(b) = m⁽ᵖ⁺¹⁾b^(p+1)/(p+1)! and ρ^(p+1) turns it into h-units). The weights of this
 * linear estimator are ωᵢ = ℓᵢ(h) − ρ^(p+1)·c·ℓᵢ^(p+1)(b); the robust variance is Σωᵢ²σ̂²ᵢ with
 * residuals of the order q fit at b (the choice under which ρ = 1 reproduces the order q fit's own
 * sandwich exactly — the identity checked in the tests).
 *
 * With b = h (ρ = 1) and the same kernel this is exactly the intercept of the order q fit at h
 * (Frisch–Waugh on r_q = [r_p, u^(p+1)]) [derived].
 */
export function biasCorrectedLimit(pFit: SideFit, qFit: SideFit): SideLimit {
  const p = pFit.order;
  const k = p + 1;
  const rowP = matrixRow(pFit.inverse!, 0, k);
  const c = dot(rowP, pFit.biasMoments);
  const rho = pFit.h / qFit.h;
  const factor = Math.pow(rho, p + 1) * c;
  const rowQ = matrixRow(qFit.inverse!, p + 1, p + 2, -factor);
  return {
    values: pFit.coefficients.map((coef, col) => coef[0]! - factor * qFit.coefficients[col]![p + 1]!),
    functional: { terms: [{ fit: pFit, row: rowP }, { fit: qFit, row: rowQ }], residualFit: qFit },
  };
}
