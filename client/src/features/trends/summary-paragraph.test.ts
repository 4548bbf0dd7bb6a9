import { describe, expect, it } from 'vitest';
import { setDisplaySettings } from '@/lib/format';
import { summaryParagraph } from './summary-paragraph';
import { ARREARS, SHUTOFF, inference, point, windowResult } from './test-fixtures';

const WORDS = { population: 'households', takeUpPhrase: 'take the credit' };
const SIX = ['2026-05', '2026-06', '2026-07', '2026-08', '2026-09', '2026-10'];

describe('summary paragraph', () => {
  setDisplaySettings({ locale: 'en-US', timeZone: 'UTC' });
  const points = SIX.map((p) => point(p, 58));

  it('says, in plain words, the take-up jump, the effect near the cutoff and the effect of eligibility', () => {
    const { text, hedged } = summaryParagraph({ words: WORDS, outcome: SHUTOFF, window: windowResult(SIX), points });
    expect(hedged).toBe(false);
    expect(text).toBe(
      'In the last 6 months (May 2026 to Oct 2026), households just eligible were 61 percentage points more likely to take the credit than households just below the cutoff (95% interval: 55 to 67 points). ' +
        'For households who take the credit because they qualify, the chance of utility shut-off within 6 months was about 12 percentage points lower near the cutoff (95% interval: 4 to 20 percentage points lower). ' +
        'Counting every household just eligible, whether they took part or not, the change was 7 percentage points lower: smaller, because not everyone who qualifies takes part. ' +
        'These are averages for households with scores near the cutoff; they do not describe or judge any individual household.',
    );
  });

  it('says when the interval does not rule out no change, in the outcome’s own unit', () => {
    const window = windowResult(SIX, { outcome: ARREARS, effect: { conventional: inference(-0.3, -0.9, 0.2), robust: inference(-0.3, -0.9, 0.2) } });
    const { text } = summaryParagraph({ words: WORDS, outcome: ARREARS, window, points });
    expect(text).toContain('the months in arrears (next 6 months) was 0.30 months lower near the cutoff, but the 95% interval runs from 0.90 months lower to 0.20 months higher, so no change cannot be ruled out.');
  });

  it('hedges when months of the window carry serious caveats', () => {
    const withSerious = points.map((p) => (p.period === '2026-07' || p.period === '2026-09' ? { ...p, worstCaveat: 'serious' as const } : p));
    const { text, hedged } = summaryParagraph({ words: WORDS, outcome: SHUTOFF, window: windowResult(SIX), points: withSerious });
    expect(hedged).toBe(true);
    expect(text).toContain('appears to have been about 12 percentage points lower');
    expect(text).toContain('Two of the 6 months (Jul 2026 and Sep 2026) carry a serious caveat, so treat the pooled figures as tentative and see those months for why.');
  });

  it('passes on a serious caveat of the pooled estimate itself', () => {
    const window = windowResult(SIX, { caveats: [{ code: 'weak_first_stage', severity: 'serious', message: 'Qualifying changed take-up only a little.', values: { f: 4 } }] });
    const { text, hedged } = summaryParagraph({ words: WORDS, outcome: SHUTOFF, window, points });
    expect(hedged).toBe(true);
    expect(text).toContain('the pooled estimate carries a serious caveat (Qualifying changed take-up only a little).');
  });

  it('never speaks of individuals except to say the figures do not judge them', () => {
    const { text } = summaryParagraph({ words: WORDS, outcome: SHUTOFF, window: windowResult(SIX), points });
    expect(text.match(/individual/g)).toHaveLength(1);
    expect(text).toMatch(/near the cutoff/);
  });

  it('explains when there is nothing to summarise', () => {
    expect(summaryParagraph({ words: WORDS, outcome: SHUTOFF, window: null, points: [] }).text).toBe(
      'There are not enough months with results yet for a pooled summary of utility shut-off within 6 months.',
    );
    const failed = windowResult(SIX, { status: 'not-estimable', problem: { code: 'too_few_observations', message: 'Too few households near the cutoff.' }, firstStage: null, itt: null, effect: null });
    expect(summaryParagraph({ words: WORDS, outcome: SHUTOFF, window: failed, points }).text).toBe(
      'Over the last 6 months (May 2026 to Oct 2026) the figures could not be estimated. Too few households near the cutoff.',
    );
  });
});
