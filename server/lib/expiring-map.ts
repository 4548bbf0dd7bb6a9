/**
 * A small in-process map whose entries are forgotten `ttlMs` after they were stored, and which
 * never holds more than `maxEntries` (the oldest go first). Time is `Date.now()`, so tests that move
 * the clock with fake timers move these entries' age too.
 */
export class ExpiringMap<K, V> {
  private readonly entries = new Map<K, { value: V; storedAt: number; lifetimeMs: number }>();
  /** Reads under way, one per key: requests arriving meanwhile wait for it instead of reading again. */
  private readonly reading = new Map<K, Promise<V | undefined>>();

  /**
   * `spread` (0–1) shortens each entry's life by a random part of up to that share of `ttlMs`.
   * Entries stored together then run out at different moments: without it, reads that a burst of
   * requests made together (dozens of sessions at start-up or after a change) all ran out in the
   * same millisecond, every `ttlMs`, and were all read again at once, queueing every request
   * behind them (spreading expiries is common practice, no source).
   */
  constructor(
    private readonly ttlMs: number,
    private readonly maxEntries: number,
    private readonly spread = 0,
  ) {}

  get(key: K): V | undefined {
    const entry = this.entries.get(key);
    if (!entry) return undefined;
    const age = Date.now() - entry.storedAt;
    // A clock moved backwards makes an entry's age meaningless: forget it too.
    if (age >= entry.lifetimeMs || age < 0) {
      this.entries.delete(key);
      return undefined;
    }
    return entry.value;
  }

  /**
   * The kept value, at once (not a promise, so a hit costs its caller no wait), or else the value of
   * `read()`, kept unless it is `undefined`. Requests that miss together share one read: when an
   * entry runs out under load, dozens of requests would otherwise each run the same query at once.
   * A read that a `delete` or `clear` overtook is returned to its callers but not kept, since what
   * it read may predate the change.
   */
  load(key: K, read: () => Promise<V | undefined>): V | Promise<V | undefined> {
    const kept = this.get(key);
    if (kept !== undefined) return kept;
    const underWay = this.reading.get(key);
    if (underWay) return underWay;
    const reading: Promise<V | undefined> = read().then(
      (value) => {
        if (this.reading.get(key) === reading) {
          this.reading.delete(key);
          if (value !== undefined) this.set(key, value);
        }
        return value;
      },
      (err: unknown) => {
        if (this.reading.get(key) === reading) this.reading.delete(key);
        throw err;
      },
    );
    this.reading.set(key, reading);
    return reading;
  }

  set(key: K, value: V): void {
    this.entries.delete(key);
    if (this.entries.size >= this.maxEntries) this.entries.delete(this.entries.keys().next().value as K);
    this.entries.set(key, { value, storedAt: Date.now(), lifetimeMs: this.ttlMs * (1 - this.spread * Math.random()) });
  }

  delete(key: K): void {
    this.entries.delete(key);
    this.reading.delete(key);
  }

  clear(): void {
    this.entries.clear();
    this.reading.clear();
  }

  get size(): number {
    return this.entries.size;
  }
}
