'use client';
/**
 * A chain or planar tiling drawn as its tiles, coloured by tile type, with the table of vertex environments.
 */
import { useMemo, useRef } from 'react';
import type { Structure } from '@/lib/structure/types';
import { vertexConfigurations } from './vertex-configs';
import { csv, saveSvgPng, saveText } from '@/components/workspace/downloads';

const TILE_COLOURS = ['#0e6f6a', '#b8862b', '#6a8fb3', '#b4472f'];
const TILE_FILLS = ['#d5ebe8', '#f3e6c8', '#dfe8f1', '#f6dcd4'];

export function TilingView({ structure, fileBase }: { structure: Structure; fileBase: string }) {
  const svgRef = useRef<SVGSVGElement>(null);
  const t = structure.tiles;
  const cfg = useMemo(() => vertexConfigurations(structure), [structure]);
  const geom = useMemo(() => {
    if (!t) return null;
    const P = structure.positions;
    let x0 = Infinity;
    let x1 = -Infinity;
    let y0 = Infinity;
    let y1 = -Infinity;
    for (let i = 0; i < structure.species.length; i++) {
      x0 = Math.min(x0, P[3 * i]);
      x1 = Math.max(x1, P[3 * i]);
      y0 = Math.min(y0, P[3 * i + 1]);
      y1 = Math.max(y1, P[3 * i + 1]);
    }
    const counts = new Array(t.kinds.length).fill(0);
    for (const k of t.kind) counts[k]++;
    return { x0, x1, y0, y1, counts };
  }, [structure, t]);
  if (!t || !geom) return <p className="p-4 text-sm text-ink-soft">This cut has no tiles to draw (3D models are shown in the 3D view).</p>;
  const P = structure.positions;
  const chain = t.cornersPerTile === 2;
  const w = Math.max(geom.x1 - geom.x0, 1e-6);
  const h = chain ? w / 12 : Math.max(geom.y1 - geom.y0, 1e-6);
  const pad = 0.02 * Math.max(w, h);
  const tiles = t.kind.length;
  const drawTiles = Math.min(tiles, 20000);
  return (
    <div className="grid h-full min-h-0 gap-3 lg:grid-cols-[1fr_260px]">
      <div className="flex min-h-0 flex-col gap-2">
        <div className="flex flex-wrap items-center gap-3 text-xs text-ink-soft">
          {t.kinds.map((k, i) => (
            <span key={k} className="inline-flex items-center gap-1">
              <span className="inline-block h-3 w-3 rounded-sm border" style={{ background: TILE_FILLS[i % 4], borderColor: TILE_COLOURS[i % 4] }} />
              {k}: {geom.counts[i]}
            </span>
          ))}
          {tiles > drawTiles ? <span className="text-clay">drawing the first {drawTiles.toLocaleString('en-US')} of {tiles.toLocaleString('en-US')} tiles</span> : null}
          <button type="button" className="ml-auto rounded border border-rule px-2 py-0.5 hover:border-tide" onClick={() => svgRef.current && void saveSvgPng(svgRef.current, `${fileBase}-tiling.png`)}>
            Save PNG
          </button>
        </div>
        <svg ref={svgRef} role="img" aria-label={`${chain ? 'Chain' : 'Tiling'} of ${tiles} tiles`} className="min-h-0 w-full flex-1 rounded-md border border-rule bg-card" viewBox={`${geom.x0 - pad} ${-(chain ? h : geom.y1) - pad} ${w + 2 * pad} ${h + 2 * pad}`} preserveAspectRatio="xMidYMid meet">
          {Array.from({ length: drawTiles }, (_, ti) => {
            const kind = t.kind[ti];
            if (chain) {
              const a = P[3 * t.corners[2 * ti]];
              const b = P[3 * t.corners[2 * ti + 1]];
              const lo = Math.min(a, b);
              const len = Math.abs(b - a);
              const hh = kind === 0 ? h * 0.8 : h * 0.45;
              return <rect key={ti} x={lo + len * 0.04} y={-h / 2 - hh / 2} width={len * 0.92} height={hh} fill={TILE_COLOURS[kind % 4]} rx={len * 0.05} />;
            }
            const pts: string[] = [];
            for (let c = 0; c < t.cornersPerTile; c++) {
              const v = t.corners[t.cornersPerTile * ti + c];
              pts.push(`${P[3 * v]},${-P[3 * v + 1]}`);
            }
            return <polygon key={ti} points={pts.join(' ')} fill={TILE_FILLS[kind % 4]} stroke={TILE_COLOURS[kind % 4]} strokeWidth={w / 900} />;
          })}
        </svg>
      </div>
      <section aria-labelledby="vc-title" className="min-h-0 overflow-y-auto rounded-md border border-rule bg-card p-2">
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
        <p className="text-xs text-ink-soft">
          {cfg.complete} complete vertices ({cfg.configs.length} kinds); {cfg.rim} on the rim left out.
        </p>
        <table className="mt-1 w-full text-xs">
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
                <td className="py-0.5 text-right font-mono">{c.count}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>
    </div>
  );
}
