/**
 * Work shared by the `runDiagnostics` calls of one scope — one call per outcome on the same
 * applicants. The density tests, covariate balance and the local-randomization window balance do
 * not depend on the outcome, so the recompute computes them once per scope instead of once per
 * outcome. Each entry is kept with the inputs it was computed from (compared by identity: arrays
 * must be the same objects, unchanged) and recomputed when they differ, so a memo can never
 * return a result for other data.
 */
export interface DiagnosticsMemo {
  readonly entries: Map<string, { basis: readonly unknown[]; value: unknown }>;
}

export function createDiagnosticsMemo(): DiagnosticsMemo {
  return { entries: new Map() };
}

/** `compute()`, or the value kept under `key` when it was computed from the same `basis`. */
export function remember<T>(memo: DiagnosticsMemo | undefined, key: string, basis: readonly unknown[], compute: () => T): T {
  if (!memo) return compute();
  const kept = memo.entries.get(key);
  if (kept && kept.basis.length === basis.length && kept.basis.every((b, i) => Object.is(b, basis[i]))) return kept.value as T;
  const value = compute();
  memo.entries.set(key, { basis, value });
  return value;
}
