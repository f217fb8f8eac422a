/**
 * Synthetic icosahedral powder patterns made by numpy, independently of lib/: the six five-fold axes of an
 * icosahedron (cyclic permutations of (0, ±1, ±τ), Coxeter, Regular Polytopes §3.7), Q∥ = (π/aR)·Σ h_i û_i and
 * Q⊥ = (π/aR)·Σ h_i û'_i (û' the Galois conjugate τ → −1/τ, normalised) for h ∈ Z⁶ (P) or Z⁶ ∪ Z⁶ + ½ (F), the
 * intensity of a ball-shaped occupation domain |3(sin x − x cos x)/x³|², x = |Q⊥|·R (textbook transform of a
 * ball; R by default that of the ball with the volume of the rhombic triacontahedron of edge aR), times the Bragg–Brentano Lp factor, Gaussian peaks, a zero shift and Poisson noise.
 */
import { runPython } from '../../../helpers/python';

export interface Synthetic {
  x: number[];
  y: number[];
  lines: { tt: number; n: number; m: number; qpar: number; qperp: number; i: number }[];
}

export function syntheticPattern(o: { aR: number; lattice: 'P' | 'F'; zero: number; lambda: number; fwhm: number; seed: number; R?: number; counts?: number; start?: number; stop?: number }): Synthetic {
  const script = String.raw`
import json, sys, itertools
import numpy as np
o = json.loads(sys.stdin.read())
t = (1 + 5 ** 0.5) / 2
par = np.array([[1,t,0],[-1,t,0],[0,1,t],[0,-1,t],[t,0,1],[t,0,-1]], float)
g = lambda v: -1 / t if v == t else (1 / t if v == -t else v)
perp = np.array([[g(v) for v in r] for r in par])
par /= np.linalg.norm(par, axis=1)[:, None]
perp /= np.linalg.norm(perp, axis=1)[:, None]
aR, lam = o['aR'], o['lambda']
rng = range(-4, 5)
H = np.array(list(itertools.product(rng, repeat=6)), float)
if o['lattice'] == 'F':
    H = np.vstack([H, H + 0.5])
qp = np.pi / aR * H @ par
qq = np.pi / aR * H @ perp
qpn = np.linalg.norm(qp, axis=1)
qqn = np.linalg.norm(qq, axis=1)
# default: the ball with the volume of the rhombic triacontahedron of edge aR, 4*sqrt(5+2*sqrt(5))*aR^3 (handbook value)
R = o.get('R') or (3 * 4 * (5 + 2 * 5 ** 0.5) ** 0.5 / (4 * np.pi)) ** (1 / 3) * aR
x = qqn * R
A = np.where(x < 1e-6, 1.0, 3 * (np.sin(x) - x * np.cos(x)) / np.maximum(x, 1e-6) ** 3)
s = np.clip(qpn * lam / (4 * np.pi), 0, 1)
tt = 2 * np.degrees(np.arcsin(s))
ok = (qpn > 1e-9) & (s < 1) & (tt > o['start']) & (tt < o['stop']) & (qqn * aR < 4)
th = np.radians(tt[ok] / 2)
lp = (1 + np.cos(2 * th) ** 2) / (np.sin(th) ** 2 * np.cos(th))
I = A[ok] ** 2 * lp * np.exp(-1.0 * (s[ok]) ** 2)
# CSG N, M
n = H[ok]
h = n[:,0]-n[:,1]; hp = n[:,4]+n[:,5]; k = n[:,2]-n[:,3]; kp = n[:,0]+n[:,1]; l = n[:,4]-n[:,5]; lp_ = n[:,2]+n[:,3]
N = h*h+hp*hp+k*k+kp*kp+l*l+lp_*lp_
M = hp*hp+kp*kp+lp_*lp_+2*(h*hp+k*kp+l*lp_)
xs = np.arange(o['start'], o['stop'], 0.01)
y = np.zeros_like(xs)
sig = o['fwhm'] / (2 * np.sqrt(2 * np.log(2)))
keys = {}
for ti, Ii, Ni, Mi, a, b in zip(tt[ok], I, N, M, qpn[ok], qqn[ok]):
    key = (int(Ni), int(Mi))
    if key in keys: keys[key]['i'] += Ii
    else: keys[key] = {'tt': float(ti), 'n': int(Ni), 'm': int(Mi), 'qpar': float(a), 'qperp': float(b), 'i': float(Ii)}
top = max(v['i'] for v in keys.values())
for v in keys.values():
    if v['i'] < 1e-4 * top: continue
    c = v['tt'] + o['zero']
    y += v['i'] / top * np.exp(-0.5 * ((xs - c) / sig) ** 2)
counts = o.get('counts') or 20000
gen = np.random.default_rng(o['seed'])
y = gen.poisson(y * counts + 50).astype(float)
print(json.dumps({'x': xs.tolist(), 'y': y.tolist(), 'lines': sorted(keys.values(), key=lambda v: -v['i'])[:40]}))
`;
  return runPython<Synthetic>(script, JSON.stringify({ start: 20, stop: 100, ...o }));
}
