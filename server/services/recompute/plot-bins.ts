import type { BinDto } from '@shared/api/results';
import type { EligibleSide } from '@shared/schemas/program';

/** Bins per side of the stored RD plot (evenly spaced; a fixed count for a readable chart: common practice, no source). */
export const BINS_PER_SIDE = 20;

/**
 * Evenly spaced bins of the centred score on each side (the cutoff is a bin edge), with the mean
 * outcome and take-up in each. Rows with a non-finite outcome are left out.
 */
export function plotBins(centred: Float64Array, outcome: Float64Array, takeUp: Float64Array | null, eligibleSide: EligibleSide): BinDto[] {
  let min = 0;
  let max = 0;
  for (let i = 0; i < centred.length; i++) {
    const x = centred[i]!;
    if (x < min) min = x;
    if (x > max) max = x;
  }
  const below = { lo: min, width: -min / BINS_PER_SIDE };
  const above = { lo: 0, width: max / BINS_PER_SIDE };
  const n = new Float64Array(2 * BINS_PER_SIDE);
  const ySum = new Float64Array(2 * BINS_PER_SIDE);
  const dSum = new Float64Array(2 * BINS_PER_SIDE);
  const dN = new Float64Array(2 * BINS_PER_SIDE);
  for (let i = 0; i < centred.length; i++) {
    const x = centred[i]!;
    const y = outcome[i]!;
    if (!Number.isFinite(x) || !Number.isFinite(y)) continue;
    // A score at the cutoff is eligible: it joins the eligible side's first bin.
    const side = x < 0 || (x === 0 && eligibleSide === 'at-or-below') ? below : above;
    const offset = side === below ? 0 : BINS_PER_SIDE;
    const k = side.width > 0 ? Math.min(BINS_PER_SIDE - 1, Math.floor((x - side.lo) / side.width)) : 0;
    n[offset + k]! += 1;
    ySum[offset + k]! += y;
    const d = takeUp ? takeUp[i]! : Number.NaN;
    if (Number.isFinite(d)) {
      dSum[offset + k]! += d;
      dN[offset + k]! += 1;
    }
  }
  const out: BinDto[] = [];
  for (let j = 0; j < 2 * BINS_PER_SIDE; j++) {
    if (n[j] === 0) continue;
    const side = j < BINS_PER_SIDE ? below : above;
    const k = j % BINS_PER_SIDE;
    const belowCutoff = j < BINS_PER_SIDE;
    const eligible = eligibleSide === 'at-or-above' ? !belowCutoff : belowCutoff;
    out.push({
      side: eligible ? 'eligible' : 'ineligible',
      low: side.lo + k * side.width,
      high: side.lo + (k + 1) * side.width,
      n: n[j]!,
      outcomeMean: ySum[j]! / n[j]!,
      takeUpMean: dN[j]! > 0 ? dSum[j]! / dN[j]! : null,
    });
  }
  return out;
}
