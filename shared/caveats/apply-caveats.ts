import { CAVEAT_RULES } from './rules';
import type { Caveat, CaveatInput, CaveatRule, CaveatSeverity } from './types';

const ORDER: Record<CaveatSeverity, number> = { serious: 0, caution: 1, info: 2 };

/**
 * Applies the rule table to one result: every rule that fires gives one caveat per entry of its
 * `find`, with the message built from the triggering numbers. Sorted serious first, then caution,
 * then info, keeping the table's order within a severity; standing cautions are always present.
 */
export function applyCaveats(input: CaveatInput, rules: readonly CaveatRule[] = CAVEAT_RULES): Caveat[] {
  const out: Caveat[] = [];
  for (const rule of rules) {
    for (const values of rule.find(input)) out.push({ code: rule.code, severity: rule.severity, message: rule.message(values, input), values });
  }
  return out
    .map((c, i) => ({ c, i }))
    .sort((a, b) => ORDER[a.c.severity] - ORDER[b.c.severity] || a.i - b.i)
    .map(({ c }) => c);
}

/** Codes of every rule, for screens that list or acknowledge caveats. */
export const CAVEAT_CODES: readonly string[] = CAVEAT_RULES.map((r) => r.code);
