import type { Structure } from '../structure/types';
import { supercell, type SupercellSize } from '../structure/supercell';
import { wrapIntoCell } from '../structure/wrap';
import { DEFAULT_MAX_POINTS } from '../models/point-cap';
import { checkComment, checkStructure, type CheckReport, type SpaceGroupProvider } from '../structure/checks/report';
import { inStandardOrigin, symmetryReady } from '../structure/symmetry';
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
      const std = opts.cifSymmetry === 'found' && s.cell && symmetryReady() ? inStandardOrigin(s) : null;
      const text = std ? writeCif(std.structure, { symmetry: std.spaceGroup }) : writeCif(s);
      if (!comment) return text;
      // A CIF comment line right after the first line (CIF 1.1: '#' starts a comment anywhere).
      const nl = text.indexOf('\n');
      return `${text.slice(0, nl + 1)}# Tauforge check: ${comment}\n${text.slice(nl + 1)}`;
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
  return writeStructure(exportStructure(s, opts), format, { comment: opts.comment, cifSymmetry: opts.cifSymmetry });
}

export interface ExportFileOptions {
  supercell?: SupercellSize;
  cifSymmetry?: 'found' | 'p1';
  /** A symmetry finder for the check (see lib/structure/checks/report.ts). */
  spaceGroup?: SpaceGroupProvider;
}

/**
 * The one export pipeline (CLI, API, download menu): check the cut, then write it — supercell and wrapping as
 * exportStructure does — with the check's warnings in the file's comment line. Returns the report too, so a
 * caller can show the warnings or ask before handing the file over.
 */
export function exportFile(s: Structure, format: WriteFormat, opts: ExportFileOptions = {}): { text: string; report: CheckReport } {
  const report = checkStructure(s, { spaceGroup: opts.spaceGroup });
  const text = writeExport(s, format, { supercell: opts.supercell, cifSymmetry: opts.cifSymmetry, comment: checkComment(report) });
  return { text, report };
}
