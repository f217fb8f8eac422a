/**
 * Icosahedral engine speed: cubic approximants 8/5 … 34/21 and a patch of about 10⁵ points.
 * Goals on one core: 21/13 under 1 s, 34/21 (785 672 vertices) under 4 s; work linear in points.
 * Prints points per second, memory after each run (rss and heapUsed; the maxima are the peaks seen)
 * and the scaling exponent from a least-squares fit of log time against log points.
 */
import { icosahedralApproximant } from '../../lib/models/icosahedral/approximant';
import { icosahedralPatch, estimatePatchCount } from '../../lib/models/icosahedral/patch';

function fitExponent(pts: { n: number; t: number }[]): number {
  const xs = pts.map((p) => Math.log(p.n));
  const ys = pts.map((p) => Math.log(p.t));
  const mx = xs.reduce((a, b) => a + b, 0) / xs.length;
  const my = ys.reduce((a, b) => a + b, 0) / ys.length;
  let num = 0;
  let den = 0;
  xs.forEach((x, i) => {
    num += (x - mx) * (ys[i] - my);
    den += (x - mx) ** 2;
  });
  return num / den;
}

export default async function icosahedralBench(): Promise<void> {
  const mb = (b: number) => (b / 2 ** 20).toFixed(0);
  let peakRss = 0;
  let peakHeap = 0;
  const line = (label: string, n: number, ms: number) => {
    const m = process.memoryUsage();
    peakRss = Math.max(peakRss, m.rss);
    peakHeap = Math.max(peakHeap, m.heapUsed);
    console.log(`${label.padEnd(22)} ${String(n).padStart(8)} points  ${ms.toFixed(0).padStart(6)} ms  ${((n / ms) * 1000).toExponential(2)} points/s  rss ${mb(m.rss)} MB  heap ${mb(m.heapUsed)} MB`);
  };
  icosahedralApproximant({ p: 3, q: 2, aR: 4.6 }); // warm-up (JIT)
  const approx: { n: number; t: number }[] = [];
  for (const [p, q] of [[8, 5], [13, 8], [21, 13], [34, 21]]) {
    const t0 = performance.now();
    const s = icosahedralApproximant({ p, q, aR: 4.6 });
    const t = performance.now() - t0;
    approx.push({ n: s.species.length, t });
    line(`approximant ${p}/${q}`, s.species.length, t);
  }
  const patch: { n: number; t: number }[] = [];
  for (const radius of [12, 18, 27.4]) {
    const spec = { aR: 1, radius, offset: [0.0123, -0.0271, 0.0316] as [number, number, number] };
    const t0 = performance.now();
    const s = icosahedralPatch(spec);
    const t = performance.now() - t0;
    patch.push({ n: s.species.length, t });
    line(`patch R=${radius} aR (est ${Math.round(estimatePatchCount(spec))})`, s.species.length, t);
  }
  console.log(`scaling exponent (log t vs log N): approximants ${fitExponent(approx).toFixed(2)}, patches ${fitExponent(patch).toFixed(2)}`);
  console.log(`peak seen: rss ${mb(peakRss)} MB, heapUsed ${mb(peakHeap)} MB`);
}
