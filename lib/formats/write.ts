import type { Structure } from '../structure/types';
import { supercell, type SupercellSize } from '../structure/supercell';
import { wrapIntoCell } from '../structure/wrap';
import { DEFAULT_MAX_POINTS } from '../models/point-cap';
import { checkComment, checkStructure, type CheckReport, type SpaceGroupProvider } from '../structure/checks/report';
import { findSpaceGroup, inStandardOrigin, symmetryReady, SYMMETRY_ATOM_LIMITS, type SpaceGroup } from '../structure/symmetry';
import { writeCif } from './cif';
import { writeExtxyz } from './extxyz';
import { writeJson } from './json';
import { writeLammpsData } from './lammps';
import { writePoscar } from './poscar';
import { writeXyz } from './xyz';
import type { StructureFormat } from './read';

export const STRUCTURE_FORMATS: readonly StructureFormat[] = ['xyz', 'extxyz', 'cif', 'json'];

/** What can be written: the formats we also read, plus the input files of the simulation codes we feed. */
export type WriteFormat = StructureFormat | 'poscar' | 'lammps';
export const WRITE_FORMATS: readonly WriteFormat[] = ['xyz', 'extxyz', 'cif', 'json', 'poscar', 'lammps'];
/** Formats that need a periodic cell. */
export const PERIODIC_ONLY_FORMATS: readonly WriteFormat[] = ['cif', 'poscar', 'lammps'];

export interface WriteOptions {
  /** A one-line summary of the check's warnings, carried in the file's comment line (none when absent). */
  comment?: string;
  /** CIF only: 'found' writes the space group, its operations and the asymmetric unit when the symmetry
   *  finder is ready and the cell is in a standard setting; 'p1' (the default) writes P 1 with every atom. */
  cifSymmetry?: 'found' | 'p1';
  /** CIF with 'found': cells with more atoms are written in P 1, saying so (default SYMMETRY_ATOM_LIMITS.server). */
  symmetryMaxAtoms?: number;
  /** CIF with 'found': write P 1 anyway, for this reason (writeExport sets it for a supercell). */
  p1Reason?: string;
}

/** What a CIF is written with: the space group and the structure moved to its standard origin, or P 1; and why. */
export interface CifSymmetryChoice {
  structure: Structure;
  spaceGroup: SpaceGroup | null;
  /** One plain-ASCII line for the file's comment: what was written and why. */
  note: string;
}

/**
 * The space group a CIF is written in. 'found' (the download menu's and the API's default): the group the finder
 * gives (moyo, symprec 1e-3 A), with the structure moved to the standard origin of the International Tables so its
 * operations are the tabulated ones; P 1 with every atom when asked ('p1'), when the cell is larger than the
 * finder's limit, when the finder is not loaded or fails, when the group is P 1, or when the cell is not in a
 * standard setting. The note says which, and why.
 */
export function cifSymmetryChoice(s: Structure, opts: Pick<WriteOptions, 'cifSymmetry' | 'symmetryMaxAtoms' | 'p1Reason'> = {}): CifSymmetryChoice {
  const n = s.species.length;
  const p1 = (why: string): CifSymmetryChoice => ({ structure: s, spaceGroup: null, note: `P 1 with all ${n} atoms: ${why}` });
  if (opts.cifSymmetry !== 'found') return p1("the 'P 1, all atoms' choice");
  if (opts.p1Reason) return p1(opts.p1Reason);
  if (!s.cell) return p1('no periodic cell');
  if (!symmetryReady()) return p1('the symmetry finder is not loaded here');
  const max = opts.symmetryMaxAtoms ?? SYMMETRY_ATOM_LIMITS.server;
  if (n > max) return p1(`more than ${max} atoms, the limit of the symmetry finder here (its time grows steeply with the cell)`);
  let g: SpaceGroup;
  let std: ReturnType<typeof inStandardOrigin>;
  try {
    g = findSpaceGroup(s);
    std = g.number === 1 ? null : inStandardOrigin(s);
  } catch (e) {
    return p1(`the symmetry finder failed (${(e as Error).message})`);
  }
  if (g.number === 1) return p1(`the symmetry finder (moyo, symprec ${g.symprec} A) finds no symmetry beyond the lattice translations`);
  if (!std) return p1(`the finder gives ${g.hmSymbol} (No. ${g.number}), but this cell is not in a standard setting of the International Tables, so its operations cannot be written against that symbol`);
  const sg = std.spaceGroup;
  const unique = sg.orbits.reduce((k, o, i) => k + (o === i ? 1 : 0), 0);
  const moved = std.structure !== s ? '; origin moved to the standard one of the International Tables' : '';
  return {
    structure: std.structure,
    spaceGroup: sg,
    note: `space group ${sg.hmSymbol} (No. ${sg.number}) found by moyo (symprec ${sg.symprec} A): ${sg.operations.length} operations, asymmetric unit of ${unique} of ${n} atoms${moved}`,
  };
}

