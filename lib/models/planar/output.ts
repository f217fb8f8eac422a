/**
 * The growing output of a tile pass: output vertices by their K (n each), numbered in order of first use as
 * a tile corner, and tiles as a kind and four corner numbers. Both are sized from the search up front and
 * doubled when full, so the tile passes append without allocating per tile.
 */
export class TilingOutput {
  private readonly n: number;
  private idx: Int32Array;
  private nOut = 0;
  private kinds: Uint8Array;
  private corners: Uint32Array;
  private nT = 0;

  /**
   * `vertices`: expected output vertices (the searched count); `tiles`: expected tiles — about one per vertex
   * (Euler's formula for a rhombus tiling), so the estimate rarely needs a regrow.
   */
  constructor(n: number, vertices: number, tiles: number) {
    this.n = n;
    this.idx = new Int32Array(n * Math.max(16, vertices));
    this.kinds = new Uint8Array(Math.max(1024, Math.ceil(1.1 * tiles)));
    this.corners = new Uint32Array(4 * this.kinds.length);
  }

  get vertexCount(): number {
    return this.nOut;
  }

  /** New output vertex V[o … o+n−1]; its number. */
  emit(V: ArrayLike<number>, o: number): number {
    const n = this.n;
    if ((this.nOut + 1) * n > this.idx.length) {
      const b = new Int32Array(2 * this.idx.length);
      b.set(this.idx);
      this.idx = b;
    }
    for (let j = 0; j < n; j++) this.idx[this.nOut * n + j] = V[o + j];
    return this.nOut++;
  }

  /** Tile of kind kd with corners c0 … c3 (output vertex numbers, counter-clockwise). */
  pushTile(kd: number, c0: number, c1: number, c2: number, c3: number): void {
    const t = this.nT;
    if (t >= this.kinds.length) {
      const k2 = new Uint8Array(2 * this.kinds.length);
      k2.set(this.kinds);
      this.kinds = k2;
      const c2a = new Uint32Array(2 * this.corners.length);
      c2a.set(this.corners);
      this.corners = c2a;
    }
    const corners = this.corners;
    this.kinds[t] = kd;
    corners[4 * t] = c0;
    corners[4 * t + 1] = c1;
    corners[4 * t + 2] = c2;
    corners[4 * t + 3] = c3;
    this.nT = t + 1;
  }

  /** K of the output vertices, n each, trimmed. */
  index(): Int32Array {
    return this.idx.slice(0, this.n * this.nOut);
  }

  /** Tile kinds and corners, trimmed. */
  tiles(): { kind: Uint8Array; corners: Uint32Array } {
    return { kind: this.kinds.slice(0, this.nT), corners: this.corners.slice(0, 4 * this.nT) };
  }
}
