'use client';
/**
 * The icosahedral model's own powder pattern (occupation-domain amplitudes, lib/diffraction/quasicrystal) laid over
 * the measured one, with scale, zero shift and a linear background fitted (our own small fit, fit.ts), R_wp and χ²,
 * and the difference curve underneath. Computed in the engine worker (lib/worker/qc-jobs.ts, lane "qc") with
 * progress and Cancel; the result is kept in the results store under the model, the measured file, λ and the peak
 * width, so it survives leaving the Diffraction tab.
 */
import type { QcModel } from '@/lib/diffraction/quasicrystal/structure-factor';
import { measuredId, resultKey, slotOf, useResultsStore, type MeasuredRef } from './resultsStore';
import { Progress } from './Progress';

const btn = 'rounded-md border border-tide px-3 py-1 text-sm text-tide hover:bg-tide-pale disabled:opacity-50';

export function QcOverlay({ scope, model, measured, lambda, fwhm }: { scope: string; model: QcModel; measured: MeasuredRef; lambda: number; fwhm: number }) {
  const slots = useResultsStore((st) => st.slots);
  const store = useResultsStore.getState;
  const key = resultKey(scope, 'qc-model', { kind: 'qc-overlay', model, measured: measuredId(measured), wavelength: lambda, fwhm });
  const job = slotOf<'qc-overlay'>(slots, key);
  const busy = job.running;
  const error = job.error?.message ?? null;
  const done = job.result;
  const fit = done ? { ...done.fit, warnings: done.warnings, aR: done.aR } : null;
  const x = done?.x ?? new Float64Array(0);
  const y = done?.y ?? new Float64Array(0);

  const run = () => {
    void store().run(key, 'qc', { kind: 'qc-overlay', model, measured: measured.data, wavelength: lambda, fwhm });
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
      {busy ? <Progress label="Model’s pattern" running={busy} stage={job.stage} fraction={job.fraction} startedAt={job.startedAt} onCancel={() => store().cancel(key)} /> : null}
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
