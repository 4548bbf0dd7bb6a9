import { describe, expect, it } from 'vitest';
import { isSignInRefusal, safeReturnPath } from './sign-in';

describe('safeReturnPath', () => {
  it('keeps paths on this site', () => {
    expect(safeReturnPath('/')).toBe('/');
    expect(safeReturnPath('/programs/3?tab=trend#top')).toBe('/programs/3?tab=trend#top');
  });
  it('sends everything else to the home page', () => {
    for (const bad of ['https://elsewhere.example/', '//elsewhere.example/x', '/\\elsewhere.example', 'programs', '/a\nb', '/auth/logout', '/api/me', 42, undefined]) {
      expect(safeReturnPath(bad)).toBe('/');
    }
  });
});

describe('isSignInRefusal', () => {
  it('knows the stable reasons only', () => {
    expect(isSignInRefusal('replayed')).toBe(true);
    expect(isSignInRefusal('toString')).toBe(false);
  });
});
