/**
 * `symmetrise` on the command line, against spglib (python3-spglib 2.0): a 2/1 cubic approximant (P a -3, No. 205)
 * with every atom moved by up to 4 mÅ is P 1 to spglib at a tight tolerance and P a -3 at 0.02 Å. The snapped file
 * must be P a -3 to spglib at 1e-5 Å, and its positions must equal (1e-6 Å, up to a rigid shift of origin) the
 * average over spglib's own operations of the jittered input, computed here in numpy — the jittered positions are
 * mÅ off it, so the comparison can fail. (spglib's standardize_cell idealises by site-symmetry averages, a
 * different rule that lands a few mÅ away, so it is not the reference for the positions.)
 */
import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { cli } from '../../helpers/cli';
import { runPython } from '../../helpers/python';
import { icosahedralApproximant } from '../../../lib/models/icosahedral/approximant';
import { writeStructure } from '../../../lib/formats/write';
import { readStructure } from '../../../lib/formats/read';
import { toFractional } from '../../../lib/math/frac';
import type { Structure } from '../../../lib/structure/types';

const dir = mkdtempSync(join(tmpdir(), 'tf-sym-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const SPGLIB = `
import sys, json
import numpy as np
import spglib
d = json.load(sys.stdin)
L = np.array(d['lattice'])
get = lambda x, k: x[k] if isinstance(x, dict) else getattr(x, k)
pert = (L, np.array(d['pert']), d['numbers'])
snap = (L, np.array(d['snap']), d['numbers'])
ref = spglib.get_symmetry_dataset(pert, symprec=0.02)
X = np.array(d['pert'])
# The orthogonal projection onto the structures invariant under spglib's operations (the Reynolds average, common
# practice): each atom j becomes the mean over the operations g of g(x_i), where i is the atom g maps onto j.
acc = np.zeros_like(X)
for R, t in zip(get(ref, 'rotations'), get(ref, 'translations')):
    img = X @ np.array(R).T + t
    for i, y in enumerate(img):
        dd = X - y
        dd -= np.round(dd)
        j = int(np.argmin(np.linalg.norm(dd @ L, axis=1)))
        acc[j] += X[j] - dd[j]
proj = acc / len(get(ref, 'rotations'))
def residual(a, b):
    # Largest distance (Å) between matched atoms after removing one rigid translation (an origin choice).
    disp = []
    for y in np.array(a):
        dd = np.array(b) - y
        dd -= np.round(dd)
        disp.append(dd[int(np.argmin(np.linalg.norm(dd @ L, axis=1)))])
    disp = np.array(disp)
    disp -= disp.mean(axis=0)
    return float(np.linalg.norm(disp @ L, axis=1).max())
print(json.dumps({
  'pertTight': get(spglib.get_symmetry_dataset(pert, symprec=1e-5), 'number'),
  'pertLoose': get(ref, 'number'),
  'projTight': get(spglib.get_symmetry_dataset((L, proj, d['numbers']), symprec=1e-5), 'number'),
  'snapTight': get(spglib.get_symmetry_dataset(snap, symprec=1e-5), 'number'),
  'snapVsProj': residual(d['snap'], proj),
  'pertVsProj': residual(d['pert'], proj),
  'snapVsIdeal': residual(d['snap'], d['ideal']),
  'pertVsIdeal': residual(d['pert'], d['ideal']),
}))
`;

function fracList(s: Structure): number[][] {
  const f = toFractional(s.cell!, s.positions);
  return Array.from({ length: s.species.length }, (_, i) => [f[3 * i], f[3 * i + 1], f[3 * i + 2]]);
}

describe('tauforge symmetrise', () => {
  it('snaps a jittered 2/1 approximant back onto P a -3; spglib agrees on the group, and the positions are the average over the operations spglib finds', async () => {
    const s = icosahedralApproximant({ p: 2, q: 1, aR: 4.6 });
    s.species.fill(13);
    // Deterministic jitter of up to 4 mÅ per coordinate.
    const jittered: Structure = { ...s, positions: s.positions.map((x, i) => x + 0.004 * Math.sin(12.9898 * i + 78.233)) };
    const input = join(dir, 'jittered.extxyz');
    writeFileSync(input, writeStructure(jittered, 'extxyz'));
    const r = await cli(['symmetrise', '--input', input, '--symprec', '0.02', '--format', 'json']);
    expect(r.code, r.err).toBe(0);
    expect(r.err).toMatch(/# space group before: P 1 \(No\. 1\)/);
    expect(r.err).toMatch(/# snapped to P a -3 \(No\. 205, 24 operations\) at symprec 0\.02 Å; largest move 0\.00\d+ Å/);
    const snapped = readStructure(r.out);
    expect(snapped.species.length).toBe(136);
    const back = runPython<Record<string, number | boolean>>(
      SPGLIB,
      JSON.stringify({ lattice: s.cell, numbers: Array.from(s.species), pert: fracList(jittered), snap: fracList(snapped), ideal: fracList(s) }),
    );
    expect(back.pertTight).toBe(1);
    expect(back.pertLoose).toBe(205);
    expect(back.snapTight).toBe(205);
    expect(back.projTight).toBe(205);
    // Our snapped cell is spglib's group's projection of the jittered one (the jitter itself is mÅ off it) …
    expect(back.pertVsProj).toBeGreaterThan(1e-3);
    expect(back.snapVsProj).toBeLessThan(1e-6);
    // … and the average over the group's 24 operations removes most of the jitter from the ideal cut.
    expect(back.snapVsIdeal).toBeLessThan((back.pertVsIdeal as number) / 2);
  });

  it('the CIF it writes carries the snapped space group; clear errors for a cell-less file and a bad tolerance', async () => {
    const s = icosahedralApproximant({ p: 1, q: 1, aR: 4.6, offset: [0.31, 0.17, 0.05] });
    s.species.fill(13);
    const input = join(dir, 'one.json');
    writeFileSync(input, writeStructure(s, 'json'));
    const r = await cli(['symmetrise', '--input', input, '--symprec', '0.001']);
    expect(r.code, r.err).toBe(0);
    expect(r.out).toMatch(/^# Tauforge symmetry: (space group|P 1 with all)/m);
    const bad = await cli(['symmetrise', '--input', input, '--symprec', '-1']);
    expect(bad.code).toBe(2);
    expect(bad.err).toMatch(/--symprec/);
    const xyz = join(dir, 'plain.xyz');
    writeFileSync(xyz, '1\nno cell\nAl 0 0 0\n');
    const none = await cli(['symmetrise', '--input', xyz]);
    expect(none.code).toBe(2);
    expect(none.err).toMatch(/periodic cell/);
  });
});
