/**
 * Finds repeated subjects among up to millions of pseudonyms without a JavaScript object per row:
 * the first 16 bytes of each 32-byte HMAC go into one growing byte array, and an open-addressing
 * table of row indexes (Int32Array, linear probing, kept at most half full) points into it.
 * 16 bytes = 128 bits, so two different identifiers sharing a prefix is beyond practical chance
 * (birthday bound: about n² / 2^129, ~10^-26 for two million rows).
 * Memory: 16 bytes a row plus 8–16 bytes a row of table.
 */
export class SubjectIndex {
  private prefixes = new Uint8Array(16 * 1024);
  private lines = new Int32Array(1024);
  private table = new Int32Array(2048).fill(-1);
  private count = 0;

  get size(): number {
    return this.count;
  }

  /**
   * Adds a subject seen on `line`.
   * @returns the line where the same subject was first seen, or 0 when it is new.
   */
  add(hash: Uint8Array, line: number): number {
    if ((this.count + 1) * 2 > this.table.length) this.grow();
    const mask = this.table.length - 1;
    let slot = slotOf(hash) & mask;
    for (;;) {
      const row = this.table[slot]!;
      if (row === -1) break;
      if (this.samePrefix(row, hash)) return this.lines[row]!;
      slot = (slot + 1) & mask;
    }
    const row = this.count++;
    if (row >= this.lines.length) {
      this.prefixes = resized(this.prefixes, this.prefixes.length * 2);
      this.lines = resized(this.lines, this.lines.length * 2);
    }
    this.prefixes.set(hash.subarray(0, 16), row * 16);
    this.lines[row] = line;
    this.table[slot] = row;
    return 0;
  }

  private samePrefix(row: number, hash: Uint8Array): boolean {
    const base = row * 16;
    for (let i = 0; i < 16; i++) if (this.prefixes[base + i] !== hash[i]) return false;
    return true;
  }

  private grow(): void {
    const table = new Int32Array(this.table.length * 2).fill(-1);
    const mask = table.length - 1;
    for (let row = 0; row < this.count; row++) {
      let slot = slotOf(this.prefixes.subarray(row * 16, row * 16 + 4)) & mask;
      while (table[slot] !== -1) slot = (slot + 1) & mask;
      table[slot] = row;
    }
    this.table = table;
  }
}

/** The HMAC's first four bytes are already uniformly distributed: use them as the slot. */
function slotOf(hash: Uint8Array): number {
  return (hash[0]! | (hash[1]! << 8) | (hash[2]! << 16) | (hash[3]! << 24)) >>> 0;
}

function resized<T extends Uint8Array | Int32Array>(array: T, length: number): T {
  const next = new (array.constructor as new (n: number) => T)(length);
  next.set(array);
  return next;
}
