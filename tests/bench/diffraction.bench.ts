/**
 * Diffraction benchmarks (figures printed, no pass/fail):
 *  1. Structure-factor direct sums on an integer hkl grid: terms (atoms × reflections) per second for
 *     lib/diffraction/hkl-sum.ts (1 thread, and 2 worker_threads splitting the atoms), against a
 *     straightforward vectorised numpy sum exp(2πi H·X) (reference /usr/bin/python3 with numpy) on the
 *     same input in the same run, with the largest difference relative to max |F|.
 *  2. Debye powder pattern of a 10⁵-atom fcc ball: pair histogram (all 5·10⁹ pairs, 0.005 Å bins,
 *     2 worker_threads) plus the pattern on 3000 Q points. Target: under 10 s.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { hklPartialSums, rowsFromSortedHkl } from '../../lib/diffraction/hkl-sum';
import { histogramSpec } from '../../lib/diffraction/pair-histogram';
import { debyeFromHistogram, type PairHistogram } from '../../lib/diffraction/debye';
import { DiffractionPool } from '../../scripts/cli/diffraction-pool/pool';

const PY = '/usr/bin/python3';

function lcg(seed: number): () => number {
  let s = seed;
  return () => (s = (s * 16807) % 2147483647) / 2147483647;
}

function hklSphere(hmax: number): Int32Array {
  const out: number[] = [];
  for (let h = -hmax; h <= hmax; h++)
    for (let k = -hmax; k <= hmax; k++)
      for (let l = -hmax; l <= hmax; l++) if ((h || k || l) && h * h + k * k + l * l <= hmax * hmax) out.push(h, k, l);
  return Int32Array.from(out);
}

async function structureFactorBench(pool: DiffractionPool): Promise<void> {
  const atoms = 2000;
  const rnd = lcg(12345);
  const frac = Float64Array.from({ length: 3 * atoms }, () => rnd());
  const hkl = hklSphere(18);
  const m = hkl.length / 3;
  const rows = rowsFromSortedHkl(hkl);
  const groupOf = new Uint16Array(atoms);
  const weight = new Float64Array(atoms).fill(1);
  const terms = atoms * m;
  console.log(`structure factor: ${atoms} atoms × ${m} reflections = ${(terms / 1e6).toFixed(1)}M terms`);

  const re = new Float64Array(m);
  const im = new Float64Array(m);
  hklPartialSums(frac, groupOf, weight, rows, re, im, 0, 50); // warm-up
  re.fill(0);
  im.fill(0);
  let t = performance.now();
  hklPartialSums(frac, groupOf, weight, rows, re, im);
  const tJs = (performance.now() - t) / 1000;
  console.log(`  lib (1 thread):     ${tJs.toFixed(3)} s  ${(terms / tJs / 1e6).toFixed(0)} M terms/s`);

  t = performance.now();
  const par = await pool.hklPartialSums(frac, groupOf, weight, rows, 1);
  const tPar = (performance.now() - t) / 1000;
  console.log(`  lib (2 workers):    ${tPar.toFixed(3)} s  ${(terms / tPar / 1e6).toFixed(0)} M terms/s (warm workers)`);

  if (!existsSync(PY) || spawnSync(PY, ['-c', 'import numpy']).status !== 0) {
    console.log('  numpy: /usr/bin/python3 with numpy not found — comparison skipped');
    return;
  }
  const dir = mkdtempSync(join(tmpdir(), 'tf-bench-'));
  try {
    writeFileSync(join(dir, 'x.bin'), Buffer.from(frac.buffer));
    writeFileSync(join(dir, 'h.bin'), Buffer.from(Float64Array.from(hkl).buffer));
    const script = `
import numpy as np, time, sys
d=sys.argv[1]
x=np.fromfile(d+'/x.bin').reshape(-1,3); h=np.fromfile(d+'/h.bin').reshape(-1,3)
t=time.perf_counter()
F=np.empty(len(h),dtype=complex)
for s in range(0,len(h),2000):
    F[s:s+2000]=np.exp(2j*np.pi*(h[s:s+2000]@x.T)).sum(axis=1)
dt=time.perf_counter()-t
np.stack([F.real,F.imag],axis=1).tofile(d+'/F.bin')
print(dt)`;
    const tNp = Number(execFileSync(PY, ['-c', script, dir], { encoding: 'utf8' }).trim());
    const F = new Float64Array(readFileSync(join(dir, 'F.bin')).buffer.slice(0));
    let maxF = 0;
    let maxD = 0;
    let maxDp = 0;
    for (let i = 0; i < m; i++) {
      maxF = Math.max(maxF, Math.hypot(F[2 * i], F[2 * i + 1]));
      maxD = Math.max(maxD, Math.hypot(re[i] - F[2 * i], im[i] - F[2 * i + 1]));
      maxDp = Math.max(maxDp, Math.hypot(par.re[i] - F[2 * i], par.im[i] - F[2 * i + 1]));
    }
    console.log(`  numpy (vectorised): ${tNp.toFixed(3)} s  ${(terms / tNp / 1e6).toFixed(0)} M terms/s`);
    console.log(`  ratio lib/numpy: 1 thread ${(tNp / tJs).toFixed(1)}×, 2 workers ${(tNp / tPar).toFixed(1)}× (goal ≥ 5×)`);
    console.log(`  max |ΔF| / max |F|: 1 thread ${(maxD / maxF).toExponential(2)}, 2 workers ${(maxDp / maxF).toExponential(2)} (goal ≤ 1e-9)`);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

async function debyeBench(pool: DiffractionPool): Promise<void> {
  const a = 3.615;
  const target = 100_000;
  const radius = Math.cbrt((3 * target * (a * a * a)) / (4 * 4 * Math.PI));
  const pts: number[] = [];
  const m = Math.ceil(radius / a) + 1;
  const basis = [
    [0, 0, 0],
    [0, 0.5, 0.5],
    [0.5, 0, 0.5],
    [0.5, 0.5, 0],
  ];
  for (let i = -m; i <= m; i++)
    for (let j = -m; j <= m; j++)
      for (let k = -m; k <= m; k++)
        for (const b of basis) {
          const x = (i + b[0]) * a;
          const y = (j + b[1]) * a;
          const z = (k + b[2]) * a;
          if (x * x + y * y + z * z <= radius * radius) pts.push(x, y, z);
        }
  const positions = Float64Array.from(pts);
  const n = positions.length / 3;
  const groupOf = new Uint16Array(n);
  const weight = new Float64Array(n).fill(1);
  const spec = histogramSpec(positions, 1, 0.005);
  const pairs = (n * (n - 1)) / 2;
  console.log(`Debye: fcc Cu ball, ${n} atoms, ${(pairs / 1e9).toFixed(2)}·10⁹ pairs, ${spec.nBins} bins of 0.005 Å`);
  const t0 = performance.now();
  const hist = await pool.pairHistogram(positions, groupOf, weight, spec);
  const t1 = performance.now();
  const ph: PairHistogram = {
    ...spec,
    hist,
    self: Float64Array.of(n),
    groups: [{ parts: [[29, 1]], biso: 0, label: 'Cu' }],
    atoms: n,
  };
  const q = Float64Array.from({ length: 3000 }, (_, k) => 0.5 + (7.5 * k) / 2999);
  const I = debyeFromHistogram(ph, q, 'xray');
  const t2 = performance.now();
  let total = 0;
  for (const v of hist) total += v;
  console.log(`  pair histogram (2 workers): ${((t1 - t0) / 1000).toFixed(2)} s, ${(((t1 - t0) * 1e6) / pairs).toFixed(2)} ns/pair per 2 threads; pairs counted ${total === pairs ? 'all' : total}`);
  console.log(`  worker busy: ${pool.lastJobMs.map((ms) => (ms / 1000).toFixed(2)).join(' s, ')} s`);
  console.log(`  pattern on ${q.length} Q points: ${((t2 - t1) / 1000).toFixed(2)} s`);
  console.log(`  total ${((t2 - t0) / 1000).toFixed(2)} s (target < 10 s); I(Q=3.01 Å⁻¹, 111)/N = ${(I[Math.round(((3.01 - 0.5) * 2999) / 7.5)] / n).toFixed(1)}`);
}

export default async function diffractionBench(): Promise<void> {
  const pool = new DiffractionPool(2);
  try {
    await pool.warm();
    await structureFactorBench(pool);
    await debyeBench(pool);
  } finally {
    await pool.close();
  }
}
