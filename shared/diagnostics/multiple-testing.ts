/**
 * Holm (1979) step-down adjusted p-values: sort ascending, p̃₍ᵢ₎ = max_{j≤i} min(1, (m − j + 1)·p₍ⱼ₎),
 * returned in the input's order. Controls the family-wise error rate; never less powerful than
 * Bonferroni, whose adjusted values are min(1, m·p).
 * @example holmAdjust([0.01, 0.04, 0.03]) // [0.03, 0.06, 0.06]
 */
export function holmAdjust(p: readonly number[]): number[] {
  const m = p.length;
  const order = p.map((_, i) => i).sort((a, b) => p[a]! - p[b]!);
  const out = new Array<number>(m);
  let running = 0;
  order.forEach((i, rank) => {
    running = Math.max(running, Math.min(1, (m - rank) * p[i]!));
    out[i] = running;
  });
  return out;
}

/** Bonferroni adjusted p-values min(1, m·p). */
export function bonferroniAdjust(p: readonly number[]): number[] {
  return p.map((v) => Math.min(1, p.length * v));
}
