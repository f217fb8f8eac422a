import { Option, type Command } from 'commander';
import { compute, emit, loadStructure, number, parse, r, radiationOption } from '../flags';
import { zoneParamsSchema } from '../../../lib/diffraction/params';
import { crystalZone, mapSpots, zonePattern, parseAxis, zoneLayers, zoneMapFromSums, type ZoneMap, type ZoneOptions, type ZoneSpot } from '../../../lib/diffraction/zone-axis';
import { groupAtoms } from '../../../lib/diffraction/scatterers';
import { DiffractionPool } from '../diffraction-pool/pool';
import type { Structure } from '../../../lib/structure/types';
import type { Radiation } from '../../../lib/diffraction/form-factors';
import { DIFFRACTION_UNITS } from '../../../lib/diffraction/units';
import { ENGINE_VERSION } from '../../../lib/version';

interface ZoneFlags {
  input: string;
  axis: string;
  qmax: number;
  format: 'json';
  radiation: Radiation;
  laueZones?: number;
  slab?: number;
  grid?: number;
  threshold?: number;
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

export function registerDiffractZone(d: Command): void {
  d.command('zone')
    .description('Zone-axis pattern: spots in the reciprocal plane normal to an axis (5, 3, 2 icosahedral, or u,v,w).')
    .requiredOption('--input <file>', 'structure file')
    .requiredOption('--axis <axis>', '5, 3, 2 or u,v,w')
    .requiredOption('--qmax <Q>', 'largest |Q| in Å⁻¹', number)
    .addOption(new Option('--format <fmt>', 'output format').choices(['json']).default('json'))
    .addOption(radiationOption('electron'))
    .option('--laue-zones <n>', 'crystals: include Laue zones |n| ≤ this', number)
    .option('--slab <Q>', 'patches: average over ±slab Å⁻¹ along the axis', number)
    .option('--grid <n>', 'patches: grid points per side', number)
    .option('--threshold <f>', 'drop spots weaker than this fraction of the strongest', number)
    .action(async (o: ZoneFlags, cmd: Command) => {
      const p = parse(zoneParamsSchema, {
        axis: o.axis.replace(/\s+/g, ''),
        qmax: o.qmax,
        radiation: o.radiation,
        laueZones: o.laueZones,
        slab: o.slab,
        grid: o.grid,
        threshold: o.threshold,
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
      emit(cmd, JSON.stringify(out) + '\n');
    });
}
