'use client';
/**
 * Pointer and keyboard control, picking, the frame driver and the viewer handle. Our own small controls
 * (./viewCamera) rather than a library's; every change asks for one frame (render on demand).
 */
import { useFrame, useThree } from '@react-three/fiber';
import { useEffect, useLayoutEffect, useMemo, useRef, useState } from 'react';
import type { Cell } from '@/lib/structure/types';
import { directionVector } from '@/lib/view/axes';
import { pickAtom } from '@/lib/view/pick';
import type { Ball, Slab } from '@/lib/view/slab';
import { visibleMask } from '@/lib/view/slab';
import type { Vec3 } from '@/lib/math/vec3';
import type { ViewStore } from './store';
import { ROTATE_PER_PIXEL, ViewCamera } from './viewCamera';
import { renderTimed } from './timing';

export interface ViewerHandle {
  /** Render now and return the picture as a PNG data URL. */
  snapshot(): string;
  /** Render k frames back to back, each forced to finish by a 1-pixel read-back; ms per frame. */
  renderFrames(k: number): { msPerFrame: number; triangles: number; calls: number };
  /** Where atom i's centre is on screen, in CSS pixels of the page. */
  atomScreen(i: number): { x: number; y: number } | null;
  /** Frames drawn so far. */
  frames(): number;
  /** The view store this viewer follows (tests read and set it). */
  store: ViewStore;
}

