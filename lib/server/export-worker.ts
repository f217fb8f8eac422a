/**
 * What an export writes: the structure formats of lib/formats (writeStructure), or the powder peak list.
 * Runs inside a queue worker's task thread (lib/server/queue/tasks.ts), never on the request thread.
 */
import type { Structure } from '../structure/types';
import { exportFile, type WriteFormat } from '../formats/write';
import { parseSupercell } from '../structure/supercell';
import { checkStructure } from '../structure/checks/report';
import { generate } from '../models';
import { braggPowder } from '../diffraction/powder';
import { peakTableCsv } from '../diffraction/peak-table';
import { XRAY_LINES } from '../diffraction/wavelengths';
import { spaceGroupOf, SYMMETRY_ATOM_LIMITS } from '../structure/symmetry';
import { ensureSymmetry } from './symmetry-wasm';

/** The exported peak list: a laboratory Cu Kα1 X-ray pattern, the most common first comparison. */
const PEAKS = { radiation: 'xray' as const, wavelength: XRAY_LINES.Cu.ka1, twoThetaMin: 5, twoThetaMax: 120 };

/** The space group (moyo) for the check and the CIF, up to SYMMETRY_ATOM_LIMITS.server atoms. */
const SYMMETRY = { spaceGroup: spaceGroupOf, symmetryMaxAtoms: SYMMETRY_ATOM_LIMITS.server };

/**
 * A format may carry a supercell after '@' ("poscar@2x2x1", lib/server/exports.ts); 'cif' is written with the space
 * group found (operations and asymmetric unit) when the finder can run, 'cif-p1' in P 1 with every atom; 'check' is
 * the Check step's report as JSON (lib/server/check.ts).
 */
function render(s: Structure, job: string): string {
  const [format, size] = job.split('@');
  ensureSymmetry();
  if (format === 'check') return JSON.stringify(checkStructure(s, { spaceGroup: SYMMETRY.spaceGroup, spaceGroupMaxAtoms: SYMMETRY.symmetryMaxAtoms }));
  if (format !== 'peaks-csv') {
    const [written, cifSymmetry] = format === 'cif-p1' ? (['cif', 'p1'] as const) : ([format as WriteFormat, 'found'] as const);
    return exportFile(s, written, { supercell: size ? parseSupercell(size) : undefined, cifSymmetry, ...SYMMETRY }).text;
  }
  if (!s.cell) throw new RangeError('the peak list needs a periodic cell: cut an approximant (finite patches give a Debye profile, not reflections)');
  return peakTableCsv(braggPowder(s, PEAKS).peaks, PEAKS);
}

/** The bytes of one export: generate() records the validated params and the engine version as provenance. */
export function renderExport(params: unknown, format: string): string {
  return render(generate(params), format);
}
