'use client';
/**
 * A chain or planar tiling drawn as its tiles, coloured by tile type, with the tiles by shape and the table of
 * vertex environments. A periodic cut (approximant) is drawn as its cell, tiles continued across the cell
 * edges, with the neighbouring cells faded around it; the tables count the cell over periodic boundaries.
 */
import { useId, useMemo, useRef, useState } from 'react';
import type { Structure } from '@/lib/structure/types';
import type { Vec2 } from '@/lib/view/lattice2';
import { vertexConfigurations } from './vertex-configs';
import { tileShapes } from './tile-shapes';
import { CONTEXT, MAIN, layoutTiles } from './tile-layout';
import { csv, saveSvgPng, saveText } from '@/components/workspace/downloads';

const TILE_COLOURS = ['#0e6f6a', '#b8862b', '#6a8fb3', '#b4472f'];
const TILE_FILLS = ['#d5ebe8', '#f3e6c8', '#dfe8f1', '#f6dcd4'];
/** Tile images drawn at most; beyond this an SVG gets slow to pan and to save. */
const MAX_IMAGES = 20000;

const pointsOf = (poly: Vec2[]) => poly.map(([x, y]) => `${x},${-y}`).join(' ');

export function TilingView({ structure, fileBase }: { structure: Structure; fileBase: string }) {
  const svgRef = useRef<SVGSVGElement>(null);
  const clipId = useId().replace(/:/g, '');
  const [repeat, setRepeat] = useState(1);
  const t = structure.tiles;
  const cfg = useMemo(() => vertexConfigurations(structure), [structure]);
  const shapes = useMemo(() => tileShapes(structure), [structure]);
  const layout = useMemo(() => layoutTiles(structure, repeat, MAX_IMAGES), [structure, repeat]);
  if (!t || !layout) return <p className="p-4 text-sm text-ink-soft">This cut has no tiles to draw (3D models are shown in the 3D view).</p>;
  const periodic = layout.periodicity !== 'none';
  const chain = layout.cornersPerTile === 2;
  const { box } = layout;
  const w = Math.max(box.x1 - box.x0, 1e-6);
  const h = chain ? w / 12 : Math.max(box.y1 - box.y0, 1e-6);
  const pad = 0.02 * Math.max(w, h);
  const viewBox = chain ? `${box.x0 - pad} ${-h - pad} ${w + 2 * pad} ${h + 2 * pad}` : `${box.x0 - pad} ${-box.y1 - pad} ${w + 2 * pad} ${h + 2 * pad}`;
  const tiles = t.kind.length;
  const k = layout.cornersPerTile;
  const P = layout.polygons;

  const drawn = (bits: number) => {
    const out = [];
    for (let i = 0; i < layout.count; i++) {
      if (!(layout.layer[i] & bits)) continue;
      const kind = layout.kind[i];
      if (chain) {
        const a = P[4 * i];
        const b = P[4 * i + 2];
        const lo = Math.min(a, b);
        const len = Math.abs(b - a);
        const hh = kind === 0 ? h * 0.8 : h * 0.45;
        out.push(<rect key={i} x={lo + len * 0.04} y={-h / 2 - hh / 2} width={len * 0.92} height={hh} fill={TILE_COLOURS[kind % 4]} rx={len * 0.05} />);
        continue;
      }
      const pts: string[] = [];
      for (let c = 0; c < k; c++) pts.push(`${P[2 * k * i + 2 * c]},${-P[2 * k * i + 2 * c + 1]}`);
      out.push(<polygon key={i} points={pts.join(' ')} fill={TILE_FILLS[kind % 4]} stroke={TILE_COLOURS[kind % 4]} strokeWidth={0.75} vectorEffect="non-scaling-stroke" />);
    }
    return out;
  };

  return (
    <div className="grid h-full min-h-0 gap-3 lg:grid-cols-[1fr_280px]">
      <div className="flex min-h-0 flex-col gap-2">
        <div className="flex flex-wrap items-center gap-3 text-xs text-ink-soft">
          {periodic ? (
            <label className="inline-flex items-center gap-1">
              Show
              <select className="rounded border border-rule bg-card px-1 py-0.5" value={repeat} onChange={(e) => setRepeat(Number(e.target.value))}>
                <option value={1}>{chain ? 'one period' : 'one cell'}</option>
                <option value={2}>{chain ? '2 periods' : '2 × 2 cells'}</option>
                <option value={3}>{chain ? '3 periods' : '3 × 3 cells'}</option>
              </select>
            </label>
          ) : null}
          {periodic ? <span>{chain ? 'Faded: the neighbouring periods.' : 'Dashed: the cell. Faded: the neighbouring cells.'}</span> : null}
          {layout.truncated ? <span className="text-clay">drawing the first {MAX_IMAGES.toLocaleString('en-US')} tiles only</span> : null}
          <button type="button" className="ml-auto rounded border border-rule px-2 py-0.5 hover:border-tide" onClick={() => svgRef.current && void saveSvgPng(svgRef.current, `${fileBase}-tiling.png`)}>
            Save PNG
          </button>
        </div>
        <svg ref={svgRef} role="img" aria-label={`${chain ? 'Chain' : 'Tiling'} of ${tiles} tiles${periodic ? ' in the cell' : ''}`} className="min-h-0 w-full flex-1 rounded-md border border-rule bg-card" viewBox={viewBox} preserveAspectRatio="xMidYMid meet">
          {layout.mainClip && layout.contextClip ? (
            <defs>
              <clipPath id={`${clipId}-main`}>
                <polygon points={pointsOf(layout.mainClip)} />
              </clipPath>
              <clipPath id={`${clipId}-context`}>
                <polygon points={pointsOf(layout.contextClip)} />
              </clipPath>
            </defs>
          ) : null}
          {periodic ? (
            <g opacity={0.3} clipPath={layout.contextClip ? `url(#${clipId}-context)` : undefined} data-layer="context">
              {drawn(CONTEXT)}
            </g>
          ) : null}
          <g clipPath={layout.mainClip ? `url(#${clipId}-main)` : undefined} data-layer="main">
            {drawn(MAIN)}
          </g>
          {layout.cells.map((c, i) => (
            <polygon key={i} points={pointsOf(c)} fill="none" stroke="#16202e" strokeWidth={1.25} strokeDasharray="6 4" vectorEffect="non-scaling-stroke" />
          ))}
          {layout.chainBounds.map((x) => (
            <line key={x} x1={x} x2={x} y1={-h * 0.98} y2={-h * 0.02} stroke="#16202e" strokeWidth={1.25} strokeDasharray="6 4" vectorEffect="non-scaling-stroke" />
          ))}
        </svg>
      </div>
      <div className="flex min-h-0 flex-col gap-3 overflow-y-auto">
        <section aria-labelledby="ts-title" className="rounded-md border border-rule bg-card p-2">
          <h3 id="ts-title" className="text-sm font-semibold">
            Tiles{periodic ? ' in the cell' : ''}
          </h3>
          <table className="mt-1 w-full text-xs" data-testid="tile-shapes">
            <thead>
              <tr className="text-left text-ink-soft">
                <th className="py-0.5 font-medium">Tile</th>
                <th className="py-0.5 font-medium">{chain ? 'Length' : 'Corner angles'}</th>
                <th className="py-0.5 text-right font-medium">Count</th>
              </tr>
            </thead>
            <tbody>
              {shapes.map((s) => (
                <tr key={`${s.kind}|${s.shape}`} className="border-t border-rule">
                  <td className="py-0.5 pr-1">
                    <span className="mr-1 inline-block h-3 w-3 rounded-sm border align-[-2px]" style={{ background: chain ? TILE_COLOURS[s.kind % 4] : TILE_FILLS[s.kind % 4], borderColor: TILE_COLOURS[s.kind % 4] }} />
                    {s.name}
                  </td>
                  <td className="py-0.5 pr-1">{s.shape}</td>
                  <td className="py-0.5 text-right font-mono">{s.count.toLocaleString('en-US')}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </section>
        <section aria-labelledby="vc-title" className="rounded-md border border-rule bg-card p-2">
          <div className="flex items-center justify-between">
            <h3 id="vc-title" className="text-sm font-semibold">
              Vertex environments
            </h3>
            <button
              type="button"
              className="text-xs text-tide underline"
              onClick={() => saveText(csv([['environment', 'count'], ...cfg.configs.map((c) => [c.signature, c.count])]), `${fileBase}-vertex-environments.csv`, 'text/csv')}
            >
              CSV
            </button>
          </div>
          <p className="text-xs text-ink-soft" data-testid="vertex-summary">
            {cfg.periodic
              ? `${cfg.complete.toLocaleString('en-US')} vertices in the cell (${cfg.configs.length} kinds), counted across the cell edges.`
              : `${cfg.complete.toLocaleString('en-US')} complete vertices (${cfg.configs.length} kinds); ${cfg.rim.toLocaleString('en-US')} on the rim left out.`}
            {cfg.periodic && cfg.rim > 0 ? <span className="text-clay"> {cfg.rim} vertices do not close.</span> : null}
          </p>
          <table className="mt-1 w-full text-xs" data-testid="vertex-environments">
            <thead>
              <tr className="text-left text-ink-soft">
                <th className="py-0.5 font-medium">Tiles meeting at the vertex</th>
                <th className="py-0.5 text-right font-medium">Count</th>
              </tr>
            </thead>
            <tbody>
              {cfg.configs.map((c) => (
                <tr key={c.signature} className="border-t border-rule">
                  <td className="py-0.5 pr-1">{c.signature}</td>
                  <td className="py-0.5 text-right font-mono">{c.count.toLocaleString('en-US')}</td>
                </tr>
              ))}
            </tbody>
          </table>
          {cfg.periodic && !chain ? (
            <p className="mt-2 text-xs text-ink-soft">An approximant is the quasiperiodic tiling under a linear phason strain, so a few vertices per cell can have neighbourhoods that the quasiperiodic tiling never shows.</p>
          ) : null}
        </section>
      </div>
    </div>
  );
}
