/**
 * Fractional ↔ Cartesian coordinates for a cell given as rows a, b, c: r = f·M = f₀a + f₁b + f₂c and
 * f = r·M⁻¹, i.e. fᵢ = r·aᵢ* with aᵢ* the reciprocal vectors (International Tables Vol. B §1.1).
 * Coordinates are packed x y z x y z … in Float64Arrays, like Structure.positions.
 */
import type { Cell } from './cell';
import { reciprocal } from './mat3';

/** Cartesian (packed) → fractional (packed): fᵢ = x·aᵢ*ₓ + y·aᵢ*ᵧ + z·aᵢ*₂, summed in that order. */
export function toFractional(cell: Cell, cart: ArrayLike<number>): Float64Array {
  const r = reciprocal(cell);
  const out = new Float64Array(cart.length);
  for (let i = 0; i < cart.length; i += 3) {
    const x = cart[i];
    const y = cart[i + 1];
    const z = cart[i + 2];
    out[i] = x * r[0][0] + y * r[0][1] + z * r[0][2];
    out[i + 1] = x * r[1][0] + y * r[1][1] + z * r[1][2];
    out[i + 2] = x * r[2][0] + y * r[2][1] + z * r[2][2];
  }
  return out;
}

/** Fractional (packed) → Cartesian (packed): r = u·a + v·b + w·c, summed in that order. */
export function toCartesian(cell: Cell, frac: ArrayLike<number>): Float64Array {
  const [a, b, c] = cell;
  const out = new Float64Array(frac.length);
  for (let i = 0; i < frac.length; i += 3) {
    const u = frac[i];
    const v = frac[i + 1];
    const w = frac[i + 2];
    out[i] = u * a[0] + v * b[0] + w * c[0];
    out[i + 1] = u * a[1] + v * b[1] + w * c[1];
    out[i + 2] = u * a[2] + v * b[2] + w * c[2];
  }
  return out;
}

/** Each fractional coordinate reduced into [0, 1) in place (x − ⌊x⌋; a −1e-17 that rounds up to 1 becomes 0). */
export function wrapFractional(frac: Float64Array): Float64Array {
  for (let i = 0; i < frac.length; i++) {
    frac[i] -= Math.floor(frac[i]);
    if (frac[i] >= 1) frac[i] = 0;
  }
  return frac;
}
