/**
 * What the workspace's Web Worker runs: pure calls into lib/ (no DOM, no worker globals), so the same code is
 * unit-tested in Node. `report` carries progress stages back to the page.
 */
import { norm, type Vec3 } from '../math/vec3';
import type { Structure } from '../structure/types';
import { composition } from '../structure/checks/composition';
import { density } from '../structure/checks/density';
import { braggPowder } from '../diffraction/powder';
import { fitPattern, fitToComparison } from '../diffraction/fit/fit-pattern';
import { withStructureFactorProgress } from '../diffraction/structure-factor';
import { debyePowder } from '../diffraction/debye-powder';
import { approximantLatticeConstant } from '../models/icosahedral/approximant';
import { TAU } from '../math/golden';
import { estimateCount, generate } from '../models';
import { parseAxis, zoneFrame, zonePattern } from '../diffraction/zone-axis';
import { indexIcosahedralSpot, indexOctagonalSpot } from './zone-index';
import { indexJob, overlayJob } from './qc-jobs';
import type { CutSummary, JobRequest, JobResultMap, PowderCurve, SeriesRow, ZoneResult } from './protocol';

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
  if (s.cell) out.cellLengths = s.cell.map(norm) as Vec3;
  if (s.site && s.siteClasses) {
    const counts = new Array(s.siteClasses.length).fill(0);
    for (let i = 0; i < s.site.length; i++) counts[s.site[i]]++;
    out.perClass = s.siteClasses.map((c, i) => ({ name: c.name, count: counts[i] }));
  }
  return out;
}

function withOrder(params: unknown, p: number, q: number): unknown {
  const base = params as Record<string, unknown>;
  return { ...base, order: `${p}/${q}`, mode: 'approximant' };
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
    // A large ball, so the integer rounding of the estimate is below 1e-6 of it.
    const R = 60 * aR;
    const qc = estimateCount({ ...(params as object), mode: 'patch', radius: R });
    rhoQc = qc / ((4 / 3) * Math.PI * R ** 3);
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
    let occupied: number | undefined;
    if (estimate <= SERIES_FULL_CUT_LIMIT) {
      const s = generate(rp);
      const sum = summarise(s);
      atoms = sum.count;
      // Fractional boundary sites (singular symmetric cuts): density from the occupancy sum.
      if (s.occupancy) occupied = s.occupancy.reduce((x, y) => x + y, 0);
      formula = sum.formula ?? '—';
      massDensity = sum.massDensity;
      exact = true;
    }
    const numberDensity = (occupied ?? atoms) / a ** 3;
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
  const { structure: s, wavelength, radiation, twoThetaMin, twoThetaMax, step, fwhm, wavelength2, ratio2, dMin } = job;
  if (s.cell) {
    // Caglioti with U = V = 0 gives a constant FWHM of √W degrees.
    const r = braggPowder(s, { wavelength, radiation, twoThetaMin, twoThetaMax, wavelength2, ratio2, dMin, profile: { U: 0, V: 0, W: fwhm * fwhm, eta: 0.5, step } });
    return {
      twoTheta: r.profile!.twoTheta,
      intensity: r.profile!.intensity,
      peaks: r.peaks.map((p) => ({ twoTheta: p.twoTheta, d: p.d, hkl: p.hkl, intensity: p.intensity })),
      wavelength,
      wavelength2,
      ratio2,
      warnings: r.warnings,
    };
  }
  const r = debyePowder(s, { wavelength, radiation, twoThetaMin, twoThetaMax, step });
  return { twoTheta: r.twoTheta, intensity: r.intensity, peaks: r.maxima.map((m) => ({ twoTheta: m.twoTheta, d: m.d, hkl: null, intensity: m.intensity })), wavelength, warnings: r.warnings };
}

const AXIS_NAMES: Record<string, string> = { '5': 'a five-fold axis', '3': 'a three-fold axis', '2': 'a two-fold axis' };

/** Zone pattern; icosahedral spots get six-index labels, octagonal-tiling spots four, with |Q⊥| (zone-index.ts). */
export function zone(job: Extract<JobRequest, { kind: 'zone' }>): ZoneResult {
  const s = job.structure;
  const axis = parseAxis(job.axis);
  const grid = 201;
  const { spots } = zonePattern(s, { axis, qmax: job.qmax, radiation: job.radiation, grid, slab: job.slab });
  const frame = zoneFrame(axis, s);
  const m = s.model;
  const aR = m?.family === 'icosahedral' ? m.aR : null;
  const edge = m?.family === 'octagonal' && s.dim === 2 ? m.edge : null;
  const tol = (2 * job.qmax) / (grid - 1);
  let top = 0;
  for (const p of spots) if (p.q > tol) top = Math.max(top, p.intensity);
  const out = spots
    .filter((p) => p.q > tol && p.q <= job.qmax)
    .map((p) => {
      const q3: [number, number, number] = [0, 1, 2].map((k) => p.qx * frame.e1[k] + p.qy * frame.e2[k] + p.qz * frame.axis[k]) as [number, number, number];
      const found = aR
        ? indexIcosahedralSpot(q3, aR, tol, 12, m?.family === 'icosahedral' ? (m.lattice ?? 'P') : 'P')
        : edge && Math.abs(q3[2]) <= tol
          ? indexOctagonalSpot([q3[0], q3[1]], edge, tol)
          : null;
      // A label is only worth showing for a small perpendicular part (a strong quasicrystal reflection).
      const idx = found && found.qPerp < 2 * p.q + 1 ? found : null;
      return {
        x: p.qx,
        y: p.qy,
        intensity: top > 0 ? p.intensity / top : 0,
        label: p.hkl ? p.hkl.join(' ') : (idx?.label ?? '—'),
        qPar: p.q,
        qPerp: idx?.qPerp,
      };
    });
  const axisLabel = typeof axis === 'string' ? AXIS_NAMES[axis] : `[${axis.join(' ')}]`;
  return { spots: out, axisLabel, qmax: job.qmax };
}

/** Progress of the structure-factor sums mapped onto [from, to] of the job, at most one message per 1 %. */
export function sumProgress(report: Report, stage: string, from: number, to: number): (fraction: number) => void {
  let last = -1;
  return (f) => {
    const x = from + (to - from) * f;
    if (x - last >= 0.01 || f === 1) {
      last = x;
      report(stage, x);
    }
  };
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
      return withStructureFactorProgress(sumProgress(report, 'structure factors', 0.2, 0.9), () => zone(j)) as JobResultMap[K];
    case 'powder':
      report('powder pattern', 0.1);
      return withStructureFactorProgress(sumProgress(report, 'structure factors', 0.1, 0.9), () => powder(j)) as JobResultMap[K];
    case 'series':
      return series(j.params, report) as JobResultMap[K];
    case 'fit':
      report('least squares', 0.1);
      return fitToComparison(fitPattern(j.measured, j.lines, j.options)) as JobResultMap[K];
    case 'qc-index':
      return indexJob(j, report) as JobResultMap[K];
    case 'qc-overlay':
      return overlayJob(j, report) as JobResultMap[K];
  }
}
