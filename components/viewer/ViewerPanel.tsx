'use client';
/** The controls beside the view: camera, look down an axis, slice, cluster, bonds, sizes, picture. */
import { useEffect, useState } from 'react';
import { saveAs } from 'file-saver';
import type { Structure } from '@/lib/structure/types';
import { axesOfFold, cellDirections, directionLabel, directionVector, formatIndices, icosahedralAxisLabel, type Direction, type Fold } from '@/lib/view/axes';
import { projectionRange, type Slab } from '@/lib/view/slab';
import type { Vec3 } from '@/lib/math/vec3';
import type { ViewerHandle } from './rig';
import type { ViewStore } from './store';

const button =
  'rounded-md border border-tide px-2 py-1 text-xs font-medium text-tide hover:bg-tide-pale disabled:cursor-not-allowed disabled:opacity-40';
const input = 'w-full rounded border border-rule bg-paper px-1.5 py-0.5 font-mono text-xs text-ink';

function Section({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <fieldset className="space-y-1.5 border-t border-rule pt-2 first:border-t-0 first:pt-0">
      <legend className="text-[11px] font-semibold uppercase tracking-wider text-ink-soft">{title}</legend>
      {children}
    </fieldset>
  );
}

function TripleInput({ label, value, onChange }: { label: string; value: Vec3; onChange: (v: Vec3) => void }) {
  return (
    <div className="grid grid-cols-3 gap-1" role="group" aria-label={label}>
      {value.map((x, k) => (
        <input
          key={k}
          type="number"
          step={1}
          className={input}
          aria-label={`${label} ${'uvw'[k]}`}
          value={x}
          onChange={(e) => {
            const v = [...value] as Vec3;
            v[k] = Number(e.target.value) || 0;
            onChange(v);
          }}
        />
      ))}
    </div>
  );
}

interface AxisItem {
  direction: Direction;
  /** What the button shows: the indices. */
  label: string;
  /** What it is called to a screen reader: "Look down <name>". */
  name: string;
}

const axisButton = 'rounded border px-1.5 py-0.5 font-mono text-[11px] leading-4';

function sameDirection(a: Direction | null, b: Direction): boolean {
  if (!a || a.kind !== b.kind) return false;
  if (a.kind === 'fold' && b.kind === 'fold') return a.fold === b.fold && a.index === b.index;
  if (a.kind === 'uvw' && b.kind === 'uvw') return a.uvw.every((x, k) => x === b.uvw[k]);
  return false;
}

/** One family of axes: a heading and a button per axis, labelled with its indices. */
function AxisButtons({ title, items, current, onLook }: { title: string; items: AxisItem[]; current: Direction | null; onLook: (d: Direction) => void }) {
  return (
    <div role="group" aria-label={title} className="space-y-0.5">
      <p className="text-[11px] font-medium text-ink">{title}</p>
      <div className="flex flex-wrap gap-1">
        {items.map((it) => {
          const on = sameDirection(current, it.direction);
          return (
            <button
              key={it.name}
              type="button"
              aria-pressed={on}
              aria-label={`Look down ${it.name}`}
              className={`${axisButton} ${on ? 'border-tide bg-tide text-white' : 'border-tide/50 text-tide hover:bg-tide-pale'}`}
              onClick={() => onLook(it.direction)}
            >
              {it.label}
            </button>
          );
        })}
      </div>
    </div>
  );
}

/** The axes of one fold, those along cube axes or diagonals ([1 0 0], [1 1 1]) first. */
function foldButtons(fold: Fold): AxisItem[] {
  const items = axesOfFold(fold).map((_, index) => {
    const label = icosahedralAxisLabel(fold, index);
    return { direction: { kind: 'fold', fold, index } as Direction, label, name: `${fold}-fold axis ${label}` };
  });
  return [...items.filter((i) => !i.label.includes('τ')), ...items.filter((i) => i.label.includes('τ'))];
}

type SlabKind = 'fold5' | 'fold3' | 'fold2' | 'uvw' | 'hkl';

function slabKindOf(d: Direction): SlabKind {
  return d.kind === 'fold' ? (`fold${d.fold}` as SlabKind) : d.kind;
}

async function savePicture(handle: React.RefObject<ViewerHandle | null>): Promise<void> {
  const url = handle.current?.snapshot();
  if (!url) return;
  const blob = await (await fetch(url)).blob();
  saveAs(blob, `tauforge-view-${new Date().toISOString().slice(0, 19).replace(/[:T]/g, '-')}.png`);
}

export interface ViewerPanelProps {
  structure: Structure;
  store: ViewStore;
  handle: React.RefObject<ViewerHandle | null>;
  /** The slab in Å as the viewer applies it (for the readout), or null. */
  slab?: Slab | null;
  /** A line of status under the bonds control. */
  note?: string;
}

/**
 * The 5-, 3- and 2-fold axes are those of the icosahedral setting; chains, planar tilings and
 * decagonal stacks (whose tenfold or stacking axis is z) get [uvw] directions only.
 */
