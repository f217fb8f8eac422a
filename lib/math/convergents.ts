/**
 * Continued fractions of quadratic irrationals x = (a + b·√d)/c, in exact integer (BigInt) arithmetic.
 *
 * The partial quotients of a quadratic irrational are eventually periodic (Lagrange). They are produced by
 * the classic recurrence on x_k = (P_k + √D)/Q_k with Q_k | (D − P_k²):
 *   a_k = ⌊(P_k + √D)/Q_k⌋,  P_{k+1} = a_k·Q_k − P_k,  Q_{k+1} = (D − P_{k+1}²)/Q_k
 * (see e.g. Niven, Zuckerman & Montgomery, An Introduction to the Theory of Numbers, §7.7), which stays in
 * integers, so no rounding can creep in. Convergents follow p_k = a_k p_{k−1} + p_{k−2} (same for q).
 */

/** x = (a + b·√d)/c with integers a, b, c, d; b ≠ 0, c ≠ 0, d ≥ 2 not a perfect square. */
export interface QuadraticIrrational {
  a: number;
  b: number;
  c: number;
  d: number;
}

/** τ = (1 + √5)/2, the golden mean. */
export const GOLDEN_MEAN: QuadraticIrrational = { a: 1, b: 1, c: 2, d: 5 };
/** 1 + √2, the silver mean. */
export const SILVER_MEAN: QuadraticIrrational = { a: 1, b: 1, c: 1, d: 2 };

export interface Convergent {
  /** Index k of the convergent (0-based). */
  k: number;
  /** Partial quotient a_k. */
  a: number;
  p: number;
  q: number;
  /** p/q as a double. */
  value: number;
  /** |x − p/q|, computed without cancellation (see convergents()). */
  error: number;
  /** Exact check of |x − p/q| < 1/q² (true for every convergent: Legendre/Dirichlet). */
  boundOk: boolean;
}

function isqrt(n: bigint): bigint {
  if (n < 0n) throw new RangeError('isqrt of a negative number');
  if (n < 2n) return n;
  let x = BigInt(Math.floor(Math.sqrt(Number(n))));
  // Newton correction: the double estimate can be off by a few units for large n.
  while (x * x > n) x = (x + n / x) / 2n;
  while ((x + 1n) * (x + 1n) <= n) x += 1n;
  return x;
}

function floorDiv(n: bigint, m: bigint): bigint {
  const q = n / m;
  return (n % m !== 0n && (n < 0n) !== (m < 0n)) ? q - 1n : q;
}

/** Sign of A + B·√d for integers A, B and non-square d > 0, exactly. */
function signSurd(A: bigint, B: bigint, d: bigint): number {
  const sa = A > 0n ? 1 : A < 0n ? -1 : 0;
  const sb = B > 0n ? 1 : B < 0n ? -1 : 0;
  if (sb === 0) return sa;
  if (sa === 0 || sa === sb) return sb;
  // Opposite signs: compare A² with B²·d.
  const diff = A * A - B * B * d;
  return diff > 0n ? sa : sb;
}

/** Throws a RangeError naming the field when x is not a valid quadratic irrational. */
export function checkQuadraticIrrational(x: QuadraticIrrational): void {
  for (const f of ['a', 'b', 'c', 'd'] as const) {
    if (!Number.isSafeInteger(x[f])) throw new RangeError(`${f}: must be a safe integer, got ${x[f]}`);
  }
  if (x.b === 0) throw new RangeError('b: must be non-zero (b = 0 gives a rational number)');
  if (x.c === 0) throw new RangeError('c: must be non-zero');
  if (x.d < 2) throw new RangeError(`d: must be at least 2, got ${x.d}`);
  const r = isqrt(BigInt(x.d));
  if (r * r === BigInt(x.d)) throw new RangeError(`d: must not be a perfect square, got ${x.d}`);
}

/** Value of x as a double. */
export function quadraticValue(x: QuadraticIrrational): number {
  return (x.a + x.b * Math.sqrt(x.d)) / x.c;
}

/**
 * Partial quotients a_0 … a_{count−1} as BigInt (the first may be negative or zero).
 */
export function partialQuotients(x: QuadraticIrrational, count: number): bigint[] {
  checkQuadraticIrrational(x);
  // Bring x to the form (P + √D)/Q with Q | D − P².
  let P = BigInt(x.b > 0 ? x.a : -x.a);
  let Q = BigInt(x.b > 0 ? x.c : -x.c);
  let D = BigInt(x.b) * BigInt(x.b) * BigInt(x.d);
  if ((D - P * P) % Q !== 0n) {
    const absQ = Q < 0n ? -Q : Q;
    P *= absQ;
    D *= Q * Q;
    Q *= absQ;
  }
  const s = isqrt(D);
  const out: bigint[] = [];
  for (let k = 0; k < count; k++) {
    // ⌊(P + √D)/Q⌋ = ⌊(P + s)/Q⌋ for Q > 0 and ⌊(P + s + 1)/Q⌋ for Q < 0, because √D is irrational
    // and no multiple of Q lies strictly between P + s and P + s + 1.
    const ak = Q > 0n ? floorDiv(P + s, Q) : floorDiv(P + s + 1n, Q);
    out.push(ak);
    P = ak * Q - P;
    Q = (D - P * P) / Q;
  }
  return out;
}

/**
 * The first `count` convergents p/q of x. Each carries its error |x − p/q| and the exact test
 * |x − p/q| < 1/q².
 *
 * Error without cancellation: with u = a·q − c·p and v = b·q, x − p/q = (u + v√d)/(c·q) and
 * u + v√d = (u² − v²d)/(u − v√d), whose numerator is an exact integer and whose denominator has no
 * cancellation (u and v√d have opposite signs near a convergent).
 *
 * Throws a RangeError naming `count` when a convergent would pass 2^53 (doubles could no longer hold p, q).
 */
export function convergents(x: QuadraticIrrational, count: number): Convergent[] {
  if (!Number.isInteger(count) || count < 1) throw new RangeError(`count: must be a positive integer, got ${count}`);
  const quotients = partialQuotients(x, count);
  const a = BigInt(x.a), b = BigInt(x.b), c = BigInt(x.c), d = BigInt(x.d);
  const absC = c < 0n ? -c : c;
  const limit = BigInt(Number.MAX_SAFE_INTEGER);
  const sqrtD = Math.sqrt(x.d);
  const out: Convergent[] = [];
  let pPrev = 1n, p = quotients[0];
  let qPrev = 0n, q = 1n;
  for (let k = 0; k < count; k++) {
    if (k > 0) {
      const ak = quotients[k];
      [pPrev, p] = [p, ak * p + pPrev];
      [qPrev, q] = [q, ak * q + qPrev];
    }
    const absP = p < 0n ? -p : p;
    if (absP > limit || q > limit) {
      throw new RangeError(`count: convergent ${k} exceeds 2^53 (safe-integer limit); ask for at most ${k} convergents`);
    }
    const u = a * q - c * p;
    const v = b * q;
    const num = u * u - v * v * d;
    const den = Number(u) - Number(v) * sqrtD;
    const error = num === 0n ? 0 : Math.abs(Number(num) / den) / (Math.abs(x.c) * Number(q));
    // |u + v√d| / (|c| q) < 1/q²  ⇔  −|c| < (u + v√d)·q < |c|
    const U = u * q, V = v * q;
    const boundOk = signSurd(U - absC, V, d) < 0 && signSurd(U + absC, V, d) > 0;
    out.push({ k, a: Number(quotients[k]), p: Number(p), q: Number(q), value: Number(p) / Number(q), error, boundOk });
  }
  return out;
}
