/**
 * Periodic structures written for simulation codes: every atom inside the cell, fractional coordinates in
 * [0, 1). DFT and MD codes accept atoms outside the cell, but many tools (and people) read an atom at
 * f = 1.03 as a mistake, and a coordinate that prints as 1.00000000 is the same site as 0 twice over.
 */
import { toCartesian, toFractional } from '../math/frac';
import type { Structure } from './types';
import { validateStructure } from './validate';

/**
 * Fractional coordinates reduced into [0, 1). A value within `snap` below 1 (it would print as 1.000… at
 * 8 decimals) becomes 0, and a value within `snap` above 0 stays, so a file never holds f = 1.
 */
export function wrappedFractional(s: Structure, snap = 5e-9): Float64Array {
  if (!s.cell) throw new Error('wrap: the structure has no cell (only periodic structures are wrapped)');
  const f = toFractional(s.cell, s.positions);
  for (let i = 0; i < f.length; i++) {
    let x = f[i] - Math.floor(f[i]);
    if (x >= 1 - snap) x = 0;
    if (Math.abs(x) < snap) x = 0; // −0 and tiny negatives rounded to zero
    f[i] = x;
  }
  return f;
}

/** How many atoms of a periodic structure lie outside its cell (some fractional coordinate ∉ [−tol, 1 + tol)). */
export function atomsOutsideCell(s: Structure, tol = 1e-6): number {
  if (!s.cell) return 0;
  validateStructure(s);
  const f = toFractional(s.cell, s.positions);
  let out = 0;
  for (let i = 0; i < f.length; i += 3) {
    if ([f[i], f[i + 1], f[i + 2]].some((x) => x < -tol || x >= 1 + tol)) out++;
  }
  return out;
}

/** A copy of a periodic structure with every atom moved into the cell (same order, same everything else). */
export function wrapIntoCell(s: Structure): Structure {
  validateStructure(s);
  if (!s.cell) throw new Error('wrap: the structure has no cell (only periodic structures are wrapped)');
  return { ...s, positions: toCartesian(s.cell, wrappedFractional(s)) };
}
