/** `diffract zone` and `diffract hyperspace`. */
import type { Command } from 'commander';
import type { ZodType } from 'zod';
import { CliError, zodMessage } from './errors';
import { compute, loadStructure, num, oneOf, r } from './diffract-io';
import { hyperspaceParamsSchema, zoneParamsSchema } from '../../lib/params/diffraction';
import { crystalZone, mapSpots, zonePattern, parseAxis, zoneLayers, zoneMapFromSums, type ZoneMap, type ZoneOptions, type ZoneSpot } from '../../lib/diffraction/zone-axis';
import { groupAtoms } from '../../lib/diffraction/scatterers';
import { DiffractionPool } from '../../lib/server/workers/diffraction-pool';
import type { Structure } from '../../lib/structure/types';
import { hyperspacePeaks } from '../../lib/diffraction/hyperspace';
import { DIFFRACTION_UNITS } from '../../lib/diffraction/units';
import { ENGINE_VERSION } from '../../lib/version';

function parse<T>(schema: ZodType<T>, input: unknown): T {
  const res = schema.safeParse(input);
  if (!res.success) throw new CliError(zodMessage(res.error));
  return res.data;
}

interface ZoneFlags {
  input: string;
  axis: string;
  qmax: string;
  format: string;
  radiation: string;
  laueZones?: string;
  slab?: string;
  grid?: string;
  threshold?: string;
}

/** Patch maps over 10⁸ atom×grid terms run on two worker threads; the result is the same sum. */
async function zoneOnThreads(s: Structure, o: ZoneOptions): Promise<{ spots: ZoneSpot[]; map?: ZoneMap }> {
  if (s.cell) return { spots: compute(() => crystalZone(s, o)) };
  const z = compute(() => zoneLayers(s, o));
  if (s.species.length * z.n * z.n <= 1e8) return compute(() => zonePattern(s, o));
  const { groups, groupOf, weight } = compute(() => groupAtoms(s));
  const pool = new DiffractionPool(2);
  try {
    const sums = [];
    for (const { grid } of z.layers) sums.push(await pool.gridPartialSums(s.positions, groupOf, weight, grid, groups.length));
    const map = zoneMapFromSums(s, o, z, sums);
    return { spots: mapSpots(map, o.qmax, o.threshold ?? 1e-3), map };
  } finally {
    await pool.close();
  }
}

export function registerZoneCommand(d: Command): void {
  d.command('zone')
    .description('Zone-axis pattern: spots in the reciprocal plane normal to an axis (5, 3, 2 icosahedral, or u,v,w).')
    .requiredOption('--input <file>', 'structure file')
    .requiredOption('--axis <axis>', '5, 3, 2 or u,v,w')
    .requiredOption('--qmax <Q>', 'largest |Q| in Å⁻¹')
    .option('--format <fmt>', 'json', 'json')
    .option('--radiation <r>', 'xray, neutron or electron', 'electron')
    .option('--laue-zones <n>', 'crystals: include Laue zones |n| ≤ this')
    .option('--slab <Q>', 'patches: average over ±slab Å⁻¹ along the axis')
    .option('--grid <n>', 'patches: grid points per side')
    .option('--threshold <f>', 'drop spots weaker than this fraction of the strongest')
    .action(async (o: ZoneFlags) => {
      oneOf('--format', o.format, ['json'] as const);
      const p = parse(zoneParamsSchema, {
        axis: o.axis.replace(/\s+/g, ''),
        qmax: num('--qmax', o.qmax),
        radiation: o.radiation,
        laueZones: num('--laue-zones', o.laueZones),
        slab: num('--slab', o.slab),
        grid: num('--grid', o.grid),
        threshold: num('--threshold', o.threshold),
      });
      const s = loadStructure(o.input);
      const axis = compute(() => parseAxis(p.axis));
      const res = await zoneOnThreads(s, { axis, qmax: p.qmax, radiation: p.radiation, laueZones: p.laueZones, slab: p.slab, grid: p.grid, threshold: p.threshold });
      const fr = res.map?.frame ?? null;
      const out = {
        engine: ENGINE_VERSION,
        units: { ...DIFFRACTION_UNITS, intensity: s.cell ? '|F|² (largest = 100 in relative)' : '|F(Q)|²/N (relative: largest off-centre spot = 100)' },
        axis: p.axis,
        method: res.map ? 'direct sum on a reciprocal-plane grid' : 'crystal reflections of the zone',
        frame: fr ? { beam: fr.axis.map((x) => r(x, 9)), e1: fr.e1.map((x) => r(x, 9)), e2: fr.e2.map((x) => r(x, 9)) } : undefined,
        spots: res.spots.map((k) => ({
          qx: r(k.qx),
          qy: r(k.qy),
          ...(k.hkl ? { qz: r(k.qz), hkl: k.hkl } : {}),
          ...(k.laueZone !== undefined ? { laueZone: k.laueZone } : {}),
          q: r(k.q),
          intensity: r(k.intensity, 6),
          relative: r(k.relative, 4),
        })),
      };
      process.stdout.write(JSON.stringify(out) + '\n');
    });
}

interface HyperFlags {
  family: string;
  aR: string;
  qmax: string;
  format: string;
  qperpMax?: string;
  radiation: string;
  species?: string;
  biso?: string;
  threshold?: string;
  lattice?: string;
}

export function registerHyperspaceCommand(d: Command): void {
  d.command('hyperspace')
    .description('Ideal quasicrystal diffraction: indexed Bragg peaks of the Fourier module.')
    .requiredOption('--family <f>', 'icosahedral, penrose, octagonal or fibonacci')
    .requiredOption('--aR <A>', 'quasilattice constant (rhombohedron edge, penrose/octagonal tile edge, long chain segment) in Å')
    .requiredOption('--qmax <Q>', 'largest |Q∥| in Å⁻¹')
    .option('--format <fmt>', 'json', 'json')
    .option('--qperp-max <Q>', 'largest |Q⊥| in Å⁻¹')
    .option('--radiation <r>', 'xray, neutron or electron', 'xray')
    .option('--species <Z>', 'atomic number on every vertex (0 = unit form factor)')
    .option('--biso <B>', 'isotropic B in Å²')
    .option('--threshold <f>', 'drop peaks with |F/N|² below this × f(0)²')
    .option('--lattice <t>', 'icosahedral hyperlattice: P, F or I', 'P')
    .action((o: HyperFlags) => {
      oneOf('--format', o.format, ['json'] as const);
      const p = parse(hyperspaceParamsSchema, {
        family: o.family,
        aR: num('--aR', o.aR),
        qmax: num('--qmax', o.qmax),
        qperpMax: num('--qperp-max', o.qperpMax),
        radiation: o.radiation,
        species: num('--species', o.species),
        biso: num('--biso', o.biso),
        threshold: num('--threshold', o.threshold),
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
            ? 'six integers in the basis of lib/tiling/hyperlattice.ts, plus Cahn, Shechtman & Gratias, J. Mater. Res. 1 (1986) 13 indices h/h\' k/k\' l/l\' with N, M'
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
      process.stdout.write(JSON.stringify(out) + '\n');
    });
}
