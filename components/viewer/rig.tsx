'use client';
/**
 * Camera, controls, picking, the frame driver and the viewer handle. Turning, sliding and zooming are drei's
 * CameraControls (drag turns, right- or shift-drag slides, the wheel zooms towards the pointer); we add
 * what a structure viewer needs on top: snapping down an axis with a chosen up, framing the structure,
 * the keyboard, picking atoms on the CPU, and near/far planes that hug the structure. Every change asks
 * for one frame (render on demand).
 */
import { CameraControls, CameraControlsImpl } from '@react-three/drei';
import { useFrame, useThree } from '@react-three/fiber';
import { useEffect, useLayoutEffect, useMemo, useRef, useState } from 'react';
import * as THREE from 'three';
import type { Cell } from '@/lib/structure/types';
import { directionVector, uprightFor, viewPose } from '@/lib/view/axes';
import { frameView } from '@/lib/view/frame';
import { pickAtom } from '@/lib/view/pick';
import type { Ball, Slab } from '@/lib/view/slab';
import { visibleMask } from '@/lib/view/slab';
import type { Vec3 } from '@/lib/math/vec3';
import type { CameraMode, ViewStore } from './store';
import { CameraPair, FOV, type Pose } from './viewCamera';
import { renderTimed } from './timing';

export interface ViewerHandle {
  /** Render now and return the picture as a PNG data URL. */
  snapshot(): string;
  /** Render k frames back to back, each forced to finish by a 1-pixel read-back; ms per frame. */
  renderFrames(k: number): { msPerFrame: number; triangles: number; calls: number };
  /** Where atom i's centre is on screen, in CSS pixels of the page. */
  atomScreen(i: number): { x: number; y: number } | null;
  /** Where a point (Å) is on screen, in CSS pixels of the page. */
  pointScreen(p: Vec3): { x: number; y: number } | null;
  /** Frames drawn so far. */
  frames(): number;
  /** The view store this viewer follows (tests read and set it). */
  store: ViewStore;
}

export interface RigProps {
  store: ViewStore;
  centre: Vec3;
  /** Bounding sphere radius (near and far planes). */
  radius: number;
  /** The largest drawn atom radius, the margin around every point when framing. */
  pad: number;
  positions: Float64Array;
  radii: Float32Array;
  cell?: Cell;
  slab: Slab | null;
  ball: Ball | null;
  handleRef: React.RefObject<ViewerHandle | null>;
  exposeTestHook?: boolean;
}

const KEY_HELP =
  'Structure view. Drag or arrow keys to turn, shift-drag or shift and arrows to slide, wheel or plus and minus to zoom, Enter picks the atom at the centre (shift adds it), F frames everything, Escape clears picks.';

/** The canvas takes keyboard focus and says what the keys do. */
function makeFocusable(el: HTMLCanvasElement): void {
  el.tabIndex = 0;
  el.setAttribute('role', 'application');
  el.setAttribute('aria-label', KEY_HELP);
}

/** One arrow-key turn. */
const KEY_TURN = (5 * Math.PI) / 180;
/** One shift-arrow slide, CSS pixels. */
const KEY_SLIDE = 20;

function poseOf(controls: CameraControlsImpl, camera: THREE.PerspectiveCamera | THREE.OrthographicCamera): Pose {
  return {
    position: controls.getPosition(new THREE.Vector3()),
    target: controls.getTarget(new THREE.Vector3()),
    up: camera.up.clone(),
    zoom: camera instanceof THREE.OrthographicCamera ? camera.zoom : 1,
  };
}

