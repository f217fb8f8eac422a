/**
 * The export job, run in its own process so a large cut never blocks the server's event loop:
 *   node --import tsx lib/server/export-worker.ts   (stdin: {"params": …, "format": "xyz"}; stdout: file bytes)
 * A child process (rather than worker_threads) because the Next.js server bundles lib/ into its own
 * chunks; a child loads the TypeScript sources directly through tsx, the same way in `next dev`,
 * `next start` and the tests. Exit code 0 = bytes on stdout; 2 = bad params (message on stderr).
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

async function main() {
  const chunks: Buffer[] = [];
  for await (const c of process.stdin) chunks.push(c as Buffer);
  const job = JSON.parse(Buffer.concat(chunks).toString('utf8')) as { params: unknown; format: string };
  let text: string;
  try {
    // generate() records the validated params and the engine version as the file's provenance.
    text = render(generate(job.params), job.format);
  } catch (e) {
    process.stderr.write(e instanceof Error ? e.message : String(e));
    process.exit(2);
  }
  process.stdout.write(text, () => process.exit(0));
}

main().catch((e: unknown) => {
  process.stderr.write(e instanceof Error ? e.message : String(e));
  process.exit(1);
});
