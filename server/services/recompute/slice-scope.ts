import type { ScopeData } from './analyzer';
import type { LoadedCohorts } from './recompute-deps';

/**
 * The arrays of the cohorts `periods` out of a joint load. One cohort is a view (no copy); a
 * window is a copy of its segments, end to end.
 * @throws RangeError when a period was not loaded
 */
export function sliceScope(loaded: LoadedCohorts, periods: readonly string[]): ScopeData {
  const segments = periods.map((p) => {
    const s = loaded.segments.find((x) => x.period === p);
    if (!s) throw new RangeError(`sliceScope: cohort ${p} was not loaded`);
    return s;
  });
  const n = segments.reduce((sum, s) => sum + s.length, 0);
  const { data } = loaded;
  const single = segments.length === 1 ? segments[0]! : null;
  const take = <T extends Float64Array | Int32Array>(column: T, make: (n: number) => T): T => {
    if (single) return column.subarray(single.offset, single.offset + single.length) as T;
    const out = make(n);
    let at = 0;
    for (const s of segments) {
      out.set(column.subarray(s.offset, s.offset + s.length), at);
      at += s.length;
    }
    return out;
  };
  const f64 = (c: Float64Array) => take(c, (k) => new Float64Array(k));
  const map = (r: Record<string, Float64Array>) => Object.fromEntries(Object.entries(r).map(([k, v]) => [k, f64(v)]));
  return {
    n,
    centred: f64(data.centred),
    cutoffOf: f64(data.cutoffOf),
    takeUp: data.takeUp ? f64(data.takeUp) : null,
    outcomes: map(data.outcomes),
    covariates: map(data.covariates),
    cluster: data.cluster ? take(data.cluster, (k) => new Int32Array(k)) : null,
  };
}
