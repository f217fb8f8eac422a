import { Option, type Command } from 'commander';
import { CliError } from '../errors';
import { compute, emit, loadStructure, number, numbers, parse, r, radiationOption, span, wavelength } from '../flags';
import { powderParamsSchema } from '../../../lib/diffraction/params';
import type { Radiation } from '../../../lib/diffraction/form-factors';
import { braggPowder } from '../../../lib/diffraction/powder';
import { debyePowder } from '../../../lib/diffraction/debye-powder';
import { groupAtoms } from '../../../lib/diffraction/scatterers';
import { histogramSpec } from '../../../lib/diffraction/pair-histogram';
import type { PairHistogram } from '../../../lib/diffraction/debye';
import { DiffractionPool } from '../diffraction-pool/pool';
import { kalpha2Of, parseWavelength } from '../../../lib/diffraction/wavelengths';
import { DIFFRACTION_UNITS, UNITS_COMMENT } from '../../../lib/diffraction/units';
import { peakTableCsv } from '../../../lib/diffraction/peak-table';
import { ENGINE_VERSION } from '../../../lib/version';

interface PowderFlags {
  input: string;
  wavelength: string;
  range: [number, number];
  radiation: Radiation;
  format: 'json' | 'csv';
  step?: number;
  U?: number;
  V?: number;
  W?: number;
  eta?: number;
  background?: number[];
  monochromator?: number;
  kalpha2?: boolean;
  bin?: number;
  dMin?: number;
}

async function powderCommand(o: PowderFlags, cmd: Command): Promise<void> {
  const p = parse(powderParamsSchema, {
    wavelength: o.wavelength,
    radiation: o.radiation,
    twoThetaMin: o.range[0],
    twoThetaMax: o.range[1],
    monochromator2Theta: o.monochromator,
    kalpha2: o.kalpha2 ?? false,
    binWidth: o.bin,
    profile: { U: o.U, V: o.V, W: o.W, eta: o.eta, step: o.step, background: o.background },
  });
  const lambda = compute(() => parseWavelength(p.wavelength, '--wavelength'));
  const s = loadStructure(o.input);
  const head = {
    engine: ENGINE_VERSION,
    units: DIFFRACTION_UNITS,
    radiation: p.radiation,
    wavelength: lambda,
    range: [p.twoThetaMin, p.twoThetaMax],
  };
  if (s.cell) {
    const line2 = p.kalpha2 ? kalpha2Of(p.wavelength) : undefined;
    if (p.kalpha2 && line2 === undefined) throw new CliError('--kalpha2: needs a Kα1 line name as --wavelength (e.g. CuKa1)');
    const res = compute(() =>
      braggPowder(s, {
        wavelength: lambda,
        radiation: p.radiation,
        twoThetaMin: p.twoThetaMin,
        twoThetaMax: p.twoThetaMax,
        monochromator2Theta: p.monochromator2Theta,
        wavelength2: line2?.wavelength,
        ratio2: line2?.ratio,
        dMin: o.dMin,
        profile: p.profile,
      }),
    );
    const peaks = res.peaks.map((k) => ({
      twoTheta: r(k.twoTheta),
      d: r(k.d),
      q: r(k.q),
      hkl: k.hkl,
      multiplicity: k.multiplicity,
      intensity: r(k.intensity, 4),
      families: k.families.map((f) => ({ hkl: f.hkl, multiplicity: f.multiplicity })),
    }));
    for (const w of res.warnings) process.stderr.write(`warning: ${w}\n`);
    const prof = res.profile!;
    if (o.format === 'json') {
      const out = {
        ...head,
        method: 'bragg',
        dMin: r(res.dMin),
        ...(line2 ? { kalpha2: { wavelength: line2.wavelength, ratio: line2.ratio } } : {}),
        warnings: res.warnings,
        peaks,
        profile: { twoTheta: Array.from(prof.twoTheta, (x) => r(x)), intensity: Array.from(prof.intensity, (x) => r(x, 4)) },
      };
      emit(cmd, JSON.stringify(out) + '\n');
    } else {
      emit(cmd, peakTableCsv(res.peaks, { radiation: p.radiation, wavelength: lambda }));
    }
    return;
  }
  const histogram = s.species.length > 20_000 ? await parallelHistogram(s, p.binWidth) : undefined;
  const res = compute(() =>
    debyePowder(s, {
      histogram,
      wavelength: lambda,
      radiation: p.radiation,
      twoThetaMin: Math.max(p.twoThetaMin, 1e-3),
      twoThetaMax: p.twoThetaMax,
      step: p.profile.step,
      monochromator2Theta: p.monochromator2Theta,
      binWidth: p.binWidth,
    }),
  );
  for (const w of res.warnings) process.stderr.write(`warning: ${w}\n`);
  const peaks = res.maxima.map((k) => ({ twoTheta: r(k.twoTheta), d: r(k.d), q: r(k.q), hkl: null, multiplicity: null, intensity: r(k.intensity, 4) }));
  if (o.format === 'json') {
    const out = {
      ...head,
      method: 'debye',
      note: 'finite patch: Debye scattering equation; peaks are local maxima of the profile; profile intensity per atom with polarization',
      peaks,
      profile: { twoTheta: Array.from(res.twoTheta, (x) => r(x)), intensity: Array.from(res.intensity, (x) => r(x, 6)) },
    };
    emit(cmd, JSON.stringify(out) + '\n');
  } else {
    const lines = [UNITS_COMMENT, `# radiation ${p.radiation}, wavelength ${lambda} Å; Debye equation, intensity per atom`];
    lines.push('twoTheta,q,intensity');
    for (let i = 0; i < res.twoTheta.length; i++) lines.push(`${r(res.twoTheta[i])},${r(res.q[i])},${r(res.intensity[i], 6)}`);
    emit(cmd, lines.join('\n') + '\n');
  }
}

