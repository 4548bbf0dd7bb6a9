import type { ProgramSummaryDto } from '@shared/api/programs';

/** The words summaries use for a program's people and for taking part, with neutral fallbacks. */
export function programWords(p: Pick<ProgramSummaryDto, 'populationLabel' | 'takeUpPhrase'> | undefined): { population: string; takeUpPhrase: string } {
  return { population: p?.populationLabel || 'applicants', takeUpPhrase: p?.takeUpPhrase || 'take part' };
}

/** "Energy-hardship index at or above 58 points". */
export function qualifyRule(p: Pick<ProgramSummaryDto, 'scoreLabel' | 'scoreUnit' | 'eligibleSide' | 'currentCutoff'>, format: (n: number | null) => string): string {
  const side = p.eligibleSide === 'at-or-above' ? 'at or above' : 'at or below';
  return `${p.scoreLabel} ${side} ${format(p.currentCutoff)}${p.scoreUnit ? ` ${p.scoreUnit}` : ''}`;
}
