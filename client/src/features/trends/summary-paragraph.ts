import type { InferenceDto, OutcomeRefDto, OutcomeResultDto, TrendPointDto } from '@shared/api/results';
import { headline } from '@shared/results/headline';
import { formatNumber, formatPeriod } from '@/lib/format';

/** Who the program serves and what taking part means, in the words of its managers. */
export interface ProgramWords {
  /** Plural noun, e.g. "households". */
  population: string;
  /** Verb phrase for taking part, e.g. "take the credit". */
  takeUpPhrase: string;
}

export interface SummaryInput {
  words: ProgramWords;
  outcome: OutcomeRefDto;
  /** The pooled window to summarise (the last 6 months, say), or null when there is none. */
  window: OutcomeResultDto | null;
  /** The months of the trend, to count serious caveats inside the window. */
  points: readonly TrendPointDto[];
}

export interface Summary {
  text: string;
  /** The paragraph warns that serious caveats weaken it. */
  hedged: boolean;
}

/**
 * The plain-language paragraph above the manager's trend charts, built only from the figures:
 * the take-up jump, the effect on those who take part because they qualify, the effect of being
 * eligible, and a warning when months of the window carry serious caveats. It speaks of groups near
 * the cutoff, never of individuals, and says when the interval does not rule out no change.
 * Intervals are the robust ones, point estimates the conventional ones (`headline()`).
 */
export function summaryParagraph({ words, outcome, window, points }: SummaryInput): Summary {
  const { population } = words;
  if (!window) {
    return { text: `There are not enough months with results yet for a pooled summary of ${lowerFirst(outcome.label)}.`, hedged: false };
  }
  const span = `the last ${window.scope.cohortCount} months (${formatPeriod(window.scope.firstPeriod)} to ${formatPeriod(window.scope.lastPeriod)})`;
  if (window.status !== 'ok') {
    const why = window.problem ? ` ${window.problem.message}` : '';
    return { text: `Over ${span} the figures could not be estimated.${why}`, hedged: true };
  }
  const inWindow = new Set(window.scope.periods.map((p) => p.period));
  const seriousMonths = points.filter((p) => inWindow.has(p.period) && p.worstCaveat === 'serious').map((p) => formatPeriod(p.period));
  const seriousOwn = window.caveats.filter((c) => c.severity === 'serious');
  const hedged = seriousMonths.length > 0 || seriousOwn.length > 0;
  const level = `${formatNumber(window.level * 100, 0)}% interval`;
  const sentences: string[] = [];

  const fs = headline(window.firstStage);
  if (fs) {
    const more = fs.estimate >= 0 ? 'more' : 'less';
    sentences.push(
      `In ${span}, ${population} just eligible were ${points100(Math.abs(fs.estimate))} ${more} likely to ${words.takeUpPhrase} than ${population} just below the cutoff (${level}: ${pointsRange(fs)}).`,
    );
  } else {
    sentences.push(`In ${span}, the change in take-up at the cutoff could not be measured.`);
  }

  const effect = headline(window.effect);
  if (effect) {
    const subject = outcomeSubject(outcome);
    const lead = `For ${population} who ${words.takeUpPhrase} because they qualify, ${subject}`;
    const verb = hedged ? 'appears to have been' : 'was';
    if (spansZero(effect)) {
      sentences.push(
        `${lead} ${verb} ${magnitude(effect.estimate, outcome)} ${direction(effect.estimate)} near the cutoff, but the ${level} runs from ${signedMagnitude(effect.ciLow, outcome)} to ${signedMagnitude(effect.ciHigh, outcome)}, so no change cannot be ruled out.`,
      );
    } else {
      sentences.push(
        `${lead} ${verb} about ${magnitude(effect.estimate, outcome)} ${direction(effect.estimate)} near the cutoff (${level}: ${magnitudeRange(effect, outcome)} ${direction(effect.estimate)}).`,
      );
    }
  }
  const itt = headline(window.itt);
  if (itt && effect && fs) {
    sentences.push(
      `Counting every ${singular(population)} just eligible, whether they took part or not, the change was ${magnitude(itt.estimate, outcome)} ${direction(itt.estimate)}: smaller, because not everyone who qualifies takes part.`,
    );
  }

  if (seriousOwn.length > 0) {
    sentences.push(`Read these figures with care: the pooled estimate carries a serious caveat (${seriousOwn.map((c) => c.message.replace(/\.$/, '')).join('; ')}).`);
  }
  if (seriousMonths.length > 0) {
    const k = seriousMonths.length;
    sentences.push(
      `${k === 1 ? 'One' : capitalise(numberWord(k))} of the ${window.scope.cohortCount} months (${listWords(seriousMonths)}) ${k === 1 ? 'carries' : 'carry'} a serious caveat, so treat the pooled figures as tentative and see ${k === 1 ? 'that month' : 'those months'} for why.`,
    );
  }
  sentences.push(`These are averages for ${population} with scores near the cutoff; they do not describe or judge any individual ${singular(population)}.`);
  return { text: sentences.join(' '), hedged };
}

