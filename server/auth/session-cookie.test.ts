import { describe, expect, it } from 'vitest';
import { newSessionId, sessionCookieValue, sessionIdVerifier, signedSessionCookie, verifiedSessionId } from './session-cookie';

describe('session cookie', () => {
  it('signs with HMAC-SHA256 (RFC 4231, test case 2), written base64url', () => {
    // RFC 4231 §4.3: key "Jefe", data "what do ya want for nothing?" →
    // 5bdcc146bf60754e6a042426089575c75a003f089d2739839dec58b964ec3843.
    const mac = Buffer.from('5bdcc146bf60754e6a042426089575c75a003f089d2739839dec58b964ec3843', 'hex').toString('base64url');
    expect(signedSessionCookie('what do ya want for nothing?', 'Jefe')).toBe(`what do ya want for nothing?.${mac}`);
  });

  it('gives back the id of a cookie it signed, and nothing for one altered or signed with another secret', () => {
    const id = newSessionId();
    const value = signedSessionCookie(id, 'secret-one');
    expect(verifiedSessionId(value, 'secret-one')).toBe(id);
    expect(verifiedSessionId(value, 'secret-two')).toBeUndefined();
    const other = newSessionId();
    expect(verifiedSessionId(`${other}${value.slice(id.length)}`, 'secret-one')).toBeUndefined();
    expect(verifiedSessionId(`${value.slice(0, -1)}${value.endsWith('A') ? 'B' : 'A'}`, 'secret-one')).toBeUndefined();
    expect(verifiedSessionId(`${value}x`, 'secret-one')).toBeUndefined();
    expect(verifiedSessionId(id, 'secret-one')).toBeUndefined();
    expect(verifiedSessionId('', 'secret-one')).toBeUndefined();
  });

  it('answers as verifiedSessionId does when it remembers values, and never remembers a wrong one', () => {
    const verify = sessionIdVerifier('secret-one');
    const id = newSessionId();
    const good = signedSessionCookie(id, 'secret-one');
    const bad = signedSessionCookie(id, 'secret-two');
    for (let i = 0; i < 3; i++) {
      expect(verify(good)).toBe(id);
      expect(verify(bad)).toBeUndefined();
    }
  });

  it('makes ids of 24 random bytes that need no escaping in a cookie', () => {
    const ids = new Set(Array.from({ length: 1000 }, newSessionId));
    expect(ids.size).toBe(1000);
    for (const id of ids) expect(id).toMatch(/^[A-Za-z0-9_-]{32}$/);
  });

  it("finds Cutline's cookie among others in a Cookie header", () => {
    expect(sessionCookieValue('a=1; cutline.sid=abc.def; b=2')).toBe('abc.def');
    expect(sessionCookieValue('cutline.sid=abc.def')).toBe('abc.def');
    expect(sessionCookieValue('xcutline.sid=abc.def; cutline.sidx=1')).toBeUndefined();
    expect(sessionCookieValue('')).toBeUndefined();
    expect(sessionCookieValue(undefined)).toBeUndefined();
  });
});
