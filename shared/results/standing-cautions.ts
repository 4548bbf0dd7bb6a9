/**
 * The cautions every results screen, annex and summary e-mail shows (README, "Cautions";
 * METHODS §11 items 1–2).
 */
export const STANDING_CAUTIONS: readonly string[] = [
  'Estimates are local: they describe applicants with scores near the cutoff, not those far above or below it; moving the cutoff could change the effect.',
  'The effect on participants is the effect for people who take part because they qualify (compliers); it says nothing direct about those who would always or never take part.',
  'Results describe groups. They are not for judging or deciding about any individual.',
  'The agency’s evaluation standards, data-protection rules and local law prevail over anything Cutline shows.',
];
