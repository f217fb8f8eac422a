/**
 * Synthetic structures for the viewer's lab page, built in the browser:
 *  • "icosa": a small icosahedral point set by cut and project (6D integer points |n_i| ≤ 4 whose
 *    perpendicular image falls in a ball), the N nearest the origin; species and site classes by
 *    perpendicular radius, so the readout has perpendicular coordinates to show;
 *  • "fcc": a ball of N points of an fcc lattice (a = 4.05 Å), no cell;
 *  • "cell": an m×m×m block of fcc cells with its cubic cell (edges and [uvw]/(hkl) in cell axes).
 */
import type { SiteClass, Structure } from '@/lib/structure/types';
import { icosahedralBasis } from '@/lib/models/icosahedral/hyperlattice';
import { ENGINE_VERSION } from '@/lib/version';

export type Shape = 'icosa' | 'fcc' | 'cell';

function nearest(points: number[][], n: number): number[][] {
  return points
    .map((p) => ({ p, r: p[0] * p[0] + p[1] * p[1] + p[2] * p[2] }))
    .sort((a, b) => a.r - b.r)
    .slice(0, n)
    .map((x) => x.p);
}

function provenance(shape: Shape, n: number) {
  return { params: { lab: 'viewer', shape, n }, engine: ENGINE_VERSION };
}

export function icosaStructure(n: number): Structure {
  const aR = 4.6;
  const b = icosahedralBasis(aR);
  const k = 4;
  const rho = 4.2;
  const span = 2 * k + 1;
  const found: number[][] = [];
  const v = [0, 0, 0, 0, 0, 0];
  for (let c = 0; c < span ** 6; c++) {
    let x = c;
    for (let d = 0; d < 6; d++) {
      v[d] = (x % span) - k;
      x = Math.floor(x / span);
    }
    let q0 = 0, q1 = 0, q2 = 0;
    for (let d = 0; d < 6; d++) {
      q0 += v[d] * b.perp[3 * d];
      q1 += v[d] * b.perp[3 * d + 1];
      q2 += v[d] * b.perp[3 * d + 2];
    }
    if (q0 * q0 + q1 * q1 + q2 * q2 >= rho * rho) continue;
    let p0 = 0, p1 = 0, p2 = 0;
    for (let d = 0; d < 6; d++) {
      p0 += v[d] * b.par[3 * d];
      p1 += v[d] * b.par[3 * d + 1];
      p2 += v[d] * b.par[3 * d + 2];
    }
    found.push([p0, p1, p2, q0, q1, q2]);
  }
  const pts = nearest(found, n);
  const siteClasses: SiteClass[] = [
    { name: 'inner window', species: 46 },
    { name: 'middle window', species: 25 },
    { name: 'outer window', species: 13 },
  ];
  const m = pts.length;
  const positions = new Float64Array(3 * m);
  const perp = new Float64Array(3 * m);
  const site = new Uint16Array(m);
  const species = new Uint16Array(m);
  pts.forEach((p, i) => {
    positions.set(p.slice(0, 3), 3 * i);
    perp.set(p.slice(3), 3 * i);
    const r = Math.hypot(p[3], p[4], p[5]) / rho;
    site[i] = r < 0.45 ? 0 : r < 0.7 ? 1 : 2;
    species[i] = siteClasses[site[i]].species;
  });
  return { positions, species, site, siteClasses, perp, perpDim: 3, provenance: provenance('icosa', n) };
}

const FCC: number[][] = [
  [0, 0, 0],
  [0.5, 0.5, 0],
  [0.5, 0, 0.5],
  [0, 0.5, 0.5],
];

export function fccBall(n: number): Structure {
  const a = 4.05;
  const m = Math.ceil(Math.cbrt(n / 4) / 2) + 2;
  const pts: number[][] = [];
  for (let i = -m; i <= m; i++)
    for (let j = -m; j <= m; j++)
      for (let k = -m; k <= m; k++) for (let s = 0; s < 4; s++) pts.push([(i + FCC[s][0]) * a, (j + FCC[s][1]) * a, (k + FCC[s][2]) * a, s]);
  return fromPoints(nearest(pts, n), 'fcc', n);
}

export function fccBlock(n: number): Structure {
  const a = 4.05;
  const m = Math.max(1, Math.round(Math.cbrt(n / 4)));
  const pts: number[][] = [];
  for (let i = 0; i < m; i++)
    for (let j = 0; j < m; j++)
      for (let k = 0; k < m; k++) for (let s = 0; s < 4; s++) pts.push([(i + FCC[s][0]) * a, (j + FCC[s][1]) * a, (k + FCC[s][2]) * a, s]);
  const st = fromPoints(pts, 'cell', n);
  st.cell = [
    [m * a, 0, 0],
    [0, m * a, 0],
    [0, 0, m * a],
  ];
  return st;
}

function fromPoints(pts: number[][], shape: Shape, n: number): Structure {
  const siteClasses: SiteClass[] = [
    { name: 'corner', species: 13 },
    { name: 'face', species: 29 },
  ];
  const m = pts.length;
  const positions = new Float64Array(3 * m);
  const site = new Uint16Array(m);
  const species = new Uint16Array(m);
  pts.forEach((p, i) => {
    positions.set(p.slice(0, 3), 3 * i);
    site[i] = p[3] === 0 ? 0 : 1;
    species[i] = siteClasses[site[i]].species;
  });
  return { positions, species, site, siteClasses, provenance: provenance(shape, n) };
}

export function syntheticStructure(shape: Shape, n: number): Structure {
  if (shape === 'icosa') return icosaStructure(n);
  if (shape === 'cell') return fccBlock(n);
  return fccBall(n);
}
