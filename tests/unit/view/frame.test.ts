/**
 * Framing (lib/view/frame.ts) checked with three.js's own cameras: placed where frameView says, a
 * PerspectiveCamera (or an OrthographicCamera of the half height it gives) shows every point inside the
 * picture with the margin, and the fit is tight — some point reaches the margin, so the picture is no
 * larger than it needs to be.
 */
import { describe, expect, it } from 'vitest';
import * as THREE from 'three';
import { frameView } from '@/lib/view/frame';
import { viewPose, axesOfFold, uprightFor } from '@/lib/view/axes';
import { cross, dot, normalize, type Vec3 } from '@/lib/math/vec3';

function rng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a * 1664525 + 1013904223) >>> 0;
    return a / 4294967296;
  };
}

/** Largest |x| and |y| in normalised device coordinates over the points (three.js Vector3.project). */
function ndcExtent(points: Float64Array, camera: THREE.Camera): { x: number; y: number; behind: boolean } {
  let x = 0, y = 0, behind = false;
  const v = new THREE.Vector3();
  for (let i = 0; i < points.length; i += 3) {
    v.set(points[i], points[i + 1], points[i + 2]).project(camera);
    x = Math.max(x, Math.abs(v.x));
    y = Math.max(y, Math.abs(v.y));
    if (v.z > 1 || v.z < -1) behind = true;
  }
  return { x, y, behind };
}

describe('frameView', () => {
  const r = rng(3);
  // A cube of points (a cell seen from anywhere) and an elongated blob off the origin.
  const cube = new Float64Array(Array.from({ length: 8 }, (_, k) => [k & 1 ? 20 : 0, k & 2 ? 20 : 0, k & 4 ? 20 : 0]).flat());
  const blob = new Float64Array(Array.from({ length: 500 }, () => [40 + (r() - 0.5) * 30, -7 + (r() - 0.5) * 6, 3 + (r() - 0.5) * 12]).flat());
  const directions: Vec3[] = [[0, 0, 1], [1, 0, 0], normalize([1, 1, 1]), ...axesOfFold(5).slice(0, 2), normalize([0.3, -0.8, 0.52])];
  const fovY = (35 * Math.PI) / 180;

  for (const [name, pts] of [['cube corners', cube], ['elongated blob', blob]] as const) {
    for (const aspect of [2.2, 0.7]) {
      it(`${name}, aspect ${aspect}: all inside with 5 % to spare, and tight (perspective and orthographic)`, () => {
        for (const back of directions) {
          const up = viewPose([0, 0, 0], back, 1, uprightFor(back, [[0, 0, 1], [0, 1, 0], [1, 0, 0]])).up;
          const f = frameView(pts, [], { back, up, fovY, aspect, margin: 1.05 });
          const persp = new THREE.PerspectiveCamera(35, aspect, 0.01, 1e4);
          persp.position.set(...(f.target.map((t, k) => t + f.distance * back[k]) as Vec3));
          persp.up.set(...up);
          persp.lookAt(...f.target);
          persp.updateMatrixWorld();
          const e = ndcExtent(pts, persp);
          expect(e.behind).toBe(false);
          expect(Math.max(e.x, e.y)).toBeLessThanOrEqual(1 / 1.05 + 1e-9);
          expect(Math.max(e.x, e.y)).toBeGreaterThan(1 / 1.05 - 0.02);

          const h = f.halfHeight;
          const ortho = new THREE.OrthographicCamera(-h * aspect, h * aspect, h, -h, -1e4, 1e4);
          ortho.position.copy(persp.position);
          ortho.up.set(...up);
          ortho.lookAt(...f.target);
          ortho.updateMatrixWorld();
          const o = ndcExtent(pts, ortho);
          expect(Math.max(o.x, o.y)).toBeLessThanOrEqual(1 / 1.05 + 1e-9);
          expect(Math.max(o.x, o.y)).toBeCloseTo(1 / 1.05, 9);
        }
      });
    }
  }

  it('pads by the atom radius', () => {
    const f0 = frameView(cube, [], { back: [0, 0, 1], up: [0, 1, 0], fovY, aspect: 1 });
    const f1 = frameView(cube, [], { back: [0, 0, 1], up: [0, 1, 0], fovY, aspect: 1, pad: 2 });
    expect(f1.halfHeight - f0.halfHeight).toBeCloseTo(2 * 1.05, 9);
  });
});

describe('uprightFor', () => {
  const xyz: Vec3[] = [[0, 0, 1], [0, 1, 0], [1, 0, 0]];
  it('puts a perpendicular cube axis up for every axis with a zero index (all five-fold axes in the (0, ±1, ±τ) setting)', () => {
    let n = 0;
    for (const fold of [5, 3, 2] as const) {
      for (const a of axesOfFold(fold)) {
        if (!a.some((x) => Math.abs(x) < 1e-12)) continue;
        n++;
        const up = uprightFor(a, xyz);
        expect(Math.abs(dot(up, a))).toBeLessThan(1e-12);
        expect(xyz.some((c) => Math.abs(dot(c, up) - 1) < 1e-12)).toBe(true);
      }
    }
    // 6 five-fold, 6 three-fold of the [0 τ 1/τ] kind, 3 two-fold along the cube axes.
    expect(n).toBe(15);
  });

  it('keeps c up down [1 0 0] and takes the first candidate on a tie (down [1 1 1] every cube axis is equally oblique)', () => {
    expect(uprightFor([1, 0, 0], xyz)).toEqual([0, 0, 1]);
    expect(uprightFor([0, 0, 1], xyz)).toEqual([0, 1, 0]);
    expect(uprightFor([1, 1, 1], xyz)).toEqual([0, 0, 1]);
    // The picture is then upright: the projected up is perpendicular to the axis and points along +z.
    const pose = viewPose([0, 0, 0], normalize([1, 1, 1]), 5, uprightFor([1, 1, 1], xyz));
    expect(dot(pose.up, normalize([1, 1, 1]))).toBeCloseTo(0, 12);
    expect(pose.up[2]).toBeGreaterThan(0);
    expect(Math.hypot(...cross(pose.up, normalize([-1, -1, 2])))).toBeLessThan(1e-12);
  });
});
