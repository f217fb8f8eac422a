import { describe, expect, it } from 'vitest';
import { add, angleDeg, cross, distance, dot, norm, normalize, pointAt, scale, sub, type Vec3 } from '@/lib/math/vec3';
import { runPython } from '../../helpers/python';

/** Deterministic pseudo-random numbers (LCG from Numerical Recipes, common practice). */
function lcg(seed: number) {
  let s = seed >>> 0;
  return () => {
    s = (1664525 * s + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
}

const r = lcg(5);
const U: Vec3[] = Array.from({ length: 20 }, () => [r() * 20 - 10, r() * 20 - 10, r() * 20 - 10]);
const V: Vec3[] = Array.from({ length: 20 }, () => [r() * 2e-3, r() * 2e5 - 1e5, r() - 0.5]);

describe('vec3 against numpy (reference library)', () => {
  const ref = runPython<{ dot: number[]; cross: number[][]; norm: number[]; unit: number[][]; dist: number[]; angle: number[] }>(
    `import sys, json, numpy as np
d = json.loads(sys.stdin.read())
u = np.array(d["u"]); v = np.array(d["v"])
cosang = np.einsum("ij,ij->i", u, v) / (np.linalg.norm(u, axis=1) * np.linalg.norm(v, axis=1))
print(json.dumps({
  "dot": np.einsum("ij,ij->i", u, v).tolist(),
  "cross": np.cross(u, v).tolist(),
  "norm": np.linalg.norm(u, axis=1).tolist(),
  "unit": (v / np.linalg.norm(v, axis=1)[:, None]).tolist(),
  "dist": np.linalg.norm(u - v, axis=1).tolist(),
  "angle": np.degrees(np.arccos(np.clip(cosang, -1, 1))).tolist(),
}))`,
    JSON.stringify({ u: U, v: V }),
  );

  it('dot, cross, norm, normalize, distance and angle agree with numpy to rounding', () => {
    const close = (x: number, y: number, scaleOf: number) => expect(Math.abs(x - y)).toBeLessThanOrEqual(1e-13 * scaleOf);
    U.forEach((u, i) => {
      const v = V[i];
      const mag = norm(u) * norm(v);
      close(dot(u, v), ref.dot[i], mag);
      cross(u, v).forEach((x, k) => close(x, ref.cross[i][k], mag));
      close(norm(u), ref.norm[i], norm(u));
      normalize(v).forEach((x, k) => close(x, ref.unit[i][k], 1));
      close(distance(u, v), ref.dist[i], norm(u) + norm(v));
      expect(angleDeg(u, v)).toBeCloseTo(ref.angle[i], 9);
    });
  });
});

describe('vec3 against textbook values', () => {
  it('cross is right-handed: x × y = z, y × z = x, z × x = y', () => {
    expect(cross([1, 0, 0], [0, 1, 0])).toEqual([0, 0, 1]);
    expect(cross([0, 1, 0], [0, 0, 1])).toEqual([1, 0, 0]);
    expect(cross([0, 0, 1], [1, 0, 0])).toEqual([0, 1, 0]);
  });

  it('tetrahedral angle between (1,1,1) and (1,−1,−1) is arccos(−1/3) = 109.4712206°', () => {
    expect(angleDeg([1, 1, 1], [1, -1, -1])).toBeCloseTo(109.4712206, 7);
  });

  it('the 3-4-5 and 2-3-6-7 Pythagorean quadruple lengths come out exact', () => {
    expect(norm([3, 4, 0])).toBe(5);
    expect(norm([2, 3, 6])).toBe(7);
    expect(distance([1, 1, 1], [3, 4, 7])).toBe(7);
  });

  it('add, sub, scale and pointAt work componentwise on packed arrays', () => {
    expect(add([1, 2, 3], [10, 20, 30])).toEqual([11, 22, 33]);
    expect(sub([1, 2, 3], [10, 20, 30])).toEqual([-9, -18, -27]);
    expect(scale([1, -2, 3], -2)).toEqual([-2, 4, -6]);
    expect(pointAt(new Float64Array([0, 1, 2, 3, 4, 5]), 1)).toEqual([3, 4, 5]);
  });

  it('normalize refuses a zero vector (no direction)', () => {
    expect(() => normalize([0, 0, 0])).toThrow(/zero vector/);
  });
});
