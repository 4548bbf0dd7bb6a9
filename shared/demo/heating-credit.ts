import { cutoffForPeriod, isEligible } from '../domain/cutoff-schedule';
import { daysInPeriod, periodRange } from '../domain/period';
import { createRng, type Rng } from '../random/rng';
import type { CovariateDefinitionInput, CutoffChange, OutcomeDefinitionInput, ProgramInput } from '../schemas/program';

/**
 * The invented demo scenario: Harrow Vale, a fictional county, pays a winter heating credit to
 * households whose energy-hardship index (0–100) is at or above a cutoff. Not every eligible
 * household claims the credit and some ineligible ones obtain it on appeal, so the design is fuzzy.
 * Every number below is made up; the built-in effects are the demo's "right answer".
 */
export const DEMO_PROGRAM: ProgramInput = {
  slug: 'winter-heating-credit',
  name: 'Winter Heating Credit',
  description:
    'Harrow Vale County (fictional) credits households with a high energy-hardship index against their winter heating bills. ' +
    'Applications are scored each month; households at or above the cutoff qualify.',
  scoreLabel: 'Energy-hardship index',
  scoreUnit: 'points',
  scoreMin: 0,
  scoreMax: 100,
  eligibleSide: 'at-or-above',
  timeZone: 'America/Chicago',
  populationLabel: 'households',
  takeUpPhrase: 'take the credit',
};

export const DEMO_FIRST_PERIOD = '2024-11';
export const DEMO_LAST_PERIOD = '2026-10';

/** The cutoff moves from 60 to 58 with the 13th cohort. */
export const DEMO_CUTOFF_SCHEDULE: CutoffChange[] = [
  { cutoff: 60, firstPeriod: '2024-11' },
  { cutoff: 58, firstPeriod: '2025-11' },
];

export const DEMO_OUTCOMES: OutcomeDefinitionInput[] = [
  { key: 'shutoff_6m', label: 'Utility shut-off within 6 months', unit: 'share', kind: 'binary', goodDirection: 'lower' },
  { key: 'arrears_months', label: 'Months in arrears (next 6 months)', unit: 'months', kind: 'continuous', goodDirection: 'lower' },
];

export const DEMO_COVARIATES: CovariateDefinitionInput[] = [
  { key: 'household_size', label: 'Household size', unit: 'people', kind: 'continuous' },
  { key: 'prior_arrears', label: 'Months in arrears, prior year', unit: 'months', kind: 'continuous' },
];

/** Effects on households who take the credit (constant across households, so it is also the complier effect). */
export const DEMO_TRUE_EFFECTS = {
  /** Change in the probability of a shut-off within 6 months. */
  shutoff_6m: -0.12,
  /** Change in expected months in arrears. */
  arrears_months: -0.8,
} as const;

/** Take-up probabilities just either side of the cutoff, in an ordinary month. */
export const DEMO_TAKE_UP = { eligible: 0.7, ineligible: 0.08 } as const;

/** A month when an outreach lapse left few eligible households claiming: a weak first stage. */
export const DEMO_WEAK_TAKE_UP_PERIOD = '2025-05';
/** A month when some scores just below the cutoff were nudged onto or just above it. */
export const DEMO_HEAPING_PERIOD = '2026-04';

export const DEMO_OFFICES = ['north', 'river', 'market', 'hillside', 'station', 'orchard'] as const;

export interface DemoHousehold {
  /** Case number as the county's system would print it (raw identifier; pseudonymised on ingest). */
  caseNumber: string;
  applicationDate: string;
  office: string;
  score: number;
  takeUp: 0 | 1;
  shutoff_6m: 0 | 1;
  arrears_months: number;
  household_size: number;
  prior_arrears: number;
}

export interface DemoCohort {
  period: string;
  cutoff: number;
  households: DemoHousehold[];
}

export function demoPeriods(): string[] {
  return periodRange(DEMO_FIRST_PERIOD, DEMO_LAST_PERIOD);
}

/**
 * Draws one cohort. The same period always gives the same households (the stream is keyed by the
 * period), so cohorts can be generated independently and in any order.
 */
export function generateDemoCohort(period: string): DemoCohort {
  const cutoff = cutoffForPeriod(DEMO_CUTOFF_SCHEDULE, period);
  if (cutoff === null) throw new RangeError(`generateDemoCohort: ${period} is before the demo starts`);
  const rng = createRng(periodKey(period));
  const size = 1500 + rng.int(2501);
  const days = daysInPeriod(period);
  const households: DemoHousehold[] = [];
  const usedNumbers = new Set<number>();
  for (let i = 0; i < size; i++) {
    let number: number;
    do number = 1_000_000 + rng.int(9_000_000);
    while (usedNumbers.has(number));
    usedNumbers.add(number);
    households.push(drawHousehold(rng, period, cutoff, days, number));
  }
  return { period, cutoff, households };
}

function drawHousehold(rng: Rng, period: string, cutoff: number, days: number, number: number): DemoHousehold {
  let score = round1(100 * rng.beta(2.4, 2.2));
  if (period === DEMO_HEAPING_PERIOD && score < cutoff && score >= cutoff - 3 && rng.uniform() < 0.35) {
    score = round1(cutoff + 0.5 * rng.uniform());
  }
  const eligible = isEligible(score, cutoff, DEMO_PROGRAM.eligibleSide);
  const z = score / 100;

  const householdSize = 1 + rng.poisson(0.8 + 2.2 * z);
  const priorArrears = rng.poisson(0.3 + 2.5 * z * z);

  const eligibleRate = period === DEMO_WEAK_TAKE_UP_PERIOD ? 0.2 : DEMO_TAKE_UP.eligible;
  // A gentle slope in take-up with the score on each side keeps the first stage a local quantity.
  const pTakeUp = eligible ? eligibleRate + 0.1 * (z - cutoff / 100) : DEMO_TAKE_UP.ineligible + 0.05 * (z - cutoff / 100);
  const takeUp = rng.bernoulli(clamp(pTakeUp, 0.01, 0.99));

  const pShutoff = clamp(0.16 + 0.3 * z * z + 0.02 * priorArrears, 0.13, 0.95) + DEMO_TRUE_EFFECTS.shutoff_6m * takeUp;
  const shutoff = rng.bernoulli(pShutoff);
  const arrearsMean = 1 + 2.5 * z + 0.4 * priorArrears + 0.15 * householdSize;
  const arrears = rng.poisson(arrearsMean + DEMO_TRUE_EFFECTS.arrears_months * takeUp);

  const day = 1 + rng.int(days);
  return {
    caseNumber: `HV-${number}`,
    applicationDate: `${period}-${String(day).padStart(2, '0')}`,
    office: DEMO_OFFICES[rng.int(DEMO_OFFICES.length)] ?? 'north',
    score,
    takeUp,
    shutoff_6m: shutoff,
    arrears_months: arrears,
    household_size: householdSize,
    prior_arrears: priorArrears,
  };
}

function periodKey(period: string): number {
  return 7919 * Number(period.slice(0, 4)) + 104_729 * Number(period.slice(5, 7));
}

function round1(v: number): number {
  return Math.round(v * 10) / 10;
}

function clamp(v: number, lo: number, hi: number): number {
  return Math.min(hi, Math.max(lo, v));
}
