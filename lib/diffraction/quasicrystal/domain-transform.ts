/**
 * Normalised Fourier transforms A(Q⊥) = (1/|W|) ∫_W e^{−iQ⊥·y} dy of every occupation-domain shape that an
 * icosahedral decoration offers (lib/models/icosahedral/decoration-schema.ts), all centred on the origin and
 * centrally symmetric, hence real:
 *  - hypercube (κ × the rhombic triacontahedron Σ[−½,½]e_i⊥): sum over the tetrahedra coned from the centre
 *    (window-transform.ts, symmetricBodyTransform);
 *  - sphere of radius R: 3(sin x − x cos x)/x³, x = |Q⊥|R (window-transform.ts, ballTransform);
 *  - shell r1 < |y| ≤ r2: the difference of two balls weighted by their volumes,
 *    A = (r2³ A_ball(r2) − r1³ A_ball(r1)) / (r2³ − r1³).
 * Lengths are perpendicular-space Å on the scale of hyperlattice.ts (|e_i⊥| = aR).
 */
import type { WindowSpec } from '../../models/icosahedral/cut';
import { icosahedralBasis } from '../../models/icosahedral/hyperlattice';
import { ballTransform, symmetricBodyTransform, zonotopeBody, type SymmetricConeBody } from '../window-transform';

export interface DomainTransform {
  /** Volume of the domain in Å³ (perpendicular space). */
  volume: number;
  /** A(Q⊥) for a Cartesian perpendicular vector (Å⁻¹). */
  at(qPerp: ArrayLike<number>): number;
}

export function domainTransform(spec: WindowSpec, aR: number): DomainTransform {
  if (spec.kind === 'hypercube') {
    if (!(spec.scale > 0)) throw new Error(`window.scale: must be positive, got ${spec.scale}`);
    const body: SymmetricConeBody = zonotopeBody(icosahedralBasis(aR).perp, spec.scale);
    return { volume: body.volume, at: (q) => symmetricBodyTransform(body, q) };
  }
  if (spec.kind === 'sphere') {
    const R = spec.radius;
    if (!(R > 0)) throw new Error(`window.radius: must be positive, got ${R}`);
    return { volume: (4 / 3) * Math.PI * R ** 3, at: (q) => ballTransform(Math.hypot(q[0], q[1], q[2]), R) };
  }
  const { r1, r2 } = spec;
  if (!(r1 >= 0 && r2 > r1)) throw new Error(`window: shell needs 0 ≤ r1 < r2, got r1 = ${r1}, r2 = ${r2}`);
  const v1 = r1 ** 3;
  const v2 = r2 ** 3;
  return {
    volume: (4 / 3) * Math.PI * (v2 - v1),
    at: (q) => {
      const k = Math.hypot(q[0], q[1], q[2]);
      return (v2 * ballTransform(k, r2) - (v1 > 0 ? v1 * ballTransform(k, r1) : 0)) / (v2 - v1);
    },
  };
}
