/**
 * Sample inputs for the route × role matrix (`access-matrix.test.ts`). The matrix finds every
 * route by itself; add an entry here only when a route needs a body, a query or particular
 * parameter values to get past validation without a 5xx. The matrix checks the access gate, so an
 * allowed caller may still get 400 or 404 from the handler.
 *
 * Keys are `METHOD /full/path/:param` exactly as the router declares them.
 * - `:programId` is always the matrix's own program (its people hold grants there or elsewhere).
 * - Any other parameter defaults to `999999` (an id that does not exist, so nothing is changed).
 */
export interface RouteSample {
  params?: Record<string, string>;
  query?: Record<string, string>;
  body?: unknown;
}

export const ROUTE_SAMPLES: Record<string, RouteSample> = {
  'POST /api/admin/users': { body: { email: 'matrix-sample@test.example', displayName: 'Matrix sample' } },
  'PATCH /api/admin/users/:userId': { body: { active: true } },
  'POST /api/admin/users/:userId/grants': { body: { role: 'director', programId: null } },
};

/** Value of a parameter without a sample: an id that exists nowhere. */
export const DEFAULT_PARAM_VALUE = '999999';
