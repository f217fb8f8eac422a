import type { Structure } from '../structure/types';
import { writeCif } from './cif';
import { writeExtxyz } from './extxyz';
import { writeJson } from './json';
import { writeXyz } from './xyz';
import type { StructureFormat } from './read';

export const STRUCTURE_FORMATS: readonly StructureFormat[] = ['xyz', 'extxyz', 'cif', 'json'];

/** One writer for every coordinate format, so the CLI, downloads and exports cannot drift apart. */
export function writeStructure(s: Structure, format: StructureFormat): string {
  switch (format) {
    case 'xyz':
      return writeXyz(s);
    case 'extxyz':
      return writeExtxyz(s);
    case 'cif':
      return writeCif(s);
    case 'json':
      return writeJson(s);
    default:
      throw new Error(`format must be one of ${STRUCTURE_FORMATS.join(', ')}, got "${String(format)}"`);
  }
}
