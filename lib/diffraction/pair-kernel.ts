/**
 * WebAssembly SIMD kernel for the inner loop of the unit-weight pair histogram (pair-histogram.ts).
 *
 * Why: the plain JS loop is instruction-bound (≈ 20 machine instructions per pair: three loads, each
 * with a bounds check, the distance, the truncation and a checked typed-array increment). The same
 * arithmetic on two pairs at once (f64x2) without bounds checks counts the pairs about twice as fast
 * (tests/bench/diffraction.bench.ts; what is left is mostly the square root and the increments).
 *
 * Exactness: every pair goes through the same IEEE-754 double operations in the same order as the JS
 * reference — dx = x_j − x_i, d² = (dx² + dy²) + dz², b = trunc(√d² · (1/Δ)) — and f64x2 sub, mul, add
 * and sqrt are correctly rounded like their scalar forms (floor of a non-negative double is the
 * truncation), so every bin index (hence every count) is identical. Bins are clamped to nBins − 1 only to keep a store inside its array; histogramSpec leaves
 * two spare bins beyond the bounding diameter, so the clamp never changes a count.
 *
 * WebAssembly (and SIMD in it) is standard in browsers, Web Workers and Node, so lib/ stays isomorphic;
 * where it is missing `pairRowKernel` returns null and callers keep the JS loop. The module is tiny
 * (< 4 KB), so synchronous compilation is allowed on a browser's main thread too. It is written out
 * below instruction by instruction (WebAssembly binary format, core spec §5 and the SIMD proposal's
 * opcode table) rather than shipped as an opaque blob.
 *
 * Memory layout (one memory per kernel, imported so JS sizes it):
 *   [0, hists·16·nBins)  lane histograms, four Uint32 lanes per bin (bin·16 + lane·4): consecutive
 *                        pairs often share a bin, and separate lanes keep their increments from
 *                        waiting on each other
 *   xs, ys, zs           n doubles each, 16-byte aligned
 */

// Value types and a few opcodes (core spec §5.3–5.4; SIMD instructions are 0xfd + LEB128 sub-opcode).
const F64 = 0x7c;
const I32 = 0x7f;
const V128 = 0x7b;
const END = 0x0b;

function uleb(v: number): number[] {
  const out: number[] = [];
  do {
    let b = v & 0x7f;
    v >>>= 7;
    if (v !== 0) b |= 0x80;
    out.push(b);
  } while (v !== 0);
  return out;
}

function sleb(v: number): number[] {
  const out: number[] = [];
  for (;;) {
    const b = v & 0x7f;
    v >>= 7;
    if ((v === 0 && (b & 0x40) === 0) || (v === -1 && (b & 0x40) !== 0)) {
      out.push(b);
      return out;
    }
    out.push(b | 0x80);
  }
}

const simd = (op: number) => [0xfd, ...uleb(op)];
const get = (i: number) => [0x20, ...uleb(i)];
const set = (i: number) => [0x21, ...uleb(i)];
const tee = (i: number) => [0x22, ...uleb(i)];
const i32c = (v: number) => [0x41, ...sleb(v)];
const I32_ADD = 0x6a;
const I32_SHL = 0x74;
const I32_LT_U = 0x49;
const I32_GE_U = 0x4f;
const I32_GT_U = 0x4b;
const SELECT = 0x1b;
const i32Load = (offset: number) => [0x28, 2, ...uleb(offset)];
const i32Store = (offset: number) => [0x36, 2, ...uleb(offset)];
const f64Load = (offset: number) => [0x2b, 3, ...uleb(offset)];
const F64_SUB = 0xa1;
const F64_MUL = 0xa2;
const F64_ADD = 0xa0;
const F64_SQRT = 0x9f;
const I32_TRUNC_SAT_F64_S = [0xfc, 0x02];
const v128Load = (offset: number) => [...simd(0x00), 3, ...uleb(offset)];
const F64X2_SPLAT = simd(0x14);
const i32x4Lane = (lane: number) => [...simd(0x1b), lane];
const F64X2_SQRT = simd(0xef);
const F64X2_ADD = simd(0xf0);
const F64X2_SUB = simd(0xf1);
const F64X2_MUL = simd(0xf2);
const F64X2_PMIN = simd(0xf6); // b < a ? b : a — one minpd, unlike f64x2.min's NaN rules
const F64X2_FLOOR = simd(0x75);

// Parameters and locals of `row`.
const X = 0, Y = 1, Z = 2, P = 3, PE = 4, OY = 5, OZ = 6, INV = 7, TOP = 8, BASE = 9, MAGIC = 10, TOPF = 11; // params
const VX = 12, VY = 13, VZ = 14, VINV = 15, VTOP = 16, T = 17, B = 18, VMAGIC = 19; // v128 locals
const K = 20; // i32 local
const S = 21; // f64 local