function hasIcosahedralAxes(structure: Structure): boolean {
  const family = structure.model?.family;
  return family === undefined || family === 'icosahedral';
}

export function ViewerPanel({ structure, store, handle, slab, note }: ViewerPanelProps) {
  const s = store();
  const cell = structure.cell;
  const ico = hasIcosahedralAxes(structure);
  const slabIsFold = s.slab.direction.kind === 'fold';
  const setSlab = s.setSlab;
  useEffect(() => {
    if (!ico && slabIsFold) setSlab({ direction: { kind: 'uvw', uvw: [0, 0, 1] }, offset: 0 });
  }, [ico, slabIsFold, setSlab]);
  const [uvw, setUvw] = useState<Vec3>([0, 0, 1]);
  const basis = cell ? 'in cell axes' : 'Cartesian';

  const slabDir = s.slab.direction;
  const r = projectionRange(structure.positions, directionVector(slabDir, cell));
  const slabRange = { lo: Math.floor(r.min - r.mid), hi: Math.ceil(r.max - r.mid), span: Math.max(1, r.max - r.min) };
  const setSlabKind = (k: SlabKind) => {
    const d: Direction =
      k === 'uvw' ? { kind: 'uvw', uvw: [0, 0, 1] } : k === 'hkl' ? { kind: 'hkl', hkl: [0, 0, 1] } : { kind: 'fold', fold: Number(k.slice(4)) as Fold, index: 0 };
    s.setSlab({ direction: d, offset: 0 });
  };

  return (
    <aside className="flex min-h-0 flex-col gap-3 overflow-y-auto rounded-lg border border-rule bg-card p-3 text-sm" aria-label="View controls">
      <Section title="Camera">
        <div className="flex gap-3" role="radiogroup" aria-label="Projection">
          {(['perspective', 'orthographic'] as const).map((m) => (
            <label key={m} className="flex items-center gap-1 text-xs">
              <input type="radio" name="tf-camera" checked={s.cameraMode === m} onChange={() => s.setCameraMode(m)} />
              {m === 'perspective' ? 'Depth' : 'Flat (orthographic)'}
            </label>
          ))}
        </div>
        <button type="button" className={button} onClick={() => s.resetView()}>
          Frame everything
        </button>
      </Section>

      <Section title="Look down">
        {ico && (
          <>
            <p className="text-[11px] text-ink-soft">Symmetry axes, indices in the cubic setting</p>
            {([5, 3, 2] as const).map((fold) => (
              <AxisButtons
                key={fold}
                title={`${fold}-fold`}
                items={foldButtons(fold)}
                current={s.axis}
                onLook={(d) => s.snapTo(d)}
              />
            ))}
          </>
        )}
        {cell ? (
          <>
            <p className="text-[11px] text-ink-soft">Cell rows [uvw]</p>
            {(['edge', 'face', 'body'] as const).map((kind) => (
              <AxisButtons
                key={kind}
                title={kind === 'edge' ? 'edges' : kind === 'face' ? 'face diagonals' : 'body diagonals'}
                items={cellDirections()
                  .filter((d) => d.kind === kind)
                  .map((d) => ({ direction: { kind: 'uvw', uvw: d.uvw } as Direction, label: formatIndices(d.uvw), name: `cell row ${formatIndices(d.uvw)}` }))}
                current={s.axis}
                onLook={(d) => s.snapTo(d)}
              />
            ))}
          </>
        ) : !ico ? (
          <AxisButtons
            title="Cartesian"
            items={[
              { direction: { kind: 'uvw', uvw: [0, 0, 1] }, label: 'z · tenfold', name: 'z, the stacking or tenfold axis' },
              { direction: { kind: 'uvw', uvw: [1, 0, 0] }, label: 'x', name: 'x' },
              { direction: { kind: 'uvw', uvw: [0, 1, 0] }, label: 'y', name: 'y' },
            ]}
            current={s.axis}
            onLook={(d) => s.snapTo(d)}
          />
        ) : null}
        <div className="grid grid-cols-[1fr_auto] items-center gap-1">
          <TripleInput label={`Direction [uvw] ${basis}`} value={uvw} onChange={setUvw} />
          <button type="button" className={button} disabled={uvw.every((x) => x === 0)} onClick={() => s.snapTo({ kind: 'uvw', uvw })}>
            Look
          </button>
        </div>
        <p className="text-[11px] text-ink-soft">
          [uvw] {basis}. Now: <span data-testid="view-axis">{s.axis ? directionLabel(s.axis) : 'free'}</span>
        </p>
      </Section>

      <Section title="Slice">
        <label className="flex items-center gap-1.5 text-xs">
          <input type="checkbox" checked={s.slab.on} onChange={(e) => s.setSlab({ on: e.target.checked })} />
          Show one slab only
        </label>
        <div className="grid grid-cols-2 gap-1">
          <select className={input} aria-label="Slab normal" value={slabKindOf(slabDir)} onChange={(e) => setSlabKind(e.target.value as SlabKind)}>
            {ico ? (
              <>
                <option value="fold5">5-fold axis</option>
                <option value="fold3">3-fold axis</option>
                <option value="fold2">2-fold axis</option>
              </>
            ) : null}
            <option value="uvw">[uvw]</option>
            <option value="hkl">(hkl) plane</option>
          </select>
          {slabDir.kind === 'fold' ? (
            <select className={input} aria-label="Which axis" value={slabDir.index} onChange={(e) => s.setSlab({ direction: { ...slabDir, index: Number(e.target.value) } })}>
              {axesOfFold(slabDir.fold).map((_, i) => (
                <option key={i} value={i}>
                  {icosahedralAxisLabel(slabDir.fold, i)}
                </option>
              ))}
            </select>
          ) : (
            <span />
          )}
        </div>
        {slabDir.kind === 'uvw' && (
          <TripleInput label="Slab normal [uvw]" value={slabDir.uvw} onChange={(v) => v.some((x) => x !== 0) && s.setSlab({ direction: { kind: 'uvw', uvw: v } })} />
        )}
        {slabDir.kind === 'hkl' && (
          <TripleInput label="Slab plane (hkl)" value={slabDir.hkl} onChange={(v) => v.some((x) => x !== 0) && s.setSlab({ direction: { kind: 'hkl', hkl: v } })} />
        )}
        <label className="block text-xs">
          Position {s.slab.offset.toFixed(1)} Å
          <input type="range" className="w-full accent-tide" min={slabRange.lo} max={slabRange.hi} step={0.1} value={s.slab.offset} onChange={(e) => s.setSlab({ offset: Number(e.target.value) })} />
        </label>
        <label className="block text-xs">
          Thickness {s.slab.thickness.toFixed(1)} Å
          <input type="range" className="w-full accent-tide" min={0.2} max={Math.ceil(slabRange.span)} step={0.1} value={s.slab.thickness} onChange={(e) => s.setSlab({ thickness: Number(e.target.value) })} />
        </label>
        <div className="flex gap-1">
          <button type="button" className={button} onClick={() => s.axis && s.setSlab({ direction: s.axis, on: true })} disabled={!s.axis}>
            Slice across the view axis
          </button>
          <button type="button" className={button} onClick={() => s.snapTo(slabDir)}>
            Look along normal
          </button>
        </div>
        {slab && <p className="text-[11px] text-ink-soft">keeps {slab.lo.toFixed(2)} ≤ n·r ≤ {slab.hi.toFixed(2)} Å</p>}
      </Section>

      <Section title="Cluster alone">
        <label className="flex items-center gap-1.5 text-xs">
          <input type="checkbox" checked={s.cluster.on} onChange={(e) => s.setCluster({ on: e.target.checked })} />
          Only atoms near the last pick
        </label>
        <label className="block text-xs">
          Radius {s.cluster.radius.toFixed(1)} Å
          <input type="range" className="w-full accent-tide" min={0.5} max={30} step={0.1} value={s.cluster.radius} onChange={(e) => s.setCluster({ radius: Number(e.target.value) })} />
        </label>
        <button type="button" className={button} disabled={s.picks.length === 0} onClick={() => s.setCluster({ on: true, centre: s.picks[s.picks.length - 1] ?? null })}>
          Fix the centre on the last pick
        </button>
        {s.cluster.centre !== null && <p className="text-[11px] text-ink-soft">centre: atom #{s.cluster.centre}</p>}
      </Section>

      <Section title="Atoms and bonds">
        <label className="block text-xs">
          Atom size ×{s.radiusScale.toFixed(2)} of covalent radius
          <input type="range" className="w-full accent-tide" min={0.1} max={1.2} step={0.01} value={s.radiusScale} onChange={(e) => s.setRadiusScale(Number(e.target.value))} />
        </label>
        <label className="flex items-center gap-1.5 text-xs">
          <input type="checkbox" checked={s.bonds.on} onChange={(e) => s.setBonds({ on: e.target.checked })} />
          Bonds up to
          <input type="number" className="w-16 rounded border border-rule bg-paper px-1.5 py-0.5 font-mono text-xs text-ink" min={0.5} max={6} step={0.1} aria-label="Bond cut-off in ångström" value={s.bonds.cutoff} onChange={(e) => s.setBonds({ cutoff: Math.max(0.5, Math.min(6, Number(e.target.value) || 0.5)) })} />
          Å
        </label>
        {note && <p className="text-[11px] text-ink-soft">{note}</p>}
        <label className="flex items-center gap-1.5 text-xs">
          <input type="checkbox" checked={s.showCell} disabled={!cell} onChange={(e) => s.setShowCell(e.target.checked)} />
          Cell edges{cell ? '' : ' (no cell)'}
        </label>
      </Section>

      <Section title="Picture">
        <button type="button" className={button} onClick={() => void savePicture(handle)}>
          Save picture (PNG)
        </button>
      </Section>
    </aside>
  );
}
