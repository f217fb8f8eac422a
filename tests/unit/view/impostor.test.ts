/**
 * The impostor formulas (lib/view/impostor.ts, mirrored by the viewer's shaders) checked against
 * three.js's own camera maths: Vector3.project for where things land on screen and at what depth,
 * Raycaster.setFromCamera + Ray.intersectSphere for where a pixel's ray meets the sphere.
 */
import { describe, expect, it } from 'vitest';
import * as THREE from 'three';
import { isOrthographic, quadCorner, quadHalfSize, surfacePoint, windowDepth } from '@/lib/view/impostor';
import type { Vec3 } from '@/lib/math/vec3';

function cameras(): [string, THREE.Camera & { projectionMatrix: THREE.Matrix4 }][] {
  const persp = new THREE.PerspectiveCamera(35, 1.6, 2, 80);
  const ortho = new THREE.OrthographicCamera(-12, 12, 7.5, -7.5, -5, 60);
  for (const cam of [persp, ortho]) {
    cam.position.set(4, -3, 25);
    cam.up.set(0.2, 1, 0).normalize();
    cam.lookAt(1, 1, 0);
    cam.updateMatrixWorld();
    cam.updateProjectionMatrix();
  }
  return [
    ['perspective', persp],
    ['orthographic', ortho],
  ];
}

const spheres: [Vec3, number][] = [
  [[1, 1, 0], 1.2],
  [[6, -2, 5], 0.7],
  [[-5, 4, -8], 2.5],
  [[3, 3, 14], 1.8], // close to the camera and off axis: the perspective silhouette is a stretched ellipse
];

const toView = (cam: THREE.Camera, p: Vec3): Vec3 => {
  const v = new THREE.Vector3(...p).applyMatrix4(cam.matrixWorldInverse);
  return [v.x, v.y, v.z];
};
const toWorld = (cam: THREE.Camera, p: Vec3) => new THREE.Vector3(...p).applyMatrix4(cam.matrixWorld);

/** Fibonacci points on a sphere. */
function spherePoints(c: Vec3, r: number, n: number): THREE.Vector3[] {
  const out: THREE.Vector3[] = [];
  for (let i = 0; i < n; i++) {
    const z = 1 - (2 * (i + 0.5)) / n;
    const s = Math.sqrt(1 - z * z);
    const phi = i * Math.PI * (3 - Math.sqrt(5));
    out.push(new THREE.Vector3(c[0] + r * s * Math.cos(phi), c[1] + r * s * Math.sin(phi), c[2] + r * z));
  }
  return out;
}

describe.each(cameras())('sphere impostor, %s camera', (name, cam) => {
  it('knows which kind of projection it has', () => {
    expect(isOrthographic(cam.projectionMatrix.elements)).toBe(name === 'orthographic');
  });

  it.each(spheres)('the quad covers the whole projected sphere and touches its outline (centre %j, r %d)', (centre, r) => {
    const ortho = name === 'orthographic';
    const c = toView(cam, centre);
    // Project the four corners with three.js; express every projected sphere point in the quad's
    // own bilinear frame by inverting the (projective) map corner → screen via a homography.
    const corners = [[-1, -1], [1, -1], [1, 1], [-1, 1]].map(([sx, sy]) => toWorld(cam, quadCorner(c, r, ortho, sx, sy)).project(cam));
    const edges = corners.map((p, k) => [p, corners[(k + 1) % 4]] as const);
    const inside = (q: THREE.Vector3) => edges.every(([a, b]) => (b.x - a.x) * (q.y - a.y) - (b.y - a.y) * (q.x - a.x) >= -1e-9);
    const pts = spherePoints(centre, r, 4000).map((p) => p.project(cam));
    expect(pts.every(inside)).toBe(true);
    // Tight: the outline comes within 1 % of the quad's edges (the tangent cone meets the quad plane
    // in the inscribed circle exactly).
    const scale = Math.hypot(corners[0].x - corners[2].x, corners[0].y - corners[2].y);
    const distToEdge = (q: THREE.Vector3) =>
      Math.min(...edges.map(([a, b]) => Math.abs((b.x - a.x) * (q.y - a.y) - (b.y - a.y) * (q.x - a.x)) / Math.hypot(b.x - a.x, b.y - a.y)));
    expect(Math.min(...pts.map(distToEdge)) / scale).toBeLessThan(0.01);
  });

  it.each(spheres)('each fragment finds the point three.js finds on the ray, at three.js depth (centre %j)', (centre, r) => {
    const ortho = name === 'orthographic';
    const c = toView(cam, centre);
    const h = quadHalfSize(c, r, ortho);
    expect(h).toBeGreaterThanOrEqual(r);
    const ray = new THREE.Raycaster();
    const sphere = new THREE.Sphere(new THREE.Vector3(...centre), r);
    let hits = 0;
    let misses = 0;
    for (let k = 0; k < 400; k++) {
      // Radii 0 … 1.4 of the inscribed circle (the outline), skipping the outline itself where hit or
      // miss is a matter of rounding.
      const f = ((k % 20) / 19) * 1.4;
      if (Math.abs(f - 1) < 0.02) continue;
      const sx = Math.cos(k * 2.4) * f;
      const sy = Math.sin(k * 2.4) * f;
      const q = quadCorner(c, r, ortho, sx, sy);
      const ndc = toWorld(cam, q).project(cam);
      ray.setFromCamera(new THREE.Vector2(ndc.x, ndc.y), cam);
      const expected = ray.ray.intersectSphere(sphere, new THREE.Vector3());
      const got = surfacePoint(c, r, q, ortho);
      if (!expected) {
        expect(got).toBeNull();
        misses++;
        continue;
      }
      expect(got).not.toBeNull();
      hits++;
      const world = toWorld(cam, got!);
      expect(world.distanceTo(expected)).toBeLessThan(1e-6 * (1 + r));
      expect(windowDepth(got!, cam.projectionMatrix.elements)).toBeCloseTo(expected.clone().project(cam).z * 0.5 + 0.5, 7);
    }
    expect(hits).toBeGreaterThan(50);
    expect(misses).toBeGreaterThan(0);
  });

  it('the front surface is nearer than the centre in depth', () => {
    const ortho = name === 'orthographic';
    const c = toView(cam, [1, 1, 0]);
    const p = surfacePoint(c, 1.2, c, ortho)!;
    expect(windowDepth(p, cam.projectionMatrix.elements)).toBeLessThan(windowDepth(c, cam.projectionMatrix.elements));
  });
});

describe('perspective impostor with the eye inside the sphere', () => {
  it('draws nothing (half-size 0)', () => {
    expect(quadHalfSize([0, 0, -0.5], 1, false)).toBe(0);
  });
});
