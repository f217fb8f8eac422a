/**
 * Star multiplicities of 6D icosahedral indices against an outside count: numpy builds the 60 rotations of the
 * icosahedral group as 3×3 matrices from its own generators (a five-fold rotation about (0, 1, τ) and a
 * three-fold about (1, 1, 1), closed under products — Coxeter, Regular Polytopes §3.7), adds the inversion, and
 * counts the distinct images of Q∥ = Σ h_i u_i (u_i the normalised (±1, τ, 0)-type five-fold axes) for each h; the
 * orbit of Q∥ has the size of the orbit of h because h ↦ Q∥ is one-to-one on Z⁶ (τ irrational).
 */
import { describe, expect, it } from 'vitest';
import { runPython } from '../../../helpers/python';
import { icosahedralOperations, starMultiplicity, starRepresentative } from '../../../../lib/diffraction/quasicrystal/star';

const SAMPLES = [
  [1, 0, 0, 0, 0, 0],
  [1, 1, 0, 0, 0, 0],
  [1, -1, 0, 0, 0, 0],
  [1, 1, 1, 0, 0, 0],
  [1, 1, 1, 1, 1, 1],
  [2, 1, 0, 0, 0, 0],
  [2, 1, 1, 0, 0, 0],
  [3, 2, 1, 0, -1, 0],
  [0.5, 0.5, 0.5, 0.5, 0.5, 0.5],
  [1.5, 0.5, -0.5, 0.5, 0.5, 0.5],
  [2, 0, 1, 0, 2, 1],
  [1, 1, 0, 0, 0, -1],
  [4, 3, 2, 1, 0, -1],
];

const SCRIPT = String.raw`
import json, sys, itertools
import numpy as np
hs = json.loads(sys.stdin.read())
t = (1 + 5 ** 0.5) / 2
def rot(n, a):
    n = np.array(n, float); n /= np.linalg.norm(n)
    K = np.array([[0, -n[2], n[1]], [n[2], 0, -n[0]], [-n[1], n[0], 0]])
    return np.eye(3) + np.sin(a) * K + (1 - np.cos(a)) * K @ K
gens = [rot([0, 1, t], 2 * np.pi / 5), rot([1, 1, 1], 2 * np.pi / 3)]
G = [np.eye(3)]
keys = {tuple(np.round(np.eye(3), 6).ravel())}
i = 0
while i < len(G):
    for g in gens:
        p = g @ G[i]
        k = tuple(np.round(p, 6).ravel())
        if k not in keys:
            keys.add(k); G.append(p)
    i += 1
assert len(G) == 60, len(G)
G = G + [-g for g in G]
u = np.array([[1,t,0],[-1,t,0],[0,1,t],[0,-1,t],[t,0,1],[t,0,-1]], float)
u /= np.linalg.norm(u, axis=1)[:, None]
out = []
for h in hs:
    q = np.array(h) @ u
    imgs = {tuple(np.round(g @ q, 6)) for g in G}
    out.append(len(imgs))
print(json.dumps({'group': len(G), 'mult': out}))
`;

describe('icosahedral stars of 6D indices', () => {
  it('has 120 distinct operations (m-3-5)', () => {
    const ops = icosahedralOperations();
    expect(ops.length).toBe(120);
    const keys = new Set(ops.map((o) => `${Array.from(o.perm)}|${Array.from(o.sign)}`));
    expect(keys.size).toBe(120);
  });

  it('multiplicities agree with a numpy count over the 120 rotations and rotation-inversions', () => {
    const ref = runPython<{ group: number; mult: number[] }>(SCRIPT, JSON.stringify(SAMPLES));
    expect(ref.group).toBe(120);
    const ours = SAMPLES.map((h) => starMultiplicity(h));
    expect(ours).toEqual(ref.mult);
    // the general star is the whole group; the five-fold axis 12, the two-fold 30, the three-fold 20 (handbook)
    expect(ref.mult).toContain(120);
  });

  it('gives every member of a star the same representative', () => {
    const h = [3, 2, 1, 0, -1, 0];
    const key = starRepresentative(h).key;
    for (const op of icosahedralOperations().slice(0, 30)) {
      const g = new Array<number>(6);
      for (let i = 0; i < 6; i++) g[op.perm[i]] = op.sign[i] * h[i];
      expect(starRepresentative(g).key).toBe(key);
    }
  });
});
