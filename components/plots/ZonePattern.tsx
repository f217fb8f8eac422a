'use client';
/**
 * A zone-axis spot pattern: each spot's area is proportional to its intensity, or to log intensity over a
 * chosen number of decades (the contrast slider: few decades show only the strong spots, many bring up the
 * weak ones without all spots saturating); hovering or focusing a spot shows its indices, |Q∥| and |Q⊥|.
 */
import { useMemo, useRef, useState } from 'react';
import type { ZoneResult, ZoneSpot } from '@/lib/worker/protocol';
import { csv, saveSvgPng, saveText } from '@/components/workspace/downloads';
import { spotWeight } from '@/lib/view/intensity';

/** Most decades the contrast slider offers. */
const MAX_DECADES = 8;

export function ZonePattern({ result, fileBase }: { result: ZoneResult; fileBase: string }) {
  // 0 decades = linear; otherwise spot area ∝ log intensity over that many decades below the strongest.
  const [decades, setDecades] = useState(0);
  const [hover, setHover] = useState<ZoneSpot | null>(null);
  const svgRef = useRef<SVGSVGElement>(null);
  const q = result.qmax;
  const rMax = q / 22;
  const spots = useMemo(() => [...result.spots].sort((a, b) => a.intensity - b.intensity), [result]);
  return (
    <div className="grid h-full min-h-0 gap-3 lg:grid-cols-[1fr_230px]">
      <div className="flex min-h-0 flex-col gap-1">
        <div className="flex flex-wrap items-center gap-3 text-xs">
          <span className="basis-full text-ink-soft xl:basis-auto">
            Looking down {result.axisLabel}; {result.spots.length} spots to |Q| = {q} Å⁻¹
          </span>
          <label className="flex items-center gap-2">
            <span>Contrast</span>
            <input
              type="range"
              min={0}
              max={MAX_DECADES}
              step={0.5}
              className="w-32 accent-tide"
              value={decades}
              onChange={(e) => setDecades(Number(e.target.value))}
              aria-label="Dynamic range in decades (0 = linear)"
              aria-valuetext={decades === 0 ? 'linear' : `${decades} decades`}
            />
            <span className="w-20 font-mono" data-testid="zone-contrast">
              {decades === 0 ? 'linear' : `log, ${decades} dec.`}
            </span>
          </label>
          <span className="ml-auto flex shrink-0 gap-2">
            <button type="button" className="rounded border border-rule px-2 py-0.5 hover:border-tide" onClick={() => svgRef.current && void saveSvgPng(svgRef.current, `${fileBase}-zone.png`)}>
              Save PNG
            </button>
            <button
              type="button"
              className="rounded border border-rule px-2 py-0.5 hover:border-tide"
              onClick={() => saveText(csv([['indices', 'qx_per_A', 'qy_per_A', 'q_par_per_A', 'q_perp_per_A', 'intensity'], ...result.spots.map((s) => [s.label, s.x, s.y, s.qPar, s.qPerp, s.intensity])]), `${fileBase}-zone.csv`, 'text/csv')}
            >
              CSV
            </button>
          </span>
        </div>
        <svg ref={svgRef} viewBox={`${-q * 1.05} ${-q * 1.05} ${2.1 * q} ${2.1 * q}`} className="min-h-0 w-full flex-1 rounded-md border border-rule bg-ink" role="img" aria-label={`Zone-axis pattern down ${result.axisLabel}`}>
          <circle cx={0} cy={0} r={q} fill="none" stroke="#3a4657" strokeWidth={q / 400} />
          <circle cx={0} cy={0} r={rMax * 0.6} fill="#b8862b" />
          {spots.map((s, i) => {
            const r = rMax * Math.sqrt(spotWeight(s.intensity, decades));
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
        <p className="mt-3 text-ink-soft">Spot area is proportional to {decades === 0 ? 'intensity' : <>log intensity above 10<sup>−{decades}</sup></>}; strongest = 1. Slide the contrast to the right to bring up weak spots.</p>
      </aside>
    </div>
  );
}
