/**
 * Powder patterns and structure factors of large approximant cells (issue 11, Deliver 6), side by side with gemmi
 * in the same run. Figures only; targets (one core): 5/3 icosahedral approximant Cu Kα1 2θ ≤ 120° < 1 s, Mo Kα1
 * < 3 s, 8/5 Cu Kα1 < 5 s, for the whole powder path: Structure → merged peak list (powderPeaks) and → peak list
 * plus Kα1 + Kα2 profile (braggPowder, what the workspace worker runs). Both are timed, then the structure factors
 * alone.
 *
 * Ours: every reflection with 2θ ≤ 120° (one of each Friedel pair), |F|² by the grid route (sf-grid.ts,
 * tolerance 1e-5, default), from the Structure to |F|² including the hkl list and form factors.
 * gemmi (Debian python3-gemmi, /usr/bin/python3, OMP_NUM_THREADS=1): the same atoms in P1, its density route
 * DensityCalculatorX (d_min, rate 1.5, Refmac-compatible blur) → transform_map_to_f_phi → prepare_asu_data,
 * F scaled by reciprocal_space_multiplier — its fastest way to all F of a large cell. Its direct per-reflection
 * calculator (StructureFactorCalculatorX) is timed on 2000 reflections and scaled up (marked "est.").
 * Accuracy: the strongest 300 reflections of ours against gemmi's direct calculator (max relative Δ|F|²), and
 * gemmi's density route against the same.
 *
 * The machine is shared: each side runs 3 times and the best is kept; wall and CPU seconds are both printed
 * together with the load average, and the ratio uses CPU seconds (wall time on a loaded machine measures the
 * other processes).
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { cpus, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { generate } from '../../lib/models';
import { friedelUniqueFactors } from '../../lib/diffraction/sf-friedel';
import { braggPowder, powderPeaks } from '../../lib/diffraction/powder';
import { XRAY_LINES } from '../../lib/diffraction/wavelengths';
import { toFractional } from '../../lib/math/frac';
import type { Structure } from '../../lib/structure/types';

const PY = '/usr/bin/python3';
const CU = 1.540593;
const MO = 0.709317;
const CU2 = XRAY_LINES.Cu.ka2;
const MO2 = XRAY_LINES.Mo.ka2;

const GEMMI = `
import gemmi, json, sys, time, math, numpy as np
d = sys.argv[1]; dmin = float(sys.argv[2]); a = float(sys.argv[3])
x = np.fromfile(d + '/x.bin').reshape(-1, 3); z = np.fromfile(d + '/z.bin').astype(int)
top = np.fromfile(d + '/top.bin').reshape(-1, 3).astype(int)
occ = np.fromfile(d + '/occ.bin')
st = gemmi.Structure(); st.cell = gemmi.UnitCell(a, a, a, 90, 90, 90); st.spacegroup_hm = 'P 1'
model = gemmi.Model('1'); ch = gemmi.Chain('A')
for i, (f, zz, oc) in enumerate(zip(x, z, occ)):
    r = gemmi.Residue(); r.name = 'ATM'; r.seqid = gemmi.SeqId(i + 1, ' ')
    at = gemmi.Atom(); at.name = 'X'; at.element = gemmi.Element(int(zz)); at.pos = st.cell.orthogonalize(gemmi.Fractional(*f)); at.b_iso = 0; at.occ = float(oc)
    r.add_atom(at); ch.add_residue(r)
model.add_chain(ch); st.add_model(model); st.setup_entities()
best = None
for rep in range(3):
    w0 = time.perf_counter(); c0 = time.process_time()
    dc = gemmi.DensityCalculatorX(); dc.d_min = dmin; dc.rate = 1.5
    dc.set_refmac_compatible_blur(st[0])
    dc.set_grid_cell_and_spacegroup(st)
    dc.put_model_density_on_grid(st[0])
    g = gemmi.transform_map_to_f_phi(dc.grid, half_l=True)
    asu = g.prepare_asu_data(dmin=dmin, with_000=False)
    inv_d2 = asu.make_1_d2_array().astype(float)
    mult = np.exp(dc.blur * 0.25 * inv_d2)  # vectorised reciprocal_space_multiplier (checked below)
    assert abs(mult[0] - dc.reciprocal_space_multiplier(float(inv_d2[0]))) < 1e-5 * mult[0]
    F = asu.value_array * mult
    w = time.perf_counter() - w0; c = time.process_time() - c0
    if best is None or c < best[1]: best = (w, c, len(F))
    if rep < 2: del g, asu, F
# The strongest reflections: gemmi direct (reference) and gemmi density route.
ss = gemmi.SmallStructure(); ss.cell = st.cell; ss.spacegroup_hm = 'P 1'
for i, (f, zz, oc) in enumerate(zip(x, z, occ)):
    s = gemmi.SmallStructure.Site(); s.label = 'S%d' % i; s.element = gemmi.Element(int(zz)); s.fract = gemmi.Fractional(*f); s.occ = float(oc)
    ss.add_site(s)
ss.setup_cell_images()
calc = gemmi.StructureFactorCalculatorX(ss.cell)
t0 = time.process_time()
ref = [calc.calculate_sf_from_small_structure(ss, [int(h), int(k), int(l)]) for h, k, l in top]
direct_per_refl = (time.process_time() - t0) / len(top)
idx = {tuple(h): i for i, h in enumerate(asu.miller_array.tolist())}
def dens(h):
    for s in (1, -1):
        j = idx.get((s * h[0], s * h[1], s * h[2]))
        if j is not None: return F[j]
    return float('nan')
dd = [abs(abs(dens(h))**2 - abs(r)**2) / abs(r)**2 for h, r in zip(top.tolist(), ref)]
print(json.dumps({'wall': best[0], 'cpu': best[1], 'n': best[2], 'directPerRefl': direct_per_refl,
  'ref2': [abs(r)**2 for r in ref], 'densityErr': max(dd), 'grid': list(dc.grid.shape)}))
`;

interface Case {
  label: string;
  order: string;
  lambda: number;
  /** Kα2 of the same anode, for the profile. */
  lambda2: number;
  /** Seconds of CPU the issue asks for. */
  target: number;
}

