import { createHmac, createSecretKey, type KeyObject } from 'node:crypto';

/**
 * Keyed pseudonyms: HMAC-SHA-256 (RFC 2104 with SHA-256) under the secret `CUTLINE_PSEUDONYM_KEY`,
 * over a purpose, the program id and the value. The purpose and program keep the same household
 * from carrying the same pseudonym across programs or roles; without the key nobody can recompute
 * a pseudonym from a guessed identifier. Surrounding spaces are ignored; case is kept.
 */
export function pseudonym(key: string | KeyObject, purpose: 'subject' | 'cluster', programId: number, value: string): Buffer {
  return createHmac('sha256', key).update(`${purpose}\u0000${programId}\u0000${value.trim()}`).digest();
}

/** The key prepared once for many pseudonyms (saves re-reading the key for every row). */
export function pseudonymKey(secret: string): KeyObject {
  return createSecretKey(Buffer.from(secret, 'utf8'));
}
