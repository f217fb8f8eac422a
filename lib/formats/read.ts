import type { Structure } from '../structure/types';
import { readCif } from './cif';
import { FormatError } from './errors';
import { readExtxyz } from './extxyz';
import { readJson } from './json';
import { readXyz } from './xyz';

export type StructureFormat = 'xyz' | 'extxyz' | 'cif' | 'json';

/**
 * Guess the format of a structure file from its text, using the file name's extension only to
 * break ties: JSON starts with "{"; CIF has a data_ block; an XYZ count line followed by a comment
 * line with Lattice= or Properties= is extended XYZ; otherwise plain XYZ.
 */
export function sniffFormat(text: string, filenameHint?: string): StructureFormat {
  const head = text.replace(/^\uFEFF/, '').trimStart();
  if (head.startsWith('{')) return 'json';
  const ext = filenameHint?.toLowerCase().match(/\.([a-z]+)$/)?.[1];
  if (/^(data_|#|loop_|_)/im.test(head.slice(0, 4096)) && /(^|\n)\s*data_/i.test(head.slice(0, 65536))) return 'cif';
  const lines = head.split(/\r\n|\r|\n/, 2);
  if (/^\d+\s*$/.test(lines[0] ?? '')) {
    if (/(^|\s)(Lattice|Properties)\s*=/i.test(lines[1] ?? '')) return 'extxyz';
    return ext === 'extxyz' ? 'extxyz' : 'xyz';
  }
  if (ext === 'cif' || ext === 'json' || ext === 'xyz' || ext === 'extxyz') return ext;
  throw new FormatError('structure file', 'cannot tell the format: expected XYZ, extended XYZ, CIF or Tauforge JSON', 1);
}

/** Read any supported structure file (XYZ, extended XYZ, CIF, Tauforge JSON). */
export function readStructure(text: string, filenameHint?: string): Structure {
  switch (sniffFormat(text, filenameHint)) {
    case 'json':
      return readJson(text);
    case 'cif':
      return readCif(text);
    case 'extxyz':
      return readExtxyz(text);
    case 'xyz':
      return readXyz(text);
  }
}