/** d² of the two pairs whose x coordinates start at byte P + off, left as f64x2 on the stack. */
function dist2x2(off: number): number[] {
  return [
    ...get(P), ...v128Load(off), ...get(VX), ...F64X2_SUB, ...tee(T), ...get(T), ...F64X2_MUL,
    ...get(P), ...get(OY), I32_ADD, ...v128Load(off), ...get(VY), ...F64X2_SUB, ...tee(T), ...get(T), ...F64X2_MUL,
    ...F64X2_ADD,
    ...get(P), ...get(OZ), I32_ADD, ...v128Load(off), ...get(VZ), ...F64X2_SUB, ...tee(T), ...get(T), ...F64X2_MUL,
    ...F64X2_ADD,
  ];
}

/**
 * Bin byte offsets of two pairs, then increment their lanes `lane0`, `lane0 + 1`. With t = √d² · inv,
 * floor(min(t, top)) + (2⁴⁸ + base/16) is exact (integers far below 2⁴⁸), and a double in [2⁴⁸, 2⁴⁹)
 * holds its integer part k as k·16 in the low mantissa bits (unit in the last place 2⁻⁴), so the low
 * 32 bits of each f64 lane are base + bin·16, the byte offset of the bin's four lanes (memory < 2³¹).
 * Cheap vector instructions instead of a saturating truncation, a clamp, a shift and an add.
 */
function binAndCount(lane0: number, vtop = VTOP, vinv = VINV, vmagic = VMAGIC, b = B, k = K): number[] {
  const inc = (lane: number) => [...get(b), ...i32x4Lane(2 * (lane - lane0)), ...tee(k), ...get(k), ...i32Load(4 * lane), ...i32c(1), I32_ADD, ...i32Store(4 * lane)];
  return [
    ...F64X2_SQRT, ...get(vinv), ...F64X2_MUL, ...get(vtop), ...F64X2_PMIN, ...F64X2_FLOOR, ...get(vmagic), ...F64X2_ADD, ...set(b),
    ...inc(lane0),
    ...inc(lane0 + 1),
  ];
}

/**
 * row(x, y, z, p, pe, oy, oz, inv, top, base, magic, topf): for every j with xs[j] at byte p ≤ · < pe (ys, zs at
 * +oy, +oz), count the pair with atom (x, y, z) into bin min(trunc(√d² · inv), top) of the lane
 * histogram at byte `base` (magic = 2⁴⁸ + base/16, topf = top as doubles). Eight pairs per pass (four
 * f64x2: fewer loop and splat instructions per pair than four), then one at a time.
 */
function rowBody(): number[] {
  const quad = [
    0x02, 0x40, // block
    0x03, 0x40, // loop
    ...get(P), ...i32c(64), I32_ADD, ...get(PE), I32_GT_U, 0x0d, 1, // br_if out: fewer than eight left
    ...dist2x2(0), ...binAndCount(0),
    ...dist2x2(16), ...binAndCount(2),
    ...dist2x2(32), ...binAndCount(0),
    ...dist2x2(48), ...binAndCount(2),
    ...get(P), ...i32c(64), I32_ADD, ...set(P),
    0x0c, 0, // br loop
    END, END,
  ];
  const sq = [...tee(S), ...get(S), F64_MUL];
  const tail = [
    0x02, 0x40,
    0x03, 0x40,
    ...get(P), ...get(PE), I32_GE_U, 0x0d, 1,
    ...get(P), ...f64Load(0), ...get(X), F64_SUB, ...sq,
    ...get(P), ...get(OY), I32_ADD, ...f64Load(0), ...get(Y), F64_SUB, ...sq, F64_ADD,
    ...get(P), ...get(OZ), I32_ADD, ...f64Load(0), ...get(Z), F64_SUB, ...sq, F64_ADD,
    F64_SQRT, ...get(INV), F64_MUL, ...I32_TRUNC_SAT_F64_S, ...set(K),
    // k = k < top ? k : top
    ...get(K), ...get(TOP), ...get(K), ...get(TOP), I32_LT_U, SELECT, ...i32c(4), I32_SHL, ...get(BASE), I32_ADD, ...tee(K),
    ...get(K), ...i32Load(0), ...i32c(1), I32_ADD, ...i32Store(0),
    ...get(P), ...i32c(8), I32_ADD, ...set(P),
    0x0c, 0,
    END, END,
  ];
  const prologue = [
    ...get(X), ...F64X2_SPLAT, ...set(VX),
    ...get(Y), ...F64X2_SPLAT, ...set(VY),
    ...get(Z), ...F64X2_SPLAT, ...set(VZ),
    ...get(INV), ...F64X2_SPLAT, ...set(VINV),
    // top and 2⁴⁸ + base/16 (the low bits then hold base + bin·16 directly) come as doubles from the
    // caller: TurboFan places these splats next to their uses inside the loop, so keep them one move each
    ...get(TOPF), ...F64X2_SPLAT, ...set(VTOP),
    ...get(MAGIC), ...F64X2_SPLAT, ...set(VMAGIC),
  ];
  const locals = [3, 8, V128, 1, I32, 1, F64]; // 3 groups: 8 × v128, 1 × i32, 1 × f64
  const body = [...locals, ...prologue, ...quad, ...tail, END];
  return [...uleb(body.length), ...body];
}

