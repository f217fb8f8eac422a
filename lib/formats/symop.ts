import { matVec, type Mat3 } from '../math/mat3';
import { add, type Vec3 } from '../math/vec3';

/** A symmetry operation in fractional coordinates: x' = R·x + t (R as rows, acting on column vectors). */
export interface SymOp {
  rot: Mat3;
  trans: Vec3;
}

/**
 * Parse a symmetry operation written as in CIF `_space_group_symop_operation_xyz`, e.g.
 * '-x+1/2,y,-z', 'x-y,x,z+1/2', '1/2+X,-Y,Z', 'x+0.25,y,z' (International Tables Vol. A notation).
 * Throws with the offending text on anything else.
 */
export function parseSymop(text: string): SymOp {
  const parts = text.replace(/\s+/g, '').toLowerCase().split(',');
  if (parts.length !== 3) throw new Error(`symmetry operation "${text}" must have three comma-separated parts`);
  const rot: Mat3 = [
    [0, 0, 0],
    [0, 0, 0],
    [0, 0, 0],
  ];
  const trans: Vec3 = [0, 0, 0];
  parts.forEach((p, row) => {
    if (p === '') throw new Error(`symmetry operation "${text}": part ${row + 1} is empty`);
    const re = /([+-]?)([^+-]+)/g;
    let m: RegExpExecArray | null;
    let consumed = 0;
    while ((m = re.exec(p)) !== null) {
      if (m.index !== consumed) break;
      consumed = re.lastIndex;
      const sign = m[1] === '-' ? -1 : 1;
      const term = m[2];
      const v = /^(\d*\.?\d*(?:\/\d+)?)\*?([xyz])$/.exec(term);
      if (v) {
        const coef = v[1] === '' ? 1 : parseFraction(v[1], text);
        rot[row]['xyz'.indexOf(v[2])] += sign * coef;
      } else {
        trans[row] += sign * parseFraction(term, text);
      }
    }
    if (consumed !== p.length) throw new Error(`symmetry operation "${text}": cannot read "${p}"`);
  });
  return { rot, trans };
}

function parseFraction(s: string, whole: string): number {
  const f = /^(\d+(?:\.\d*)?|\.\d+)(?:\/(\d+(?:\.\d*)?))?$/.exec(s);
  if (!f) throw new Error(`symmetry operation "${whole}": "${s}" is not a number or fraction`);
  const v = f[2] === undefined ? Number(f[1]) : Number(f[1]) / Number(f[2]);
  if (!Number.isFinite(v)) throw new Error(`symmetry operation "${whole}": "${s}" is not a number or fraction`);
  return v;
}

/** Apply an operation to fractional coordinates (u, v, w). */
export function applySymop(op: SymOp, u: number, v: number, w: number): Vec3 {
  return add(matVec(op.rot, [u, v, w]), op.trans);
}