function spansZero(i: InferenceDto): boolean {
  return i.ciLow <= 0 && i.ciHigh >= 0;
}

/** "61 percentage points" from a share difference 0.61. */
function points100(share: number): string {
  const v = Math.round(share * 100);
  return `${v} percentage ${v === 1 ? 'point' : 'points'}`;
}

function pointsRange(i: InferenceDto): string {
  return `${signedWhole(i.ciLow * 100)} to ${signedWhole(i.ciHigh * 100)} points`;
}

function signedWhole(v: number): string {
  const r = Math.round(v);
  return r < 0 ? `\u2212${Math.abs(r)}` : String(r);
}

/** Size of a change without its sign: "12 percentage points", "0.80 months". */
function magnitude(v: number, outcome: OutcomeRefDto, withUnit = true): string {
  if (outcome.unit === 'share') {
    const p = Math.round(Math.abs(v) * 100);
    return withUnit ? points100(Math.abs(v)) : String(p);
  }
  const body = formatNumber(Math.abs(v), 2);
  return withUnit && outcome.unit ? `${body} ${outcome.unit}` : body;
}

/** An interval on one side of 0 by size, smaller end first: "4 to 20 percentage points". */
function magnitudeRange(i: InferenceDto, outcome: OutcomeRefDto): string {
  const [a, b] = [Math.abs(i.ciLow), Math.abs(i.ciHigh)].sort((x, y) => x - y) as [number, number];
  return `${magnitude(a, outcome, false)} to ${magnitude(b, outcome)}`;
}

/** "12 percentage points lower", "3 percentage points higher". */
function signedMagnitude(v: number, outcome: OutcomeRefDto): string {
  return `${magnitude(v, outcome)} ${direction(v)}`;
}

function direction(v: number): string {
  return v < 0 ? 'lower' : 'higher';
}

/** "the chance of utility shut-off within 6 months", "the months in arrears (next 6 months)". */
function outcomeSubject(outcome: OutcomeRefDto): string {
  const label = lowerFirst(outcome.label);
  return outcome.kind === 'binary' ? `the chance of ${label}` : `the ${label}`;
}

function lowerFirst(s: string): string {
  // Keep acronyms ("ITT", "GED") as they are.
  return /^[A-Z][a-z]/.test(s) ? s.charAt(0).toLowerCase() + s.slice(1) : s;
}

function capitalise(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}

/** "households" → "household"; leaves words it does not know as they are. */
function singular(plural: string): string {
  if (plural.endsWith('ies')) return `${plural.slice(0, -3)}y`;
  if (plural.endsWith('s')) return plural.slice(0, -1);
  return plural;
}

const NUMBER_WORDS = ['zero', 'one', 'two', 'three', 'four', 'five', 'six', 'seven', 'eight', 'nine', 'ten', 'eleven', 'twelve'];
function numberWord(n: number): string {
  return NUMBER_WORDS[n] ?? String(n);
}

function listWords(items: readonly string[]): string {
  if (items.length <= 1) return items.join('');
  return `${items.slice(0, -1).join(', ')} and ${items.at(-1)}`;
}
