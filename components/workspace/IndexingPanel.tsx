'use client';
/**
 * Indexing of the measured pattern opened in the diffraction panel as an icosahedral quasicrystal: six indices,
 * N and M per peak, the refined quasilattice constant aR and zero shift with their standard uncertainties, the
 * residuals and the phason-strain trend; "Use this aR" saves a new revision of the model with it (REST API, one client).
 * The indexing runs in the engine worker (lib/worker/qc-jobs.ts, lane "indexing") with progress and Cancel, and
 * its result is kept in the results store under the measured file, wavelength and hyperlattice, so leaving the
 * Diffraction tab (even mid-run) and coming back shows it again.
 */
import { useState } from 'react';
import { measuredId, resultKey, slotOf, useResultsStore } from './resultsStore';
import { Progress } from './Progress';
import { parseWavelength } from '@/lib/diffraction/wavelengths';
import { send } from '@/components/ui/api';
import { QcOverlay } from './QcOverlay';
import type { QcModel } from '@/lib/diffraction/quasicrystal/structure-factor';

const btn = 'rounded-md bg-tide px-3 py-1 text-sm font-medium text-white hover:bg-tide-deep disabled:opacity-50';

export interface SavedRevision {
  id: string | number;
  number?: number;
}

function median(v: number[]): number {
  const s = v.slice().sort((a, b) => a - b);
  return s.length ? s[Math.floor(s.length / 2)] : 0.1;
}

const fmt = (v: number | null, d: number) => (v === null || !Number.isFinite(v) ? '—' : v.toFixed(d));
const idx = (h: number[] | null) => (h ? h.map((v) => (Number.isInteger(v) ? String(v) : `${v * 2}/2`)).join(' ') : '—');

