import type { Rng } from '../random/rng';
import { createRng } from '../random/rng';
import { DiagnosticError } from './errors';

/** Default balance threshold for window selection: p > 0.15 (Cattaneo, Frandsen & Titiunik 2015; from memory). */
export const WINDOW_BALANCE_P = 0.15;
/** Fewest observations per side a window must hold (common practice, no source). */
export const MIN_WINDOW_PER_SIDE = 10;
/** Candidate windows tried at most. */
const MAX_WINDOWS = 20;

export interface LocalRandomizationOptions {
  /** Permutations (Monte Carlo); exact enumeration is used instead when it needs no more. Default 2,000. */
  permutations?: number;
  /** Start value of the random stream, so results repeat. Default 1. */
  start?: number;
  /** Largest half-window considered, score units (e.g. the estimate's bandwidth). Default: the whole range. */
  maxWindow?: number;
  /** Balance threshold. Default 0.15. */
  balanceP?: number;
  /** Confidence level of the effect interval. Default 0.95. */
  level?: number;
  /**
   * Work kept between calls on the same scores and covariates with the same permutations and start
   * (`newLocalRandomizationShare`): neither the windows' balance nor the relabellings depend on the
   * outcome, so one scope's outcomes draw them once.
   */
  share?: LocalRandomizationShare;
}

/** See `LocalRandomizationOptions.share`. */
export interface LocalRandomizationShare {
  /** Smallest covariate balance p by window. */
  balances: Map<number, number>;
  /** Relabellings by window and start. */
  relabellings: Map<string, Relabellings>;
}

export function newLocalRandomizationShare(): LocalRandomizationShare {
  return { balances: new Map(), relabellings: new Map() };
}

export interface WindowBalance {
  /** Half-width w of the window |t| ≤ w, score units. */
  window: number;
  nIneligible: number;
  nEligible: number;
  /** Smallest covariate balance p-value in the window (null without covariates). */
  minBalanceP: number | null;
}

export interface LocalRandomizationResult {
  /** How the window was chosen. */
  windowRule: 'covariate-balance' | 'smallest-usable';
  /** Half-width of the chosen window, score units. */
  window: number;
  nIneligible: number;
  nEligible: number;
  /** Eligible minus ineligible mean outcome (the effect of being eligible). */
  itt: number;
  /** Permutation p-value of the difference in means (two-sided). */
  ittP: number;
  /** Fuzzy: difference in mean take-up. */
  firstStage: number | null;
  /** Fuzzy: itt / firstStage (Wald ratio); sharp: itt. */
  effect: number | null;
  /** Interval for a constant effect by inverting the permutation test; null ends mean unbounded. */
  ciLow: number | null;
  ciHigh: number | null;
  /** Permutations used, and whether they were all C(n, n_eligible) assignments. */
  permutations: number;
  exact: boolean;
  /** Every candidate window with its balance (nested, smallest first). */
  windows: WindowBalance[];
}

/**
 * Local-randomization analysis (Cattaneo, Frandsen & Titiunik 2015, J. Causal Inference 3(1);
 * METHODS §10): inside a small window around the cutoff, treat eligibility as if assigned at random
 * with the observed number eligible, and test by permuting eligibility labels.
 *
 * Window: nested symmetric windows |t| ≤ w from the smallest holding 10 per side outward (at the
 * distinct distances when the score is discrete). With covariates, the chosen window is the largest
 * such that it and every smaller one pass balance (smallest permutation p over covariates > 0.15);
 * without covariates, or when even the smallest fails, the smallest usable window.
 *
 * Test and interval: with adjusted outcome Ỹ = Y − τ₀D (D = take-up, or eligibility when sharp), the
 * statistic for a relabelling π is a_π − τ₀b_π, where a_π and b_π are the differences in mean Y and
 * D under π; one set of relabellings serves every τ₀, so the interval {τ₀: p(τ₀) > α} is found by a
 * search on τ₀ (Anderson–Rubin-type in the fuzzy case, valid however small the take-up jump).
 * p-values are (1 + #{|T_π| ≥ |T|})/(1 + M) for Monte Carlo relabellings and exact counts / C(n, n₁)
 * when all assignments are enumerated.
 *
 * @param t centred scores (t ≥ 0 eligible).
 * @throws DiagnosticError when no window holds 10 observations on each side.
 */
