/**
 * Version of the diagnostics and the caveat table, stamped on stored results beside the engine's
 * version (`ProvenanceDto.diagnosticsVersion`). Bump it whenever any returned number, rule or
 * message can change.
 */
export const DIAGNOSTICS_VERSION = '1.2.0';
