/** `diffract compare`: scale a simulated powder pattern to a measured two-column file and report R factors. */
import type { Command } from 'commander';
import { CliError, zodMessage } from '../errors';
import { compute, loadStructure, num, r, range, readText } from '../flags';
import { compareParamsSchema, profileSchema, radiationSchema } from '../../../lib/diffraction/params';
import { readMeasured, type MeasuredAxis } from '../../../lib/formats/measured';
import { braggPowder } from '../../../lib/diffraction/powder';
import { debyePowder } from '../../../lib/diffraction/debye-powder';
import { comparePatterns, type SimReflection } from '../../../lib/diffraction/compare';
import { parseWavelength } from '../../../lib/diffraction/wavelengths';
import { DIFFRACTION_UNITS } from '../../../lib/diffraction/units';
import { ENGINE_VERSION } from '../../../lib/version';

interface Flags {
  input: string;
  measured: string;
  wavelength: string;
  radiation: string;
  axis?: string;
  range?: string;
  noBackground?: boolean;
  background?: boolean;
  step?: string;
  peakThreshold?: string;
}

export function registerDiffractCompare(d: Command): void {
  d.command('compare')
    .description('Scale the simulated powder pattern to a measured one; R_p, R_wp and a peak-matching table.')
    .requiredOption('--input <file>', 'structure file')
    .requiredOption('--measured <file>', 'two-column pattern: 2θ/I, Q/I or d/I')
    .option('--wavelength <spec>', 'CuKa1, MoKa1, … or Å', 'CuKa1')
    .option('--radiation <r>', 'xray, neutron or electron', 'xray')
    .option('--axis <axis>', 'measured x axis when the file has no header: 2theta, q or d')
    .option('--range <a:b>', 'simulated 2θ range (default: the measured range)')
    .option('--no-background', 'fit the scale only')
    .option('--step <deg>', 'simulation step in 2θ')
    .option('--peak-threshold <f>', 'measured peaks: prominence above this fraction of the range')
    .action((o: Flags) => {
      const radiation = radiationSchema.safeParse(o.radiation);
      if (!radiation.success) throw new CliError(zodMessage(radiation.error));
      const cp = compareParamsSchema.safeParse({ background: o.background !== false, peakThreshold: num('--peak-threshold', o.peakThreshold) });
      if (!cp.success) throw new CliError(zodMessage(cp.error));
      const lambda = compute(() => parseWavelength(o.wavelength, '--wavelength'));
      const axis = o.axis === undefined ? undefined : (o.axis as MeasuredAxis);
      if (axis !== undefined && !['2theta', 'q', 'd'].includes(axis)) throw new CliError(`--axis: must be 2theta, q or d, got "${o.axis}"`);
      const measured = compute(() => readMeasured(readText(o.measured, '--measured'), { axis }));
      const s = loadStructure(o.input);
      const prof = profileSchema.parse({ step: num('--step', o.step) });
      let t0: number;
      let t1: number;
      if (o.range) [t0, t1] = range('--range', o.range);
      else {
        const tt = Array.from(measured.x, (x) =>
          measured.axis === '2theta' ? x : measured.axis === 'q' ? (360 / Math.PI) * Math.asin(Math.min(1, (x * lambda) / (4 * Math.PI))) : (360 / Math.PI) * Math.asin(Math.min(1, lambda / (2 * x))),
        );
        t0 = Math.max(0.01, Math.min(...tt) - 1);
        t1 = Math.min(179.9, Math.max(...tt) + 1);
      }
      let sim: { twoTheta: Float64Array; intensity: Float64Array };
      let refl: SimReflection[];
      if (s.cell) {
        const res = compute(() => braggPowder(s, { wavelength: lambda, radiation: radiation.data, twoThetaMin: t0, twoThetaMax: t1, profile: prof }));
        sim = res.profile!;
        refl = res.peaks.map((p) => ({ twoTheta: p.twoTheta, d: p.d, hkl: p.hkl, intensity: p.intensity }));
      } else {
        const res = compute(() => debyePowder(s, { wavelength: lambda, radiation: radiation.data, twoThetaMin: t0, twoThetaMax: t1, step: prof.step }));
        sim = { twoTheta: res.twoTheta, intensity: res.intensity };
        refl = res.maxima.map((p) => ({ twoTheta: p.twoTheta, d: p.d, hkl: null, intensity: p.intensity }));
      }
      const c = compute(() => comparePatterns(measured, sim, refl, { wavelength: lambda, background: cp.data.background, peakThreshold: cp.data.peakThreshold }));
      const out = {
        engine: ENGINE_VERSION,
        units: DIFFRACTION_UNITS,
        weights: 'w = 1/I_obs (counting statistics)',
        scale: r(c.scale, 9),
        background: r(c.background, 6),
        rp: r(c.rp, 6),
        rwp: r(c.rwp, 6),
        points: c.points,
        peaks: c.peaks.map((p) => ({
          twoTheta: r(p.twoTheta),
          intensity: r(p.intensity, 4),
          nearest: p.nearest ? { twoTheta: r(p.nearest.twoTheta), d: r(p.nearest.d), hkl: p.nearest.hkl, intensity: r(p.nearest.intensity, 4) } : null,
          misfit: p.misfit === null ? null : r(p.misfit),
        })),
      };
      process.stdout.write(JSON.stringify(out) + '\n');
    });
}