export function localRandomization(
  data: { t: Float64Array; outcome: Float64Array; takeUp?: Float64Array; covariates?: readonly Float64Array[] },
  options: LocalRandomizationOptions = {},
): LocalRandomizationResult {
  const permutations = options.permutations ?? 2000;
  const balanceP = options.balanceP ?? WINDOW_BALANCE_P;
  const level = options.level ?? 0.95;
  if (!Number.isInteger(permutations) || permutations < 100) throw new RangeError('localRandomization: permutations must be an integer of at least 100');
  const { t } = data;
  const covariates = data.covariates ?? [];
  const windows = candidateWindows(t, options.maxWindow ?? Infinity);
  if (windows.length === 0) {
    throw new DiagnosticError('too_few_observations', `No window around the cutoff holds ${MIN_WINDOW_PER_SIDE} observations on each side.`);
  }
  const checked: WindowBalance[] = [];
  let chosen = 0;
  let passedSoFar = covariates.length > 0;
  for (let w = 0; w < windows.length; w++) {
    const inside = indicesWithin(t, windows[w]!);
    const counts = sideCounts(t, inside);
    let minP: number | null = null;
    if (covariates.length > 0 && passedSoFar) {
      minP = options.share?.balances.get(windows[w]!) ?? null;
      if (minP === null) {
        const draws = relabellings(t, inside, permutations, options.start ?? 1);
        minP = Math.min(...covariates.map((x) => permutationP(draws, x)));
        options.share?.balances.set(windows[w]!, minP);
      }
      if (minP > balanceP) chosen = w;
      else passedSoFar = false;
    }
    checked.push({ window: windows[w]!, nIneligible: counts[0], nEligible: counts[1], minBalanceP: minP });
    if (!passedSoFar && covariates.length > 0 && minP !== null && minP <= balanceP) break;
  }
  const windowRule = covariates.length > 0 && checked[0]!.minBalanceP! > balanceP ? 'covariate-balance' : 'smallest-usable';
  const window = windows[windowRule === 'covariate-balance' ? chosen : 0]!;
  const inside = indicesWithin(t, window);
  const counts = sideCounts(t, inside);
  const drawKey = `${window}|${options.start ?? 2}`;
  const draws = options.share?.relabellings.get(drawKey) ?? relabellings(t, inside, permutations, options.start ?? 2);
  options.share?.relabellings.set(drawKey, draws);
  // Sharp design: D is eligibility itself, so the same interval code applies (its difference is 1).
  const d = data.takeUp ?? Float64Array.from(t, (v) => +(v >= 0));
  const itt = draws.observed(data.outcome);
  const ittP = permutationP(draws, data.outcome);
  const firstStage = data.takeUp ? draws.observed(d) : null;
  const effect = firstStage === null ? itt : Math.abs(firstStage) > 0 ? itt / firstStage : null;
  const interval = effect === null ? { low: null, high: null } : invertTest(draws, data.outcome, d, 1 - level, effect);
  return {
    windowRule,
    window,
    nIneligible: counts[0],
    nEligible: counts[1],
    itt,
    ittP,
    firstStage,
    effect,
    ciLow: interval.low,
    ciHigh: interval.high,
    permutations: draws.count,
    exact: draws.exact,
    windows: checked,
  };
}

/** The relabellings of one window: for each, which positions inside the window count as eligible. */
export interface Relabellings {
  count: number;
  exact: boolean;
  /** Difference in means (eligible − ineligible) of `values` under the observed labels. */
  observed(values: Float64Array): number;
  /** Differences in means of `values` under every relabelling. */
  statistics(values: Float64Array): Float64Array;
}

