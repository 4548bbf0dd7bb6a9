/** The caveat rule table (`rules.ts`, written to be reviewed by non-programmers) and how it is applied. */
export { CAVEAT_RULES } from './rules';
export { applyCaveats, CAVEAT_CODES } from './apply-caveats';
export { plainNumber, plainP, plainScore } from './format';
export type * from './types';
