import { Option, type Command } from 'commander';
import { compute, emit, number, parse, r, radiationOption } from '../flags';
import { hyperspaceParamsSchema, type HyperspaceParams } from '../../../lib/diffraction/params';
import type { Radiation } from '../../../lib/diffraction/form-factors';
import { hyperspacePeaks } from '../../../lib/diffraction/hyperspace';
import { DIFFRACTION_UNITS } from '../../../lib/diffraction/units';
import { ENGINE_VERSION } from '../../../lib/version';

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

export function registerDiffractHyperspace(d: Command): void {
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
