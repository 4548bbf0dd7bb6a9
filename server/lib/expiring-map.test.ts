import { afterEach, describe, expect, it, vi } from 'vitest';
import { ExpiringMap } from './expiring-map';

describe('ExpiringMap', () => {
  afterEach(() => vi.useRealTimers());

  it('forgets an entry once its time is up, and when the clock goes back', () => {
    vi.useFakeTimers({ toFake: ['Date'], now: 1_000_000 });
    const map = new ExpiringMap<string, number>(1000, 10);
    map.set('a', 1);
    vi.setSystemTime(1_000_999);
    expect(map.get('a')).toBe(1);
    vi.setSystemTime(1_001_000);
    expect(map.get('a')).toBeUndefined();
    map.set('b', 2);
    vi.setSystemTime(1_000_500);
    expect(map.get('b')).toBeUndefined();
  });

  it('keeps at most its limit, dropping the oldest first', () => {
    const map = new ExpiringMap<number, number>(60_000, 3);
    for (let i = 0; i < 5; i++) map.set(i, i);
    expect(map.size).toBe(3);
    expect([map.get(0), map.get(1), map.get(2), map.get(3), map.get(4)]).toEqual([undefined, undefined, 2, 3, 4]);
  });
});
