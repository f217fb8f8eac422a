import { describe, expect, it } from 'vitest';
import * as THREE from 'three';
import { angleAt, distanceBetween, pickAtom, raySphere } from '@/lib/view/pick';
import { inBall, projectionRange, slabAround, visibleMask } from '@/lib/view/slab';
import type { Vec3 } from '@/lib/math/vec3';

/** Deterministic pseudo-random numbers (mulberry32). */
function rng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

describe('raySphere against three.js Ray.intersectSphere', () => {
  it('agrees on hit or miss and on the distance, origin inside included', () => {
    const r = rng(7);
    let hits = 0;
    for (let k = 0; k < 2000; k++) {
      const o: Vec3 = [r() * 10 - 5, r() * 10 - 5, r() * 10 - 5];
      const d = new THREE.Vector3(r() - 0.5, r() - 0.5, r() - 0.5).normalize();
      const c: Vec3 = [r() * 10 - 5, r() * 10 - 5, r() * 10 - 5];
      const rad = 0.3 + r() * 3;
      const ray = new THREE.Ray(new THREE.Vector3(...o), d);
      const expected = ray.intersectSphere(new THREE.Sphere(new THREE.Vector3(...c), rad), new THREE.Vector3());
      const t = raySphere({ origin: o, direction: [d.x, d.y, d.z] }, c, rad);
      if (!expected) expect(t).toBeNull();
      else {
        hits++;
        expect(t).not.toBeNull();
        expect(expected.distanceTo(new THREE.Vector3(...o))).toBeCloseTo(t!, 9);
      }
    }
    expect(hits).toBeGreaterThan(100);
  });
});

describe('pickAtom', () => {
  // A row of atoms along z, looked at from +z: the nearest one (largest z) wins.
  const positions = new Float64Array([0, 0, 0, 0, 0, 3, 0, 0, 6, 5, 5, 5]);
  const radii = new Float32Array([1, 1, 1, 1]);
  const ray = { origin: [0, 0, 20] as Vec3, direction: [0, 0, -1] as Vec3 };

  it('returns the first sphere along the ray', () => {
    expect(pickAtom(ray, positions, radii)).toEqual({ index: 2, t: 13 });
  });

  it('skips atoms the slab hides and picks the next one behind', () => {
    const visible = visibleMask(positions, slabAround([0, 0, 1], 1.5, 4), null);
    expect(Array.from(visible)).toEqual([1, 1, 0, 0]);
    expect(pickAtom(ray, positions, radii, visible)?.index).toBe(1);
  });

  it('misses when nothing is on the ray, and ignores atoms behind the origin', () => {
    expect(pickAtom({ origin: [3, 0, 20], direction: [0, 0, -1] }, positions, radii)).toBeNull();
    expect(pickAtom({ origin: [0, 0, 4.5], direction: [0, 0, 1] }, positions, radii)?.index).toBe(2);
  });

  it('agrees with a brute-force three.js Raycaster-style search on random atoms', () => {
    const r = rng(3);
    const n = 500;
    const pos = new Float64Array(3 * n).map(() => r() * 40 - 20);
    const rad = new Float32Array(n).map(() => 0.5 + r());
    let hits = 0;
    for (let k = 0; k < 50; k++) {
      const o = new THREE.Vector3(r() * 10, r() * 10, 60);
      const d = new THREE.Vector3(r() * 0.4 - 0.2, r() * 0.4 - 0.2, -1).normalize();
      let best = -1;
      let bestT = Infinity;
      for (let i = 0; i < n; i++) {
        const hit = new THREE.Ray(o, d).intersectSphere(new THREE.Sphere(new THREE.Vector3(pos[3 * i], pos[3 * i + 1], pos[3 * i + 2]), rad[i]), new THREE.Vector3());
        if (hit && hit.distanceTo(o) < bestT) {
          bestT = hit.distanceTo(o);
          best = i;
        }
      }
      const got = pickAtom({ origin: [o.x, o.y, o.z], direction: [d.x, d.y, d.z] }, pos, rad);
      expect(got?.index ?? -1).toBe(best);
      if (best >= 0) hits++;
    }
    // Most rays meet an atom, so the comparison is not between two misses.
    expect(hits).toBeGreaterThan(25);
  });
});

describe('slab and ball', () => {
  // Simple cubic lattice, spacing 1 Å, z = −2 … 2.
  const pts: number[] = [];
  for (let x = -2; x <= 2; x++) for (let y = -2; y <= 2; y++) for (let z = -2; z <= 2; z++) pts.push(x, y, z);
  const positions = new Float64Array(pts);

  it('a 1 Å slab normal to z keeps exactly one layer of 25', () => {
    const mask = visibleMask(positions, slabAround([0, 0, 1], 1, 0.98), null);
    expect(mask.reduce((a, b) => a + b, 0)).toBe(25);
    for (let i = 0; i < mask.length; i++) if (mask[i]) expect(positions[3 * i + 2]).toBe(1);
  });

  it('a slab normal to (111) through the origin keeps the plane x + y + z = 0 (19 points in the 5³ block)', () => {
    const n: Vec3 = [1 / Math.sqrt(3), 1 / Math.sqrt(3), 1 / Math.sqrt(3)];
    const mask = visibleMask(positions, slabAround(n, 0, 0.1), null);
    expect(mask.reduce((a, b) => a + b, 0)).toBe(19);
  });

  it('a ball of radius 1 keeps the centre and its 6 nearest neighbours; ball and slab combine', () => {
    const ball = { centre: [0, 0, 0] as Vec3, radius: 1.0001 };
    expect(visibleMask(positions, null, ball).reduce((a, b) => a + b, 0)).toBe(7);
    expect(visibleMask(positions, slabAround([0, 0, 1], 0, 0.5), ball).reduce((a, b) => a + b, 0)).toBe(5);
    expect(inBall(ball, 1, 1, 0)).toBe(false);
  });

  it('projectionRange spans the atoms and centres on the centroid', () => {
    expect(projectionRange(positions, [0, 0, 1])).toEqual({ min: -2, max: 2, mid: 0 });
  });
});

describe('measuring', () => {
  it('distance and angle, including the tetrahedral angle arccos(−1/3) = 109.4712°', () => {
    const p = new Float64Array([1, 1, 1, 0, 0, 0, 1, -1, -1, 3, 4, 0]);
    expect(distanceBetween(p, 1, 3)).toBe(5);
    expect(angleAt(p, 0, 1, 2)).toBeCloseTo(109.4712206, 6);
    expect(angleAt(p, 3, 1, 3)).toBeCloseTo(0, 5);
  });
});
