/**
 * The viewer's two cameras and what the controls library does not know about them: the orthographic
 * frustum in CSS pixels (so zoom reads as pixels per ångström), near and far planes that hug the
 * structure (the impostors write their own depth, so depth precision matters), and carrying a view from
 * one projection to the other at the same apparent size. Turning, sliding and zooming are drei's
 * CameraControls (./rig). No React here.
 */
import * as THREE from 'three';
import type { Vec3 } from '@/lib/math/vec3';
import type { CameraMode } from './store';

/** Vertical field of view of the perspective camera, degrees. */
export const FOV = 35;
const HALF_FOV = (FOV * Math.PI) / 360;

/** Where a camera is: enough to put the other camera at the same view. */
export interface Pose {
  position: THREE.Vector3;
  target: THREE.Vector3;
  up: THREE.Vector3;
  /** Orthographic zoom (pixels per Å); 1 for the perspective camera. */
  zoom: number;
}

export class CameraPair {
  readonly perspective = new THREE.PerspectiveCamera(FOV, 1, 0.1, 1000);
  readonly orthographic = new THREE.OrthographicCamera(-1, 1, 1, -1, 0.1, 1000);
  private centre = new THREE.Vector3();
  private radius = 10;
  width = 1;
  height = 1;

  constructor() {
    // r3f leaves "manual" cameras alone on resize; setSize fits both frusta.
    Object.assign(this.perspective, { manual: true });
    Object.assign(this.orthographic, { manual: true });
    this.perspective.position.set(0, 0, 30);
    this.orthographic.position.set(0, 0, 30);
  }

  of(mode: CameraMode): THREE.PerspectiveCamera | THREE.OrthographicCamera {
    return mode === 'orthographic' ? this.orthographic : this.perspective;
  }

  /** The structure's bounding sphere: near and far planes hug it. */
  setExtent(centre: Vec3, radius: number): void {
    this.centre.set(...centre);
    this.radius = Math.max(radius, 1e-3);
  }

  setSize(width: number, height: number): void {
    this.width = Math.max(1, width);
    this.height = Math.max(1, height);
    this.perspective.aspect = this.width / this.height;
    Object.assign(this.orthographic, { left: -this.width / 2, right: this.width / 2, top: this.height / 2, bottom: -this.height / 2 });
    this.perspective.updateProjectionMatrix();
    this.orthographic.updateProjectionMatrix();
  }

  /** Fit near and far around the structure for the camera's current position. */
  fitDepth(cam: THREE.PerspectiveCamera | THREE.OrthographicCamera): void {
    const dc = cam.position.distanceTo(this.centre);
    const far = dc + this.radius * 1.2 + 1;
    const near = cam instanceof THREE.PerspectiveCamera ? Math.max(dc - this.radius * 1.2, far / 5000, 0.01) : dc - this.radius * 1.2 - 1;
    if (near !== cam.near || far !== cam.far) {
      cam.near = near;
      cam.far = far;
      cam.updateProjectionMatrix();
    }
  }

  /** World length of one CSS pixel at the target, for sliding by pixels. */
  worldPerPixel(pose: Pose, mode: CameraMode): number {
    return mode === 'orthographic' ? 1 / pose.zoom : (2 * pose.position.distanceTo(pose.target) * Math.tan(HALF_FOV)) / this.height;
  }

  /**
   * The same view in the other projection: perspective → orthographic keeps the position and sets the zoom
   * that shows the target plane at the same size; orthographic → perspective moves to the distance at which
   * the perspective camera shows that size.
   */
  carry(pose: Pose, from: CameraMode, to: CameraMode): Pose {
    if (from === to) return pose;
    const d = pose.position.distanceTo(pose.target);
    if (to === 'orthographic') return { ...pose, zoom: this.height / (2 * Math.max(d, 1e-6) * Math.tan(HALF_FOV)) };
    const dist = this.height / (2 * pose.zoom * Math.tan(HALF_FOV));
    const dir = pose.position.clone().sub(pose.target).normalize();
    return { ...pose, position: pose.target.clone().addScaledVector(dir, dist), zoom: 1 };
  }
}
