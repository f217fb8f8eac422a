'use client';
/**
 * The icosahedral model's own powder pattern (occupation-domain amplitudes, lib/diffraction/quasicrystal) laid over
 * the measured one, with scale, zero shift and a linear background fitted (our own small fit, fit.ts), R_wp and χ²,
 * and the difference curve underneath.
 */
import { useState } from 'react';
import type { QcModel } from '@/lib/diffraction/quasicrystal/structure-factor';
import { qcPowder } from '@/lib/diffraction/quasicrystal/powder';
import { fitLinesToPattern, type PatternFit } from '@/lib/diffraction/quasicrystal/fit';

const btn = 'rounded-md border border-tide px-3 py-1 text-sm text-tide hover:bg-tide-pale disabled:opacity-50';

export function QcOverlay({ model, x, y, lambda, fwhm }: { model: QcModel; x: Float64Array; y: Float64Array; lambda: number; fwhm: number }) {
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [fit, setFit] = useState<(PatternFit & { warnings: string[]; aR: number }) | null>(null);

  const run = () => {
    setBusy(true);
    setError(null);
    setTimeout(() => {
      try {
        const shape = { U: 0, V: 0, W: fwhm * fwhm, eta: 0.5 };
        const p = qcPowder(model, { wavelength: lambda, twoThetaMin: Math.max(1, x[0] - 1), twoThetaMax: Math.min(179, x[x.length - 1] + 1) });
        const f = fitLinesToPattern(x, y, p.stars.map((s) => ({ twoTheta: s.twoTheta, intensity: s.intensity })), shape);
        setFit({ ...f, warnings: [...p.warnings, ...f.warnings], aR: model.aR });
      } catch (e) {
        setFit(null);
        setError((e as Error).message);
      } finally {
        setBusy(false);
      }
    }, 30);
  };

  const W = 900;
  const H = 220;
  const D = 60;
  let path = '';
  let calc = '';
  let diff = '';
  if (fit) {
    let lo = Infinity;
    let hi = -Infinity;
    for (let i = 0; i < y.length; i++) {
      lo = Math.min(lo, y[i], fit.calculated[i]);
      hi = Math.max(hi, y[i], fit.calculated[i]);
    }
    const sx = (v: number) => ((v - x[0]) / (x[x.length - 1] - x[0])) * W;
    const sy = (v: number) => H - ((v - lo) / (hi - lo || 1)) * H;
    const stride = Math.max(1, Math.floor(y.length / 2000));
    let dmax = 0;
    for (let i = 0; i < y.length; i++) dmax = Math.max(dmax, Math.abs(y[i] - fit.calculated[i]));
    for (let i = 0; i < y.length; i += stride) {
      const c = i === 0 ? 'M' : 'L';
      path += `${c}${sx(x[i]).toFixed(1)},${sy(y[i]).toFixed(1)}`;
      calc += `${c}${sx(x[i]).toFixed(1)},${sy(fit.calculated[i]).toFixed(1)}`;
      diff += `${c}${sx(x[i]).toFixed(1)},${(H + D / 2 - ((y[i] - fit.calculated[i]) / (dmax || 1)) * (D / 2)).toFixed(1)}`;
    }
  }

  return (
    <div className="space-y-1" data-testid="qc-overlay">
      <div className="flex flex-wrap items-center gap-3">
        <button type="button" className={btn} disabled={busy} onClick={run}>
          {busy ? 'Computing the model’s pattern…' : `Overlay the model’s own pattern (aR = ${model.aR.toFixed(5)} Å)`}
        </button>
        {fit ? (
          <span className="text-xs" data-testid="qc-fit">
            scale {fit.scale.toPrecision(4)}, zero shift {fit.zeroShift.toFixed(4)} ± {fit.zeroShiftSigma.toPrecision(2)}°, R_wp {(100 * fit.rwp).toFixed(1)} %, R_exp {(100 * fit.rexp).toFixed(1)} %, χ² {fit.chi2.toFixed(2)}
          </span>
        ) : null}
      </div>
      {error ? (
        <p className="text-xs text-clay" role="alert">
          {error}
        </p>
      ) : null}
      {fit?.warnings.map((w) => (
        <p key={w} className="text-xs text-clay" role="alert">
          {w}
        </p>
      ))}
      {fit ? (
        <svg viewBox={`0 0 ${W} ${H + D}`} className="w-full" role="img" aria-label="Measured pattern, the model’s fitted pattern and their difference">
          <path d={path} fill="none" stroke="#9a9a9a" strokeWidth={1} />
          <path d={calc} fill="none" stroke="#0f6b6b" strokeWidth={1} />
          <line x1={0} x2={W} y1={H + D / 2} y2={H + D / 2} stroke="#ddd" />
          <path d={diff} fill="none" stroke="#b5532f" strokeWidth={0.8} />
          <text x={4} y={12} fontSize={11} fill="#555">
            grey: measured · teal: model (occupation domains), fitted · below: difference
          </text>
        </svg>
      ) : null}
    </div>
  );
}
