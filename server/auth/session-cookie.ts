import { createHmac, randomBytes, timingSafeEqual } from 'node:crypto';

/** Name of the session cookie. */
export const SESSION_COOKIE = 'cutline.sid';

/**
 * A new session id: 24 random bytes (192 bits; OWASP's session management cheat sheet asks for at
 * least 64 bits of entropy), base64url, so it needs no escaping in a cookie.
 */
export function newSessionId(): string {
  return randomBytes(24).toString('base64url');
}

/**
 * The cookie value for a session id: the id, a dot, and its HMAC-SHA256 under the session secret
 * (base64url). The signature lets a request with a made-up id be turned away without a database
 * read; the id's randomness is what keeps sessions unguessable.
 */
export function signedSessionCookie(sessionId: string, secret: string): string {
  return `${sessionId}.${signature(sessionId, secret)}`;
}

/** The session id in a cookie value, if its signature is right (compared in constant time). */
export function verifiedSessionId(cookieValue: string, secret: string): string | undefined {
  const dot = cookieValue.lastIndexOf('.');
  if (dot <= 0) return undefined;
  const id = cookieValue.slice(0, dot);
  const given = Buffer.from(cookieValue.slice(dot + 1));
  const expected = Buffer.from(signature(id, secret));
  return given.length === expected.length && timingSafeEqual(given, expected) ? id : undefined;
}

/** Cookie values one verifier remembers at most (bounded memory; emptied when full). */
const MAX_REMEMBERED = 10_000;

/**
 * `verifiedSessionId` under one secret, remembering the values it has verified: a session's
 * requests all carry the same value, and computing its HMAC on each cost about 3% of a cached
 * dashboard answer's CPU. Only values that verified are remembered.
 */
export function sessionIdVerifier(secret: string): (cookieValue: string) => string | undefined {
  const verified = new Map<string, string>();
  return (cookieValue) => {
    const known = verified.get(cookieValue);
    if (known !== undefined) return known;
    const id = verifiedSessionId(cookieValue, secret);
    if (id !== undefined) {
      if (verified.size >= MAX_REMEMBERED) verified.clear();
      verified.set(cookieValue, id);
    }
    return id;
  };
}

/** The raw value of Cutline's session cookie in a `Cookie` header, if the request carries one. */
export function sessionCookieValue(cookieHeader: string | undefined): string | undefined {
  if (!cookieHeader) return undefined;
  for (const part of cookieHeader.split(';')) {
    const pair = part.trim();
    if (pair.startsWith(`${SESSION_COOKIE}=`)) return pair.slice(SESSION_COOKIE.length + 1);
  }
  return undefined;
}

function signature(sessionId: string, secret: string): string {
  return createHmac('sha256', secret).update(sessionId).digest('base64url');
}
