'use client';
/**
 * Powder profile: the calculated curve at full resolution, the measured pattern laid over it (scaled by least
 * squares), the difference underneath, R_p and R_wp, and the table of matched peaks. Drawn with uPlot on a
 * canvas: drag to zoom into a 2θ range, Shift-drag (or the arrow buttons) to pan, double-click or Reset to see
 * it all; pointing reads 2θ, the intensities and the nearest reflection; the intensity axis is linear, √ or log.
 */
import { useEffect, useMemo, useRef, useState } from 'react';
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';
import type { PowderCurve } from '@/lib/worker/protocol';
import type { CompareResult } from '@/lib/diffraction/compare';
import { csv, saveCanvasPng, saveText } from '@/components/workspace/downloads';
import { fromAxis, nearestReflection, toAxis, type IntensityScale } from '@/lib/view/intensity';

const SCALES: { id: IntensityScale; label: string }[] = [
  { id: 'linear', label: 'Linear' },
  { id: 'sqrt', label: '√I' },
  { id: 'log', label: 'log I' },
];

/** Our design tokens (app/globals.css), read from the page so the canvas matches it. */
function tokens() {
  const css = typeof window !== 'undefined' ? getComputedStyle(document.documentElement) : null;
  const t = (name: string, fallback: string) => css?.getPropertyValue(name).trim() || fallback;
  const font = (typeof window !== 'undefined' ? getComputedStyle(document.body).fontFamily : '') || 'ui-sans-serif, system-ui, sans-serif';
  return {
    ink: t('--color-ink', '#16202e'),
    inkSoft: t('--color-ink-soft', '#3a4657'),
    card: t('--color-card', '#fffdf8'),
    rule: t('--color-rule', '#ddd8cb'),
    tide: t('--color-tide', '#0e6f6a'),
    brass: t('--color-brass', '#b8862b'),
    clay: t('--color-clay', '#b4472f'),
    font,
  };
}

/** Index of the value in an ascending array nearest to x. */
function nearestIndex(xs: ArrayLike<number>, x: number): number {
  let lo = 0;
  let hi = xs.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (xs[mid] < x) lo = mid;
    else hi = mid;
  }
  return Math.abs(xs[lo] - x) <= Math.abs(xs[hi] - x) ? lo : hi;
}

interface Readout {
  twoTheta: number;
  calculated: number;
  measured: number | null;
  reflection: { hkl: number[] | null; twoTheta: number; d: number; intensity: number } | null;
}

/** Words for the fitted parameters (units as the fit reports them). */
const PARAM_LABELS: Record<string, string> = {
  scale: 'scale',
  zero: 'zero shift (°, measured = calculated + zero)',
  U: 'Caglioti U (deg²)',
  V: 'Caglioti V (deg²)',
  W: 'Caglioti W (deg²)',
  lattice: 'cell scale k (a = k·a of the model)',
};

