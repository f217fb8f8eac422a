/**
 * LAMMPS data file, atom style `atomic` (LAMMPS manual, read_data command): a title line (the check's warnings on a
 * '#' line below it), the counts, the box,
 * `Masses` (one line per atom type, the element in a comment), and `Atoms # atomic` with `id type x y z`.
 *
 * LAMMPS boxes are "restricted triclinic": a = (lx, 0, 0), b = (xy, ly, 0), c = (xz, yz, lz) with lx, ly, lz > 0
 * (manual, Howto triclinic). The cell is turned into that frame from its lengths and angles
 * (lx = a, xy = b cos γ, ly = √(b² − xy²), xz = c cos β, yz = (b c cos α − xy xz)/ly, lz = √(c² − xz² − yz²)),
 * which is a rotation, so distances and fractional coordinates are unchanged. The tilts are then reduced to
 * |xy| ≤ lx/2, |xz| ≤ lx/2, |yz| ≤ ly/2 by adding lattice vectors (same lattice), because LAMMPS refuses or warns
 * about larger tilts. Atoms are wrapped into the box. An orthogonal cell gets no tilt line.
 */
import { cellParameters, type Cell } from '../math/cell';
import { toCartesian } from '../math/frac';
import { atomicWeight, symbolOf } from '../structure/elements';
import type { Structure } from '../structure/types';
import { validateStructure } from '../structure/validate';
import { wrappedFractional } from '../structure/wrap';
import { fixed } from './number';
import { requireOrderedSites } from './ordered';
import { simulationComment, type SimulationWriteOptions } from './poscar';

const DEG = Math.PI / 180;

/** The same lattice turned into LAMMPS's frame (a along x, b in the xy plane), tilts not yet reduced. Rows a, b, c. */
export function lammpsFrame(cell: Cell): Cell {
  const p = cellParameters(cell);
  const cos = (deg: number) => (Math.abs(deg - 90) < 1e-10 ? 0 : Math.cos(deg * DEG));
  const lx = p.a;
  const xy = p.b * cos(p.gamma);
  const ly = Math.sqrt(p.b * p.b - xy * xy);
  const xz = p.c * cos(p.beta);
  const yz = (p.b * p.c * cos(p.alpha) - xy * xz) / ly;
  const lz = Math.sqrt(p.c * p.c - xz * xz - yz * yz);
  return [
    [lx, 0, 0],
    [xy, ly, 0],
    [xz, yz, lz],
  ];
}

/** The LAMMPS box: lammpsFrame with the tilts reduced (c −= round(yz/ly)·b, c −= round(xz/lx)·a, b −= round(xy/lx)·a). */
export function lammpsCell(cell: Cell): Cell {
  const [[lx], [xy0, ly], [xz0, yz0, lz]] = lammpsFrame(cell);
  let xy = xy0;
  let xz = xz0;
  let yz = yz0;
  const m = Math.round(yz / ly);
  yz -= m * ly;
  xz -= m * xy;
  xz -= Math.round(xz / lx) * lx;
  xy -= Math.round(xy / lx) * lx;
  const z = (v: number) => (Math.abs(v) < 1e-12 ? 0 : v);
  return [
    [lx, 0, 0],
    [z(xy), ly, 0],
    [z(xz), z(yz), lz],
  ];
}

export function writeLammpsData(s: Structure, opts: SimulationWriteOptions = {}): string {
  validateStructure(s);
  if (!s.cell) throw new Error('LAMMPS data needs a periodic cell: cut an approximant (a finite patch has no box for LAMMPS)');
  if (s.species.length === 0) throw new Error('LAMMPS data: the structure has no atoms');
  requireOrderedSites(s, 'LAMMPS data');
  const box = lammpsCell(s.cell);
  // Cartesian positions in the LAMMPS frame: fractional coordinates (a rotation keeps them) times the frame cell,
  // then fractional in the reduced box and wrapped, so every atom lies in [lo, hi).
  const frame = lammpsFrame(s.cell);
  const rotated = toCartesian(frame, wrappedFractional(s));
  const inBox: Structure = { ...s, positions: rotated, cell: box };
  const f = wrappedFractional(inBox);
  const xyz = toCartesian(box, f);
  const types = [...new Set(s.species)].sort((a, b) => a - b);
  const typeOf = new Map(types.map((z, t) => [z, t + 1]));
  const [[lx], [xy, ly], [xz, yz, lz]] = box;
  // The first line is LAMMPS's title line. Readers other than LAMMPS (ase.io.read 3.22) also scan it for header
  // keywords ("atoms", "xlo xhi"), so the check's words go on a '#' comment line below it (LAMMPS ignores text
  // after '#') and the title only says how many problems there are.
  const out: string[] = [];
  if (opts.comment) {
    const severe = (opts.comment.match(/\bSEVERE\b/g) ?? []).length;
    const warnings = (opts.comment.match(/\bWARNING\b/g) ?? []).length;
    out.push(simulationComment(s, `check: ${severe} severe, ${warnings} warning${warnings === 1 ? '' : 's'} - see the comment below`), `# ${opts.comment}`);
  } else out.push(simulationComment(s));
  out.push('');
  out.push(`${s.species.length} atoms`, `${types.length} atom types`, '');
  out.push(`0.0 ${fixed(lx, 10)} xlo xhi`, `0.0 ${fixed(ly, 10)} ylo yhi`, `0.0 ${fixed(lz, 10)} zlo zhi`);
  if (xy !== 0 || xz !== 0 || yz !== 0) out.push(`${fixed(xy, 10)} ${fixed(xz, 10)} ${fixed(yz, 10)} xy xz yz`);
  out.push('', 'Masses', '');
  for (const z of types) out.push(`${typeOf.get(z)} ${atomicWeight(z)} # ${symbolOf(z)}`);
  out.push('', 'Atoms # atomic', '');
  for (let i = 0; i < s.species.length; i++) {
    out.push(`${i + 1} ${typeOf.get(s.species[i])} ${fixed(xyz[3 * i], 10)} ${fixed(xyz[3 * i + 1], 10)} ${fixed(xyz[3 * i + 2], 10)}`);
  }
  return out.join('\n') + '\n';
}
