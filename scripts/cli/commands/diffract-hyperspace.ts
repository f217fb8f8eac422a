import { Option, type Command } from 'commander';
import { compute, emit, number, parse, r, radiationOption } from '../flags';
import { hyperspaceParamsSchema, type HyperspaceParams } from '../../../lib/diffraction/params';
import type { Radiation } from '../../../lib/diffraction/form-factors';
import { hyperspacePeaks } from '../../../lib/diffraction/hyperspace';
import { DIFFRACTION_UNITS } from '../../../lib/diffraction/units';
import { ENGINE_VERSION } from '../../../lib/version';
import { numbers, readJsonFile, readText, span, wavelength } from '../flags';
import { icosahedralPatchSchema } from '../../../lib/models/icosahedral/schema';
import { parseWavelength } from '../../../lib/diffraction/wavelengths';
import { profileSchema } from '../../../lib/diffraction/params';
import { readMeasured } from '../../../lib/formats/measured';
import { qcPowder } from '../../../lib/diffraction/quasicrystal/powder';
import { fitLinesToPattern } from '../../../lib/diffraction/quasicrystal/fit';
import { CliError } from '../errors';

interface HyperFlags {
  family: HyperspaceParams['family'];
  aR: number;
  qmax: number;
  format: 'json';
  qperpMax?: number;
  radiation: Radiation;
  species?: number;
  biso?: number;
  threshold?: number;
  lattice: HyperspaceParams['lattice'];
}

/** The occupation-domain part of icosahedral Params (a saved model's params.json, or just these fields). */
const qcModelSchema = icosahedralPatchSchema.pick({ aR: true, lattice: true, offset: true, species: true, decoration: true });

interface QcFlags {
  model: string;
  aR?: number;
  wavelength: string;
  radiation: Radiation;
  range: [number, number];
  bPar?: number;
  bPerp?: number;
  qperpMax?: number;
  threshold?: number;
  step?: number;
  caglioti?: number[];
  eta?: number;
  measured?: string;
}

/** `diffract qc-powder`: the powder pattern of a decorated icosahedral model from its occupation domains. */
function registerQcPowder(d: Command): void {
  d.command('qc-powder')
    .description('Powder pattern of a decorated icosahedral quasicrystal from its occupation domains (icosahedral stars, Lp, profile); optionally fitted to a measured pattern.')
    .requiredOption('--model <file>', 'JSON with aR, lattice, offset and decoration (icosahedral Params)')
    .option('--aR <A>', 'quasilattice constant in Å (overrides the model’s, e.g. a refined one)', number)
    .option('--wavelength <spec>', 'CuKa1, MoKa1, … or Å', wavelength, 'CuKa1')
    .addOption(radiationOption('xray'))
    .option('--range <a:b>', '2θ range in degrees', span, [10, 100] as [number, number])
    .option('--b-par <B>', 'thermal B∥ in Å²', number)
    .option('--b-perp <B>', 'phason B⊥ in Å² (perpendicular space)', number)
    .option('--qperp-max <Q>', 'largest |Q⊥| in Å⁻¹ (default 12/aR)', number)
    .option('--threshold <f>', 'drop reflections with |F/N|² below this × |F(0)/N|² (default 1e-5)', number)
    .option('--step <deg>', 'profile step in 2θ', number)
    .option('--caglioti <U,V,W>', 'Caglioti U, V, W in degrees²', numbers)
    .option('--eta <f>', 'pseudo-Voigt Lorentzian fraction', number)
    .option('--measured <file>', 'fit scale, zero shift and a linear background to this two- or three-column pattern (2θ)')
    .action((o: QcFlags, cmd: Command) => {
      const raw = readJsonFile(o.model, '--model') as Record<string, unknown>;
      const src = raw && typeof raw === 'object' && 'params' in raw && typeof raw.params === 'object' ? (raw.params as Record<string, unknown>) : raw;
      const m = parse(qcModelSchema, { ...src, ...(o.aR !== undefined ? { aR: o.aR } : {}) });
      const lambda = compute(() => parseWavelength(o.wavelength, '--wavelength'));
      if (o.caglioti && o.caglioti.length !== 3) throw new CliError('--caglioti: expected three numbers U,V,W');
      const prof = parse(profileSchema, { step: o.step, ...(o.caglioti ? { U: o.caglioti[0], V: o.caglioti[1], W: o.caglioti[2] } : {}), ...(o.eta !== undefined ? { eta: o.eta } : {}) });
      const res = compute(() =>
        qcPowder(m, { wavelength: lambda, radiation: o.radiation, twoThetaMin: o.range[0], twoThetaMax: o.range[1], bPar: o.bPar, bPerp: o.bPerp, qperpMax: o.qperpMax, threshold: o.threshold, profile: prof }),
      );
      let fit: ReturnType<typeof fitLinesToPattern> | undefined;
      if (o.measured) {
        const meas = compute(() => readMeasured(readText(o.measured!, '--measured'), { axis: '2theta' }));
        if (meas.axis !== '2theta') throw new CliError('--measured: the fit needs a 2θ axis');
        const lines = res.stars.map((s) => ({ twoTheta: s.twoTheta, intensity: s.intensity }));
        fit = compute(() => fitLinesToPattern(meas.x, meas.intensity, lines, prof, { sigma: meas.sigma }));
      }
      const out = {
        engine: ENGINE_VERSION,
        units: { ...DIFFRACTION_UNITS, intensity: 'Σ|F/N|²·Lp over the star, strongest = 100', f2: 'mean |F/N|² per reflection' },
        model: { aR: m.aR, lattice: m.lattice, offset: m.offset },
        formula: 'F/N = Σ_k Σ_c (V_k/V) g_k e^{2πi h·(s_k+c)} e^{−iQ⊥·o} A_k(Q⊥) exp(−B∥|Q∥|²/16π² − B⊥|Q⊥|²/16π²) (lib/diffraction/quasicrystal/structure-factor.ts)',
        stars: res.stars.map((s) => ({
          indices: s.indices,
          N: s.N,
          M: s.M,
          multiplicity: s.multiplicity,
          twoTheta: r(s.twoTheta, 4),
          d: r(s.d, 5),
          qPar: r(s.qPar, 5),
          qPerp: r(s.qPerp, 5),
          f2: r(s.f2, 8),
          intensity: r(s.intensity, 4),
        })),
        ...(fit
          ? {
              fit: {
                scale: r(fit.scale, 9),
                scaleSigma: r(fit.scaleSigma, 9),
                zeroShift: r(fit.zeroShift, 5),
                zeroShiftSigma: r(fit.zeroShiftSigma, 5),
                background: fit.background.map((b) => r(b, 6)),
                rp: r(fit.rp, 5),
                rwp: r(fit.rwp, 5),
                rexp: r(fit.rexp, 5),
                chi2: r(fit.chi2, 4),
              },
            }
          : {}),
        warnings: [...res.warnings, ...(fit?.warnings ?? [])],
      };
      emit(cmd, JSON.stringify(out) + '\n');
    });
}