// Parameters and locals of `row2`.
const R2 = { X1: 0, Y1: 1, Z1: 2, X2: 3, Y2: 4, Z2: 5, P: 6, PE: 7, OY: 8, OZ: 9, INV: 10, TOPF: 11, M1: 12, M2: 13 };
const R2V = { X1: 14, Y1: 15, Z1: 16, X2: 17, Y2: 18, Z2: 19, INV: 20, TOP: 21, M1: 22, M2: 23, T: 24, B: 25, LX: 26, LY: 27, LZ: 28 };
const R2K = 29;

/** d² of the two j in LX, LY, LZ to the atom in vx, vy, vz (same operations and order as dist2x2). */
function dist2From(vx: number, vy: number, vz: number): number[] {
  const t = R2V.T;
  return [
    ...get(R2V.LX), ...get(vx), ...F64X2_SUB, ...tee(t), ...get(t), ...F64X2_MUL,
    ...get(R2V.LY), ...get(vy), ...F64X2_SUB, ...tee(t), ...get(t), ...F64X2_MUL,
    ...F64X2_ADD,
    ...get(R2V.LZ), ...get(vz), ...F64X2_SUB, ...tee(t), ...get(t), ...F64X2_MUL,
    ...F64X2_ADD,
  ];
}

/**
 * row2(x1, y1, z1, x2, y2, z2, p, pe, oy, oz, inv, topf, magic1, magic2): two rows against the same j,
 * (pe − p) a multiple of 32 bytes (four j). Each j coordinate is loaded once for both rows; row 1
 * counts into lanes 0, 1 of its histogram, row 2 into lanes 2, 3 of its own.
 */
function row2Body(): number[] {
  const V = R2V;
  const load = (off: number) => [
    ...get(R2.P), ...v128Load(off), ...set(V.LX),
    ...get(R2.P), ...get(R2.OY), I32_ADD, ...v128Load(off), ...set(V.LY),
    ...get(R2.P), ...get(R2.OZ), I32_ADD, ...v128Load(off), ...set(V.LZ),
  ];
  const both = [
    ...dist2From(V.X1, V.Y1, V.Z1), ...binAndCount(0, V.TOP, V.INV, V.M1, V.B, R2K),
    ...dist2From(V.X2, V.Y2, V.Z2), ...binAndCount(2, V.TOP, V.INV, V.M2, V.B, R2K),
  ];
  const loop = [
    0x02, 0x40,
    0x03, 0x40,
    ...get(R2.P), ...get(R2.PE), I32_GE_U, 0x0d, 1,
    ...load(0), ...both,
    ...load(16), ...both,
    ...get(R2.P), ...i32c(32), I32_ADD, ...set(R2.P),
    0x0c, 0,
    END, END,
  ];
  const prologue = [
    ...get(R2.X1), ...F64X2_SPLAT, ...set(V.X1),
    ...get(R2.Y1), ...F64X2_SPLAT, ...set(V.Y1),
    ...get(R2.Z1), ...F64X2_SPLAT, ...set(V.Z1),
    ...get(R2.X2), ...F64X2_SPLAT, ...set(V.X2),
    ...get(R2.Y2), ...F64X2_SPLAT, ...set(V.Y2),
    ...get(R2.Z2), ...F64X2_SPLAT, ...set(V.Z2),
    ...get(R2.INV), ...F64X2_SPLAT, ...set(V.INV),
    ...get(R2.TOPF), ...F64X2_SPLAT, ...set(V.TOP),
    ...get(R2.M1), ...F64X2_SPLAT, ...set(V.M1),
    ...get(R2.M2), ...F64X2_SPLAT, ...set(V.M2),
  ];
  const locals = [2, 15, V128, 1, I32];
  const body = [...locals, ...prologue, ...loop, END];
  return [...uleb(body.length), ...body];
}

