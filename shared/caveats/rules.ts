import { plainNumber, plainP, plainScore } from './format';
import type { CaveatInput, CaveatRule, CaveatValues } from './types';

/*
 * THE CAVEAT TABLE
 * ================
 * Each rule below turns a finding of the diagnostics into a caveat a program manager can read.
 * For every rule: a stable code (never reuse or rename), a severity (info / caution / serious),
 * the trigger in plain words, and the message with the numbers that triggered it.
 *
 * Thresholds: 5% for tests unless said otherwise; F = 10 (Staiger–Stock rule of thumb) and
 * F = 104.7 (Lee, McCrary, Moreira & Porter 2022, above which no widening is needed); heaping
 * "1.5 times the neighbouring values at p < 0.01" and "fewer than 10 distinct scores" are common
 * practice, no source.
 *
 * Wording rules: plain, short, concrete; about groups and the data, never about any person; a
 * discrete score gets the local-randomization comparison as its alternative, never clustering by
 * score value (Kolesár & Rothe 2018 show clustering does not repair it).
 */

const above = (input: CaveatInput) => input.eligibleSide === 'at-or-above';
/** Where the eligible and the ineligible sit, in the program's own direction. */
const eligibleSideWords = (input: CaveatInput) => (above(input) ? 'just above the cutoff' : 'just below the cutoff');
const ineligibleSideWords = (input: CaveatInput) => (above(input) ? 'just below' : 'just above');
const once = (values: CaveatValues = {}): CaveatValues[] => [values];
const never: CaveatValues[] = [];