/** One writer for every coordinate format, so the CLI, downloads and exports cannot drift apart. */
export function writeStructure(s: Structure, format: WriteFormat, opts: WriteOptions = {}): string {
  const comment = opts.comment?.replace(/[\r\n]+/g, ' ').trim() || undefined;
  switch (format) {
    case 'xyz':
      return writeXyz(s, { check: comment });
    case 'extxyz':
      return writeExtxyz(s, { check: comment });
    case 'cif': {
      const choice = cifSymmetryChoice(s, opts);
      const text = choice.spaceGroup ? writeCif(choice.structure, { symmetry: choice.spaceGroup }) : writeCif(s);
      // Comment lines right after the first line (CIF 1.1: '#' starts a comment anywhere).
      const nl = text.indexOf('\n');
      const lines = [...(comment ? [`# Tauforge check: ${comment}`] : []), `# Tauforge symmetry: ${choice.note}`];
      return `${text.slice(0, nl + 1)}${lines.join('\n')}\n${text.slice(nl + 1)}`;
    }
    case 'json':
      return writeJson(s);
    case 'poscar':
      return writePoscar(s, { comment });
    case 'lammps':
      return writeLammpsData(s, { comment });
    default:
      throw new Error(`format must be one of ${WRITE_FORMATS.join(', ')}, got "${String(format)}"`);
  }
}

export interface ExportOptions extends WriteOptions {
  /** Repeat the cell n₁ × n₂ × n₃ times first (periodic structures only). */
  supercell?: SupercellSize;
}

/**
 * The structure an export writes: the supercell when asked for, and — for periodic structures — every atom
 * wrapped into the cell, fractional coordinates in [0, 1) (simulation codes and readers expect that).
 */
export function exportStructure(s: Structure, opts: Pick<ExportOptions, 'supercell'> = {}): Structure {
  let out = s;
  const n = opts.supercell;
  if (n && (n[0] !== 1 || n[1] !== 1 || n[2] !== 1)) {
    if (!s.cell) throw new Error(`a supercell (${n.join('×')}) needs a periodic cell: cut an approximant`);
    // The supercell counts against the same point cap as the cut (the cut's own maxPoints, else the default).
    const cap = (s.model as { maxPoints?: number } | undefined)?.maxPoints ?? DEFAULT_MAX_POINTS;
    const total = s.species.length * n[0] * n[1] * n[2];
    if (total > cap) {
      throw new RangeError(`supercell: ${n.join('×')} of ${s.species.length.toLocaleString('en-US')} atoms is ${total.toLocaleString('en-US')} atoms, more than the point cap of ${cap.toLocaleString('en-US')}`);
    }
    out = supercell(out, n);
  }
  if (out.cell) out = wrapIntoCell(out);
  return out;
}

/** Export = exportStructure + writeStructure: what the CLI, the API and the download menu write. */
export function writeExport(s: Structure, format: WriteFormat, opts: ExportOptions = {}): string {
  if (PERIODIC_ONLY_FORMATS.includes(format) && !s.cell) {
    const name = format === 'poscar' ? 'POSCAR' : format === 'lammps' ? 'LAMMPS data' : 'CIF';
    throw new Error(`${name} needs a periodic cell: cut an approximant (this structure is a finite patch or a tiling without a cell)`);
  }
  const n = opts.supercell;
  const p1Reason = n && n[0] * n[1] * n[2] > 1 ? `a supercell (${n.join('x')}) is written in P 1 with every atom` : opts.p1Reason;
  return writeStructure(exportStructure(s, opts), format, { comment: opts.comment, cifSymmetry: opts.cifSymmetry, symmetryMaxAtoms: opts.symmetryMaxAtoms, p1Reason });
}

export interface ExportFileOptions {
  supercell?: SupercellSize;
  cifSymmetry?: 'found' | 'p1';
  /** The symmetry finder's atom limit for the CIF and the check (default SYMMETRY_ATOM_LIMITS.server). */
  symmetryMaxAtoms?: number;
  /** A symmetry finder for the check (see lib/structure/checks/report.ts). */
  spaceGroup?: SpaceGroupProvider;
}

/**
 * The one export pipeline (CLI, API, download menu): check the cut, then write it — supercell and wrapping as
 * exportStructure does — with the check's warnings in the file's comment line. Returns the report too, so a
 * caller can show the warnings or ask before handing the file over.
 */
export function exportFile(s: Structure, format: WriteFormat, opts: ExportFileOptions = {}): { text: string; report: CheckReport } {
  const report = checkStructure(s, { spaceGroup: opts.spaceGroup, spaceGroupMaxAtoms: opts.symmetryMaxAtoms });
  const text = writeExport(s, format, { supercell: opts.supercell, cifSymmetry: opts.cifSymmetry, symmetryMaxAtoms: opts.symmetryMaxAtoms, comment: checkComment(report) });
  return { text, report };
}
