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
import { CliError } from '../errors';
import { kalpha2Of } from '../../../lib/diffraction/wavelengths';
import { fitLinesFromPeaks, fitPattern } from '../../../lib/diffraction/fit/fit-pattern';

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
  fit?: boolean;
  bgTerms?: number;
  lattice: boolean;
  kalpha2?: boolean;
  U?: number;
  V?: number;
  W?: number;
  eta?: number;
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
    .option('--fit', 'least-squares fit: scale, zero shift, Chebyshev background, Caglioti U V W and the cell scale, with standard uncertainties')
    .option('--bg-terms <n>', 'with --fit: Chebyshev background terms (default 4)', number)
    .option('--no-lattice', 'with --fit: keep the cell of the model')
    .option('--kalpha2', 'with --fit: include the Kα2 line (needs a Kα1 line name as --wavelength)')
    .option('--U <u>', 'starting Caglioti U (deg²)', number)
    .option('--V <v>', 'starting Caglioti V (deg²)', number)
    .option('--W <w>', 'starting Caglioti W (deg²)', number)
    .option('--eta <eta>', 'pseudo-Voigt Lorentzian fraction (held fixed)', number)
    .action((o: Flags, cmd: Command) => {
      const cp = parse(compareParamsSchema, { background: o.background, peakThreshold: o.peakThreshold });
      const lambda = compute(() => parseWavelength(o.wavelength, '--wavelength'));
      const measured = compute(() => readMeasured(readText(o.measured, '--measured'), { axis: o.axis }));
      const s = loadStructure(o.input);
      const prof = parse(profileSchema, { step: o.step, U: o.U, V: o.V, W: o.W, eta: o.eta });
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
      if (o.fit) {
        if (!s.cell) throw new CliError('--fit: needs a periodic cell (a finite patch has no reflection list to refine)');
        const line2 = o.kalpha2 ? kalpha2Of(o.wavelength) : undefined;
        if (o.kalpha2 && !line2) throw new CliError('--kalpha2: needs a Kα1 line name as --wavelength (e.g. CuKa1)');
        // Lines a little beyond the measured range: a zero shift or a cell change can bring them in.
        const peaks = compute(() => braggPowder(s, { wavelength: lambda, radiation: o.radiation, twoThetaMin: Math.max(0.01, t0 - 2), twoThetaMax: Math.min(179.9, t1 + 2) }).peaks);
        const f = compute(() =>
          fitPattern(measured, fitLinesFromPeaks(peaks), {
            wavelength: lambda,
            radiation: o.radiation,
            wavelength2: line2?.wavelength,
            ratio2: line2?.ratio,
            profile: { U: prof.U, V: prof.V, W: prof.W, eta: prof.eta },
            nBackground: o.bgTerms,
            refineLattice: o.lattice,
            peakThreshold: cp.peakThreshold,
          }),
        );
        for (const w of f.warnings) process.stderr.write(`warning: ${w}\n`);
        const out = {
          engine: ENGINE_VERSION,
          units: { ...DIFFRACTION_UNITS, zero: 'degrees 2θ, measured = calculated + zero', lattice: 'cell scale k, a = k·a(model)', U: 'deg²', V: 'deg²', W: 'deg²' },
          method: 'least squares (Levenberg–Marquardt); σ = √diag((JᵀWJ)⁻¹)·√χ²_red, statistical only',
          weights: f.weights === 'sigma' ? 'w = 1/σ² (σ column)' : 'w = 1/I_obs (counting statistics)',
          parameters: Object.fromEntries(f.parameters.map((p) => [p.name, { value: r(p.value, 8), sigma: r(p.sigma, 8) }])),
          before: { rp: r(f.initial.rp, 6), rwp: r(f.initial.rwp, 6), rexp: r(f.initial.rexp, 6), chi2: r(f.initial.chi2, 4) },
          rp: r(f.final.rp, 6),
          rwp: r(f.final.rwp, 6),
          rexp: r(f.final.rexp, 6),
          chi2: r(f.final.chi2, 4),
          points: f.final.points,
          iterations: f.iterations,
          warnings: f.warnings,
          peaks: f.peaks.map((p) => ({
            twoTheta: r(p.twoTheta),
            intensity: r(p.intensity, 4),
            label: p.line ? { twoTheta: r(p.line.twoTheta), d: r(p.line.d), hkl: p.line.hkl, share: r(p.share, 3), withinWidth: p.withinWidth } : null,
            misfit: p.misfit === null ? null : r(p.misfit),
          })),
        };
        emit(cmd, JSON.stringify(out) + '\n');
        return;
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
      const c = compute(() =>
        comparePatterns(measured, sim, refl, {
          wavelength: lambda,
          background: cp.background,
          peakThreshold: cp.peakThreshold,
          eta: prof.eta,
          fwhm: (tt) => Math.sqrt(Math.max(prof.U * Math.tan((tt * Math.PI) / 360) ** 2 + prof.V * Math.tan((tt * Math.PI) / 360) + prof.W, 1e-8)),
        }),
      );
      for (const w of c.warnings) process.stderr.write(`warning: ${w}\n`);
      const out = {
        engine: ENGINE_VERSION,
        units: DIFFRACTION_UNITS,
        weights: c.weights === 'sigma' ? 'w = 1/σ² (σ column)' : 'w = 1/I_obs (counting statistics)',
        scale: r(c.scale, 9),
        background: r(c.background, 6),
        rp: r(c.rp, 6),
        rwp: r(c.rwp, 6),
        rexp: r(c.rexp, 6),
        chi2: r(c.chi2, 4),
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
