'use client';
/**
 * <StructureViewer>: a Structure in 3D. Atoms are sphere impostors (one quad per atom, one draw call per
 * species), the canvas renders only when something changes, and the view state lives in a zustand store
 * (./store) that panels beside the viewer can share. Mount it through ./LazyStructureViewer (no SSR).
 */
import { Canvas } from '@react-three/fiber';
import { useCallback, useEffect, useImperativeHandle, useMemo, useRef, useState } from 'react';
import * as THREE from 'three';
import type { Structure } from '@/lib/structure/types';
import { directionVector } from '@/lib/view/axes';
import { projectionRange, slabAround, type Ball, type Slab } from '@/lib/view/slab';
import type { Vec3 } from '@/lib/math/vec3';
import { applyClip, createClipUniforms } from './impostorMaterial';
import { measurePicks } from '@/lib/view/measure';
import { PeriodicCell } from '@/lib/view/minimum-image';
import { Bonds, CellEdges, ImpostorAtoms, NaiveAtoms, PickMarks } from './layers';
import { MeasureMarks } from './MeasureMarks';
import { AxisGizmo } from './AxisGizmo';
import { Rig, type ViewerHandle } from './rig';
import { atomRadii, sceneData } from './sceneData';
import { useViewStore, type ViewStore } from './store';
import { ViewerPanel } from './ViewerPanel';
import { AtomReadout } from './AtomReadout';

export type { ViewerHandle };

export interface StructureViewerProps {
  structure: Structure;
  /** View state; defaults to the shared useViewStore. */
  store?: ViewStore;
  /**
   * 'impostor' (default: sphere impostors with the quads written out, one ordinary draw per species),
   * 'instanced' (the same impostors from one shared quad through InstancedBufferGeometry — several times
   * slower in software WebGL, see tests/bench/viewer.bench.ts) or 'naive' (triangulated spheres, for the
   * benchmark only).
   */
  drawMode?: 'impostor' | 'instanced' | 'naive';
  /** Show the control panel beside the view (default true). */
  showPanel?: boolean;
  /** Show the picked-atom readout under the view (default true). */
  showReadout?: boolean;
  /** Offer the full-window button (default true). */
  allowFullWindow?: boolean;
  /** Classes for the outer box; give it a height (default h-[640px]). */
  className?: string;
  /** Also put the handle on window.__tauforgeViewer (lab pages, benchmark, browser tests). */
  exposeTestHook?: boolean;
  /** Snapshot and frame-timing handle. */
  ref?: React.Ref<ViewerHandle | null>;
}

/** Slab and ball in Å from the view state, or null when off. */
export function useClipShapes(structure: Structure, store: ViewStore): { slab: Slab | null; ball: Ball | null } {
  const slabState = store((s) => s.slab);
  const cluster = store((s) => s.cluster);
  const picks = store((s) => s.picks);
  const slab = useMemo(() => {
    if (!slabState.on) return null;
    const n = directionVector(slabState.direction, structure.cell);
    const range = projectionRange(structure.positions, n);
    return slabAround(n, range.mid + slabState.offset, slabState.thickness);
  }, [slabState, structure]);
  const centreAtom = cluster.centre ?? (picks.length ? picks[picks.length - 1] : null);
  const ball = useMemo(() => {
    if (!cluster.on) return null;
    const p = structure.positions;
    let c: Vec3;
    if (centreAtom !== null && 3 * centreAtom + 2 < p.length) c = [p[3 * centreAtom], p[3 * centreAtom + 1], p[3 * centreAtom + 2]];
    else {
      const n = p.length / 3;
      c = [0, 0, 0];
      for (let i = 0; i < n; i++) for (let d = 0; d < 3; d++) c[d] += p[3 * i + d] / Math.max(1, n);
    }
    return { centre: c, radius: cluster.radius };
  }, [cluster.on, cluster.radius, centreAtom, structure]);
  return { slab, ball };
}