function approximant(order: string): Structure {
  return generate({ family: 'icosahedral', mode: 'approximant', order, aR: 4.6, species: 'Al' } as never);
}

function cpuSeconds(c: NodeJS.CpuUsage): number {
  return (c.user + c.system) / 1e6;
}

async function runCase(c: Case, s: Structure): Promise<void> {
  const dMin = c.lambda / (2 * Math.sin((120 * Math.PI) / 360));
  let best = { wall: Infinity, cpu: Infinity };
  let f: ReturnType<typeof friedelUniqueFactors> | undefined;
  for (let rep = 0; rep < 3; rep++) {
    f = undefined;
    const w0 = performance.now();
    const c0 = process.cpuUsage();
    f = friedelUniqueFactors(s, dMin, 'xray', { method: 'grid' });
    const cpu = cpuSeconds(process.cpuUsage(c0));
    const wall = (performance.now() - w0) / 1000;
    if (cpu < best.cpu) best = { wall, cpu };
  }
  // End to end as the workspace runs it: Structure → merged peak list → Kα1 + Kα2 profile (braggPowder), and the
  // peak list alone (powderPeaks).
  let lines = { wall: Infinity, cpu: Infinity, n: 0 };
  let full = { wall: Infinity, cpu: Infinity };
  for (let rep = 0; rep < 3; rep++) {
    let w0 = performance.now();
    let c0 = process.cpuUsage();
    const peaks = powderPeaks(s, { wavelength: c.lambda, radiation: 'xray', twoThetaMin: 0, twoThetaMax: 120 });
    let cpu = cpuSeconds(process.cpuUsage(c0));
    if (cpu < lines.cpu) lines = { wall: (performance.now() - w0) / 1000, cpu, n: peaks.length };
    w0 = performance.now();
    c0 = process.cpuUsage();
    braggPowder(s, {
      wavelength: c.lambda,
      wavelength2: c.lambda2,
      ratio2: c.lambda2 === CU2 ? XRAY_LINES.Cu.ratio : XRAY_LINES.Mo.ratio,
      radiation: 'xray',
      twoThetaMin: 2,
      twoThetaMax: 120,
      profile: { U: 0, V: 0, W: 0.01, eta: 0.5, step: 0.01 },
    });
    cpu = cpuSeconds(process.cpuUsage(c0));
    if (cpu < full.cpu) full = { wall: (performance.now() - w0) / 1000, cpu };
  }
  const m = f!.d.length;
  const order = Array.from({ length: m }, (_, i) => i).sort((p, q) => f!.f2[q] - f!.f2[p]).slice(0, 300);
  const a = Math.hypot(...s.cell![0]);
  const dir = mkdtempSync(join(tmpdir(), 'tf-sf-'));
  try {
    const frac = toFractional(s.cell!, s.positions);
    writeFileSync(join(dir, 'x.bin'), Buffer.from(frac.buffer));
    writeFileSync(join(dir, 'z.bin'), Buffer.from(Float64Array.from(s.species).buffer));
    // Occupancies (the symmetric 5/3 cut has fractional boundary sites): gemmi gets the same weights as ours.
    writeFileSync(join(dir, 'occ.bin'), Buffer.from((s.occupancy ? Float64Array.from(s.occupancy) : new Float64Array(s.species.length).fill(1)).buffer));
    writeFileSync(join(dir, 'top.bin'), Buffer.from(Float64Array.from(order.flatMap((i) => Array.from(f!.hkl.subarray(3 * i, 3 * i + 3)))).buffer));
    const out = execFileSync(PY, ['-c', GEMMI, dir, String(dMin), String(a)], {
      encoding: 'utf8',
      env: { ...process.env, OMP_NUM_THREADS: '1' },
      maxBuffer: 1 << 26,
    });
    const g = JSON.parse(out) as { wall: number; cpu: number; n: number; directPerRefl: number; ref2: number[]; densityErr: number; grid: number[] };
    let ourErr = 0;
    order.forEach((i, t) => (ourErr = Math.max(ourErr, Math.abs(f!.f2[i] - g.ref2[t]) / g.ref2[t])));
    const directEst = g.directPerRefl * m;
    const occSum = s.occupancy ? s.occupancy.reduce((x, y) => x + y, 0) : s.species.length;
    console.log(`${c.label}: ${s.species.length} sites (Σ occupancy ${occSum.toFixed(0)}), a = ${a.toFixed(2)} Å, ${m} reflections (one per Friedel pair, d ≥ ${dMin.toFixed(3)} Å)`);
    console.log(`  powder peak list:        ${lines.cpu.toFixed(2)} s CPU, ${lines.wall.toFixed(2)} s wall   (powderPeaks, ${lines.n} lines)`);
    console.log(`  powder with profile:     ${full.cpu.toFixed(2)} s CPU, ${full.wall.toFixed(2)} s wall   (braggPowder, Kα1 + Kα2, step 0.01°)`);
    console.log(`  structure factors alone: ${best.cpu.toFixed(2)} s CPU, ${best.wall.toFixed(2)} s wall   strongest 300: max Δ|F|²/|F|² ${ourErr.toExponential(1)} vs gemmi direct`);
    console.log(`  gemmi density FFT:       ${g.cpu.toFixed(2)} s CPU, ${g.wall.toFixed(2)} s wall   (grid ${g.grid.join('×')}, ${g.n} reflections)   strongest 300: ${g.densityErr.toExponential(1)}`);
    console.log(`  gemmi direct (est.):     ${directEst.toFixed(1)} s CPU (from ${order.length} reflections)`);
    console.log(
      `  ratio gemmi density / ours (CPU): powder peak list ${(g.cpu / lines.cpu).toFixed(2)}×, with profile ${(g.cpu / full.cpu).toFixed(2)}×, structure factors ${(g.cpu / best.cpu).toFixed(2)}×; gemmi direct / ours ${(directEst / best.cpu).toFixed(0)}×`,
    );
    console.log(`  target ${c.target} s CPU for the powder pattern: ${full.cpu < c.target ? 'met' : 'MISSED'}   load average ${loadavg().map((x) => x.toFixed(1)).join(' ')} on ${cpus().length} cores`);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

export default async function structureFactorLargeBench(): Promise<void> {
  const cases: Case[] = [
    { label: '5/3 approximant, Cu Kα1, 2θ ≤ 120° (target < 1 s)', order: '5/3', lambda: CU, lambda2: CU2, target: 1 },
    { label: '5/3 approximant, Mo Kα1, 2θ ≤ 120° (target < 3 s)', order: '5/3', lambda: MO, lambda2: MO2, target: 3 },
    { label: '8/5 approximant, Cu Kα1, 2θ ≤ 120° (target < 5 s)', order: '8/5', lambda: CU, lambda2: CU2, target: 5 },
  ];
  const cells = new Map<string, Structure>();
  for (const c of cases) {
    if (!cells.has(c.order)) cells.set(c.order, approximant(c.order));
    await runCase(c, cells.get(c.order)!);
  }
}
