/**
 * Exact set of integer vectors K ∈ Zⁿ (hyperlattice nodes of any dimension) with insertion-order indices:
 * open addressing (linear probing on a power-of-two table kept at most half full) over the n int32
 * components, vectors stored in one growable Int32Array. Lookups compare integers only — no strings, no
 * packed doubles — and because entries keep insertion order the set doubles as a breadth-first queue:
 * entry i is coords[n·i … n·i + n − 1].
 *
 * `bound` (optional) refuses components outside [−bound, bound) with a RangeError carrying `boundMessage`:
 * the planar cut keeps the index range its earlier packed-double key allowed (|K_j| < 2^⌊52/n⌋⁻¹), so the
 * patches refused before are refused now.
 */
export class IntVectorSet {
  readonly n: number;
  /** Vectors, n per entry, in insertion order (capacity may exceed size·n). */
  coords: Int32Array;
  size = 0;
  /** Entry index + 1 per slot; 0 = empty. */
  private slots: Int32Array;
  private mask: number;
  private readonly bound: number;
  private readonly boundMessage: string;

  constructor(n: number, expected = 1024, opts: { bound?: number; boundMessage?: string } = {}) {
    this.n = n;
    this.bound = opts.bound ?? Infinity;
    this.boundMessage = opts.boundMessage ?? `integer vector component beyond ±${this.bound - 1}`;
    let cap = 1024;
    while (cap < 2 * expected) cap *= 2;
    this.slots = new Int32Array(cap);
    this.mask = cap - 1;
    this.coords = new Int32Array(Math.max(16, expected) * n);
  }

  // FNV-style mixing with Math.imul: cheap and the same on every engine.
  private hash(K: ArrayLike<number>, o: number): number {
    const { n, bound } = this;
    let h = 0x811c9dc5;
    for (let j = 0; j < n; j++) {
      const v = K[o + j];
      if (v < -bound || v >= bound) throw new RangeError(this.boundMessage);
      h = Math.imul(h ^ v, 0x9e3779b1);
      h ^= h >>> 15;
    }
    return h;
  }

  /** Index of the vector K[o … o+n−1], or −1. */
  indexOf(K: ArrayLike<number>, o = 0): number {
    const { n, coords, slots, mask } = this;
    let s = this.hash(K, o) & mask;
    for (;;) {
      const e = slots[s];
      if (e === 0) return -1;
      const b = (e - 1) * n;
      let j = 0;
      while (j < n && coords[b + j] === K[o + j]) j++;
      if (j === n) return e - 1;
      s = (s + 1) & mask;
    }
  }

  /** Insert K[o … o+n−1]; its new index, or −1 when it was already there. */
  add(K: ArrayLike<number>, o = 0): number {
    return this.indexOf(K, o) >= 0 ? -1 : this.insert(K, o);
  }

  /** Append K[o … o+n−1], which must not be present yet; its index. */
  insert(K: ArrayLike<number>, o = 0): number {
    const { n } = this;
    if ((this.size + 1) * n > this.coords.length) {
      const grown = new Int32Array(this.coords.length * 2);
      grown.set(this.coords);
      this.coords = grown;
    }
    const i = this.size++;
    const c = this.coords;
    for (let j = 0; j < n; j++) c[i * n + j] = K[o + j];
    if (2 * this.size > this.slots.length) this.rehash();
    else this.place(i);
    return i;
  }

  private place(i: number): void {
    const { slots, mask } = this;
    let s = this.hash(this.coords, i * this.n) & mask;
    while (slots[s] !== 0) s = (s + 1) & mask;
    slots[s] = i + 1;
  }

  private rehash(): void {
    this.slots = new Int32Array(this.slots.length * 2);
    this.mask = this.slots.length - 1;
    for (let i = 0; i < this.size; i++) this.place(i);
  }
}
