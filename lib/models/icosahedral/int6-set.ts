/**
 * Open-addressing hash set of 6-vectors of small integers (the nodes of a 6D cut), keyed without strings.
 * Entries keep insertion order, so the set doubles as the BFS queue: entry i has coordinates
 * coords[6i … 6i+5]. Linear probing on a power-of-two table kept at most half full.
 */
export class Int6Set {
  /** 6 coordinates per entry, in insertion order (length ≥ 6·size). */
  coords: Int32Array;
  size = 0;
  private table: Int32Array;
  private mask: number;

  constructor(expected = 1024) {
    let cap = 1024;
    while (cap < 2 * expected) cap *= 2;
    this.table = new Int32Array(cap).fill(-1);
    this.mask = cap - 1;
    this.coords = new Int32Array(6 * Math.max(16, expected));
  }

  private static hash(c: ArrayLike<number>, o: number): number {
    // FNV-style mixing with Math.imul: cheap and deterministic on every engine.
    let h = 0x811c9dc5 | 0;
    for (let i = 0; i < 6; i++) {
      h = Math.imul(h ^ (c[o + i] | 0), 0x01000193);
      h ^= h >>> 15;
    }
    return Math.imul(h, 0x2c1b3c6d) ^ (h >>> 12);
  }

  private find(c: ArrayLike<number>, o: number): number {
    const t = this.table;
    const k = this.coords;
    let slot = Int6Set.hash(c, o) & this.mask;
    for (;;) {
      const e = t[slot];
      if (e < 0) return -1 - slot;
      const b = 6 * e;
      if (k[b] === c[o] && k[b + 1] === c[o + 1] && k[b + 2] === c[o + 2] && k[b + 3] === c[o + 3] && k[b + 4] === c[o + 4] && k[b + 5] === c[o + 5]) return e;
      slot = (slot + 1) & this.mask;
    }
  }

  /** Index of the entry equal to c[o … o+5], or −1. */
  indexOf(c: ArrayLike<number>, o = 0): number {
    const r = this.find(c, o);
    return r >= 0 ? r : -1;
  }

  /** Insert c[o … o+5]; returns its new index, or −1 if it was already present. */
  add(c: ArrayLike<number>, o = 0): number {
    const r = this.find(c, o);
    if (r >= 0) return -1;
    const idx = this.size;
    if (6 * (idx + 1) > this.coords.length) {
      const grown = new Int32Array(this.coords.length * 2);
      grown.set(this.coords);
      this.coords = grown;
    }
    const k = this.coords;
    const b = 6 * idx;
    for (let i = 0; i < 6; i++) k[b + i] = c[o + i];
    this.table[-1 - r] = idx;
    this.size++;
    if (2 * this.size > this.table.length) this.rehash();
    return idx;
  }

  private rehash(): void {
    const cap = this.table.length * 2;
    this.table = new Int32Array(cap).fill(-1);
    this.mask = cap - 1;
    for (let e = 0; e < this.size; e++) {
      let slot = Int6Set.hash(this.coords, 6 * e) & this.mask;
      while (this.table[slot] >= 0) slot = (slot + 1) & this.mask;
      this.table[slot] = e;
    }
  }
}