function relabellings(t: Float64Array, inside: Int32Array, permutations: number, start: number): Relabellings {
  const m = inside.length;
  const eligibleCount = sideCounts(t, inside)[1];
  const exactCount = binomial(m, eligibleCount);
  const exact = exactCount <= permutations;
  const count = exact ? exactCount : permutations;
  // masks[r*m + j] = 1 when position j is eligible under relabelling r.
  const masks = new Uint8Array(count * m);
  if (exact) enumerateCombinations(m, eligibleCount, masks);
  else drawPermutations(m, eligibleCount, count, createRng(start), masks);
  const n1 = eligibleCount;
  const n0 = m - eligibleCount;
  return {
    count,
    exact,
    observed(values) {
      let s1 = 0;
      let s0 = 0;
      for (let j = 0; j < m; j++) {
        const i = inside[j]!;
        if (t[i]! >= 0) s1 += values[i]!;
        else s0 += values[i]!;
      }
      return s1 / n1 - s0 / n0;
    },
    statistics(values) {
      let total = 0;
      const local = new Float64Array(m);
      for (let j = 0; j < m; j++) {
        local[j] = values[inside[j]!]!;
        total += local[j]!;
      }
      const out = new Float64Array(count);
      for (let r = 0; r < count; r++) {
        let s1 = 0;
        const base = r * m;
        for (let j = 0; j < m; j++) s1 += masks[base + j]! * local[j]!;
        out[r] = s1 / n1 - (total - s1) / n0;
      }
      return out;
    },
  };
}

/** Permutation p-value of "no difference in means" for one variable. */
function permutationP(draws: Relabellings, values: Float64Array): number {
  return pValue(draws.statistics(values), null, draws.observed(values), 0, draws.exact);
}

function pValue(a: Float64Array, b: Float64Array | null, observed: number, tau0: number, exact: boolean): number {
  // A relative tolerance so relabellings tied with the observed statistic count as extreme.
  const threshold = Math.abs(observed) * (1 - 1e-12) - 1e-15;
  let extreme = 0;
  for (let r = 0; r < a.length; r++) {
    const v = b ? a[r]! - tau0 * b[r]! : a[r]!;
    extreme += +(Math.abs(v) >= threshold);
  }
  return exact ? extreme / a.length : (1 + extreme) / (1 + a.length);
}

/**
 * {τ₀ : p(τ₀) > α}, where under relabelling π the statistic is a_π − τ₀b_π (a, b: differences in
 * mean outcome and mean D, computed once). Searched outward from the point estimate by doubling
 * steps, then bisection; an end stays null when p > α however far out (unbounded).
 */
function invertTest(draws: Relabellings, y: Float64Array, d: Float64Array, alpha: number, centre: number): { low: number | null; high: number | null } {
  const a = draws.statistics(y);
  const b = draws.statistics(d);
  const ay = draws.observed(y);
  const bd = draws.observed(d);
  const p = (tau0: number) => pValue(a, b, ay - tau0 * bd, tau0, draws.exact);
  if (!(p(centre) > alpha)) return { low: centre, high: centre };
  const scale = Math.max(Math.abs(centre), spread(a) / Math.max(Math.abs(bd), 1e-12), 1e-12);
  const edge = (direction: 1 | -1): number | null => {
    let inner = centre;
    let step = scale / 4;
    while (step <= 1e6 * scale) {
      const outer = centre + direction * step;
      if (!(p(outer) > alpha)) {
        let lo = inner;
        let hi = outer;
        for (let it = 0; it < 60 && Math.abs(hi - lo) > 1e-9 * scale; it++) {
          const mid = (lo + hi) / 2;
          if (p(mid) > alpha) lo = mid;
          else hi = mid;
        }
        return (lo + hi) / 2;
      }
      inner = outer;
      step *= 2;
    }
    return null;
  };
  return { low: edge(-1), high: edge(1) };
}

