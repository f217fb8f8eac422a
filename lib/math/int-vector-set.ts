/**
 * Exact set of hyperlattice points K ∈ Zⁿ with insertion-order indices: open addressing (linear probing) on
 * the n int32 components, points stored in one growable Int32Array. Replaces a Map keyed by a packed
 * double, which hashes heap numbers and allocates; here lookups compare integers only.
 *
 * The index range stays what the packed key allowed (|K_j| < 2^⌊52/n⌋⁻¹), with the same error, so patches
 * that were refused before are refused now.
 */
export class ZTable {
  readonly n: number;
  /** Points, n per entry, in insertion order (capacity may exceed size·n). */
  pts: Int32Array;
  size = 0;
  private slots: Int32Array;
  private mask: number;
  private readonly half: number;

  constructor(n: number, expected = 1024) {
    this.n = n;
    this.half = 2 ** Math.floor(52 / n) / 2;
    let cap = 1024;
    while (cap < 2 * expected) cap *= 2;
    this.slots = new Int32Array(cap);
    this.mask = cap - 1;
    this.pts = new Int32Array(Math.max(16, expected) * n);
  }

  private hash(K: ArrayLike<number>, o: number): number {
    const { n, half } = this;
    let h = 0x811c9dc5;
    for (let j = 0; j < n; j++) {
      const v = K[o + j];
      if (v < -half || v >= half) {
        throw new RangeError(`radius: the patch is too large (hyperlattice index beyond ±${half - 1})`);
      }
      h = Math.imul(h ^ v, 0x9e3779b1);
      h ^= h >>> 15;
    }
    return h;
  }

  /** Index of K, or −1. */
  find(K: ArrayLike<number>): number {
    const { n, pts, slots, mask } = this;
    let s = this.hash(K, 0) & mask;
    for (;;) {
      const e = slots[s];
      if (e === 0) return -1;
      const o = (e - 1) * n;
      let j = 0;
      while (j < n && pts[o + j] === K[j]) j++;
      if (j === n) return e - 1;
      s = (s + 1) & mask;
    }
  }

  /** Appends K (which must not be present) and returns its index. */
  insert(K: ArrayLike<number>): number {
    const { n } = this;
    if ((this.size + 1) * n > this.pts.length) {
      const p = new Int32Array(this.pts.length * 2);
      p.set(this.pts);
      this.pts = p;
    }
    const i = this.size++;
    this.pts.set(K as ArrayLike<number>, i * n);
    if (2 * this.size > this.slots.length) this.rehash();
    else this.place(i);
    return i;
  }

  private place(i: number): void {
    const { slots, mask } = this;
    let s = this.hash(this.pts, i * this.n) & mask;
    while (slots[s] !== 0) s = (s + 1) & mask;
    slots[s] = i + 1;
  }

  private rehash(): void {
    this.slots = new Int32Array(this.slots.length * 2);
    this.mask = this.slots.length - 1;
    for (let i = 0; i < this.size; i++) this.place(i);
  }
}