export function StructureViewer({
  structure,
  store = useViewStore,
  drawMode = 'impostor',
  showPanel = true,
  showReadout = true,
  allowFullWindow = true,
  className = 'h-[640px]',
  exposeTestHook = false,
  ref,
}: StructureViewerProps) {
  const radiusScale = store((s) => s.radiusScale);
  const picks = store((s) => s.picks);
  const bonds = store((s) => s.bonds);
  const showCell = store((s) => s.showCell);
  const nearestImage = store((s) => s.nearestImage);
  const fullWindow = store((s) => s.fullWindow) && allowFullWindow;
  const controlsOpen = store((s) => s.controlsOpen);
  const handleRef = useRef<ViewerHandle | null>(null);
  useImperativeHandle(ref, () => ({
    snapshot: () => handleRef.current?.snapshot() ?? '',
    renderFrames: (k) => handleRef.current?.renderFrames(k) ?? { msPerFrame: NaN, triangles: 0, calls: 0 },
    atomScreen: (i) => handleRef.current?.atomScreen(i) ?? null,
    pointScreen: (p) => handleRef.current?.pointScreen(p) ?? null,
    frames: () => handleRef.current?.frames() ?? 0,
    store,
  }));

  // Extent and batches do not depend on the radius scale except for the margin: compute at scale 1.
  const data = useMemo(() => sceneData(structure, 1), [structure]);
  const radii = useMemo(() => atomRadii(structure.species, radiusScale), [structure, radiusScale]);
  const [clip] = useState(createClipUniforms);
  const { slab, ball } = useClipShapes(structure, store);
  const [invalidate, setInvalidate] = useState<(() => void) | null>(null);
  const [bondCount, setBondCount] = useState<{ n: number; truncated: boolean } | null>(null);
  const onBondCount = useCallback((n: number, truncated: boolean) => setBondCount({ n, truncated }), []);
  const lattice = useMemo(() => (structure.cell ? new PeriodicCell(structure.cell) : null), [structure]);
  const measurement = useMemo(
    () => measurePicks(structure.positions, picks.filter((i) => i < structure.species.length), nearestImage ? lattice : null),
    [structure, picks, nearestImage, lattice],
  );

  // Full window: Esc leaves (before the canvas's own Esc, which clears picks), the page behind stops
  // scrolling, and leaving the viewer (another tab, another cut) never strands the page in it.
  const setFullWindow = store((s) => s.setFullWindow);
  useEffect(() => {
    if (!fullWindow) return;
    const onKey = (e: KeyboardEvent) => {
      if (e.key !== 'Escape') return;
      e.stopPropagation();
      e.preventDefault();
      setFullWindow(false);
    };
    window.addEventListener('keydown', onKey, true);
    const html = document.documentElement;
    const overflow = html.style.overflow;
    html.style.overflow = 'hidden';
    return () => {
      window.removeEventListener('keydown', onKey, true);
      html.style.overflow = overflow;
    };
  }, [fullWindow, setFullWindow]);
  useEffect(() => () => setFullWindow(false), [setFullWindow]);

  // Atom indices refer to this structure only: forget picks when it changes.
  useEffect(() => {
    store.getState().clearPicks();
    store.getState().setCluster({ centre: null });
  }, [structure, store]);

  useEffect(() => {
    applyClip(clip, slab, ball);
    invalidate?.();
  }, [clip, slab, ball, invalidate]);

  useEffect(() => {
    invalidate?.();
  }, [invalidate, radiusScale, picks, bonds, showCell, drawMode, measurement]);

  const panelShown = showPanel && controlsOpen;
  return (
    <div
      className={`grid min-h-0 gap-3 ${panelShown ? 'grid-cols-[minmax(0,1fr)_17rem]' : 'grid-cols-1'} ${fullWindow ? 'fixed inset-0 z-50 bg-paper p-3' : className}`}
      data-testid="structure-viewer"
      data-full-window={fullWindow ? 'true' : undefined}
    >
      <div className="flex min-h-0 flex-col gap-2">
        <div className="relative isolate min-h-0 flex-1 overflow-hidden rounded-lg border border-rule bg-card" data-testid="viewer-canvas">
          <Canvas
            frameloop="demand"
            dpr={1}
            gl={{ antialias: false, preserveDrawingBuffer: false, alpha: false }}
            onCreated={(state) => {
              state.gl.setClearColor(new THREE.Color('#fffdf8'), 1);
              setInvalidate(() => state.invalidate);
            }}
          >
            <Rig
              store={store}
              centre={data.centre}
              radius={data.radius * Math.max(1, radiusScale)}
              pad={data.largestAtom * radiusScale}
              positions={structure.positions}
              radii={radii}
              cell={structure.cell}
              slab={slab}
              ball={ball}
              handleRef={handleRef}
              exposeTestHook={exposeTestHook}
            />
            {drawMode === 'naive' ? (
              <NaiveAtoms batches={data.batches} radiusScale={radiusScale} />
            ) : (
              <ImpostorAtoms batches={data.batches} clip={clip} radiusScale={radiusScale} instanced={drawMode === 'instanced'} />
            )}
            <PickMarks positions={structure.positions} picks={picks} radii={radii} clip={clip} />
            <MeasureMarks measurement={measurement} radii={radii} clip={clip} />
            {bonds.on && (
              <Bonds positions={structure.positions} cutoff={bonds.cutoff} clip={clip} onCount={onBondCount} />
            )}
            {structure.cell && showCell && <CellEdges cell={structure.cell} />}
            <AxisGizmo />
          </Canvas>
          <ViewToolbar store={store} showPanel={showPanel} allowFullWindow={allowFullWindow} />
        </div>
        {showReadout && <AtomReadout structure={structure} store={store} measurement={measurement} />}
      </div>
      {panelShown && (
        <ViewerPanel
          structure={structure}
          store={store}
          handle={handleRef}
          slab={slab}
          note={bonds.on && bondCount ? `${bondCount.n.toLocaleString('en')} bonds${bondCount.truncated ? ' (limit reached)' : ''}` : undefined}
        />
      )}
    </div>
  );
}

const toolButton = 'rounded-md border border-rule bg-card/90 px-2 py-0.5 text-xs font-medium text-ink shadow-sm hover:border-tide hover:text-tide';

/** Over the view's top-right corner: show or hide the controls beside it, and full window on or off. */
function ViewToolbar({ store, showPanel, allowFullWindow }: { store: ViewStore; showPanel: boolean; allowFullWindow: boolean }) {
  const fullWindow = store((s) => s.fullWindow);
  const controlsOpen = store((s) => s.controlsOpen);
  const setFullWindow = store((s) => s.setFullWindow);
  const setControlsOpen = store((s) => s.setControlsOpen);
  return (
    <div className="absolute right-2 top-2 z-40 flex gap-1.5">
      {showPanel && (
        <button type="button" className={toolButton} aria-expanded={controlsOpen} onClick={() => setControlsOpen(!controlsOpen)}>
          {controlsOpen ? 'Hide view controls' : 'View controls'}
        </button>
      )}
      {allowFullWindow && (
        <button
          type="button"
          className={toolButton}
          aria-pressed={fullWindow}
          title={fullWindow ? 'Back to the page (Esc)' : 'Let the view fill the browser window'}
          onClick={() => setFullWindow(!fullWindow)}
        >
          {fullWindow ? 'Leave full window (Esc)' : 'Full window'}
        </button>
      )}
    </div>
  );
}

export default StructureViewer;