export function IndexingPanel({
  scope,
  params,
  projectId,
  canEdit,
  baseRevision,
  onSaved,
}: {
  scope: string;
  params: Record<string, unknown>;
  projectId?: string;
  canEdit?: boolean;
  baseRevision: string | null;
  onSaved: (next: Record<string, unknown>, rev: SavedRevision) => void;
}) {
  const scoped = useResultsStore((st) => st.scopes[scope]);
  const slots = useResultsStore((st) => st.slots);
  const chosen = useResultsStore((st) => st.indexLattice[scope]);
  const store = useResultsStore.getState;
  const measured = scoped?.measured ?? null;
  const wl = scoped?.form.wl ?? 'CuKa1';
  const lattice: 'P' | 'F' = chosen ?? (params.lattice === 'F' ? 'F' : 'P');
  const [saving, setSaving] = useState<{ busy?: boolean; ok?: string; error?: string }>({});

  let lambda: number | null = null;
  try {
    lambda = parseWavelength(/^[\d.]+$/.test(wl) ? Number(wl) : wl);
  } catch {
    lambda = null;
  }

  // The result shown is the one for exactly this file, wavelength and hyperlattice (or none).
  const key = measured && lambda !== null ? resultKey(scope, 'measured', { kind: 'qc-index', measured: measuredId(measured), wavelength: lambda, lattice }) : null;
  const job = slotOf<'qc-index'>(slots, key ?? '');
  const result = job.result && measured ? { ...job.result, name: measured.name } : null;
  const error = job.error?.message ?? null;
  const busy = job.running;

  const run = () => {
    if (!measured || lambda === null || !key) return;
    setSaving({});
    void store().run(key, 'indexing', { kind: 'qc-index', measured: measured.data, wavelength: lambda, lattice });
  };
  const cancel = () => {
    if (key) store().cancel(key);
  };

  const saveAR = async () => {
    if (!result || !projectId) return;
    const aR = Number(result.aR.toFixed(5));
    const next = { ...params, aR };
    setSaving({ busy: true });
    try {
      const rev = await send<SavedRevision>('POST', `/api/projects/${encodeURIComponent(projectId)}/revisions`, {
        params: next,
        message: `aR = ${aR} Å (± ${result.aRSigma.toPrecision(2)}) from indexing ${result.name}`,
        baseRevision: baseRevision === null ? null : Number(baseRevision),
      });
      setSaving({ ok: `Saved revision ${rev.number ?? rev.id} with aR = ${aR} Å.` });
      onSaved(next, rev);
    } catch (e) {
      setSaving({ error: (e as Error).message });
    }
  };

  return (
    <section aria-label="Indexing" className="space-y-2 rounded-md border border-rule bg-card p-3 text-sm" data-testid="indexing-panel">
      <div className="flex flex-wrap items-center gap-3">
        <h3 className="font-medium">Index the measured pattern (icosahedral)</h3>
        <label className="flex items-center gap-1 text-xs">
          Hyperlattice
          <select aria-label="Hyperlattice for indexing" className="rounded-md border border-rule bg-card px-2 py-1 text-sm" value={lattice} onChange={(e) => store().setIndexLattice(scope, e.target.value as 'P' | 'F')}>
            <option value="P">P — simple</option>
            <option value="F">F — face-centred (half-integer indices)</option>
          </select>
        </label>
        <button type="button" className={btn} disabled={!measured || lambda === null || busy} onClick={run}>
          {busy ? 'Indexing…' : 'Index peaks'}
        </button>
        {!measured ? <span className="text-xs text-ink-soft">Open a measured pattern above first.</span> : null}
        {lambda === null ? <span className="text-xs text-clay">Set a valid wavelength above.</span> : null}
      </div>
      {busy ? <Progress label="Indexing" running={busy} stage={job.stage} fraction={job.fraction} startedAt={job.startedAt} onCancel={cancel} /> : null}
      {error ? (
        <p className="text-xs text-clay" role="alert">
          {error}
        </p>
      ) : null}
      {result ? (
        <div className="space-y-2">
          <p data-testid="indexing-summary">
            <strong>
              a<sub>R</sub> = {result.aR.toFixed(5)} ± {result.aRSigma.toPrecision(2)} Å
            </strong>
            , zero shift {result.zeroShift.toFixed(4)} ± {result.zeroShiftSigma.toPrecision(2)}° · {result.indexed} of {result.peaks.length} peaks indexed · RMS residual {result.rmsResidual.toFixed(4)}° · score {result.score.toFixed(2)} ({result.name}, λ = {result.wavelength.toFixed(5)} Å, {result.lattice})
          </p>
          <p className="text-xs text-ink-soft">Phason strain: {result.phasonStrain.note}{result.phasonStrain.width ? ` (width slope ${result.phasonStrain.width.slope.toExponential(2)} ± ${result.phasonStrain.width.slopeSigma.toExponential(1)})` : ''}.</p>
          {result.warnings.map((w) => (
            <p key={w} className="text-xs text-clay" role="alert">
              {w}
            </p>
          ))}
          <div className="flex flex-wrap items-center gap-3">
            {projectId && canEdit ? (
              <button type="button" className={btn} disabled={saving.busy} onClick={() => void saveAR()}>
                {saving.busy ? 'Saving…' : `Use this aR (${result.aR.toFixed(5)} Å)`}
              </button>
            ) : (
              <span className="text-xs text-ink-soft">Saving aR needs a project you can edit.</span>
            )}
            {saving.ok ? (
              <span className="text-xs text-tide" role="status">
                {saving.ok}
              </span>
            ) : null}
            {saving.error ? (
              <span className="text-xs text-clay" role="alert">
                {saving.error}
              </span>
            ) : null}
          </div>
          {measured && lambda !== null ? (
            <QcOverlay
              scope={scope}
              model={{ aR: result.aR, lattice: (params.lattice as QcModel['lattice']) ?? 'P', offset: params.offset as number[] | undefined, species: params.species as string | undefined, decoration: params.decoration as QcModel['decoration'] }}
              measured={measured}
              lambda={lambda}
              fwhm={median(result.peaks.map((p) => p.fwhm))}
            />
          ) : null}
          <div>
            <table className="w-full text-right text-xs tabular-nums" data-testid="indexing-table">
              <thead className="sticky top-0 bg-card">
                <tr>
                  <th className="px-1 text-left">2θ obs (°)</th>
                  <th className="px-1">2θ calc</th>
                  <th className="px-1">residual</th>
                  <th className="px-1 text-left">six indices</th>
                  <th className="px-1">N</th>
                  <th className="px-1">M</th>
                  <th className="px-1">|Q⊥| (Å⁻¹)</th>
                  <th className="px-1" title="reflections with this N, M (one or more icosahedral stars)">m (N, M)</th>
                  <th className="px-1">FWHM</th>
                  <th className="px-1">area</th>
                </tr>
              </thead>
              <tbody>
                {result.peaks.map((p) => (
                  <tr key={p.twoTheta} className={p.indices ? '' : 'text-clay'}>
                    <td className="px-1 text-left">{p.twoTheta.toFixed(3)}</td>
                    <td className="px-1">{fmt(p.twoThetaCalc, 3)}</td>
                    <td className="px-1">{fmt(p.residual, 4)}</td>
                    <td className="px-1 text-left">{idx(p.indices)}</td>
                    <td className="px-1">{p.N ?? '—'}</td>
                    <td className="px-1">{p.M ?? '—'}</td>
                    <td className="px-1">{fmt(p.qPerp, 3)}</td>
                    <td className="px-1">{p.multiplicity ?? '—'}</td>
                    <td className="px-1">{p.fwhm.toFixed(3)}</td>
                    <td className="px-1">{p.area.toFixed(0)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </div>
      ) : null}
    </section>
  );
}
