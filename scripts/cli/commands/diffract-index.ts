/**
 * `diffract index`: find the peaks of a measured icosahedral powder pattern, index them with six hyperlattice
 * indices and N, M, and refine the quasilattice constant aR and the zero shift by least squares.
 */
import { Option, type Command } from 'commander';
import { compute, emit, number, r, readText, wavelength } from '../flags';
import { readMeasured, type MeasuredAxis } from '../../../lib/formats/measured';
import { parseWavelength } from '../../../lib/diffraction/wavelengths';
import { indexIcosahedralPattern } from '../../../lib/diffraction/quasicrystal/index-icosahedral';
import { CliError } from '../errors';
import { ENGINE_VERSION } from '../../../lib/version';

interface Flags {
  input: string;
  family: 'icosahedral';
  lattice: 'P' | 'F';
  wavelength: string;
  axis?: MeasuredAxis;
  aRMin?: number;
  aRMax?: number;
  aR?: number;
  prominence?: number;
  format: 'json';
}

export function registerDiffractIndex(d: Command): void {
  d.command('index')
    .description('Index a measured quasicrystal powder pattern; refine the quasilattice constant aR and the zero shift.')
    .requiredOption('--input <file>', 'two- or three-column pattern: 2θ (or Q, d) and intensity')
    .addOption(new Option('--family <f>', 'quasicrystal family').choices(['icosahedral']).default('icosahedral'))
    .addOption(new Option('--lattice <t>', 'icosahedral hyperlattice (F allows half-integer superstructure indices)').choices(['P', 'F']).default('P'))
    .option('--wavelength <spec>', 'CuKa1, MoKa1, … or Å', wavelength, 'CuKa1')
    .addOption(new Option('--axis <axis>', 'x axis when the file has no header').choices(['2theta', 'q', 'd']))
    .option('--aR <A>', 'approximate aR in Å: search within ±3 % of it', number)
    .option('--aR-min <A>', 'smallest aR searched (default 3 Å)', number)
    .option('--aR-max <A>', 'largest aR searched (default 12 Å)', number)
    .option('--prominence <f>', 'peaks: minimum prominence as a fraction of the intensity range (default 0.01)', number)
    .addOption(new Option('--format <fmt>', 'output format').choices(['json']).default('json'))
    .action((o: Flags, cmd: Command) => {
      const lambda = compute(() => parseWavelength(o.wavelength, '--wavelength'));
      const m = compute(() => readMeasured(readText(o.input, '--input'), { axis: o.axis }));
      if (o.prominence !== undefined && !(o.prominence > 0 && o.prominence < 1)) throw new CliError(`--prominence: must be between 0 and 1, got ${o.prominence}`, 2);
      const tt = compute(() =>
        Float64Array.from(m.x, (x, i) => {
          const v = m.axis === '2theta' ? x : m.axis === 'q' ? (360 / Math.PI) * Math.asin((x * lambda) / (4 * Math.PI)) : (360 / Math.PI) * Math.asin(lambda / (2 * x));
          if (!Number.isFinite(v)) throw new Error(`--input: point ${i + 1} (${x}) is out of reach for λ = ${lambda} Å`);
          return v;
        }),
      );
      const order = Array.from(tt.keys()).sort((a, b) => tt[a] - tt[b]);
      const x = Float64Array.from(order, (i) => tt[i]);
      const y = Float64Array.from(order, (i) => m.intensity[i]);
      const res = compute(() =>
        indexIcosahedralPattern(x, y, {
          wavelength: lambda,
          lattice: o.lattice,
          aRGuess: o.aR,
          aRMin: o.aRMin,
          aRMax: o.aRMax,
          peaks: o.prominence !== undefined ? { minProminence: o.prominence } : undefined,
        }),
      );
      const trend = (t: typeof res.phasonStrain.shift) => (t ? { slope: r(t.slope, 8), slopeSigma: r(t.slopeSigma, 8), intercept: r(t.intercept, 8), points: t.points } : null);
      const out = {
        engine: ENGINE_VERSION,
        family: 'icosahedral',
        lattice: res.lattice,
        wavelength: r(lambda, 7),
        units: { twoTheta: 'degrees', aR: 'Å', qPar: 'Å⁻¹ (2π/d)', qPerp: 'Å⁻¹', slope: 'Å⁻¹ per Å⁻¹ (shift) and Å⁻¹ per Å⁻¹ (FWHM in Q)' },
        indexing: 'six indices in the reciprocal basis of lib/models/icosahedral/hyperlattice.ts (half-integers: F superstructure), N and M of Cahn, Shechtman & Gratias, J. Mater. Res. 1 (1986) 13',
        aR: r(res.aR, 7),
        aRSigma: r(res.aRSigma, 7),
        zeroShift: r(res.zeroShift, 5),
        zeroShiftSigma: r(res.zeroShiftSigma, 5),
        peaksFound: res.found,
        indexed: res.indexed,
        rmsResidual: r(res.rmsResidual, 5),
        score: r(res.score, 4),
        intensityMisfit: r(res.intensityMisfit, 4),
        peaks: res.peaks.map((p) => ({
          twoTheta: r(p.twoTheta, 4),
          twoThetaSigma: r(p.twoThetaSigma, 5),
          twoThetaCalc: p.twoThetaCalc === null ? null : r(p.twoThetaCalc, 4),
          residual: p.residual === null ? null : r(p.residual, 5),
          indices: p.indices,
          N: p.N,
          M: p.M,
          qPar: p.qPar === null ? null : r(p.qPar, 5),
          qPerp: p.qPerp === null ? null : r(p.qPerp, 5),
          multiplicity: p.multiplicity,
          fwhm: r(p.fwhm, 4),
          area: r(p.area, 4),
          predicted: p.predicted === null ? null : r(p.predicted, 3),
        })),
        phasonStrain: { shift: trend(res.phasonStrain.shift), width: trend(res.phasonStrain.width), note: res.phasonStrain.note },
        warnings: res.warnings,
      };
      emit(cmd, JSON.stringify(out) + '\n');
    });
}
