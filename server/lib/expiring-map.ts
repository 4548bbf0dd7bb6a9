/**
 * A small in-process map whose entries are forgotten `ttlMs` after they were stored, and which
 * never holds more than `maxEntries` (the oldest go first). Time is `Date.now()`, so tests that move
 * the clock with fake timers move these entries' age too.
 */
export class ExpiringMap<K, V> {
  private readonly entries = new Map<K, { value: V; storedAt: number }>();

  constructor(
    private readonly ttlMs: number,
    private readonly maxEntries: number,
  ) {}

  get(key: K): V | undefined {
    const entry = this.entries.get(key);
    if (!entry) return undefined;
    const age = Date.now() - entry.storedAt;
    // A clock moved backwards makes an entry's age meaningless: forget it too.
    if (age >= this.ttlMs || age < 0) {
      this.entries.delete(key);
      return undefined;
    }
    return entry.value;
  }

  set(key: K, value: V): void {
    this.entries.delete(key);
    if (this.entries.size >= this.maxEntries) this.entries.delete(this.entries.keys().next().value as K);
    this.entries.set(key, { value, storedAt: Date.now() });
  }

  delete(key: K): void {
    this.entries.delete(key);
  }

  clear(): void {
    this.entries.clear();
  }

  get size(): number {
    return this.entries.size;
  }
}
