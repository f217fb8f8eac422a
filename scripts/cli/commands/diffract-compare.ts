/** `diffract compare`: scale a simulated powder pattern to a measured two-column file and report R factors. */
import { Option, type Command } from 'commander';
import { compute, emit, loadStructure, number, parse, r, radiationOption, readText, span, wavelength } from '../flags';
import { compareParamsSchema, profileSchema } from '../../../lib/diffraction/params';
import { readMeasured, type MeasuredAxis } from '../../../lib/formats/measured';
import { braggPowder } from '../../../lib/diffraction/powder';
import { debyePowder } from '../../../lib/diffraction/debye-powder';
import { comparePatterns, type SimReflection } from '../../../lib/diffraction/compare';
import { parseWavelength } from '../../../lib/diffraction/wavelengths';
import type { Radiation } from '../../../lib/diffraction/form-factors';
import { DIFFRACTION_UNITS } from '../../../lib/diffraction/units';
import { ENGINE_VERSION } from '../../../lib/version';

interface Flags {
  input: string;
  measured: string;
  wavelength: string;
  radiation: Radiation;
  axis?: MeasuredAxis;
  range?: [number, number];
  background: boolean;
  step?: number;
  peakThreshold?: number;
}

const MEASURED_AXES: readonly MeasuredAxis[] = ['2theta', 'q', 'd'];

export function registerDiffractCompare(d: Command): void {
  d.command('compare')
    .description('Scale the simulated powder pattern to a measured one; R_p, R_wp and a peak-matching table.')
    .requiredOption('--input <file>', 'structure file')
    .requiredOption('--measured <file>', 'two-column pattern: 2θ/I, Q/I or d/I')
    .option('--wavelength <spec>', 'CuKa1, MoKa1, … or Å', wavelength, 'CuKa1')
    .addOption(radiationOption('xray'))
    .addOption(new Option('--axis <axis>', 'measured x axis when the file has no header').choices(MEASURED_AXES))
    .option('--range <a:b>', 'simulated 2θ range (default: the measured range)', span)
    .option('--no-background', 'fit the scale only')
    .option('--step <deg>', 'simulation step in 2θ', number)
    .option('--peak-threshold <f>', 'measured peaks: prominence above this fraction of the range', number)
    .action((o: Flags, cmd: Command) => {
      const cp = parse(compareParamsSchema, { background: o.background, peakThreshold: o.peakThreshold });
      const lambda = compute(() => parseWavelength(o.wavelength, '--wavelength'));
      const measured = compute(() => readMeasured(readText(o.measured, '--measured'), { axis: o.axis }));
      const s = loadStructure(o.input);
      const prof = parse(profileSchema, { step: o.step });
      let t0: number;
      let t1: number;
      if (o.range) [t0, t1] = o.range;
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
        const res = compute(() => braggPowder(s, { wavelength: lambda, radiation: o.radiation, twoThetaMin: t0, twoThetaMax: t1, profile: prof }));
        sim = res.profile!;
        refl = res.peaks.map((p) => ({ twoTheta: p.twoTheta, d: p.d, hkl: p.hkl, intensity: p.intensity }));
      } else {
        const res = compute(() => debyePowder(s, { wavelength: lambda, radiation: o.radiation, twoThetaMin: t0, twoThetaMax: t1, step: prof.step }));
        sim = { twoTheta: res.twoTheta, intensity: res.intensity };
        refl = res.maxima.map((p) => ({ twoTheta: p.twoTheta, d: p.d, hkl: null, intensity: p.intensity }));
      }
      const c = compute(() => comparePatterns(measured, sim, refl, { wavelength: lambda, background: cp.background, peakThreshold: cp.peakThreshold }));
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
      emit(cmd, JSON.stringify(out) + '\n');
    });
}
