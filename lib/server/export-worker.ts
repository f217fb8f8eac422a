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

/** The exported peak list: a laboratory Cu Kα1 X-ray pattern, the most common first comparison. */
const PEAKS = { radiation: 'xray' as const, wavelength: XRAY_LINES.Cu.ka1, twoThetaMin: 5, twoThetaMax: 120 };

/**
 * A format may carry a supercell after '@' ("poscar@2x2x1", lib/server/exports.ts); 'check' is the Check step's
 * report as JSON (lib/server/check.ts).
 */
function render(s: Structure, job: string): string {
  const [format, size] = job.split('@');
  if (format === 'check') return JSON.stringify(checkStructure(s));
  if (format !== 'peaks-csv') return exportFile(s, format as WriteFormat, { supercell: size ? parseSupercell(size) : undefined }).text;
  if (!s.cell) throw new RangeError('the peak list needs a periodic cell: cut an approximant (finite patches give a Debye profile, not reflections)');
  return peakTableCsv(braggPowder(s, PEAKS).peaks, PEAKS);
}

/** The bytes of one export: generate() records the validated params and the engine version as provenance. */
export function renderExport(params: unknown, format: string): string {
  return render(generate(params), format);
}
