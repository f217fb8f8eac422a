/**
 * View state shared by the viewer and whatever panels sit beside it (the workspace mounts both).
 * Only what a person chose lives here — camera mode, axis, slab, cluster, picks, bonds, radii, how the
 * measurement reads a periodic cell, how much of the window the viewer takes — never
 * three.js objects, so any component can read and set it without touching the scene.
 */
import { create, type StoreApi, type UseBoundStore } from 'zustand';
import type { Direction } from '@/lib/view/axes';
import { DEFAULT_RADIUS_SCALE } from '@/lib/view/palette';

export type CameraMode = 'perspective' | 'orthographic';

export type { Direction };

export interface SlabState {
  on: boolean;
  /** The slab normal. */
  direction: Direction;
  /** Centre of the slab along the normal, in Å from the structure's centroid. */
  offset: number;
  /** Thickness in Å. */
  thickness: number;
}

export interface ClusterState {
  on: boolean;
  /** Atom index at the centre, or null (then the structure's centroid). */
  centre: number | null;
  /** Radius in Å. */
  radius: number;
}

export interface BondState {
  on: boolean;
  /** Cut-off in Å. */
  cutoff: number;
}

export interface ViewState {
  cameraMode: CameraMode;
  /** The axis the view was last snapped to, null after free rotation from the start. */
  axis: Direction | null;
  /** Bumped on every snap request, so snapping to the same axis twice still snaps. */
  snapRequest: number;
  /** Bumped to ask the viewer to frame the whole structure again. */
  resetRequest: number;
  slab: SlabState;
  cluster: ClusterState;
  /** Picked atom indices, oldest first, at most MAX_PICKS. */
  picks: number[];
  bonds: BondState;
  radiusScale: number;
  showCell: boolean;
  /** In a periodic cell, measure to the nearest image of each next pick (the minimum image). */
  nearestImage: boolean;
  /** The viewer covers the whole browser window (Esc leaves). */
  fullWindow: boolean;
  /** The control panel beside the view is open. */
  controlsOpen: boolean;

  setCameraMode(mode: CameraMode): void;
  snapTo(direction: Direction): void;
  resetView(): void;
  setSlab(patch: Partial<SlabState>): void;
  setCluster(patch: Partial<ClusterState>): void;
  /** Pick atom i; with `extend` it is added to the picks (for distances and angles), else it replaces them. */
  pick(i: number, extend?: boolean): void;
  clearPicks(): void;
  setBonds(patch: Partial<BondState>): void;
  setRadiusScale(s: number): void;
  setShowCell(on: boolean): void;
  setNearestImage(on: boolean): void;
  setFullWindow(on: boolean): void;
  setControlsOpen(on: boolean): void;
}

/** Three picks give a distance pair and an angle. */
export const MAX_PICKS = 3;

export const initialViewState = {
  cameraMode: 'perspective' as CameraMode,
  axis: null,
  snapRequest: 0,
  resetRequest: 0,
  slab: { on: false, direction: { kind: 'fold', fold: 5, index: 0 } as Direction, offset: 0, thickness: 4 },
  cluster: { on: false, centre: null, radius: 6 },
  picks: [] as number[],
  bonds: { on: false, cutoff: 3 },
  radiusScale: DEFAULT_RADIUS_SCALE,
  showCell: true,
  nearestImage: true,
  fullWindow: false,
  controlsOpen: true,
} satisfies Partial<ViewState>;

export type ViewStore = UseBoundStore<StoreApi<ViewState>>;

/** A fresh store, for a page that shows more than one viewer. */
export function createViewStore(): ViewStore {
  return create<ViewState>()((set) => ({
    ...initialViewState,
    setCameraMode: (cameraMode) => set({ cameraMode }),
    snapTo: (direction) => set((s) => ({ axis: direction, snapRequest: s.snapRequest + 1 })),
    resetView: () => set((s) => ({ axis: null, resetRequest: s.resetRequest + 1 })),
    setSlab: (patch) => set((s) => ({ slab: { ...s.slab, ...patch } })),
    setCluster: (patch) => set((s) => ({ cluster: { ...s.cluster, ...patch } })),
    pick: (i, extend = false) =>
      set((s) => ({ picks: extend ? [...s.picks.filter((p) => p !== i), i].slice(-MAX_PICKS) : [i] })),
    clearPicks: () => set({ picks: [] }),
    setBonds: (patch) => set((s) => ({ bonds: { ...s.bonds, ...patch } })),
    setRadiusScale: (radiusScale) => set({ radiusScale: Math.max(0.05, Math.min(2, radiusScale)) }),
    setShowCell: (showCell) => set({ showCell }),
    setNearestImage: (nearestImage) => set({ nearestImage }),
    setFullWindow: (fullWindow) => set({ fullWindow }),
    setControlsOpen: (controlsOpen) => set({ controlsOpen }),
  }));
}

/** The store the workspace shares by default. */
export const useViewStore: ViewStore = createViewStore();
