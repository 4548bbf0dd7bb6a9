import { describe, expect, it } from 'vitest';
import { applyCaveats } from './apply-caveats';
import { CAVEAT_RULES } from './rules';
import type { CaveatInput } from './types';

/** A result with nothing wrong: every triggered rule must stay silent on it. */
function cleanInput(): CaveatInput {
  const row = { estimate: -0.1, ciLow: -0.2, ciHigh: 0.0, p: 0.5, h: 10 };
  return {
    design: 'fuzzy',
    cutoff: 60,
    eligibleSide: 'at-or-above',
    population: 'households',
    outcomesTested: 1,
    covariateLabels: { household_size: 'household size' },
    estimate: { itt: -0.06, effect: -0.1, effectCiLow: -0.18, effectCiHigh: -0.02, effectP: 0.01, firstStage: 0.6 },
    notRun: [],
    findings: {
      density: {
        mccrary: { theta: 0.02, se: 0.1, z: 0.2, p: 0.84, densityIneligible: 0.02, densityEligible: 0.02, binWidth: 0.8, h: 15 },
        localPolynomial: { statistic: 0.3, p: 0.76, densityIneligible: 0.02, densityEligible: 0.02, h: 15, usedIneligible: 600, usedEligible: 600 },
        plot: { histogram: [], binWidth: 0.8, ineligible: [], eligible: [] },
      },
      heaping: {
        distinctValues: 800,
        step: 0.1,
        distinctNearCutoff: { ineligible: 200, eligible: 200 },
        window: 10,
        discrete: false,
        roundValues: [{ base: 1, share: 0.1, count: 260, expected: 255, ratio: 1.02, p: 0.4 }],
        atCutoff: { score: 60, count: 3, neighbourMean: 3, ratio: 1, p: 0.6 },
        nearCutoff: [],
      },
      balance: [{ covariate: 'household_size', jump: 0.1, ciLow: -0.2, ciHigh: 0.4, t: 0.6, p: 0.55, pAdjusted: 0.55, h: 12 }],
      placebo: [
        { cutoff: 45, side: 'ineligible', ...row, pAdjusted: 1 },
        { cutoff: 75, side: 'eligible', ...row, pAdjusted: 1 },
      ],
      sensitivity: [
        { h: 5, multiple: 0.5, rule: 'grid', estimate: -0.12, ciLow: -0.3, ciHigh: 0.05, p: 0.2 },
        { h: 10, multiple: 1, rule: 'grid', estimate: -0.1, ciLow: -0.18, ciHigh: -0.02, p: 0.01 },
        { h: 20, multiple: 2, rule: 'grid', estimate: -0.09, ciLow: -0.15, ciHigh: -0.03, p: 0.004 },
      ],
      donut: [{ radius: 0.5, dropped: 12, estimate: -0.11, ciLow: -0.2, ciHigh: -0.01, p: 0.03, h: 10 }],
      weakFirstStage: {
        f: 180, firstStage: 0.6, tfCiLow: -0.17, tfCiHigh: -0.03, tfCritical: 1.96, tfFactor: 1, tfBasis: 'no-adjustment',
        arCiLow: -0.18, arCiHigh: -0.02, arShape: 'interval', belowRuleOfThumb: false, belowStockYogo: false,
      },
      localRandomization: null,
      bins: null,
      power: {
        alpha: 0.05, power: 0.8, multiplier: 2.8, designEffect: 4.8, n: 1500, eligibleShare: 0.5, outcomeSd: 1, rSquared: 0,
        takeUpJump: 0.6, seItt: 0.11, mdeItt: 0.32, mdeEffect: 0.53, designEffectBasis: 'test', kernel: 'triangular', targetEffect: null, nForTarget: null,
      },
    },
  };
}

/** One constructed case per triggered rule: the smallest change to the clean result that should fire it. */
const CASES: Record<string, (input: CaveatInput) => void> = {
  weak_take_up_jump: (i) => Object.assign(i.findings.weakFirstStage!, { f: 6.2 }),
  take_up_jump_widens_interval: (i) => Object.assign(i.findings.weakFirstStage!, { f: 40, tfCiLow: -0.2, tfCiHigh: 0.01 }),
  score_density_jump: (i) => {
    Object.assign(i.findings.density!.mccrary, { p: 0.01, theta: 0.4 });
    Object.assign(i.findings.density!.localPolynomial, { p: 0.02 });
  },
  score_density_jump_one_test: (i) => Object.assign(i.findings.density!.localPolynomial, { p: 0.03 }),
  scores_piled_at_cutoff: (i) => Object.assign(i.findings.heaping!, { atCutoff: { score: 60, count: 40, neighbourMean: 4, ratio: 10, p: 1e-9 } }),
  scores_piled_on_round_numbers: (i) => Object.assign(i.findings.heaping!.roundValues[0]!, { ratio: 2.4, p: 1e-6 }),
  few_score_values_near_cutoff: (i) => Object.assign(i.findings.heaping!, { discrete: true, distinctNearCutoff: { ineligible: 4, eligible: 5 } }),
  covariate_differs: (i) => Object.assign(i.findings.balance[0]!, { p: 0.03, pAdjusted: 0.06 }),
  covariates_differ_jointly: (i) => Object.assign(i.findings.balance[0]!, { p: 0.001, pAdjusted: 0.002 }),
  jumps_at_false_cutoffs: (i) => Object.assign(i.findings.placebo[0]!, { p: 0.001, pAdjusted: 0.002, estimate: 0.4 }),
  depends_on_window_width: (i) => Object.assign(i.findings.sensitivity[0]!, { estimate: -0.4 }),
  depends_on_scores_at_cutoff: (i) => Object.assign(i.findings.donut[0]!, { estimate: 0.05 }),
  several_outcomes_tested: (i) => Object.assign(i, { outcomesTested: 3 }),
  small_effects_undetectable: (i) => Object.assign(i.estimate!, { effectP: 0.4 }),
  check_not_run: (i) => Object.assign(i, { notRun: [{ check: 'score density check', code: 'too_few_observations', reason: 'Too few scores near the cutoff.' }] }),
};