export const CAVEAT_RULES: readonly CaveatRule[] = [
  // ── Standing cautions: on every result ────────────────────────────────────────────────────
  {
    code: 'local_to_cutoff',
    severity: 'info',
    standing: true,
    trigger: 'Always.',
    find: (input) => once(input.centredFrom === null ? {} : { cutoff: input.centredFrom ?? input.cutoff }),
    message: (v, input) =>
      `This describes ${input.population} with scores near ${v.cutoff === undefined ? 'the cutoff in force each month' : plainScore(Number(v.cutoff))}. ` +
      `It says nothing about ${input.population} far from the cutoff, and moving the cutoff could change the effect.`,
  },
  {
    code: 'compliers_only',
    severity: 'info',
    standing: true,
    trigger: 'Always.',
    find: () => once(),
    message: (_v, input) =>
      input.design === 'fuzzy'
        ? `The effect on participants is for ${input.population} who take part because they qualify. ` +
          `It says nothing direct about those who would take part anyway, or never would.`
        : `The effect is for ${input.population} at the cutoff whose participation follows eligibility; here everyone who qualifies takes part.`,
  },
  {
    code: 'groups_not_individuals',
    severity: 'info',
    standing: true,
    trigger: 'Always.',
    find: () => once(),
    message: () =>
      'These results describe groups and are not for judging or deciding about any individual. ' +
      "The agency's evaluation standards, data-protection rules and local law take precedence.",
  },
  {
    code: 'eligibility_versus_participation',
    severity: 'info',
    standing: true,
    trigger: 'Whenever take-up is imperfect (a fuzzy design).',
    find: (input) => {
      const e = input.estimate;
      if (input.design !== 'fuzzy') return never;
      return once(e && e.firstStage !== null ? { itt: e.itt, firstStage: e.firstStage, effect: e.effect } : {});
    },
    message: (v) =>
      v.itt === undefined
        ? 'Two effects are reported: the effect of being eligible, which averages over those who take part and those who do not, and the effect on participants, which is the first divided by the take-up jump.'
        : `Two effects are reported: the effect of being eligible (${plainNumber(Number(v.itt))}) averages over those who take part and those who do not; ` +
          `the effect on participants (${plainNumber(Number(v.effect))}) is that divided by the take-up jump (${plainNumber(Number(v.firstStage))}).`,
  },

  // ── Take-up jump ──────────────────────────────────────────────────────────────────────────
  {
    code: 'weak_take_up_jump',
    severity: 'serious',
    standing: false,
    trigger: 'Fuzzy design and the take-up jump is weak: first-stage F below 10.',
    find: (input) => {
      const w = input.findings.weakFirstStage;
      return w && w.f < 10 ? once({ f: w.f }) : never;
    },
    message: (v) =>
      `The take-up jump is small (F = ${plainNumber(Number(v.f))}), so the effect on participants is imprecise and may be biased; ` +
      'read the effect of being eligible instead.',
  },
  {
    code: 'take_up_jump_widens_interval',
    severity: 'info',
    standing: false,
    trigger: 'Fuzzy design with first-stage F from 10 up to 104.7: the usual interval is too narrow and the widened (tF) one applies.',
    find: (input) => {
      const w = input.findings.weakFirstStage;
      if (!w || w.f < 10 || w.f >= 104.7 || w.tfCiLow === null || w.tfCiHigh === null) return never;
      return once({ f: w.f, tfCiLow: w.tfCiLow, tfCiHigh: w.tfCiHigh });
    },
    message: (v) =>
      `The take-up jump (F = ${plainNumber(Number(v.f))}) is not strong enough for the usual interval; ` +
      `allowing for it, the effect on participants lies between ${plainNumber(Number(v.tfCiLow))} and ${plainNumber(Number(v.tfCiHigh))}.`,
  },

  // ── Scores moved across the cutoff ────────────────────────────────────────────────────────
  {
    code: 'score_density_jump',
    severity: 'serious',
    standing: false,
    trigger: 'Both density tests (McCrary; local polynomial) find a jump in how many scores sit either side of the cutoff (p < 0.05).',
    find: (input) => {
      const d = input.findings.density;
      if (!d || !(d.mccrary.p < 0.05 && d.localPolynomial.p < 0.05)) return never;
      return once({ p: Math.max(d.mccrary.p, d.localPolynomial.p), theta: d.mccrary.theta });
    },
    message: (v, input) =>
      Number(v.theta) > 0
        ? `More ${input.population} sit ${eligibleSideWords(input)} than ${ineligibleSideWords(input)} (${plainP(Number(v.p))}): ` +
          'scores may have been adjusted to reach eligibility, so the estimate may be biased.'
        : `Fewer ${input.population} sit ${eligibleSideWords(input)} than ${ineligibleSideWords(input)} (${plainP(Number(v.p))}): ` +
          'scores may have been moved away from eligibility, so the estimate may be biased.',
  },
  {
    code: 'score_density_jump_one_test',
    severity: 'caution',
    standing: false,
    trigger: 'Exactly one of the two density tests finds a jump at the cutoff (p < 0.05).',
    find: (input) => {
      const d = input.findings.density;
      if (!d || (d.mccrary.p < 0.05) === (d.localPolynomial.p < 0.05)) return never;
      return once({ p: Math.min(d.mccrary.p, d.localPolynomial.p), theta: d.mccrary.theta });
    },
    message: (v, input) =>
      `One of two checks finds ${Number(v.theta) > 0 ? 'more' : 'fewer'} ${input.population} ${eligibleSideWords(input)} than expected (${plainP(Number(v.p))}); ` +
      'the other does not. Scores may have been adjusted near the cutoff; check how they are set.',
  },
  {
    code: 'scores_piled_at_cutoff',
    severity: 'caution',
    standing: false,
    trigger: 'The score value at the cutoff holds at least 1.5 times as many as the two values either side of it (p < 0.01).',
    find: (input) => {
      const c = input.findings.heaping?.atCutoff;
      return c && c.ratio !== null && c.ratio >= 1.5 && c.p < 0.01 ? once({ score: c.score, ratio: c.ratio, count: c.count }) : never;
    },
    message: (v, input) =>
      `Unusually many ${input.population} have a score of exactly ${plainScore(Number(v.score))} (${plainNumber(Number(v.ratio))} times the neighbouring scores). ` +
      'Check how scores at the cutoff are set; the estimates without them are in the donut table.',
  },
  {
    code: 'scores_piled_on_round_numbers',
    severity: 'info',
    standing: false,
    trigger: 'Multiples of a round number (10 or 5 score steps) hold at least 1.5 times as many as their neighbours (p < 0.01).',
    find: (input) => {
      const rows = input.findings.heaping?.roundValues ?? [];
      const hit = rows.find((r) => r.ratio !== null && r.ratio >= 1.5 && r.p < 0.01);
      return hit ? once({ base: hit.base, ratio: hit.ratio! }) : never;
    },
    message: (v) =>
      `Scores pile up on multiples of ${plainScore(Number(v.base))} (${plainNumber(Number(v.ratio))} times the neighbouring values). ` +
      'If scores are rounded by hand, results near the cutoff may be affected.',
  },
  {
    code: 'few_score_values_near_cutoff',
    severity: 'caution',
    standing: false,
    trigger: 'Fewer than 10 distinct score values within the bandwidth on a side of the cutoff.',
    find: (input) => {
      const h = input.findings.heaping;
      if (!h || !h.discrete) return never;
      const lr = input.findings.localRandomization;
      const values: CaveatValues = { distinct: Math.min(h.distinctNearCutoff.ineligible, h.distinctNearCutoff.eligible) };
      if (lr && lr.effect !== null) Object.assign(values, { localEffect: lr.effect, localP: lr.ittP, window: lr.window });
      return once(values);
    },
    message: (v, input) =>
      `The score takes only ${v.distinct} distinct values near the cutoff on one side, so the usual intervals are unreliable. ` +
      (v.localEffect === undefined
        ? `Compare only the ${input.population} closest to the cutoff instead (the local-randomization analysis).`
        : `Comparing only the ${input.population} with scores within ${plainScore(Number(v.window))} of the cutoff is a better guide: ` +
          `estimate ${plainNumber(Number(v.localEffect))}, ${plainP(Number(v.localP))}.`),
  },

  // ── Comparability of the two sides ────────────────────────────────────────────────────────
  {
    code: 'covariate_differs',
    severity: 'caution',
    standing: false,
    trigger: 'A characteristic measured before eligibility jumps at the cutoff (p < 0.05); one caveat per characteristic.',
    find: (input) =>
      input.findings.balance.filter((b) => b.p < 0.05).map((b) => ({ covariate: input.covariateLabels[b.covariate] ?? b.covariate, jump: b.jump, p: b.p })),
    message: (v) => {
      const label = String(v.covariate);
      return `${label.charAt(0).toUpperCase()}${label.slice(1)} differs at the cutoff (jump ${plainNumber(Number(v.jump))}, ${plainP(Number(v.p))}): the groups either side may not be comparable.`;
    },
  },
  {
    code: 'covariates_differ_jointly',
    severity: 'serious',
    standing: false,
    trigger: 'After allowing for the number of characteristics checked (Holm), at least one still jumps at the cutoff (adjusted p < 0.05).',
    find: (input) => {
      const rows = input.findings.balance;
      if (rows.length === 0) return never;
      const worst = rows.reduce((a, b) => (b.pAdjusted < a.pAdjusted ? b : a));
      return worst.pAdjusted < 0.05 ? once({ checked: rows.length, failing: rows.filter((r) => r.pAdjusted < 0.05).length, pAdjusted: worst.pAdjusted }) : never;
    },
    message: (v) =>
      `Even allowing for the ${v.checked} characteristics checked, ${v.failing === 1 ? 'one differs' : `${v.failing} differ`} at the cutoff ` +
      `(adjusted ${plainP(Number(v.pAdjusted))}): the estimate may reflect who applies on each side, not the program.`,
  },
  {
    code: 'jumps_at_false_cutoffs',
    severity: 'caution',
    standing: false,
    trigger: 'The outcome jumps at a false cutoff away from the real one (Holm-adjusted p < 0.05).',
    find: (input) => {
      const rows = input.findings.placebo;
      if (rows.length === 0) return never;
      const worst = rows.reduce((a, b) => (b.pAdjusted < a.pAdjusted ? b : a));
      if (!(worst.pAdjusted < 0.05)) return never;
      const figures = { estimate: worst.estimate, pAdjusted: worst.pAdjusted };
      // Pooled cohorts have no one score for a false cutoff, only its distance from each month's cutoff.
      if (input.centredFrom === null) return once({ distance: worst.cutoff, ...figures });
      return once({ cutoff: worst.cutoff + (input.centredFrom ?? 0), ...figures });
    },
    message: (v) =>
      `The outcome also jumps ${v.distance === undefined ? `at a score of ${plainScore(Number(v.cutoff))}` : `${plainScore(Math.abs(Number(v.distance)))} points ${Number(v.distance) < 0 ? 'below' : 'above'} the cutoff`}, ` +
      `where nothing changes (jump ${plainNumber(Number(v.estimate))}, adjusted ${plainP(Number(v.pAdjusted))}): ` +
      'the outcome may change with the score in ways the estimate does not capture.',
  },

  // ── Robustness of the estimate ────────────────────────────────────────────────────────────
  {
    code: 'depends_on_window_width',
    severity: 'caution',
    standing: false,
    trigger: 'With a narrower or wider comparison window (0.5 to 2 times the bandwidth) the estimate falls outside the main interval.',
    find: (input) => {
      const e = input.estimate;
      if (!e) return never;
      const off = input.findings.sensitivity.filter((r) => r.multiple !== 1 && (r.estimate < e.effectCiLow || r.estimate > e.effectCiHigh));
      if (off.length === 0) return never;
      const far = off.reduce((a, b) => (Math.abs(b.estimate - e.effect) > Math.abs(a.estimate - e.effect) ? b : a));
      return once({ estimate: e.effect, otherEstimate: far.estimate, otherH: far.h });
    },
    message: (v, input) =>
      `The estimate changes with how far from the cutoff ${input.population} are compared: ${plainNumber(Number(v.estimate))} as reported, ` +
      `${plainNumber(Number(v.otherEstimate))} comparing only those within ${plainScore(Number(v.otherH))} of the cutoff. Treat it with care.`,
  },
  {
    code: 'depends_on_scores_at_cutoff',
    severity: 'caution',
    standing: false,
    trigger: 'Leaving out the scores closest to the cutoff (the donut) moves the estimate outside the main interval.',
    find: (input) => {
      const e = input.estimate;
      if (!e) return never;
      const off = input.findings.donut.filter((r) => r.estimate < e.effectCiLow || r.estimate > e.effectCiHigh);
      if (off.length === 0) return never;
      const first = off.reduce((a, b) => (b.radius < a.radius ? b : a));
      return once({ estimate: e.effect, otherEstimate: first.estimate, radius: first.radius, dropped: first.dropped });
    },
    message: (v, input) =>
      `Leaving out the ${v.dropped} ${input.population} with scores within ${plainScore(Number(v.radius))} of the cutoff changes the estimate from ` +
      `${plainNumber(Number(v.estimate))} to ${plainNumber(Number(v.otherEstimate))}: it leans on those closest to the cutoff.`,
  },

  // ── Reading the numbers ───────────────────────────────────────────────────────────────────
  {
    code: 'several_outcomes_tested',
    severity: 'info',
    standing: false,
    trigger: 'More than one outcome is analysed in the same run.',
    find: (input) => (input.outcomesTested > 1 ? once({ outcomes: input.outcomesTested }) : never),
    message: (v) => `${v.outcomes} outcomes were tested: one significant result among many may be chance.`,
  },
  {
    code: 'small_effects_undetectable',
    severity: 'info',
    standing: false,
    trigger: 'No effect is detected (p of 0.05 or more) and the power calculation is available.',
    find: (input) => {
      const e = input.estimate;
      const power = input.findings.power;
      if (!e || !power || !(e.effectP >= 0.05)) return never;
      const mde = power.mdeEffect ?? power.mdeItt;
      return once({ mde, n: power.n });
    },
    message: (v, input) =>
      `No clear effect was found, but with ${plainNumber(Number(v.n))} ${input.population} near the cutoff, effects smaller than ` +
      `${plainNumber(Number(v.mde))} could easily go unnoticed.`,
  },
  {
    code: 'check_not_run',
    severity: 'info',
    standing: false,
    trigger: 'A diagnostic could not be computed on these data; one caveat per diagnostic.',
    find: (input) => input.notRun.map((n) => ({ check: n.check, reason: n.reason, reasonCode: n.code })),
    message: (v) => `The ${v.check} could not be computed: ${String(v.reason).charAt(0).toLowerCase()}${String(v.reason).slice(1)}`,
  },
];
