/**
 * What the viewer measures between picked atoms: the lengths from each pick to the next and, with three
 * picks, the angle at the middle one. In a periodic cell the measurement can follow the nearest image: each
 * later atom is replaced by its image nearest the atom before it, so a bond across a cell face reads as
 * the bond, not as a line across the whole cell. The points returned are where the lines are drawn.
 */
import type { Cell } from '../math/cell';
import { angleDeg, pointAt, sub, type Vec3 } from '../math/vec3';
import { PeriodicCell } from './minimum-image';

export interface Measurement {
  /** Atom indices, in pick order. */
  atoms: number[];
  /** Where each atom is drawn for the measurement (an image of it when `shifts` is not [0 0 0]). */
  points: Vec3[];
  /** Lattice translation [n m l] (multiples of a, b, c) from each atom to its point. */
  shifts: Vec3[];
  /** |points[k+1] − points[k]| in Å. */
  lengths: number[];
  /** Angle points[0]–points[1]–points[2] at points[1] in degrees, with three picks; else null. */
  angle: number | null;
}

/**
 * Measure along the picks. With `cell` (nearest image on), each step points[k] → points[k+1] is the minimum
 * image of atom k+1 seen from points[k]; without it, the atoms' own positions.
 */
export function measurePicks(positions: ArrayLike<number>, picks: readonly number[], cell?: Cell | PeriodicCell | null): Measurement {
  const lattice = cell ? (cell instanceof PeriodicCell ? cell : new PeriodicCell(cell)) : null;
  const points: Vec3[] = [];
  const shifts: Vec3[] = [];
  for (let k = 0; k < picks.length; k++) {
    const p = pointAt(positions, picks[k]);
    if (k === 0 || !lattice) {
      points.push(p);
      shifts.push([0, 0, 0]);
      continue;
    }
    const from = points[k - 1];
    // The step is d − t with d = p − from and t a lattice vector, so the point drawn is p − t.
    const { vector, shift } = lattice.nearest(sub(p, from));
    points.push([from[0] + vector[0], from[1] + vector[1], from[2] + vector[2]]);
    shifts.push(shift.map((x) => 0 - x) as Vec3);
  }
  const lengths: number[] = [];
  for (let k = 0; k + 1 < points.length; k++) lengths.push(Math.hypot(...sub(points[k + 1], points[k])));
  const angle = points.length >= 3 ? angleDeg(sub(points[0], points[1]), sub(points[2], points[1])) : null;
  return { atoms: [...picks], points, shifts, lengths, angle };
}
