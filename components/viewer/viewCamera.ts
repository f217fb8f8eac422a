/**
 * The viewer's camera pair and how a person moves it: free rotation about the screen axes (no pole,
 * so any axis can be looked down with any up), zoom, pan, framing, snapping down an axis, and the
 * perspective ⇄ orthographic switch that keeps the apparent size at the target. No React here; the
 * Rig component calls these methods and then asks for a frame.
 */
import * as THREE from 'three';
import { viewPose } from '@/lib/view/axes';
import type { Vec3 } from '@/lib/math/vec3';
import type { CameraMode } from './store';

/** Vertical field of view of the perspective camera, degrees. */
export const FOV = 35;
export const ROTATE_PER_PIXEL = 0.008;
const HALF_FOV = (FOV * Math.PI) / 360;

export class ViewCamera {
  readonly perspective = new THREE.PerspectiveCamera(FOV, 1, 0.1, 1000);
  readonly orthographic = new THREE.OrthographicCamera(-1, 1, 1, -1, 0.1, 1000);
  readonly target = new THREE.Vector3();
  camera: THREE.PerspectiveCamera | THREE.OrthographicCamera = this.perspective;
  private centre = new THREE.Vector3();
  private radius = 10;
  private width = 1;
  private height = 1;

  constructor() {
    // r3f leaves "manual" cameras alone on resize; setSize fits both frusta.
    Object.assign(this.perspective, { manual: true });
    Object.assign(this.orthographic, { manual: true });
    this.perspective.position.set(0, 0, 30);
    this.orthographic.position.set(0, 0, 30);
  }

  /** The structure's bounding sphere: near and far planes hug it, framing fits it. */
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

  distance(): number {
    return this.camera.position.distanceTo(this.target);
  }

  /** Re-aim at the target and fit near/far around the structure, for the best depth precision. */
  update(): void {
    const cam = this.camera;
    cam.lookAt(this.target);
    cam.updateMatrixWorld();
    const dc = cam.position.distanceTo(this.centre);
    const far = dc + this.radius * 1.2 + 1;
    cam.near = cam instanceof THREE.PerspectiveCamera ? Math.max(dc - this.radius * 1.2, far / 5000, 0.01) : dc - this.radius * 1.2 - 1;
    cam.far = far;
    cam.updateProjectionMatrix();
  }

  /** Frame the whole structure, keeping the view direction. */
  frameAll(): void {
    const cam = this.camera;
    const dir = cam.position.clone().sub(this.target);
    if (dir.lengthSq() < 1e-12) dir.set(0, 0, 1);
    dir.normalize();
    this.target.copy(this.centre);
    const fit = Math.min(HALF_FOV, Math.atan(Math.tan(HALF_FOV) * (this.width / this.height)));
    cam.position.copy(this.target).addScaledVector(dir, (this.radius * 1.05) / Math.sin(fit));
    if (cam instanceof THREE.OrthographicCamera) cam.zoom = Math.min(this.width, this.height) / (2 * this.radius * 1.05);
    this.update();
  }

  setMode(mode: CameraMode): void {
    const from = this.camera;
    const to = mode === 'orthographic' ? this.orthographic : this.perspective;
    if (from === to) return;
    to.position.copy(from.position);
    to.up.copy(from.up);
    if (to instanceof THREE.OrthographicCamera) {
      to.zoom = this.height / (2 * this.distance() * Math.tan(HALF_FOV));
    } else if (from instanceof THREE.OrthographicCamera) {
      const d = this.height / (2 * from.zoom * Math.tan(HALF_FOV));
      const dir = from.position.clone().sub(this.target).normalize();
      to.position.copy(this.target).addScaledVector(dir, d);
    }
    this.camera = to;
    this.update();
  }

  /** Look down a unit axis through the structure's centre, keeping the picture as upright as possible. */
  lookDown(axis: Vec3): void {
    const cam = this.camera;
    this.target.copy(this.centre);
    const c: Vec3 = [this.centre.x, this.centre.y, this.centre.z];
    const pose = viewPose(c, axis, Math.max(this.distance(), 1), [cam.up.x, cam.up.y, cam.up.z]);
    cam.position.set(...pose.position);
    cam.up.set(...pose.up);
    this.update();
  }

  /** Turn the scene by a pointer drag of (dx, dy) pixels. */
  rotate(dx: number, dy: number): void {
    const angle = Math.hypot(dx, dy) * ROTATE_PER_PIXEL;
    if (angle === 0) return;
    const cam = this.camera;
    const right = new THREE.Vector3().setFromMatrixColumn(cam.matrixWorld, 0);
    const up = new THREE.Vector3().setFromMatrixColumn(cam.matrixWorld, 1);
    // The scene turns by +angle about (dy·right + dx·up), so the camera turns by −angle about it.
    const axis = right.multiplyScalar(dy).add(up.multiplyScalar(dx)).normalize();
    const q = new THREE.Quaternion().setFromAxisAngle(axis, -angle);
    const offset = cam.position.clone().sub(this.target).applyQuaternion(q);
    cam.position.copy(this.target).add(offset);
    cam.up.applyQuaternion(q);
    this.update();
  }

  /** Slide the view by (dx, dy) pixels. */
  pan(dx: number, dy: number): void {
    const cam = this.camera;
    const perPixel = cam instanceof THREE.OrthographicCamera ? 1 / cam.zoom : (2 * this.distance() * Math.tan(HALF_FOV)) / this.height;
    const right = new THREE.Vector3().setFromMatrixColumn(cam.matrixWorld, 0);
    const up = new THREE.Vector3().setFromMatrixColumn(cam.matrixWorld, 1);
    const delta = right.multiplyScalar(-dx * perPixel).add(up.multiplyScalar(dy * perPixel));
    this.target.add(delta);
    cam.position.add(delta);
    this.update();
  }

  /** factor < 1 comes closer. */
  zoom(factor: number): void {
    const cam = this.camera;
    if (cam instanceof THREE.OrthographicCamera) {
      cam.zoom = Math.min(1e5, Math.max(1e-3, cam.zoom / factor));
    } else {
      const d = Math.min(this.radius * 50, Math.max(0.5, this.distance() * factor));
      const dir = cam.position.clone().sub(this.target).normalize();
      cam.position.copy(this.target).addScaledVector(dir, d);
    }
    this.update();
  }

  /** The picking ray through a point given in normalised device coordinates. */
  ray(ndcX: number, ndcY: number): { origin: Vec3; direction: Vec3 } {
    const r = new THREE.Raycaster();
    r.setFromCamera(new THREE.Vector2(ndcX, ndcY), this.camera);
    const o = r.ray.origin;
    const d = r.ray.direction;
    return { origin: [o.x, o.y, o.z], direction: [d.x, d.y, d.z] };
  }

  /** Normalised device coordinates of a world point. */
  project(p: Vec3): Vec3 {
    const v = new THREE.Vector3(...p).project(this.camera);
    return [v.x, v.y, v.z];
  }
}
