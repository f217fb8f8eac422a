/**
 * The viewer's camera pair (components/viewer/viewCamera.ts): switching projection keeps the picture's
 * scale at the target, checked with three.js's own projection — a point in the target plane lands on the
 * same pixel in the perspective camera and in the orthographic camera the pose is carried to, both ways.
 */
import { describe, expect, it } from 'vitest';
import * as THREE from 'three';
import { CameraPair, type Pose } from '@/components/viewer/viewCamera';

function place(cam: THREE.PerspectiveCamera | THREE.OrthographicCamera, pose: Pose): void {
  cam.position.copy(pose.position);
  cam.up.copy(pose.up);
  if (cam instanceof THREE.OrthographicCamera) cam.zoom = pose.zoom;
  cam.lookAt(pose.target);
  cam.updateMatrixWorld();
  cam.updateProjectionMatrix();
}

describe('CameraPair.carry', () => {
  it('keeps a point of the target plane on the same pixel from perspective to orthographic and back', () => {
    const pair = new CameraPair();
    pair.setSize(900, 600);
    const target = new THREE.Vector3(3, -2, 5);
    const persp: Pose = { position: new THREE.Vector3(10, 7, 30), target, up: new THREE.Vector3(0, 1, 0), zoom: 1 };
    // A point 4 Å off the target, in the plane through the target perpendicular to the view.
    const view = persp.position.clone().sub(target).normalize();
    const side = new THREE.Vector3().crossVectors(view, persp.up).normalize();
    const p = target.clone().addScaledVector(side, 4);

    place(pair.perspective, persp);
    const a = p.clone().project(pair.perspective);
    const ortho = pair.carry(persp, 'perspective', 'orthographic');
    place(pair.orthographic, ortho);
    const b = p.clone().project(pair.orthographic);
    expect(b.x).toBeCloseTo(a.x, 9);
    expect(b.y).toBeCloseTo(a.y, 9);

    const back = pair.carry(ortho, 'orthographic', 'perspective');
    expect(back.position.distanceTo(persp.position)).toBeLessThan(1e-9);
    place(pair.perspective, back);
    const c = p.clone().project(pair.perspective);
    expect(c.x).toBeCloseTo(a.x, 9);
  });

  it('fits near and far around the structure for the camera where it stands', () => {
    const pair = new CameraPair();
    pair.setExtent([0, 0, 0], 10);
    pair.perspective.position.set(0, 0, 40);
    pair.fitDepth(pair.perspective);
    // The sphere spans 30…50 Å from the camera; the planes leave 20 % of the radius (and 1 Å) to spare.
    expect(pair.perspective.near).toBeCloseTo(28, 9);
    expect(pair.perspective.far).toBeCloseTo(53, 9);
  });
});
