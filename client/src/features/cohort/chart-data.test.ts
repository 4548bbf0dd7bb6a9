import { describe, expect, it } from 'vitest';
import type { BinDto } from '@shared/api/results';
import { binPoints, densitySeries, fitLines, limitPoints } from './chart-data';
import { readDiagnostics } from './diagnostics-view';

describe('month chart transforms', () => {
  const bins: BinDto[] = [
    { side: 'eligible', low: 0, high: 2, n: 10, outcomeMean: 0.2, takeUpMean: 0.7 },
    { side: 'ineligible', low: -2, high: 0, n: 12, outcomeMean: 0.3, takeUpMean: 0.1 },
    { side: 'ineligible', low: -4, high: -2, n: 0, outcomeMean: null, takeUpMean: null },
  ];

  it('puts bin means at their mid-score with the cutoff added back, leaving empty bins out', () => {
    expect(binPoints(bins, 'outcome', 60, 100)).toEqual({ ineligible: [{ x: 59, y: 30, n: 12 }], eligible: [{ x: 61, y: 20, n: 10 }] });
    expect(binPoints(bins, 'takeUp', 60, 100).eligible[0]!.y).toBeCloseTo(70, 10);
  });

  it('shifts fitted lines and limits to the score scale', () => {
    const fit = { ineligible: [{ score: -1, value: 0.3 }, { score: -2, value: 0.35 }], eligible: [{ score: 1, value: 0.2 }] };
    expect(fitLines(fit, 58, 100).ineligible.map((p) => p.x)).toEqual([56, 57]);
    expect(fitLines(null, 58)).toEqual({ ineligible: [], eligible: [] });
    const limits = { ineligible: { outcome: 0.31, takeUp: 0.1 }, eligible: { outcome: 0.22, takeUp: 0.72 } };
    expect(limitPoints(limits, 'takeUp', 58, 100)).toEqual({ ineligible: { x: 58, y: 10 }, eligible: { x: 58, y: 72 } });
    expect(limitPoints(null, 'outcome', 58)).toEqual({ ineligible: null, eligible: null });
  });

  it('reads the stored diagnostics defensively: missing or malformed parts come back empty', () => {
    const view = readDiagnostics({
      density: { mccrary: { theta: 0.1, se: 0.05, z: 2, p: 0.04, h: 10, binWidth: 1 }, localPolynomial: { statistic: 1.2, p: 0.2, h: 8 }, plot: { histogram: [{ score: -0.5, height: 0.02, count: 20, side: 'ineligible' }, { score: 0.5, height: 0.03, count: 30, side: 'eligible' }], ineligible: [], eligible: [{ score: 0, density: 0.03 }] } },
      balance: [{ covariate: 'household_size', jump: 0.1, ciLow: -0.2, ciHigh: 0.4, t: 0.5, p: 0.6, pAdjusted: 0.9, h: 9 }, { nonsense: true }],
      placebo: 'not an array',
      weakFirstStage: { f: 7.3, firstStage: 0.11, tfCiLow: null, tfCiHigh: 2, arShape: 'two-rays', belowRuleOfThumb: true, belowStockYogo: true },
      bins: { outcome: { fit: { ineligible: [{ score: -1, value: 0.3 }], eligible: [] } }, takeUp: null },
    });
    expect(view.density?.mccrary?.p).toBe(0.04);
    expect(view.balance).toEqual([{ covariate: 'household_size', estimate: 0.1, ciLow: -0.2, ciHigh: 0.4, p: 0.6, pAdjusted: 0.9, h: 9 }]);
    expect(view.placebo).toEqual([]);
    expect(view.weakFirstStage).toMatchObject({ f: 7.3, tfCiLow: null, arShape: 'two-rays', belowRuleOfThumb: true });
    expect(view.power).toBeNull();
    expect(view.fits.outcome?.ineligible).toHaveLength(1);
    expect(view.fits.takeUp).toBeNull();
    expect(readDiagnostics(null)).toMatchObject({ density: null, balance: [], sensitivity: [], donut: [], weakFirstStage: null });
    // Histogram in score units, bin width from the McCrary result.
    const d = densitySeries(view.density!, 60);
    expect(d.bars.map((b) => b.x)).toEqual([59.5, 60.5]);
    expect(d.binWidth).toBe(1);
    expect(d.curves.eligible).toEqual([{ x: 60, y: 0.03 }]);
  });
});