export function registerDiffractHyperspace(d: Command): void {
  registerQcPowder(d);
  d.command('hyperspace')
    .description('Ideal quasicrystal diffraction: indexed Bragg peaks of the Fourier module.')
    .addOption(new Option('--family <f>', 'the ideal tiling or model').choices(hyperspaceParamsSchema.shape.family.options).makeOptionMandatory())
    .requiredOption('--aR <A>', 'quasilattice constant (rhombohedron edge, penrose/octagonal tile edge, long chain segment) in Å', number)
    .requiredOption('--qmax <Q>', 'largest |Q∥| in Å⁻¹', number)
    .addOption(new Option('--format <fmt>', 'output format').choices(['json']).default('json'))
    .option('--qperp-max <Q>', 'largest |Q⊥| in Å⁻¹', number)
    .addOption(radiationOption('xray'))
    .option('--species <Z>', 'atomic number on every vertex (0 = unit form factor)', number)
    .option('--biso <B>', 'isotropic B in Å²', number)
    .option('--threshold <f>', 'drop peaks with |F/N|² below this × f(0)²', number)
    .addOption(new Option('--lattice <t>', 'icosahedral hyperlattice').choices(['P', 'F', 'I']).default('P'))
    .action((o: HyperFlags, cmd: Command) => {
      const p = parse(hyperspaceParamsSchema, {
        family: o.family,
        aR: o.aR,
        qmax: o.qmax,
        qperpMax: o.qperpMax,
        radiation: o.radiation,
        species: o.species,
        biso: o.biso,
        threshold: o.threshold,
        lattice: o.lattice,
      });
      const peaks = compute(() => hyperspacePeaks(p));
      const out = {
        engine: ENGINE_VERSION,
        units: { ...DIFFRACTION_UNITS, intensity: '|F(Q∥)/N|² of the ideal structure (relative: strongest Q ≠ 0 = 100)' },
        family: p.family,
        ...(p.family === 'icosahedral' ? { lattice: p.lattice } : {}),
        aR: p.aR,
        indexing:
          p.family === 'icosahedral'
            ? 'six integers in the basis of lib/models/icosahedral/hyperlattice.ts, plus Cahn, Shechtman & Gratias, J. Mater. Res. 1 (1986) 13 indices h/h\' k/k\' l/l\' with N, M'
            : p.family === 'penrose'
              ? 'four integers (h1..h4, h5 = 0) of the Z⁵ reciprocal lattice, penrose.ts basis'
              : p.family === 'octagonal'
                ? 'four integers (h0..h3) of the Z⁴ reciprocal lattice, octagonal.ts basis: Q∥ = (π/aR) Σ h_j (cos jπ/4, sin jπ/4)'
              : 'two integers (h, k) dual to the (L, S) steps of the chain',
        peaks: peaks.map((k) => ({
          indices: k.indices,
          ...(k.csg ? { csg: k.csg.label, N: k.csg.N, M: k.csg.M } : {}),
          qPar: k.qPar.map((x) => r(x)),
          qParNorm: r(k.qParNorm),
          qPerpNorm: r(k.qPerpNorm),
          intensity: r(k.intensity, 8),
          relative: r(k.relative, 4),
        })),
      };
      emit(cmd, JSON.stringify(out) + '\n');
    });
}
