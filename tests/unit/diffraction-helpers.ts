/** Shared helpers for the diffraction tests: the reference Python (Debian python3 with numpy/gemmi/xraylib). */
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import type { Cell, Structure } from '../../lib/structure/types';

export const REF_PYTHON = '/usr/bin/python3';

function has(mods: string): boolean {
  if (!existsSync(REF_PYTHON)) return false;
  const r = spawnSync(REF_PYTHON, ['-c', `import ${mods}`], { encoding: 'utf8' });
  return r.status === 0;
}

export const hasGemmi = has('gemmi');
export const hasXraylib = has('xraylib');
export const hasNumpy = has('numpy');

/** Run a Python snippet with the reference interpreter; stdin is `input`; returns parsed JSON stdout. */
export function runPython<T>(code: string, input = ''): T {
  const out = execFileSync(REF_PYTHON, ['-c', code], { input, encoding: 'utf8', maxBuffer: 1 << 28 });
  return JSON.parse(out) as T;
}

/** A crystal from a cell and fractional sites (species per site). */
export function crystal(cell: Cell, sites: [number, number, number, number][], biso?: number): Structure {
  const n = sites.length;
  const positions = new Float64Array(3 * n);
  const species = new Uint16Array(n);
  sites.forEach(([z, x, y, w], i) => {
    species[i] = z;
    for (let c = 0; c < 3; c++) positions[3 * i + c] = x * cell[0][c] + y * cell[1][c] + w * cell[2][c];
  });
  const s: Structure = { positions, species, cell, provenance: { params: { test: true }, engine: 'test' } };
  if (biso !== undefined) {
    s.site = new Uint16Array(n);
    const zs = [...new Set(sites.map((t) => t[0]))];
    s.siteClasses = zs.map((z) => ({ name: `Z${z}`, species: z, biso }));
    sites.forEach(([z], i) => (s.site![i] = zs.indexOf(z)));
  }
  return s;
}

export function cubic(a: number): Cell {
  return [
    [a, 0, 0],
    [0, a, 0],
    [0, 0, a],
  ];
}

export const FCC: [number, number, number][] = [
  [0, 0, 0],
  [0, 0.5, 0.5],
  [0.5, 0, 0.5],
  [0.5, 0.5, 0],
];
