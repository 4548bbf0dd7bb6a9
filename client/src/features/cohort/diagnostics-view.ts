/**
 * A careful reading of the stored diagnostics (`OutcomeResultDetailDto.diagnostics`, the JSON of
 * `runDiagnostics` in shared/diagnostics). Each part is read only when it has the expected shape,
 * so a result stored before a diagnostic existed shows "not run" for it instead of breaking the page.
 * Positions are score minus the cohort's cutoff (the recompute estimates every scope at cutoff 0).
 */

export interface IntervalRow {
  estimate: number;
  ciLow: number | null;
  ciHigh: number | null;
  p: number | null;
}
export interface DensityView {
  mccrary: { theta: number; se: number; z: number; p: number; h: number; binWidth: number } | null;
  localPolynomial: { statistic: number; p: number; h: number } | null;
  histogram: Array<{ score: number; height: number; count: number; side: 'ineligible' | 'eligible' }>;
  curves: { ineligible: Array<{ score: number; density: number }>; eligible: Array<{ score: number; density: number }> };
}
export interface BalanceView extends IntervalRow {
  covariate: string;
  pAdjusted: number | null;
  h: number | null;
}
export interface PlaceboView extends IntervalRow {
  cutoff: number;
  side: string;
  pAdjusted: number | null;
}
export interface SensitivityView extends IntervalRow {
  h: number;
  multiple: number | null;
  rule: string;
}
export interface DonutView extends IntervalRow {
  radius: number;
  dropped: number;
}
export interface WeakFirstStageView {
  f: number;
  firstStage: number;
  tfCiLow: number | null;
  tfCiHigh: number | null;
  tfFactor: number | null;
  arCiLow: number | null;
  arCiHigh: number | null;
  arShape: string;
  belowRuleOfThumb: boolean;
  belowStockYogo: boolean;
}
export interface PowerView {
  alpha: number;
  power: number;
  n: number;
  mdeItt: number;
  mdeEffect: number | null;
  targetEffect: number | null;
  nForTarget: number | null;
}
export type Fit = { ineligible: Array<{ score: number; value: number }>; eligible: Array<{ score: number; value: number }> };

export interface DiagnosticsView {
  density: DensityView | null;
  balance: BalanceView[];
  placebo: PlaceboView[];
  sensitivity: SensitivityView[];
  donut: DonutView[];
  weakFirstStage: WeakFirstStageView | null;
  power: PowerView | null;
  fits: { outcome: Fit | null; takeUp: Fit | null };
}

type Obj = Record<string, unknown>;
const isObj = (v: unknown): v is Obj => typeof v === 'object' && v !== null && !Array.isArray(v);
const num = (v: unknown): number | null => (typeof v === 'number' && Number.isFinite(v) ? v : null);
const arr = (v: unknown): Obj[] => (Array.isArray(v) ? v.filter(isObj) : []);

function interval(o: Obj): IntervalRow | null {
  const estimate = num(o.estimate ?? o.jump);
  if (estimate === null) return null;
  return { estimate, ciLow: num(o.ciLow), ciHigh: num(o.ciHigh), p: num(o.p) };
}

function fit(v: unknown): Fit | null {
  if (!isObj(v)) return null;
  const side = (s: unknown) => arr(s).flatMap((p) => (num(p.score) !== null && num(p.value) !== null ? [{ score: p.score as number, value: p.value as number }] : []));
  const f = { ineligible: side(v.ineligible), eligible: side(v.eligible) };
  return f.ineligible.length + f.eligible.length > 0 ? f : null;
}

export function readDiagnostics(raw: Record<string, unknown> | null): DiagnosticsView {
  const d: Obj = raw ?? {};
  const density = isObj(d.density) ? readDensity(d.density) : null;
  const bins = isObj(d.bins) ? d.bins : {};
  return {
    density,
    balance: arr(d.balance).flatMap((r) => {
      const i = interval(r);
      return i && typeof r.covariate === 'string' ? [{ ...i, covariate: r.covariate, pAdjusted: num(r.pAdjusted), h: num(r.h) }] : [];
    }),
    placebo: arr(d.placebo).flatMap((r) => {
      const i = interval(r);
      return i && num(r.cutoff) !== null ? [{ ...i, cutoff: r.cutoff as number, side: String(r.side ?? ''), pAdjusted: num(r.pAdjusted) }] : [];
    }),
    sensitivity: arr(d.sensitivity).flatMap((r) => {
      const i = interval(r);
      return i && num(r.h) !== null ? [{ ...i, h: r.h as number, multiple: num(r.multiple), rule: String(r.rule ?? 'grid') }] : [];
    }),
    donut: arr(d.donut).flatMap((r) => {
      const i = interval(r);
      return i && num(r.radius) !== null ? [{ ...i, radius: r.radius as number, dropped: num(r.dropped) ?? 0 }] : [];
    }),
    weakFirstStage: isObj(d.weakFirstStage) && num(d.weakFirstStage.f) !== null ? readWeak(d.weakFirstStage) : null,
    power: isObj(d.power) && num(d.power.mdeItt) !== null ? readPower(d.power) : null,
    fits: { outcome: isObj(bins.outcome) ? fit(bins.outcome.fit) : null, takeUp: isObj(bins.takeUp) ? fit(bins.takeUp.fit) : null },
  };
}

function readDensity(o: Obj): DensityView {
  const m = isObj(o.mccrary) ? o.mccrary : null;
  const lp = isObj(o.localPolynomial) ? o.localPolynomial : null;
  const plot = isObj(o.plot) ? o.plot : {};
  const curve = (v: unknown) => arr(v).flatMap((p) => (num(p.score) !== null && num(p.density) !== null ? [{ score: p.score as number, density: p.density as number }] : []));
  return {
    mccrary:
      m && num(m.theta) !== null
        ? { theta: m.theta as number, se: num(m.se) ?? NaN, z: num(m.z) ?? NaN, p: num(m.p) ?? NaN, h: num(m.h) ?? NaN, binWidth: num(m.binWidth) ?? NaN }
        : null,
    localPolynomial: lp && num(lp.p) !== null ? { statistic: num(lp.statistic) ?? NaN, p: lp.p as number, h: num(lp.h) ?? NaN } : null,
    histogram: arr(plot.histogram).flatMap((b) =>
      num(b.score) !== null && num(b.height) !== null ? [{ score: b.score as number, height: b.height as number, count: num(b.count) ?? 0, side: b.side === 'eligible' ? ('eligible' as const) : ('ineligible' as const) }] : [],
    ),
    curves: { ineligible: curve(plot.ineligible), eligible: curve(plot.eligible) },
  };
}

function readWeak(o: Obj): WeakFirstStageView {
  return {
    f: o.f as number,
    firstStage: num(o.firstStage) ?? NaN,
    tfCiLow: num(o.tfCiLow),
    tfCiHigh: num(o.tfCiHigh),
    tfFactor: num(o.tfFactor),
    arCiLow: num(o.arCiLow),
    arCiHigh: num(o.arCiHigh),
    arShape: String(o.arShape ?? 'interval'),
    belowRuleOfThumb: o.belowRuleOfThumb === true,
    belowStockYogo: o.belowStockYogo === true,
  };
}

function readPower(o: Obj): PowerView {
  return {
    alpha: num(o.alpha) ?? 0.05,
    power: num(o.power) ?? 0.8,
    n: num(o.n) ?? NaN,
    mdeItt: o.mdeItt as number,
    mdeEffect: num(o.mdeEffect),
    targetEffect: num(o.targetEffect),
    nForTarget: num(o.nForTarget),
  };
}
