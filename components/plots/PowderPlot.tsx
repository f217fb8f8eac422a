'use client';
/**
 * Powder profile: the calculated curve, the measured pattern laid over it (scaled by least squares), the
 * difference underneath, R_p and R_wp, and the table of matched peaks.
 */
import { useMemo, useRef } from 'react';
import type { PowderCurve } from '@/lib/worker/protocol';
import type { CompareResult } from '@/lib/diffraction/compare';
import { csv, saveSvgPng, saveText } from '@/components/workspace/downloads';

// A wide, low frame: with the measured-pattern box above it the whole plot, x axis included, stays in view
// on a 1280×800 screen; the peak table scrolls below.
const W = 900;
const H = 300;
const M = { l: 52, r: 12, t: 10, b: 34 };

function path(xs: ArrayLike<number>, ys: ArrayLike<number>, X: (x: number) => number, Y: (y: number) => number): string {
  let d = '';
  const n = xs.length;
  const step = Math.max(1, Math.floor(n / 2000));
  for (let i = 0; i < n; i += step) d += `${i ? 'L' : 'M'}${X(xs[i]).toFixed(1)},${Y(ys[i]).toFixed(1)}`;
  return d;
}

export function PowderPlot({ curve, comparison, measuredName, fileBase }: { curve: PowderCurve; comparison: CompareResult | null; measuredName?: string; fileBase: string }) {
  const svgRef = useRef<SVGSVGElement>(null);
  const residual = useMemo(() => (comparison ? comparison.observed.map((v, i) => v - comparison.calculated[i]) : null), [comparison]);
  const view = useMemo(() => {
    const x0 = curve.twoTheta[0];
    const x1 = curve.twoTheta[curve.twoTheta.length - 1];
    let yMax = 0;
    for (const v of curve.intensity) yMax = Math.max(yMax, v);
    let scale = 1;
    let bg = 0;
    if (comparison) {
      scale = comparison.scale;
      bg = comparison.background;
      yMax = 0;
      for (const v of comparison.observed) yMax = Math.max(yMax, v);
      for (const v of curve.intensity) yMax = Math.max(yMax, v * scale + bg);
    }
    let rMax = 0;
    if (residual) for (const v of residual) rMax = Math.max(rMax, Math.abs(v));
    return { x0, x1, yMax: yMax || 1, scale, bg, rMax: rMax || 1 };
  }, [curve, comparison, residual]);
  const mainH = comparison ? (H - M.t - M.b) * 0.75 : H - M.t - M.b;
  const resTop = M.t + mainH + 8;
  const resH = H - M.b - resTop;
  const X = (x: number) => M.l + ((x - view.x0) / (view.x1 - view.x0)) * (W - M.l - M.r);
  const Y = (y: number) => M.t + mainH - (y / (view.yMax * 1.05)) * mainH;
  const R = (r: number) => resTop + resH / 2 - (r / view.rMax) * (resH / 2);
  const ticks: number[] = [];
  const span = view.x1 - view.x0;
  const stepT = span > 60 ? 10 : span > 20 ? 5 : 2;
  for (let t = Math.ceil(view.x0 / stepT) * stepT; t <= view.x1; t += stepT) ticks.push(t);
  const calcScaled = useMemo(() => curve.intensity.map((v) => v * view.scale + view.bg), [curve, view.scale, view.bg]);

  const exportCsv = () => {
    const rows: (string | number | undefined)[][] = [['two_theta_deg', 'calculated']];
    if (comparison && residual) {
      rows[0] = ['two_theta_deg', 'measured', 'calculated_scaled', 'difference'];
      for (let i = 0; i < comparison.twoTheta.length; i++) rows.push([comparison.twoTheta[i], comparison.observed[i], comparison.calculated[i], residual[i]]);
    } else for (let i = 0; i < curve.twoTheta.length; i++) rows.push([curve.twoTheta[i], curve.intensity[i]]);
    saveText(csv(rows), `${fileBase}-powder.csv`, 'text/csv');
  };

  return (
    <div className="space-y-2">
      {/* One row: the legend (which may wrap within its own box), then R values and the buttons, which never wrap. */}
      <div className="flex items-center gap-3 text-xs">
        <div className="flex min-w-0 flex-1 flex-wrap items-center gap-x-3 gap-y-0.5">
          <span className="inline-flex items-center gap-1">
            <span className="inline-block h-0.5 w-4 bg-tide" /> calculated (λ = {curve.wavelength.toFixed(4)} Å)
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
        </div>
        {comparison ? (
          <span className="flex shrink-0 gap-3 whitespace-nowrap font-mono">
            <span data-testid="rwp">R_wp = {(100 * comparison.rwp).toFixed(1)} %</span>
            <span>R_p = {(100 * comparison.rp).toFixed(1)} %</span>
          </span>
        ) : null}
        <span className="flex shrink-0 gap-2">
          <button type="button" className="rounded border border-rule px-2 py-0.5 hover:border-tide" onClick={() => svgRef.current && void saveSvgPng(svgRef.current, `${fileBase}-powder.png`)}>
            Save PNG
          </button>
          <button type="button" className="rounded border border-rule px-2 py-0.5 hover:border-tide" onClick={exportCsv}>
            CSV
          </button>
        </span>
      </div>
      <svg ref={svgRef} viewBox={`0 0 ${W} ${H}`} className="w-full rounded-md border border-rule bg-card" role="img" aria-label="Powder pattern">
        <rect x={0} y={0} width={W} height={H} fill="#fffdf8" />
        <line x1={M.l} x2={W - M.r} y1={M.t + mainH} y2={M.t + mainH} stroke="#ddd8cb" />
        {ticks.map((t) => (
          <g key={t}>
            <line x1={X(t)} x2={X(t)} y1={H - M.b} y2={H - M.b + 4} stroke="#3a4657" />
            <text x={X(t)} y={H - M.b + 16} textAnchor="middle" fontSize={11} fill="#3a4657">
              {t}
            </text>
          </g>
        ))}
        <text x={(W + M.l) / 2} y={H - 4} textAnchor="middle" fontSize={11} fill="#3a4657">
          2θ (degrees)
        </text>
        <text x={14} y={M.t + mainH / 2} fontSize={11} fill="#3a4657" transform={`rotate(-90 14 ${M.t + mainH / 2})`} textAnchor="middle">
          intensity (arb.)
        </text>
        {curve.peaks
          .filter((p) => p.intensity > 1)
          .map((p, i) => (
            <line key={i} x1={X(p.twoTheta)} x2={X(p.twoTheta)} y1={M.t + mainH} y2={M.t + mainH - 5} stroke="#b8862b" />
          ))}
        {comparison ? (
          <g>
            {Array.from(comparison.twoTheta, (x, i) => (i % Math.max(1, Math.floor(comparison.twoTheta.length / 1500)) === 0 ? <circle key={i} cx={X(x)} cy={Y(comparison.observed[i])} r={1.3} fill="#16202e" /> : null))}
          </g>
        ) : null}
        <path d={path(curve.twoTheta, calcScaled, X, Y)} fill="none" stroke="#0e6f6a" strokeWidth={1.4} />
        {comparison && residual ? (
          <g>
            <line x1={M.l} x2={W - M.r} y1={R(0)} y2={R(0)} stroke="#ddd8cb" />
            <path d={path(comparison.twoTheta, residual, X, R)} fill="none" stroke="#b4472f" strokeWidth={1} />
          </g>
        ) : null}
      </svg>
      {comparison ? (
        <div className="max-h-48 overflow-y-auto rounded-md border border-rule bg-card">
          <table className="w-full text-xs">
            <caption className="px-2 py-1 text-left text-sm font-semibold">Peak matching ({comparison.peaks.filter((m) => m.nearest).length} of {comparison.peaks.length} measured peaks matched)</caption>
            <thead>
              <tr className="text-left text-ink-soft">
                <th className="px-2 font-medium">Measured 2θ (°)</th>
                <th className="px-2 font-medium">Measured height (file units)</th>
                <th className="px-2 font-medium">Calculated 2θ (°)</th>
                <th className="px-2 font-medium">hkl (strongest)</th>
                <th className="px-2 font-medium">Calculated intensity (rel.)</th>
                <th className="px-2 font-medium">Δ2θ (°)</th>
              </tr>
            </thead>
            <tbody>
              {comparison.peaks.map((m, i) => (
                <tr key={i} className={`border-t border-rule ${m.nearest ? '' : 'text-clay'}`}>
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