export function Rig({ store, centre, radius, pad, positions, radii, cell, slab, ball, handleRef, exposeTestHook }: RigProps) {
  const gl = useThree((s) => s.gl);
  const size = useThree((s) => s.size);
  const set = useThree((s) => s.set);
  const scene = useThree((s) => s.scene);
  const invalidate = useThree((s) => s.invalidate);
  const mode = store((s) => s.cameraMode);
  const snapRequest = store((s) => s.snapRequest);
  const resetRequest = store((s) => s.resetRequest);
  const [pair] = useState(() => new CameraPair());
  const camera = pair.of(mode);
  const [controls, setControls] = useState<CameraControlsImpl | null>(null);
  const controlsRef = useRef<CameraControlsImpl | null>(null);
  useEffect(() => {
    controlsRef.current = controls;
  }, [controls]);
  const frameCountRef = useRef(0);
  // Framing sees the atoms and the cell's corners.
  const corners = useMemo<Vec3[]>(() => {
    if (!cell) return [];
    const [a, b, c] = cell;
    return Array.from({ length: 8 }, (_, k) => [0, 1, 2].map((d) => (k & 1 ? a[d] : 0) + (k & 2 ? b[d] : 0) + (k & 4 ? c[d] : 0)) as Vec3);
  }, [cell]);
  // The last view, so switching projection (which gives the controls a new camera) keeps it.
  const poseRef = useRef<{ pose: Pose; mode: CameraMode } | null>(null);
  const framedRef = useRef<string>('');
  const snappedRef = useRef(0);

  // A resized view keeps what it shows at the same fraction of its height in both projections (the
  // perspective camera does so by itself; the orthographic zoom is in pixels per Å and must follow).
  useLayoutEffect(() => {
    const before = pair.height;
    pair.setSize(size.width, size.height);
    const c = controlsRef.current;
    if (c && c.camera instanceof THREE.OrthographicCamera && before > 1) void c.zoomTo(c.camera.zoom * (pair.height / before), false);
    invalidate();
  }, [pair, size, invalidate]);

  useLayoutEffect(() => {
    set({ camera });
  }, [camera, set]);

  /** Look along `back` (towards the camera) with `up`, standing just far enough back to see everything. */
  const frameAlong = (c: CameraControlsImpl, back: THREE.Vector3, up: THREE.Vector3) => {
    const f = frameView(positions, corners, {
      back: [back.x, back.y, back.z],
      up: [up.x, up.y, up.z],
      fovY: (FOV * Math.PI) / 180,
      aspect: pair.width / pair.height,
      pad,
    });
    const [tx, ty, tz] = f.target;
    // The orthographic camera's distance only sets near and far: keep it outside the structure.
    const d = camera instanceof THREE.OrthographicCamera ? Math.max(f.distance, radius * 2) : f.distance;
    camera.up.copy(up);
    c.updateCameraUp();
    void c.setLookAt(tx + back.x * d, ty + back.y * d, tz + back.z * d, tx, ty, tz, false);
    if (camera instanceof THREE.OrthographicCamera) void c.zoomTo(pair.height / (2 * f.halfHeight), false);
  };

  // Set up each controls instance (a new one comes with each camera), then frame or carry the view over.
  useLayoutEffect(() => {
    // Between a projection switch and the new controls, the old controls still hold the old camera.
    if (!controls || controls.camera !== camera) return;
    const c = controls;
    pair.setExtent(centre, radius);
    const key = `${centre.join(',')}|${radius}|${resetRequest}`;
    const last = poseRef.current;
    if (framedRef.current === key && last) {
      const p = pair.carry(last.pose, last.mode, mode);
      camera.up.copy(p.up);
      c.updateCameraUp();
      void c.setLookAt(p.position.x, p.position.y, p.position.z, p.target.x, p.target.y, p.target.z, false);
      if (camera instanceof THREE.OrthographicCamera) void c.zoomTo(p.zoom, false);
    } else {
      // A new structure, or "frame everything": keep the direction (down z at first) and fit.
      framedRef.current = key;
      const back = last ? last.pose.position.clone().sub(last.pose.target).normalize() : new THREE.Vector3(0, 0, 1);
      const up = last ? last.pose.up.clone() : new THREE.Vector3(0, 1, 0);
      frameAlong(c, back, up.addScaledVector(back, -up.dot(back)).normalize());
    }
    c.update(0);
    poseRef.current = { pose: poseOf(c, camera), mode };
    invalidate();
    // frameAlong reads positions, corners and pad; centre and radius change with them.
  }, [controls, camera, mode, pair, centre, radius, resetRequest, invalidate]); // eslint-disable-line react-hooks/exhaustive-deps

  // Snap: look down the chosen axis, upright to the cell (or to x y z), and frame what is seen from there.
  useLayoutEffect(() => {
    const axis = store.getState().axis;
    // Only a new request snaps: a new controls instance (projection switch) keeps the turned view.
    if (!controls || controls.camera !== camera || !axis || snapRequest === snappedRef.current) return;
    snappedRef.current = snapRequest;
    const d = directionVector(axis, cell);
    const candidates: Vec3[] = cell ? [cell[2], cell[1], cell[0]] : [[0, 0, 1], [0, 1, 0], [1, 0, 0]];
    const pose = viewPose([0, 0, 0], d, 1, uprightFor(d, candidates));
    frameAlong(controls, new THREE.Vector3(...d), new THREE.Vector3(...pose.up));
    controls.update(0);
    invalidate();
  }, [controls, snapRequest, store, cell, invalidate]); // eslint-disable-line react-hooks/exhaustive-deps

  // Shown atoms for picking: the same rule as the shader's uniforms.
  const visible = useMemo(() => (slab || ball ? visibleMask(positions, slab, ball) : undefined), [positions, slab, ball]);

  useEffect(() => {
    const el = gl.domElement;
    const c = controls?.camera === camera ? controls : null;
    const raycaster = new THREE.Raycaster();
    const pickAt = (clientX: number, clientY: number, extend: boolean) => {
      const rect = el.getBoundingClientRect();
      raycaster.setFromCamera(new THREE.Vector2(((clientX - rect.left) / rect.width) * 2 - 1, -((clientY - rect.top) / rect.height) * 2 + 1), camera);
      const o = raycaster.ray.origin;
      const dir = raycaster.ray.direction;
      const hit = pickAtom({ origin: [o.x, o.y, o.z], direction: [dir.x, dir.y, dir.z] }, positions, radii, visible);
      if (hit) store.getState().pick(hit.index, extend);
      else if (!extend) store.getState().clearPicks();
    };
    makeFocusable(el);
    let down: { x: number; y: number; moved: number; id: number } | null = null;
    const onDown = (e: PointerEvent) => {
      el.focus({ preventScroll: true });
      down = { x: e.clientX, y: e.clientY, moved: 0, id: e.pointerId };
      // Shift-drag slides; the controls read their button map when the drag starts, which is after us.
      if (c) c.mouseButtons.left = e.shiftKey ? CameraControlsImpl.ACTION.TRUCK : CameraControlsImpl.ACTION.ROTATE;
    };
    const onMove = (e: PointerEvent) => {
      if (!down || e.pointerId !== down.id) return;
      down.moved += Math.abs(e.clientX - down.x) + Math.abs(e.clientY - down.y);
      down.x = e.clientX;
      down.y = e.clientY;
    };
    const onUp = (e: PointerEvent) => {
      if (!down || e.pointerId !== down.id) return;
      if (down.moved < 5 && e.button === 0) pickAt(e.clientX, e.clientY, e.shiftKey || e.ctrlKey || e.metaKey);
      down = null;
    };
    const onKey = (e: KeyboardEvent) => {
      if (!c) return;
      const arrows: Record<string, [number, number]> = { ArrowLeft: [-1, 0], ArrowRight: [1, 0], ArrowUp: [0, -1], ArrowDown: [0, 1] };
      const a = arrows[e.key];
      if (a && e.shiftKey) {
        // The same as a drag of KEY_SLIDE pixels: the structure follows the arrow.
        const s = pair.worldPerPixel(poseOf(c, camera), mode) * KEY_SLIDE;
        void c.truck(-a[0] * s, -a[1] * s, false);
      } else if (a) void c.rotate(-a[0] * KEY_TURN, -a[1] * KEY_TURN, false);
      else if (e.key === '+' || e.key === '=' || e.key === '-' || e.key === '_') {
        const closer = e.key === '+' || e.key === '=';
        if (camera instanceof THREE.OrthographicCamera) void c.zoomTo(camera.zoom * (closer ? 1.15 : 1 / 1.15), false);
        else void c.dollyTo(c.distance * (closer ? 1 / 1.15 : 1.15), false);
      } else if (e.key === 'f' || e.key === 'F' || e.key === 'Home') store.getState().resetView();
      else if (e.key === 'Escape') store.getState().clearPicks();
      else if (e.key === 'Enter' || e.key === ' ') {
        const r = el.getBoundingClientRect();
        pickAt(r.left + r.width / 2, r.top + r.height / 2, e.shiftKey);
      } else return;
      e.preventDefault();
      invalidate();
    };
    el.addEventListener('pointerdown', onDown);
    el.addEventListener('pointermove', onMove);
    el.addEventListener('pointerup', onUp);
    el.addEventListener('keydown', onKey);
    return () => {
      el.removeEventListener('pointerdown', onDown);
      el.removeEventListener('pointermove', onMove);
      el.removeEventListener('pointerup', onUp);
      el.removeEventListener('keydown', onKey);
    };
  }, [gl, controls, camera, mode, pair, positions, radii, visible, store, invalidate]);

  // We draw each frame ourselves (priority 1, after the controls moved the camera at −1) so frames can be
  // counted; the axis gizmo draws over it at priority 2.
  useFrame(() => {
    pair.fitDepth(camera);
    gl.render(scene, camera);
    frameCountRef.current++;
    if (controls?.camera === camera) poseRef.current = { pose: poseOf(controls, camera), mode };
  }, 1);

  useEffect(() => {
    const toScreen = (p: Vec3) => {
      const v = new THREE.Vector3(...p).project(camera);
      const r = gl.domElement.getBoundingClientRect();
      return { x: r.left + ((v.x + 1) / 2) * r.width, y: r.top + ((1 - v.y) / 2) * r.height };
    };
    const h: ViewerHandle = {
      snapshot() {
        pair.fitDepth(camera);
        gl.render(scene, camera);
        const url = gl.domElement.toDataURL('image/png');
        // The picture has the structure only; draw the full frame (with the axis gizmo) again on screen.
        invalidate();
        return url;
      },
      renderFrames(k) {
        pair.fitDepth(camera);
        const r = renderTimed(gl, scene, camera, k);
        frameCountRef.current += k + 1;
        return r;
      },
      atomScreen(i) {
        if (!(i >= 0 && 3 * i + 2 < positions.length)) return null;
        return toScreen([positions[3 * i], positions[3 * i + 1], positions[3 * i + 2]]);
      },
      pointScreen: toScreen,
      frames: () => frameCountRef.current,
      store,
    };
    handleRef.current = h;
    const w = window as unknown as { __tauforgeViewer?: ViewerHandle };
    if (exposeTestHook) w.__tauforgeViewer = h;
    return () => {
      if (handleRef.current === h) handleRef.current = null;
      if (w.__tauforgeViewer === h) delete w.__tauforgeViewer;
    };
  }, [gl, scene, camera, pair, positions, handleRef, exposeTestHook, store, invalidate]);

  // Short smoothing: in software WebGL every extra frame costs, and a viewer should follow the hand.
  return (
    <CameraControls
      ref={setControls}
      camera={camera}
      makeDefault
      smoothTime={0.08}
      draggingSmoothTime={0.02}
      dollyToCursor
      minDistance={0.5}
      maxDistance={radius * 50}
      minZoom={1e-3}
      maxZoom={1e5}
    />
  );
}