function section(id: number, content: number[]): number[] {
  return [id, ...uleb(content.length), ...content];
}

const name = (s: string) => [...uleb(s.length), ...Array.from(s, (c) => c.charCodeAt(0))];

function moduleBytes(): Uint8Array<ArrayBuffer> {
  const type = [
    2,
    ...[0x60, 12, F64, F64, F64, I32, I32, I32, I32, F64, I32, I32, F64, F64, 0],
    ...[0x60, 14, F64, F64, F64, F64, F64, F64, I32, I32, I32, I32, F64, F64, F64, F64, 0],
  ];
  const imports = [1, ...name('env'), ...name('mem'), 0x02, 0x00, 1]; // memory, min 1 page, no max
  const funcs = [2, 0, 1];
  const exports = [2, ...name('row'), 0x00, 0, ...name('row2'), 0x00, 1];
  const code = [2, ...rowBody(), ...row2Body()];
  return Uint8Array.from([
    0x00, 0x61, 0x73, 0x6d, 0x01, 0x00, 0x00, 0x00,
    ...section(1, type),
    ...section(2, imports),
    ...section(3, funcs),
    ...section(7, exports),
    ...section(10, code),
  ]);
}

export interface PairRowKernel {
  /** `hists` lane histograms of 4 × nBins counts each (hist·4·nBins + bin·4 + lane), zeroed at creation. */
  lanes: Uint32Array;
  xs: Float64Array;
  ys: Float64Array;
  zs: Float64Array;
  /** Count the pairs of (x, y, z) with atoms j0 ≤ j < j1 into lane histogram `hist`. */
  row(x: number, y: number, z: number, j0: number, j1: number, hist: number): void;
  /** The same for two atoms at once (j1 − j0 a multiple of 4), into histograms hist1 and hist2. */
  row2(x1: number, y1: number, z1: number, x2: number, y2: number, z2: number, j0: number, j1: number, hist1: number, hist2: number): void;
}

let compiled: WebAssembly.Module | null | undefined;

function kernelModule(): WebAssembly.Module | null {
  if (compiled !== undefined) return compiled;
  try {
    const bytes = moduleBytes();
    compiled = typeof WebAssembly === 'object' && WebAssembly.validate(bytes) ? new WebAssembly.Module(bytes) : null;
  } catch {
    compiled = null;
  }
  return compiled;
}

/**
 * A kernel for n atoms and `hists` histograms of nBins bins of width 1/inv, or null where WebAssembly
 * SIMD is unavailable (or the arrays would not fit one 32-bit memory).
 */
export function pairRowKernel(n: number, nBins: number, inv: number, hists = 1): PairRowKernel | null {
  const mod = kernelModule();
  if (!mod) return null;
  const histBytes = 16 * nBins;
  const col = 16 * Math.ceil((8 * n) / 16);
  const xo = histBytes * hists;
  const bytes = xo + 3 * col;
  if (bytes > 2 ** 31) return null;
  let mem: WebAssembly.Memory;
  try {
    mem = new WebAssembly.Memory({ initial: Math.ceil(bytes / 65536) || 1 });
  } catch {
    return null; // no room for that much memory: the JS loops need none extra
  }
  const inst = new WebAssembly.Instance(mod, { env: { mem } });
  type RowFn = (x: number, y: number, z: number, p: number, pe: number, oy: number, oz: number, inv: number, top: number, base: number, magic: number, topf: number) => void;
  const rowFn = inst.exports.row as RowFn;
  type Row2Fn = (x1: number, y1: number, z1: number, x2: number, y2: number, z2: number, p: number, pe: number, oy: number, oz: number, inv: number, topf: number, m1: number, m2: number) => void;
  const row2Fn = inst.exports.row2 as Row2Fn;
  const buf = mem.buffer;
  const top = nBins - 1;
  return {
    lanes: new Uint32Array(buf, 0, 4 * nBins * hists),
    xs: new Float64Array(buf, xo, n),
    ys: new Float64Array(buf, xo + col, n),
    zs: new Float64Array(buf, xo + 2 * col, n),
    row: (x, y, z, j0, j1, hist) => rowFn(x, y, z, xo + 8 * j0, xo + 8 * j1, col, 2 * col, inv, top, hist * histBytes, 2 ** 48 + hist * nBins, top),
    row2: (x1, y1, z1, x2, y2, z2, j0, j1, h1, h2) =>
      row2Fn(x1, y1, z1, x2, y2, z2, xo + 8 * j0, xo + 8 * j1, col, 2 * col, inv, top, 2 ** 48 + h1 * nBins, 2 ** 48 + h2 * nBins),
  };
}
