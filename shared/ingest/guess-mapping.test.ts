import { describe, expect, it } from 'vitest';
import { guessMapping } from './guess-mapping';

describe('guessMapping', () => {
  it('matches outcome keys and role name fragments, each column once', () => {
    const columns = ['Case Number', 'Application Date', 'Office', 'Hardship Index', 'Credit Taken', 'shutoff_6m', 'Arrears months'];
    const guess = guessMapping(columns, [{ key: 'shutoff_6m', label: 'Shut-off' }, { key: 'arrears', label: 'Arrears months' }], []);
    expect(guess).toMatchObject({
      subjectId: 'Case Number',
      score: 'Hardship Index',
      takeUp: 'Credit Taken',
      applicationDate: 'Application Date',
      cluster: 'Office',
      outcomes: { shutoff_6m: 'shutoff_6m', arrears: 'Arrears months' },
    });
  });
  it('does not take "months in arrears" for the cohort month', () => {
    const guess = guessMapping(['Case ref', 'Applied on', 'Shut-off within 6 months', 'Months in arrears'], [], []);
    expect(guess.periodColumn).toBeUndefined();
    expect(guess.subjectId).toBe('Case ref');
  });
  it('leaves a role out when nothing fits', () => {
    expect(guessMapping(['a', 'b'], [], []).score).toBeUndefined();
  });
});