export function PowderPlot({ curve, comparison, measuredName, fileBase }: { curve: PowderCurve; comparison: CompareResult | null; measuredName?: string; fileBase: string }) {
  const boxRef = useRef<HTMLDivElement>(null);
  const plotRef = useRef<uPlot | null>(null);
  const [scale, setScale] = useState<IntensityScale>('linear');
  const [readout, setReadout] = useState<Readout | null>(null);
  const [zoomed, setZoomed] = useState(false);
  // The 2θ window survives a change of intensity axis (the plot is rebuilt), not a new curve.
  const windowRef = useRef<{ curve: PowderCurve; min: number; max: number } | null>(null);
  const residual = useMemo(() => (comparison ? comparison.observed.map((v, i) => v - comparison.calculated[i]) : null), [comparison]);
  const calcScaled = useMemo(() => (comparison ? curve.intensity.map((v) => v * comparison.scale + comparison.background) : curve.intensity), [curve, comparison]);
  // A fitted comparison carries its own calculated curve on the measured points (zero shift, widths, background).
  const fitted = !!comparison?.fit;
  const x0 = curve.twoTheta[0];
  const x1 = curve.twoTheta[curve.twoTheta.length - 1];

  useEffect(() => {
    const box = boxRef.current;
    if (!box) return;
    const c = tokens();
    const f = (v: number) => toAxis(v, scale);
    // One x column for both tables: the calculated curve on its own grid, the measured points and the difference
    // on theirs (null where a table has no point; lines span the gaps).
    const calcT: [number[], number[]] = comparison?.fit ? [Array.from(comparison.twoTheta), Array.from(comparison.calculated, f)] : [Array.from(curve.twoTheta), Array.from(calcScaled, f)];
    const data: uPlot.AlignedData = comparison && residual
      ? uPlot.join([calcT, [Array.from(comparison.twoTheta), Array.from(comparison.observed, f), Array.from(comparison.observed, (o, i) => f(o) - f(comparison.calculated[i]))]])
      : [calcT[0], calcT[1]];
    const axisFont = `11px ${c.font}`;
    const labelFont = `12px ${c.font}`;
    const fmt = (v: number) => {
      const a = Math.abs(v);
      return a === 0 ? '0' : a >= 1e4 || a < 1e-2 ? v.toExponential(Number(v.toExponential(0)) === v ? 0 : 1) : String(Number(v.toPrecision(3)));
    };
    const curvesOnly = (u: uPlot, splits: number[]) => {
      const lo = u.scales.y.min ?? 0;
      const hi = u.scales.y.max ?? 1;
      const floor = lo + (hi - lo) * 0.24;
      return splits.map((v) => (v >= floor ? v : null));
    };
    let panFrom: { x: number; min: number; max: number } | null = null;
    const opts: uPlot.Options = {
      width: Math.max(320, box.clientWidth),
      height: comparison ? 340 : 300,
      legend: { show: false },
      cursor: {
        drag: { x: true, y: false, setScale: true },
        y: false,
        points: { show: false },
        bind: {
          mousedown: (u, _t, handler) => (e: MouseEvent) => {
            if (!e.shiftKey) return handler(e);
            const sx = u.scales.x;
            panFrom = { x: e.clientX, min: sx.min ?? x0, max: sx.max ?? x1 };
            const move = (ev: MouseEvent) => {
              if (!panFrom) return;
              const dx = ((ev.clientX - panFrom.x) / u.over.clientWidth) * (panFrom.max - panFrom.min);
              u.setScale('x', { min: panFrom.min - dx, max: panFrom.max - dx });
            };
            const up = () => {
              panFrom = null;
              window.removeEventListener('mousemove', move);
              window.removeEventListener('mouseup', up);
            };
            window.addEventListener('mousemove', move);
            window.addEventListener('mouseup', up);
            return null;
          },
        },
      },
      scales: {
        x: { time: false, range: (_u, min, max) => [min, max] },
        // The curves fill the upper three quarters; the difference the lowest quarter (its own scale).
        y: {
          range: (_u, min, max) => {
            const a = scale === 'log' ? min : Math.min(0, min);
            const hi = max + 0.05 * (max - a || 1);
            return [a - (hi - a) / 3, hi];
          },
        },
        d: {
          range: (_u, min, max) => {
            const r = Math.max(Math.abs(min), Math.abs(max)) || 1;
            return [-r, -r + (2 * r) / 0.22];
          },
        },
      },
      axes: [
        { stroke: c.inkSoft, font: axisFont, labelFont, label: '2θ (degrees)', grid: { stroke: c.rule, width: 1 }, ticks: { stroke: c.inkSoft, width: 1 } },
        {
          stroke: c.inkSoft,
          font: axisFont,
          labelFont,
          label: scale === 'linear' ? 'intensity (arb.)' : scale === 'sqrt' ? 'intensity (arb., √ axis)' : 'intensity (arb., log axis)',
          size: 56,
          // Ticks, grid and labels above the curves' lower edge only; the difference band has no intensity ticks.
          grid: { stroke: c.rule, width: 1, filter: curvesOnly },
          ticks: { stroke: c.inkSoft, width: 1, filter: curvesOnly },
          filter: curvesOnly,
          values: (_u, splits) => splits.map((v) => (v === null ? '' : fmt(fromAxis(v, scale)))),
        },
      ],
      series: [
        {},
        { label: 'calculated', scale: 'y', stroke: c.tide, width: 1.4, spanGaps: true, points: { show: false } },
        ...(comparison
          ? [
              { label: 'measured', scale: 'y', stroke: c.ink, fill: c.ink, width: 0, paths: () => null, points: { show: true, size: 2.6, width: 0, stroke: c.ink, fill: c.ink } },
              { label: 'difference', scale: 'd', stroke: c.clay, width: 1, spanGaps: true, points: { show: false } },
            ]
          : []),
      ],
      hooks: {
        // A card-coloured ground so the saved PNG is not transparent.
        drawClear: [
          (u) => {
            u.ctx.save();
            u.ctx.fillStyle = c.card;
            u.ctx.fillRect(0, 0, u.ctx.canvas.width, u.ctx.canvas.height);
            u.ctx.restore();
          },
        ],
        // Reflection positions as short brass ticks along the foot of the curves; the difference's zero line.
        draw: [
          (u) => {
            const ctx = u.ctx;
            const { left, top, width, height } = u.bbox;
            const dpr = devicePixelRatio || 1;
            ctx.save();
            ctx.beginPath();
            ctx.rect(left, top, width, height);
            ctx.clip();
            const foot = top + height * 0.76;
            ctx.strokeStyle = c.brass;
            ctx.lineWidth = dpr;
            ctx.beginPath();
            // After a fit the ticks sit where the fit put the lines: cell scale k and zero shift applied.
            const fp = comparison?.fit?.parameters;
            const zero = fp?.find((q) => q.name === 'zero')?.value ?? 0;
            const k = fp?.find((q) => q.name === 'lattice')?.value ?? 1;
            for (const p of curve.peaks) {
              if (p.intensity <= 1) continue;
              const tt = fp ? (360 / Math.PI) * Math.asin(Math.min(1, curve.wavelength / (2 * p.d * k))) + zero : p.twoTheta;
              const x = u.valToPos(tt, 'x', true);
              ctx.moveTo(x, foot);
              ctx.lineTo(x, foot - 6 * dpr);
            }
            ctx.stroke();
            if (comparison) {
              const y = u.valToPos(0, 'd', true);
              ctx.strokeStyle = c.rule;
              ctx.beginPath();
              ctx.moveTo(left, y);
              ctx.lineTo(left + width, y);
              ctx.stroke();
            }
            ctx.restore();
          },
        ],
        setCursor: [
          (u) => {
            const left = u.cursor.left ?? -1;
            if (left < 0) return setReadout(null);
            const x = u.posToVal(left, 'x');
            const i = nearestIndex(curve.twoTheta, x);
            const span = (u.scales.x.max ?? x1) - (u.scales.x.min ?? x0);
            const reflection = nearestReflection(curve.peaks, x, Math.max(0.05, span / 150), 0.01);
            const j = comparison ? nearestIndex(comparison.twoTheta, x) : -1;
            setReadout({ twoTheta: x, calculated: comparison?.fit ? comparison.calculated[j] : calcScaled[i], measured: comparison ? comparison.observed[j] : null, reflection });
          },
        ],
        setScale: [
          (u, key) => {
            if (key !== 'x') return;
            const min = u.scales.x.min ?? x0;
            const max = u.scales.x.max ?? x1;
            windowRef.current = { curve, min, max };
            setZoomed(min > x0 + 1e-9 || max < x1 - 1e-9);
          },
        ],
      },
    };
    const kept = windowRef.current?.curve === curve ? windowRef.current : null;
    const u = new uPlot(opts, data, box);
    plotRef.current = u;
    if (kept) u.setScale('x', { min: kept.min, max: kept.max });
    const ro = new ResizeObserver(() => u.setSize({ width: Math.max(320, box.clientWidth), height: opts.height }));
    ro.observe(box);
    return () => {
      ro.disconnect();
      u.destroy();
      plotRef.current = null;
    };
  }, [curve, comparison, residual, calcScaled, scale, x0, x1]);

  const pan = (dir: -1 | 1) => {
    const u = plotRef.current;
    if (!u) return;
    const min = u.scales.x.min ?? x0;
    const max = u.scales.x.max ?? x1;
    const d = dir * 0.25 * (max - min);
    u.setScale('x', { min: min + d, max: max + d });
  };
  const reset = () => plotRef.current?.setScale('x', { min: x0, max: x1 });

  const exportCsv = () => {
    const rows: (string | number | undefined)[][] = [['two_theta_deg', 'calculated']];
    if (comparison && residual) {
      rows[0] = ['two_theta_deg', 'measured', 'calculated_scaled', 'difference'];
      for (let i = 0; i < comparison.twoTheta.length; i++) rows.push([comparison.twoTheta[i], comparison.observed[i], comparison.calculated[i], residual[i]]);
    } else for (let i = 0; i < curve.twoTheta.length; i++) rows.push([curve.twoTheta[i], curve.intensity[i]]);
    saveText(csv(rows), `${fileBase}-powder.csv`, 'text/csv');
  };

  const small = 'rounded border border-rule px-2 py-0.5 hover:border-tide disabled:opacity-50';
  return (
    <div className="space-y-2">
      {/* One row: the legend (which may wrap within its own box), then R values and the buttons, which never wrap. */}
      <div className="flex items-center gap-3 text-xs">
        <div className="flex min-w-0 flex-1 flex-wrap items-center gap-x-3 gap-y-0.5">
          <span className="inline-flex items-center gap-1">
            <span className="inline-block h-0.5 w-4 bg-tide" /> {fitted ? 'fitted' : 'calculated'} (λ = {curve.wavelength.toFixed(4)} Å)
          </span>
          {comparison ? (
            <>
              <span className="inline-flex min-w-0 items-center gap-1">
                <span className="inline-block h-2 w-2 shrink-0 rounded-full bg-ink" />
                <span className="max-w-64 truncate" title={measuredName}>
                  measured{measuredName ? `: ${measuredName}` : ''}
                </span>
              </span>
              <span className="inline-flex items-center gap-1">
                <span className="inline-block h-0.5 w-4 bg-clay" /> difference
              </span>
            </>
          ) : null}
          <span className="inline-flex items-center gap-1">
            <span className="inline-block h-2 w-px bg-brass" /> reflections
          </span>
        </div>
        {comparison ? (
          <span className="flex shrink-0 gap-3 whitespace-nowrap font-mono">
            <span data-testid="rwp">R_wp = {(100 * comparison.rwp).toFixed(2)} %</span>
            <span>R_p = {(100 * comparison.rp).toFixed(2)} %</span>
            {Number.isFinite(comparison.rexp) ? <span title={comparison.weights === 'sigma' ? 'weights 1/σ² from the file' : 'weights 1/I (counting statistics)'}>R_exp = {(100 * comparison.rexp).toFixed(2)} %</span> : null}
            {Number.isFinite(comparison.chi2) ? <span data-testid="chi2">χ² = {comparison.chi2.toPrecision(3)}</span> : null}
          </span>
        ) : null}
        <span className="flex shrink-0 gap-2">
          <button type="button" className={small} onClick={() => plotRef.current && saveCanvasPng(plotRef.current.ctx.canvas, `${fileBase}-powder.png`)}>
            Save PNG
          </button>
          <button type="button" className={small} onClick={exportCsv}>
            CSV
          </button>
        </span>
      </div>
      <div className="flex flex-wrap items-center gap-3 text-xs">
        <div role="radiogroup" aria-label="Intensity axis" className="flex overflow-hidden rounded border border-rule">
          {SCALES.map((s) => (
            <button key={s.id} type="button" role="radio" aria-checked={scale === s.id} onClick={() => setScale(s.id)} className={`px-2 py-0.5 ${scale === s.id ? 'bg-ink text-paper' : 'bg-card hover:bg-tide-pale'}`}>
              {s.label}
            </button>
          ))}
        </div>
        <span className="flex gap-1">
          <button type="button" className={small} onClick={() => pan(-1)} disabled={!zoomed} aria-label="Pan to lower 2θ">
            ←
          </button>
          <button type="button" className={small} onClick={() => pan(1)} disabled={!zoomed} aria-label="Pan to higher 2θ">
            →
          </button>
          <button type="button" className={small} onClick={reset} disabled={!zoomed}>
            Reset zoom
          </button>
        </span>
        <span className="text-ink-soft">Drag to zoom · Shift-drag to pan · double-click to see all</span>
      </div>
      <div className="relative">
        <div ref={boxRef} role="img" aria-label="Powder pattern" data-testid="powder-plot" className="tf-plot w-full overflow-hidden rounded-md border border-rule bg-card" />
        <div className="pointer-events-none absolute right-2 top-2 min-w-44 rounded border border-rule bg-card/95 px-2 py-1 font-mono text-xs" aria-live="polite" data-testid="powder-readout">
          {readout ? (
            <>
              <div>2θ = {readout.twoTheta.toFixed(3)}°</div>
              <div className="text-tide">calc = {readout.calculated.toPrecision(4)}</div>
              {readout.measured !== null ? <div>meas = {readout.measured.toPrecision(4)}</div> : null}
              <div className="text-brass">{readout.reflection ? `hkl ${readout.reflection.hkl ? readout.reflection.hkl.join(' ') : '—'} at ${readout.reflection.twoTheta.toFixed(3)}°, d = ${readout.reflection.d.toFixed(4)} Å` : 'no reflection here'}</div>
            </>
          ) : (
            <span className="font-sans text-ink-soft">Point at the plot to read it.</span>
          )}
        </div>
      </div>
      {comparison?.warnings.length ? (
        <ul className="text-xs text-clay" role="alert">
          {comparison.warnings.map((w) => (
            <li key={w}>{w}</li>
          ))}
        </ul>
      ) : null}
      {comparison?.fit ? (
        <div className="rounded-md border border-rule bg-card" data-testid="fit-parameters">
          <table className="w-full text-xs">
            <caption className="px-2 py-1 text-left text-sm font-semibold">
              Fitted parameters (R_wp {(100 * comparison.fit.initialRwp).toFixed(1)} % before the fit; σ statistical only, scaled by √χ²)
            </caption>
            <thead>
              <tr className="text-left text-ink-soft">
                <th className="px-2 font-medium">Parameter</th>
                <th className="px-2 font-medium">Value</th>
                <th className="px-2 font-medium">σ</th>
              </tr>
            </thead>
            <tbody>
              {comparison.fit.parameters.map((p) => (
                <tr key={p.name} className="border-t border-rule">
                  <td className="px-2">{PARAM_LABELS[p.name] ?? p.name.replace(/^background(\d+)$/, 'background c$1 (Chebyshev)')}</td>
                  <td className="px-2 font-mono">{p.value.toPrecision(6)}</td>
                  <td className="px-2 font-mono">{p.sigma.toPrecision(2)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : null}
      {comparison ? (
        <div className="max-h-48 overflow-y-auto rounded-md border border-rule bg-card">
          <table className="w-full text-xs">
            <caption className="px-2 py-1 text-left text-sm font-semibold">Peak matching ({comparison.peaks.filter((m) => m.nearest).length} of {comparison.peaks.length} measured peaks matched)</caption>
            <thead>
              <tr className="text-left text-ink-soft">
                <th className="px-2 font-medium">Measured 2θ (°)</th>
                <th className="px-2 font-medium">Measured height (file units)</th>
                <th className="px-2 font-medium">Calculated 2θ (°)</th>
                <th className="px-2 font-medium">hkl (largest contribution within the width)</th>
                <th className="px-2 font-medium">{comparison.fit ? 'Calculated area (file units)' : 'Calculated intensity (rel.)'}</th>
                <th className="px-2 font-medium">Δ2θ (°)</th>
              </tr>
            </thead>
            <tbody>
              {comparison.peaks.map((m, i) => (
                <tr key={i} className={`border-t border-rule ${m.nearest && m.withinWidth !== false ? '' : 'text-clay'}`} title={m.withinWidth === false ? 'no calculated line within one peak width: nearest line shown' : undefined}>
                  <td className="px-2 font-mono">{m.twoTheta.toFixed(3)}</td>
                  <td className="px-2 font-mono">{m.intensity.toPrecision(4)}</td>
                  <td className="px-2 font-mono">{m.nearest ? m.nearest.twoTheta.toFixed(3) : 'no match'}</td>
                  <td className="px-2 font-mono">{m.nearest?.hkl?.join(' ') ?? ''}</td>
                  <td className="px-2 font-mono">{m.nearest ? m.nearest.intensity.toPrecision(3) : ''}</td>
                  <td className="px-2 font-mono">{m.misfit !== null ? m.misfit.toFixed(3) : ''}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : null}
    </div>
  );
}
