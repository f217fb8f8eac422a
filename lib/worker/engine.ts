/**
 * What the workspace's Web Worker runs: pure calls into lib/ (no DOM, no worker globals), so the same code is
 * unit-tested in Node. `report` carries progress stages back to the page.
 */
import type { Structure } from '../structure/types';
import { composition } from '../structure/checks/composition';
import { density } from '../structure/checks/density';
import { braggPowder } from '../diffraction/powder';
import { debyePowder } from '../diffraction/debye-powder';
import { approximantLatticeConstant } from '../tiling/approximant';
import { TAU } from '../tiling/hyperlattice';
// TEMPORARY: swap for '../generate' (the lead's dispatcher) when it lands.
import { estimateCount, generate } from './generate-shim';
import { zoneSpots } from './zone-shim';
import type { CutSummary, JobRequest, JobResultMap, PowderCurve, SeriesRow } from './protocol';

export type Report = (stage: string, fraction?: number) => void;

/** Approximant orders of a series: consecutive Fibonacci ratios 1/1 … 21/13. */
export const SERIES_ORDERS: [number, number][] = [
  [1, 1],
  [2, 1],
  [3, 2],
  [5, 3],
  [8, 5],
  [13, 8],
  [21, 13],
];

/** Rows whose estimate is above this are reported from the estimate only (no full cut in the series). */
export const SERIES_FULL_CUT_LIMIT = 200_000;

export function summarise(s: Structure): CutSummary {
  const out: CutSummary = { count: s.species.length };
  if (s.species.length === 0) return out;
  try {
    const d = density(s);
    out.numberDensity = d.numberDensity;
    out.massDensity = d.massDensity;
  } catch {
    /* density needs a cell or a ball big enough; leave it out */
  }
  try {
    const c = composition(s);
    out.formula = c.formula;
    out.composition = c.entries.map((e) => ({ symbol: e.symbol, count: e.count, fraction: e.fraction }));
  } catch {
    /* no composition for an invalid structure */
  }
  if (s.cell) out.cellLengths = s.cell.map((v) => Math.hypot(v[0], v[1], v[2])) as [number, number, number];
  if (s.site && s.siteClasses) {
    const counts = new Array(s.siteClasses.length).fill(0);
    for (let i = 0; i < s.site.length; i++) counts[s.site[i]]++;
    out.perClass = s.siteClasses.map((c, i) => ({ name: c.name, count: counts[i] }));
  }
  return out;
}

function withOrder(params: unknown, p: number, q: number): unknown {
  const base = params as Record<string, unknown>;
  // The model may carry the order as p, q or as an `order` object; set whichever it uses.
  if (base.order && typeof base.order === 'object') return { ...base, order: { ...(base.order as object), p, q }, kind: 'approximant' };
  return { ...base, p, q, kind: 'approximant' };
}

function aROf(params: unknown): number {
  const a = (params as { aR?: unknown }).aR;
  return typeof a === 'number' ? a : 4.6;
}

export function series(params: unknown, report: Report = () => {}): JobResultMap['series'] {
  const aR = aROf(params);
  const rows: SeriesRow[] = [];
  let rhoQc: number | undefined;
  // The quasicrystal's density is the limit of the series; with the patch route we measure it directly.
  try {
    const qc = estimateCount({ ...(params as object), kind: 'patch', radius: 10 * aR });
    rhoQc = qc / ((4 / 3) * Math.PI * (10 * aR) ** 3);
  } catch {
    rhoQc = undefined;
  }
  SERIES_ORDERS.forEach(([p, q], i) => {
    report(`order ${p}/${q}`, i / SERIES_ORDERS.length);
    const rp = withOrder(params, p, q);
    const a = approximantLatticeConstant(p, q, aR);
    const estimate = estimateCount(rp);
    let atoms = Math.round(estimate);
    let formula = '—';
    let massDensity: number | undefined;
    let exact = false;
    if (estimate <= SERIES_FULL_CUT_LIMIT) {
      const s = generate(rp);
      const sum = summarise(s);
      atoms = sum.count;
      formula = sum.formula ?? '—';
      massDensity = sum.massDensity;
      exact = true;
    }
    const numberDensity = atoms / a ** 3;
    rows.push({
      p,
      q,
      a,
      atoms,
      numberDensity,
      massDensity,
      formula,
      strain: (q * TAU - p) / (p * TAU + q),
      densityMisfit: rhoQc ? (numberDensity - rhoQc) / rhoQc : undefined,
      exact,
    });
  });
  return { rows, quasicrystalDensity: rhoQc };
}

function powder(job: Extract<JobRequest, { kind: 'powder' }>): PowderCurve {
  const { structure: s, wavelength, radiation, twoThetaMin, twoThetaMax, step, fwhm } = job;
  if (s.cell) {
    // Caglioti with U = V = 0 gives a constant FWHM of √W degrees.
    const r = braggPowder(s, { wavelength, radiation, twoThetaMin, twoThetaMax, profile: { U: 0, V: 0, W: fwhm * fwhm, eta: 0.5, step } });
    return {
      twoTheta: r.profile!.twoTheta,
      intensity: r.profile!.intensity,
      peaks: r.peaks.map((p) => ({ twoTheta: p.twoTheta, d: p.d, hkl: p.hkl.join(' '), intensity: p.intensity })),
      wavelength,
    };
  }
  const r = debyePowder(s, { wavelength, radiation, twoThetaMin, twoThetaMax, step });
  return { twoTheta: r.twoTheta, intensity: r.intensity, peaks: r.maxima.map((m) => ({ twoTheta: m.twoTheta, d: m.d, intensity: m.intensity })), wavelength };
}

export function runJob<K extends JobRequest['kind']>(job: Extract<JobRequest, { kind: K }>, report: Report = () => {}): JobResultMap[K] {
  const j = job as JobRequest;
  switch (j.kind) {
    case 'estimate':
      return { estimate: estimateCount(j.params) } as JobResultMap[K];
    case 'generate': {
      report('cutting', 0.1);
      const structure = generate(j.params);
      report('checking', 0.8);
      return { structure, summary: summarise(structure) } as JobResultMap[K];
    }
    case 'zone':
      report('structure factors', 0.2);
      return zoneSpots(j.structure, j.axis, j.qmax, j.radiation) as JobResultMap[K];
    case 'powder':
      report('powder pattern', 0.2);
      return powder(j) as JobResultMap[K];
    case 'series':
      return series(j.params, report) as JobResultMap[K];
  }
}
