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

  it('shares one read among the requests that miss together, and keeps its value', async () => {
    const map = new ExpiringMap<string, number>(60_000, 10);
    let reads = 0;
    const read = () => new Promise<number>((resolve) => setTimeout(() => resolve(++reads), 5));
    const values = await Promise.all([map.load('a', read), map.load('a', read), map.load('a', read)]);
    expect(values).toEqual([1, 1, 1]);
    expect(reads).toBe(1);
    expect(await map.load('a', read)).toBe(1);
    expect(reads).toBe(1);
  });

  it('does not keep a read that a change overtook, nor an undefined value, nor share a failure later', async () => {
    const map = new ExpiringMap<string, number>(60_000, 10);
    let release!: (v: number) => void;
    const slow = map.load('a', () => new Promise<number>((resolve) => (release = resolve)));
    map.clear();
    // A request after the change reads afresh rather than joining the read from before it.
    const fresh = map.load('a', async () => 2);
    release(1);
    expect(await slow).toBe(1);
    expect(await fresh).toBe(2);
    expect(map.get('a')).toBe(2);
    map.delete('a');
    expect(await map.load('a', async () => undefined)).toBeUndefined();
    expect(map.size).toBe(0);
    await expect(map.load('b', () => Promise.reject(new Error('down')))).rejects.toThrow('down');
    expect(await map.load('b', async () => 3)).toBe(3);
  });

  it('spreads the expiries of entries stored together over the last part of their time', () => {
    vi.useFakeTimers({ toFake: ['Date'], now: 1_000_000 });
    const map = new ExpiringMap<number, number>(1000, 1000, 0.5);
    for (let i = 0; i < 200; i++) map.set(i, i);
    const alive = (at: number) => {
      vi.setSystemTime(1_000_000 + at);
      return Array.from({ length: 200 }, (_, i) => map.get(i)).filter((v) => v !== undefined).length;
    };
    // Times move forward only, since `get` forgets what has run out.
    expect(alive(499)).toBe(200);
    const halfway = alive(750);
    expect(halfway).toBeGreaterThan(40);
    expect(halfway).toBeLessThan(160);
    expect(alive(1000)).toBe(0);
  });
});
