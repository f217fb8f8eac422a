'use client';
/**
 * The perpendicular-space picture: every point of the cut at its lifted (perpendicular) coordinates inside the
 * occupation domain. 3D (icosahedral) is a projected scatter you turn by dragging or with the arrow keys;
 * 2D tilings and 1D chains are drawn flat. Outline = the ideal window (icosahedral) or the hull of each site
 * class's points.
 */
import { useEffect, useMemo, useRef, useState } from 'react';
import type { Structure } from '@/lib/structure/types';
import { hull2, idealWindow, markPoints, project3, zonotopeCorners, BOUNDARY_SHRINK } from './perp-geometry';
import { saveCanvasPng } from '@/components/workspace/downloads';

const CLASS_COLOURS = ['#0e6f6a', '#b8862b', '#3a4657', '#6a8fb3', '#8b5a9e', '#4f8a3c'];

export function PerpView({ structure, fileBase }: { structure: Structure; fileBase: string }) {
  const canvasRef = useRef<HTMLCanvasElement>(null);
  const [yaw, setYaw] = useState(0.35);
  const [pitch, setPitch] = useState(0.25);
  const drag = useRef<{ x: number; y: number } | null>(null);
  const dim = structure.perpDim ?? 0;
  const window3 = useMemo(() => idealWindow(structure), [structure]);
  const marks = useMemo(() => markPoints(structure, window3), [structure, window3]);
  const counts = useMemo(() => {
    const c = [0, 0, 0];
    for (const m of marks) c[m]++;
    return c;
  }, [marks]);

  useEffect(() => {
    const cv = canvasRef.current;
    if (!cv || !structure.perp) return;
    const dpr = window.devicePixelRatio || 1;
    const W = cv.clientWidth;
    const H = cv.clientHeight;
    cv.width = W * dpr;
    cv.height = H * dpr;
    const g = cv.getContext('2d')!;
    g.setTransform(dpr, 0, 0, dpr, 0, 0);
    g.fillStyle = '#fffdf8';
    g.fillRect(0, 0, W, H);
    const n = structure.species.length;
    const P = structure.perp;
    const xy = new Float64Array(2 * n);
    const depth = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      if (dim === 3) {
        const [a, b, c] = project3(P[3 * i], P[3 * i + 1], P[3 * i + 2], yaw, pitch);
        xy[2 * i] = a;
        xy[2 * i + 1] = b;
        depth[i] = c;
      } else if (dim === 2) {
        xy[2 * i] = P[2 * i];
        xy[2 * i + 1] = P[2 * i + 1];
      } else {
        xy[2 * i] = P[i];
        xy[2 * i + 1] = 0;
      }
    }
    const corners = window3 ? zonotopeCorners(window3).map(([a, b, c]) => project3(a, b, c, yaw, pitch)) : [];
    let ext = 1e-9;
    for (let i = 0; i < 2 * n; i++) ext = Math.max(ext, Math.abs(xy[i]));
    for (const c of corners) ext = Math.max(ext, Math.abs(c[0]), Math.abs(c[1]));
    const k = (0.45 * Math.min(W, H)) / ext;
    const X = (x: number) => W / 2 + k * x;
    const Y = (y: number) => H / 2 - k * y;
    const outline = (pts: [number, number][], stroke: string, dash: number[] = []) => {
      const h = hull2(pts);
      if (h.length < 2) return;
      g.beginPath();
      h.forEach(([x, y], j) => (j ? g.lineTo(X(x), Y(y)) : g.moveTo(X(x), Y(y))));
      g.closePath();
      g.setLineDash(dash);
      g.strokeStyle = stroke;
      g.lineWidth = 1.5;
      g.stroke();
      g.setLineDash([]);
    };
    if (corners.length) {
      outline(corners.map((c) => [c[0], c[1]] as [number, number]), '#16202e');
      outline(corners.map((c) => [c[0] * BOUNDARY_SHRINK, c[1] * BOUNDARY_SHRINK] as [number, number]), '#ddd8cb', [4, 3]);
    } else if (dim === 2 && structure.site) {
      const groups = new Map<number, [number, number][]>();
      for (let i = 0; i < n; i++) {
        const c = structure.site[i];
        if (!groups.has(c)) groups.set(c, []);
        groups.get(c)!.push([xy[2 * i], xy[2 * i + 1]]);
      }
      for (const [c, pts] of groups) outline(pts, CLASS_COLOURS[c % CLASS_COLOURS.length]);
    } else if (dim === 1) {
      let lo = Infinity;
      let hi = -Infinity;
      for (let i = 0; i < n; i++) {
        lo = Math.min(lo, xy[2 * i]);
        hi = Math.max(hi, xy[2 * i]);
      }
      g.strokeStyle = '#16202e';
      g.beginPath();
      g.moveTo(X(lo), Y(0));
      g.lineTo(X(hi), Y(0));
      g.stroke();
    }
    const order = Array.from({ length: n }, (_, i) => i);
    if (dim === 3) order.sort((a, b) => depth[a] - depth[b]);
    const r = Math.max(1.5, Math.min(4, 300 / Math.sqrt(n + 1)));
    for (const i of order) {
      const m = marks[i];
      const c = structure.site ? structure.site[i] : 0;
      g.beginPath();
      g.arc(X(xy[2 * i]), Y(xy[2 * i + 1]), m === 2 ? r * 1.6 : r, 0, 2 * Math.PI);
      g.fillStyle = m === 2 ? '#b4472f' : m === 1 ? '#b8862b' : CLASS_COLOURS[c % CLASS_COLOURS.length];
      g.globalAlpha = m === 0 ? 0.7 : 1;
      g.fill();
    }
    g.globalAlpha = 1;
  }, [structure, yaw, pitch, dim, marks, window3]);

  if (!structure.perp || !dim) return <p className="p-4 text-sm text-ink-soft">This cut carries no perpendicular-space coordinates.</p>;
  const classes = structure.siteClasses ?? [];
  return (
    <div className="flex h-full min-h-0 flex-col gap-2">
      <div className="flex flex-wrap items-center gap-3 text-xs text-ink-soft">
        <span>
          {dim}D perpendicular space{dim === 3 ? ' — drag or use the arrow keys to turn' : ''}
        </span>
        {window3 ? (
          <>
            <span className="inline-flex items-center gap-1">
              <span className="inline-block h-2.5 w-2.5 rounded-full bg-brass" /> near the window boundary: {counts[1]}
            </span>
            <span className="inline-flex items-center gap-1">
              <span className="inline-block h-2.5 w-2.5 rounded-full bg-clay" /> outside the ideal window (phason defects): {counts[2]}
            </span>
          </>
        ) : null}
        {classes.slice(0, 6).map((c, i) => (
          <span key={i} className="inline-flex items-center gap-1">
            <span className="inline-block h-2.5 w-2.5 rounded-full" style={{ background: CLASS_COLOURS[i % CLASS_COLOURS.length] }} /> {c.name}
          </span>
        ))}
        <button type="button" className="ml-auto rounded border border-rule px-2 py-0.5 hover:border-tide" onClick={() => canvasRef.current && saveCanvasPng(canvasRef.current, `${fileBase}-perp.png`)}>
          Save PNG
        </button>
      </div>
      <canvas
        ref={canvasRef}
        tabIndex={0}
        role="img"
        aria-label={`Perpendicular-space picture of ${structure.species.length} points`}
        className="min-h-0 w-full flex-1 cursor-grab rounded-md border border-rule"
        onPointerDown={(e) => {
          drag.current = { x: e.clientX, y: e.clientY };
          (e.target as HTMLElement).setPointerCapture(e.pointerId);
        }}
        onPointerMove={(e) => {
          if (!drag.current || dim !== 3) return;
          setYaw((v) => v + (e.clientX - drag.current!.x) * 0.01);
          setPitch((v) => Math.max(-1.5, Math.min(1.5, v + (e.clientY - drag.current!.y) * 0.01)));
          drag.current = { x: e.clientX, y: e.clientY };
        }}
        onPointerUp={() => (drag.current = null)}
        onKeyDown={(e) => {
          if (dim !== 3) return;
          if (e.key === 'ArrowLeft') setYaw((v) => v - 0.1);
          else if (e.key === 'ArrowRight') setYaw((v) => v + 0.1);
          else if (e.key === 'ArrowUp') setPitch((v) => Math.max(-1.5, v - 0.1));
          else if (e.key === 'ArrowDown') setPitch((v) => Math.min(1.5, v + 0.1));
          else return;
          e.preventDefault();
        }}
      />
    </div>
  );
}