const STANDING = CAVEAT_RULES.filter((r) => r.standing).map((r) => r.code);

describe('caveat rules', () => {
  it('has a constructed case for every rule that is not standing, and unique codes', () => {
    expect(Object.keys(CASES).sort()).toEqual(CAVEAT_RULES.filter((r) => !r.standing).map((r) => r.code).sort());
    expect(new Set(CAVEAT_RULES.map((r) => r.code)).size).toBe(CAVEAT_RULES.length);
  });

  it('gives only the standing cautions on a clean result', () => {
    expect(applyCaveats(cleanInput()).map((c) => c.code)).toEqual(STANDING);
  });

  it('drops the eligibility-versus-participation caution for a sharp design only', () => {
    const sharp = cleanInput();
    sharp.design = 'sharp';
    sharp.findings.weakFirstStage = null;
    expect(applyCaveats(sharp).map((c) => c.code)).toEqual(STANDING.filter((c) => c !== 'eligibility_versus_participation'));
  });

  for (const [code, construct] of Object.entries(CASES)) {
    it(`fires ${code} on its constructed case, with the triggering numbers`, () => {
      const input = cleanInput();
      construct(input);
      const caveats = applyCaveats(input);
      const hit = caveats.find((c) => c.code === code);
      expect(hit, `${code} should fire`).toBeDefined();
      expect(hit!.severity).toBe(CAVEAT_RULES.find((r) => r.code === code)!.severity);
      expect(Object.keys(hit!.values).length).toBeGreaterThan(0);
      expect(hit!.message).toMatch(/^[A-Z0-9].*[.)]$/s);
      for (const s of STANDING) expect(caveats.map((c) => c.code)).toContain(s);
    });
  }

  it('words the weak take-up caveat plainly, with the number that triggered it', () => {
    const input = cleanInput();
    CASES.weak_take_up_jump!(input);
    expect(applyCaveats(input)[0]).toEqual({
      code: 'weak_take_up_jump',
      severity: 'serious',
      message: 'The take-up jump is small (F = 6.2), so the effect on participants is imprecise and may be biased; read the effect of being eligible instead.',
      values: { f: 6.2 },
    });
  });

  it('says which side has the extra scores, in the program’s direction', () => {
    const input = cleanInput();
    CASES.score_density_jump!(input);
    const above = applyCaveats(input).find((c) => c.code === 'score_density_jump')!;
    expect(above.message).toBe(
      'More households sit just above the cutoff than just below (p = 0.02): scores may have been adjusted to reach eligibility, so the estimate may be biased.',
    );
    input.eligibleSide = 'at-or-below';
    expect(applyCaveats(input).find((c) => c.code === 'score_density_jump')!.message).toMatch(/^More households sit just below the cutoff than just above/);
  });

  it('offers the local-randomization comparison for a discrete score, never clustering', () => {
    const input = cleanInput();
    CASES.few_score_values_near_cutoff!(input);
    input.findings.localRandomization = {
      windowRule: 'smallest-usable', window: 2, nIneligible: 40, nEligible: 45, itt: -0.05, ittP: 0.3, firstStage: 0.55, effect: -0.09,
      ciLow: -0.3, ciHigh: 0.1, permutations: 2000, exact: false, windows: [],
    };
    const message = applyCaveats(input).find((c) => c.code === 'few_score_values_near_cutoff')!.message;
    expect(message).toContain('with scores within 2 of the cutoff');
    expect(message).toContain('estimate -0.09');
    for (const c of applyCaveats(input)) expect(c.message.toLowerCase()).not.toContain('cluster');
  });

  it('names the agency’s scores when it is given distances from one cohort’s cutoff, and distances when cutoffs are pooled', () => {
    const input = cleanInput();
    CASES.jumps_at_false_cutoffs!(input);
    input.cutoff = 0;
    input.findings.placebo = input.findings.placebo.map((r) => ({ ...r, cutoff: r.cutoff - 60 }));
    const message = (code: string) => applyCaveats(input).find((c) => c.code === code)!.message;
    input.centredFrom = 58;
    expect(message('local_to_cutoff')).toMatch(/^This describes households with scores near 58\. /);
    expect(message('jumps_at_false_cutoffs')).toMatch(/^The outcome also jumps at a score of 43, /);
    input.centredFrom = null;
    expect(message('local_to_cutoff')).toMatch(/^This describes households with scores near the cutoff in force each month\. /);
    expect(message('jumps_at_false_cutoffs')).toMatch(/^The outcome also jumps 15 points below the cutoff, /);
    for (const c of applyCaveats(input)) expect(c.message).not.toMatch(/scores? (near|of) -?0\b/);
  });

  it('sorts serious before caution before info', () => {
    const input = cleanInput();
    for (const construct of Object.values(CASES)) construct(input);
    const order = { serious: 0, caution: 1, info: 2 };
    const severities = applyCaveats(input).map((c) => order[c.severity]);
    expect(severities).toEqual([...severities].sort((a, b) => a - b));
  });
});