/** Large patches: the O(N²) pair loop on two worker threads. */
async function parallelHistogram(s: Parameters<typeof groupAtoms>[0], binWidth: number): Promise<PairHistogram> {
  const { groups, groupOf, weight } = compute(() => groupAtoms(s));
  const spec = compute(() => histogramSpec(s.positions, groups.length, binWidth));
  const pool = new DiffractionPool(2);
  try {
    const hist = await pool.pairHistogram(s.positions, groupOf, weight, spec);
    const self = new Float64Array(groups.length);
    for (let i = 0; i < groupOf.length; i++) self[groupOf[i]] += weight[i];
    return { ...spec, hist, self, groups, atoms: groupOf.length };
  } finally {
    await pool.close();
  }
}

/** diffract powder: Bragg peaks of a cell, or the Debye equation for a finite patch. */
export function registerDiffractPowder(d: Command): void {
  d.command('powder')
    .description('Powder pattern: Bragg peaks of a periodic cell, or the Debye equation for a finite patch.')
    .requiredOption('--input <file>', 'structure file: XYZ, extended XYZ, CIF or Tauforge JSON')
    .option('--wavelength <spec>', 'CuKa1, CuKa2, CuKa, MoKa1, CoKa1, CrKa1, AgKa1, <n>kV, or Å', wavelength, 'CuKa1')
    .addOption(new Option('--range <a:b>', '2θ range in degrees').argParser(span).default([10, 120], '10:120'))
    .addOption(radiationOption('xray'))
    .addOption(new Option('--format <fmt>', 'json: peaks and profile; csv: peak table (cell) or profile (patch)').choices(['json', 'csv']).default('json'))
    .option('--step <deg>', 'profile step in 2θ (degrees)', number)
    .option('--U <u>', 'Caglioti U (deg²)', number)
    .option('--V <v>', 'Caglioti V (deg²)', number)
    .option('--W <w>', 'Caglioti W (deg²)', number)
    .option('--eta <eta>', 'pseudo-Voigt Lorentzian fraction', number)
    .option('--background <b0,b1,...>', 'background polynomial in 2θ', numbers)
    .option('--monochromator <deg>', 'monochromator angle 2θ_m (degrees)', number)
    .option('--kalpha2', 'add the Kα2 line to the profile (I(Kα2)/I(Kα1) of the element, about 0.51)')
    .option('--d-min <Å>', 'resolution: leave out reflections with d below this (electrons default to 0.5 Å)', number)
    .option('--bin <Å>', 'pair-distance bin for finite patches (Å)', number)
    .action((o: PowderFlags, cmd: Command) => powderCommand(o, cmd));
}
