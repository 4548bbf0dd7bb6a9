/**
 * Version of the estimation engine's numerics, stamped on every result. Bump it whenever a change
 * can alter any number the engine returns, so stored results say which engine produced them.
 */
export const ENGINE_VERSION = '1.0.1';
