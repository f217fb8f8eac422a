'use client';
/**
 * A zone-axis spot pattern: each spot's area is proportional to its intensity (or to log intensity),
 * hovering or focusing a spot shows its indices, |Q∥| and |Q⊥|.
 */
import { useMemo, useRef, useState } from 'react';
import type { ZoneResult, ZoneSpot } from '@/lib/worker/protocol';
import { csv, saveSvgPng, saveText } from '@/components/workspace/downloads';

/** Spot radius in Å⁻¹ for intensity 1; area ∝ weight. */
function weight(I: number, log: boolean, floor: number): number {
  if (!log) return I;
  return Math.max(0, Math.log10(I / floor)) / Math.log10(1 / floor);
}

export function ZonePattern({ result, fileBase }: { result: ZoneResult; fileBase: string }) {
  const [log, setLog] = useState(false);
  const [hover, setHover] = useState<ZoneSpot | null>(null);
  const svgRef = useRef<SVGSVGElement>(null);
  const floor = 1e-4;
  const q = result.qmax;
  const rMax = q / 22;
  const spots = useMemo(() => [...result.spots].sort((a, b) => a.intensity - b.intensity), [result]);
  return (
    <div className="grid h-full min-h-0 gap-3 lg:grid-cols-[1fr_230px]">
      <div className="flex min-h-0 flex-col gap-1">
        <div className="flex flex-wrap items-center gap-3 text-xs">
          <span className="text-ink-soft">
            Looking down {result.axisLabel}; {result.spots.length} spots to |Q| = {q} Å⁻¹
          </span>
          <label className="flex items-center gap-1">
            <input type="checkbox" className="accent-tide" checked={log} onChange={(e) => setLog(e.target.checked)} /> Log scale
          </label>
          <button type="button" className="ml-auto rounded border border-rule px-2 py-0.5 hover:border-tide" onClick={() => svgRef.current && void saveSvgPng(svgRef.current, `${fileBase}-zone.png`)}>
            Save PNG
          </button>
          <button
            type="button"
            className="rounded border border-rule px-2 py-0.5 hover:border-tide"
            onClick={() => saveText(csv([['indices', 'qx_per_A', 'qy_per_A', 'q_par_per_A', 'q_perp_per_A', 'intensity'], ...result.spots.map((s) => [s.label, s.x, s.y, s.qPar, s.qPerp, s.intensity])]), `${fileBase}-zone.csv`, 'text/csv')}
          >
            CSV
          </button>
        </div>
        <svg ref={svgRef} viewBox={`${-q * 1.05} ${-q * 1.05} ${2.1 * q} ${2.1 * q}`} className="min-h-0 w-full flex-1 rounded-md border border-rule bg-ink" role="img" aria-label={`Zone-axis pattern down ${result.axisLabel}`}>
          <circle cx={0} cy={0} r={q} fill="none" stroke="#3a4657" strokeWidth={q / 400} />
          <circle cx={0} cy={0} r={rMax * 0.6} fill="#b8862b" />
          {spots.map((s, i) => {
            const r = rMax * Math.sqrt(weight(s.intensity, log, floor));
            if (r <= 0) return null;
            return (
              <circle
                key={i}
                cx={s.x}
                cy={-s.y}
                r={Math.max(r, q / 500)}
                fill={hover === s ? '#b8862b' : '#fffdf8'}
                tabIndex={s.intensity > 0.05 ? 0 : -1}
                aria-label={`spot ${s.label}`}
                onMouseEnter={() => setHover(s)}
                onFocus={() => setHover(s)}
              />
            );
          })}
        </svg>
      </div>
      <aside className="rounded-md border border-rule bg-card p-2 text-xs" aria-live="polite">
        <h3 className="text-sm font-semibold">Spot</h3>
        {hover ? (
          <dl className="mt-1 grid grid-cols-[auto_1fr] gap-x-2 gap-y-0.5">
            <dt className="text-ink-soft">Indices</dt>
            <dd className="font-mono" data-testid="spot-indices">
              {hover.label}
            </dd>
            <dt className="text-ink-soft">|Q∥|</dt>
            <dd className="font-mono">{hover.qPar.toFixed(4)} Å⁻¹</dd>
            <dt className="text-ink-soft">|Q⊥|</dt>
            <dd className="font-mono">{hover.qPerp !== undefined ? `${hover.qPerp.toFixed(4)} Å⁻¹` : '— (periodic cell)'}</dd>
            <dt className="text-ink-soft">d</dt>
            <dd className="font-mono">{((2 * Math.PI) / hover.qPar).toFixed(4)} Å</dd>
            <dt className="text-ink-soft">Intensity</dt>
            <dd className="font-mono">{hover.intensity.toExponential(3)}</dd>
          </dl>
        ) : (
          <p className="mt-1 text-ink-soft">Point at a spot (or Tab to it) to read its indices.</p>
        )}
        <p className="mt-3 text-ink-soft">Spot area is proportional to {log ? 'log intensity above 10⁻⁴' : 'intensity'}; strongest = 1.</p>
      </aside>
    </div>
  );
}