function spread(values: Float64Array): number {
  let s = 0;
  let s2 = 0;
  for (const v of values) {
    s += v;
    s2 += v * v;
  }
  const mean = s / values.length;
  return Math.sqrt(Math.max(0, s2 / values.length - mean * mean));
}

/**
 * Nested windows up to `maxWindow`, each with ≥ 10 per side: the distinct distances when at most 20
 * lie there (discrete scores), else a geometric grid of 20 from the smallest window to the farthest
 * score, cut at `maxWindow`. The grid does not depend on `maxWindow`, so the outcomes of one scope
 * (each with its own bandwidth) share their windows' balance checks.
 */
function candidateWindows(t: Float64Array, maxWindow: number): number[] {
  const below = Float64Array.from(t.filter((v) => v < 0), (v) => -v).sort();
  const above = Float64Array.from(t.filter((v) => v >= 0)).sort();
  if (below.length < MIN_WINDOW_PER_SIDE || above.length < MIN_WINDOW_PER_SIDE) return [];
  const smallest = Math.max(below[MIN_WINDOW_PER_SIDE - 1]!, above[MIN_WINDOW_PER_SIDE - 1]!);
  const farthest = Math.max(below[below.length - 1]!, above[above.length - 1]!);
  const largest = Math.min(maxWindow, farthest);
  if (smallest > largest) return [];
  const distinct = [...new Set([...below, ...above])].filter((v) => v >= smallest && v <= largest).sort((x, y) => x - y);
  if (distinct.length <= MAX_WINDOWS) return distinct;
  return geometricGrid(smallest, farthest).filter((w) => w <= largest);
}

function geometricGrid(from: number, to: number): number[] {
  const ratio = Math.pow(to / from, 1 / (MAX_WINDOWS - 1));
  const out: number[] = [];
  for (let k = 0; k < MAX_WINDOWS - 1; k++) out.push(from * Math.pow(ratio, k));
  out.push(to);
  return out;
}

function indicesWithin(t: Float64Array, w: number): Int32Array {
  const out: number[] = [];
  for (let i = 0; i < t.length; i++) if (Math.abs(t[i]!) <= w * (1 + 1e-12)) out.push(i);
  return Int32Array.from(out);
}

function sideCounts(t: Float64Array, inside: Int32Array): [number, number] {
  let eligible = 0;
  for (const i of inside) eligible += +(t[i]! >= 0);
  return [inside.length - eligible, eligible];
}

function binomial(n: number, k: number): number {
  let c = 1;
  for (let j = 1; j <= k; j++) {
    c = (c * (n - k + j)) / j;
    if (c > 1e15) return Infinity;
  }
  return Math.round(c);
}

function enumerateCombinations(m: number, k: number, masks: Uint8Array): void {
  const pick = Array.from({ length: k }, (_, j) => j);
  let r = 0;
  for (;;) {
    for (const j of pick) masks[r * m + j] = 1;
    r++;
    let j = k - 1;
    while (j >= 0 && pick[j] === m - k + j) j--;
    if (j < 0) return;
    pick[j]!++;
    for (let q = j + 1; q < k; q++) pick[q] = pick[q - 1]! + 1;
  }
}

/** Random subsets of size k by a partial Fisher–Yates shuffle per relabelling. */
function drawPermutations(m: number, k: number, count: number, rng: Rng, masks: Uint8Array): void {
  const order = Int32Array.from({ length: m }, (_, j) => j);
  for (let r = 0; r < count; r++) {
    for (let j = 0; j < k; j++) {
      const swap = j + rng.int(m - j);
      const tmp = order[j]!;
      order[j] = order[swap]!;
      order[swap] = tmp;
      masks[r * m + order[j]!] = 1;
    }
  }
}