export interface RigProps {
  store: ViewStore;
  centre: Vec3;
  radius: number;
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

export function Rig({ store, centre, radius, positions, radii, cell, slab, ball, handleRef, exposeTestHook }: RigProps) {
  const gl = useThree((s) => s.gl);
  const size = useThree((s) => s.size);
  const set = useThree((s) => s.set);
  const scene = useThree((s) => s.scene);
  const invalidate = useThree((s) => s.invalidate);
  const mode = store((s) => s.cameraMode);
  const snapRequest = store((s) => s.snapRequest);
  const resetRequest = store((s) => s.resetRequest);
  const [view] = useState(() => new ViewCamera());
  const frameCountRef = useRef(0);

  useLayoutEffect(() => {
    view.setSize(size.width, size.height);
    view.update();
    invalidate();
  }, [view, size, invalidate]);

  useLayoutEffect(() => {
    view.setExtent(centre, radius);
    view.frameAll();
    invalidate();
  }, [view, centre, radius, resetRequest, invalidate]);

  useLayoutEffect(() => {
    view.setMode(mode);
    set({ camera: view.camera });
    invalidate();
  }, [view, mode, set, invalidate]);

  useLayoutEffect(() => {
    const axis = store.getState().axis;
    if (!axis || snapRequest === 0) return;
    view.lookDown(directionVector(axis, cell));
    invalidate();
  }, [view, snapRequest, store, cell, invalidate]);

  // Shown atoms for picking: the same rule as the shader's uniforms.
  const visible = useMemo(() => (slab || ball ? visibleMask(positions, slab, ball) : undefined), [positions, slab, ball]);

  useEffect(() => {
    const el = gl.domElement;
    const pickAt = (clientX: number, clientY: number, extend: boolean) => {
      const rect = el.getBoundingClientRect();
      const ray = view.ray(((clientX - rect.left) / rect.width) * 2 - 1, -((clientY - rect.top) / rect.height) * 2 + 1);
      const hit = pickAtom(ray, positions, radii, visible);
      if (hit) store.getState().pick(hit.index, extend);
      else if (!extend) store.getState().clearPicks();
    };
    const act = (f: () => void) => {
      f();
      invalidate();
    };
    makeFocusable(el);
    let down: { x: number; y: number; moved: number; panning: boolean; id: number } | null = null;
    const onDown = (e: PointerEvent) => {
      el.focus({ preventScroll: true });
      el.setPointerCapture?.(e.pointerId);
      down = { x: e.clientX, y: e.clientY, moved: 0, panning: e.button === 2 || e.shiftKey, id: e.pointerId };
    };
    const onMove = (e: PointerEvent) => {
      if (!down || e.pointerId !== down.id) return;
      const dx = e.clientX - down.x;
      const dy = e.clientY - down.y;
      down.moved += Math.abs(dx) + Math.abs(dy);
      down.x = e.clientX;
      down.y = e.clientY;
      const d = down;
      act(() => (d.panning ? view.pan(dx, dy) : view.rotate(dx, dy)));
    };
    const onUp = (e: PointerEvent) => {
      if (!down || e.pointerId !== down.id) return;
      if (down.moved < 5 && e.button === 0) pickAt(e.clientX, e.clientY, e.shiftKey || e.ctrlKey || e.metaKey);
      down = null;
    };
    const onWheel = (e: WheelEvent) => {
      e.preventDefault();
      act(() => view.zoom(Math.exp(Math.max(-1, Math.min(1, e.deltaY * 0.002)))));
    };
    const onKey = (e: KeyboardEvent) => {
      const step = (5 * Math.PI) / 180 / ROTATE_PER_PIXEL;
      const arrows: Record<string, [number, number]> = { ArrowLeft: [-1, 0], ArrowRight: [1, 0], ArrowUp: [0, -1], ArrowDown: [0, 1] };
      const a = arrows[e.key];
      if (a) act(() => (e.shiftKey ? view.pan(a[0] * 20, a[1] * 20) : view.rotate(a[0] * step, a[1] * step)));
      else if (e.key === '+' || e.key === '=') act(() => view.zoom(1 / 1.15));
      else if (e.key === '-' || e.key === '_') act(() => view.zoom(1.15));
      else if (e.key === 'f' || e.key === 'F' || e.key === 'Home') act(() => view.frameAll());
      else if (e.key === 'Escape') store.getState().clearPicks();
      else if (e.key === 'Enter' || e.key === ' ') {
        const r = el.getBoundingClientRect();
        pickAt(r.left + r.width / 2, r.top + r.height / 2, e.shiftKey);
      } else return;
      e.preventDefault();
    };
    const onContext = (e: Event) => e.preventDefault();
    el.addEventListener('pointerdown', onDown);
    el.addEventListener('pointermove', onMove);
    el.addEventListener('pointerup', onUp);
    el.addEventListener('wheel', onWheel, { passive: false });
    el.addEventListener('keydown', onKey);
    el.addEventListener('contextmenu', onContext);
    return () => {
      el.removeEventListener('pointerdown', onDown);
      el.removeEventListener('pointermove', onMove);
      el.removeEventListener('pointerup', onUp);
      el.removeEventListener('wheel', onWheel);
      el.removeEventListener('keydown', onKey);
      el.removeEventListener('contextmenu', onContext);
    };
  }, [gl, view, positions, radii, visible, store, invalidate]);

  // We draw each frame ourselves (priority 1) so frames can be counted.
  useFrame(() => {
    gl.render(scene, view.camera);
    frameCountRef.current++;
  }, 1);

  useEffect(() => {
    const h: ViewerHandle = {
      snapshot() {
        gl.render(scene, view.camera);
        return gl.domElement.toDataURL('image/png');
      },
      renderFrames(k) {
        const r = renderTimed(gl, scene, view.camera, k);
        frameCountRef.current += k + 1;
        return r;
      },
      atomScreen(i) {
        if (!(i >= 0 && 3 * i + 2 < positions.length)) return null;
        const p = view.project([positions[3 * i], positions[3 * i + 1], positions[3 * i + 2]]);
        const r = gl.domElement.getBoundingClientRect();
        return { x: r.left + ((p[0] + 1) / 2) * r.width, y: r.top + ((1 - p[1]) / 2) * r.height };
      },
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
  }, [gl, scene, view, positions, handleRef, exposeTestHook, store]);

  return null;
}
