'use client';
/** Zone-axis patterns and powder profiles of the current cut, with a measured pattern to compare against. */
import { useMemo, useState } from 'react';
import type { Structure } from '@/lib/structure/types';
import type { PowderCurve } from '@/lib/worker/protocol';
import { powderParamsSchema, zoneParamsSchema } from '@/lib/diffraction/params';
import { kalpha2Of, parseWavelength } from '@/lib/diffraction/wavelengths';
import { readMeasured, type MeasuredPattern } from '@/lib/formats/measured';
import { comparePatterns } from '@/lib/diffraction/compare';
import { lorentzPolarization } from '@/lib/diffraction/lorentz-polarization';
import { ZonePattern } from '@/components/plots/ZonePattern';
import { PowderPlot } from '@/components/plots/PowderPlot';
import { resultKey, slotOf, useResultsStore, type DiffractionForm, type DiffractionKind, type MeasuredRef } from './resultsStore';
import { Progress } from './Progress';
import { jobProgressText, uploadDatasetNow } from './jobs-client';
import { plainError } from '@/lib/zod-text';
import { describeSchema } from '@/components/forms/describe';
import { firstPerField, formMessages } from '@/components/forms/messages';

const input = 'rounded-md border border-rule bg-card px-2 py-1 text-sm aria-[invalid=true]:border-clay';
const btn = 'rounded-md bg-tide px-3 py-1 text-sm font-medium text-white hover:bg-tide-deep disabled:opacity-50';

// The settings' words, limits and defaults come from their schemas (lib/diffraction/params.ts).
const ZONE_FORM = describeSchema(zoneParamsSchema);
const POWDER_FORM = describeSchema(powderParamsSchema);
const POWDER_DEFAULTS = powderParamsSchema.parse({});
/** Widest constant peak the panel offers, degrees: the panel's own choice (the profile takes W = FWHM²). */
const MAX_FWHM = 5;

/** A typed number, or the text itself so the schema can say what is wrong with it. */
function numberOrText(t: string): number | string {
  return t.trim() !== '' && Number.isFinite(Number(t)) ? Number(t) : t;
}

export interface DatasetRef {
  id: string;
  name: string;
  url: string;
}

/** Where a local file can be kept as a project dataset (editors only). */
export interface DatasetTarget {
  projectId: string;
  canEdit: boolean;
  onStored: (d: DatasetRef) => void;
}

/** The panel's settings before anything was typed. */
const FORM_DEFAULTS: DiffractionForm = { sub: 'zone', axis: '5', qmax: '3', radiation: 'xray', wl: String(POWDER_DEFAULTS.wavelength), tt0: String(POWDER_DEFAULTS.twoThetaMin), tt1: String(POWDER_DEFAULTS.twoThetaMax), fwhm: '0.15' };

/**
 * `modelKey` names the model the structure was cut from (results are kept per model and settings, so a
 * pattern of one model is never shown for another).
 */
export function DiffractionPanel({ structure, fileBase, datasets = [], target, modelKey }: { structure: Structure; fileBase: string; datasets?: DatasetRef[]; target?: DatasetTarget; modelKey?: string }) {
  const scope = target?.projectId ?? 'scratch';
  const model = modelKey ?? 'current';
  const scoped = useResultsStore((st) => st.scopes[scope]);
  const slots = useResultsStore((st) => st.slots);
  const store = useResultsStore.getState;
  const form = scoped?.form ?? FORM_DEFAULTS;
  const measured = scoped?.measured ?? null;
  const { sub, axis, qmax, radiation, wl, tt0, tt1, fwhm } = form;
  const set = (patch: Partial<DiffractionForm>) => store().setForm(scope, FORM_DEFAULTS, patch);
  const setSub = (v: DiffractionKind) => set({ sub: v });
  const setAxis = (v: string) => set({ axis: v });
  const setQmax = (v: string) => set({ qmax: v });
  const setRadiation = (v: DiffractionForm['radiation']) => set({ radiation: v });
  const setWl = (v: string) => set({ wl: v });
  const setTt0 = (v: string) => set({ tt0: v });
  const setTt1 = (v: string) => set({ tt1: v });
  const setFwhm = (v: string) => set({ fwhm: v });
  const setMeasured = (m: MeasuredRef | null | ((old: MeasuredRef | null) => MeasuredRef | null)) => store().setMeasured(scope, FORM_DEFAULTS, m);
  const [measErr, setMeasErr] = useState<string | null>(null);
  // Kα2 doublet: offered for a Kα1 line name (the ratio of that element, wavelengths.ts).
  const [withKa2, setWithKa2] = useState(false);
  const line2 = radiation === 'xray' ? kalpha2Of(wl) : undefined;
  const ka2 = withKa2 && line2 ? line2 : undefined;
  // Electron powder: the resolution limit d_min the user sets (default in lib/diffraction/powder.ts).
  const [dMinText, setDMinText] = useState('');
  const dMin = radiation === 'electron' && dMinText.trim() !== '' ? Number(dMinText) : undefined;
  const dMinErr = dMin !== undefined && !(dMin > 0 && Number.isFinite(dMin)) ? 'd min: must be a positive length in Å' : null;
  const [keepState, setKeepState] = useState<{ busy?: boolean; progress?: string; fraction?: number; ok?: string; error?: string }>({});
  const zoneInput = { axis: axis.replace(/\s+/g, ''), qmax: numberOrText(qmax) };
  const zoneCheck = zoneParamsSchema.safeParse(zoneInput, { error: plainError });
  const zoneErr = formMessages(firstPerField(zoneCheck.error), ZONE_FORM, zoneInput);
  let lambda: number | null = null;
  let wlErr: string | null = null;
  try {
    lambda = parseWavelength(/^[\d.]+$/.test(wl) ? Number(wl) : wl);
  } catch (e) {
    wlErr = (e as Error).message;
  }
  const powderInput = { wavelength: lambda ?? wl, radiation, twoThetaMin: numberOrText(tt0), twoThetaMax: numberOrText(tt1) };
  const powderCheck = powderParamsSchema.safeParse(powderInput, { error: plainError });
  const powderErr = formMessages(firstPerField(powderCheck.error), POWDER_FORM, powderInput);
  const rangeErr = [powderErr.get('twoThetaMin'), powderErr.get('twoThetaMax')].filter((m): m is string => !!m);
  const fwhmErr = !(Number(fwhm) > 0 && Number(fwhm) <= MAX_FWHM) ? `Peak width: must be more than 0° and at most ${MAX_FWHM}°` : null;

  // Which result is shown: the one computed for this model with exactly these settings, or none.
  const zoneSettings = { kind: 'zone' as const, axis: axis.replace(/\s+/g, ''), qmax: numberOrText(qmax), radiation };
  const powderSettings = { kind: 'powder' as const, wavelength: lambda ?? wl, radiation, twoThetaMin: numberOrText(tt0), twoThetaMax: numberOrText(tt1), step: powderCheck.success ? powderCheck.data.profile.step : null, fwhm: numberOrText(fwhm), ...(ka2 ? { kalpha2: ka2.ratio } : {}), ...(dMin !== undefined ? { dMin } : {}) };
  const zoneKey = resultKey(scope, model, zoneSettings);
  const powderKey = resultKey(scope, model, powderSettings);
  const zone = { ...slotOf<'zone'>(slots, zoneKey), cancel: () => store().cancel(zoneKey) };
  const powder = { ...slotOf<'powder'>(slots, powderKey), cancel: () => store().cancel(powderKey) };

  // A comparison that cannot be made says why (e.g. the measured range lies outside the simulated one).
  const curve = (slots[powderKey]?.result ?? null) as PowderCurve | null;
  const { comparison: plain, compareErr } = useMemo(() => {
    if (!measured || !curve) return { comparison: null, compareErr: null };
    const h = Number(fwhm) > 0 ? Number(fwhm) : 0.1;
    try {
      return { comparison: comparePatterns(measured.data, curve, curve.peaks, { wavelength: curve.wavelength, background: true, fwhm: () => h, eta: 0.5 }), compareErr: null };
    } catch (e) {
      return { comparison: null, compareErr: compareMessage((e as Error).message, measured.data, curve.twoTheta) };
    }
  }, [measured, curve, fwhm]);
  // A least-squares fit of the shown curve's reflections to the measured pattern (periodic cells only), run in
  // the worker and kept in the results store for exactly this curve and measured pattern.
  const [showFit, setShowFit] = useState(true);
  const fitKey = resultKey(scope, model, { kind: 'fit', powder: powderKey, measured: measured ? `${measured.name}:${measured.data.x.length}:${measured.data.x[0]}` : null });
  const fit = { ...slotOf<'fit'>(slots, fitKey), cancel: () => store().cancel(fitKey) };
  const fitted = showFit && measured && curve ? (fit.result ?? null) : null;
  const comparison = fitted ?? plain;
  const canFit = !!measured && !!curve && curve.peaks.some((p) => p.hkl !== null);
  const runFit = () => {
    if (!measured || !curve) return;
    const h = Number(fwhm) > 0 ? Number(fwhm) : 0.1;
    setShowFit(true);
    // The curve's line intensities are m|F|²·Lp (largest 100); the fit wants m|F|² and applies Lp itself.
    const lines = curve.peaks.map((p) => ({ d: p.d, hkl: p.hkl, strength: p.intensity / lorentzPolarization(p.twoTheta, radiation) }));
    void store().run(fitKey, 'diffraction', {
      kind: 'fit',
      measured: measured.data,
      lines,
      options: { wavelength: curve.wavelength, wavelength2: curve.wavelength2, ratio2: curve.ratio2, radiation, profile: { U: 0, V: 0, W: h * h, eta: 0.5 }, nBackground: 4, refineLattice: true },
    });
  };

  const loadText = (name: string, text: string, from: { file?: File; datasetId?: string }) => {
    setKeepState({});
    try {
      setMeasured({ name, data: readMeasured(text), ...from });
      setMeasErr(null);
    } catch (e) {
      setMeasured(null);
      setMeasErr(`${name}: ${(e as Error).message}`);
    }
  };

  const keepInProject = async (file: File) => {
    if (!target) return;
    setKeepState({ busy: true });
    const fd = new FormData();
    fd.set('file', file);
    fd.set('kind', 'pattern');
    try {
      // 201: stored at once; 202: the parse waits for a worker, followed here with its progress.
      const d = await uploadDatasetNow(target.projectId, fd, (j) => setKeepState({ busy: true, progress: jobProgressText(j), fraction: j.progress }));
      const ref: DatasetRef = { id: String(d.id), name: d.filename ?? file.name, url: d.downloadUrl ?? '' };
      target.onStored(ref);
      setMeasured((m) => (m && m.file === file ? { name: m.name, data: m.data, datasetId: ref.id } : m));
      setKeepState({ ok: `${ref.name} is now a dataset of this project.` });
    } catch (e) {
      const network = e instanceof TypeError;
      setKeepState({ error: network ? 'The server could not be reached; nothing was stored.' : `${(e as Error).message}${/nothing was stored/.test((e as Error).message) ? '' : ' Nothing was stored.'}` });
    }
  };

  return (
    <div className="flex h-full min-h-0 flex-col gap-2">
      <div className="flex gap-1" role="tablist" aria-label="Diffraction">
        {(['zone', 'powder'] as const).map((k) => (
          <button key={k} role="tab" aria-selected={sub === k} type="button" onClick={() => setSub(k)} className={`rounded-md px-3 py-1 text-sm ${sub === k ? 'bg-ink text-paper' : 'border border-rule bg-card hover:border-tide'}`}>
            {k === 'zone' ? 'Zone-axis pattern' : 'Powder pattern'}
          </button>
        ))}
      </div>
      {sub === 'zone' ? (
        <>
          <form
            className="flex flex-wrap items-end gap-3"
            onSubmit={(e) => {
              e.preventDefault();
              if (!zoneCheck.success) return;
              void store().run(zoneKey, 'diffraction', { kind: 'zone', structure, axis: zoneSettings.axis, qmax: Number(qmax), slab: 0, radiation });
            }}
          >
            <div>
              <label htmlFor="zone-axis" className="block text-xs text-ink-soft">
                Zone axis (5, 3, 2 or u,v,w)
              </label>
              <input id="zone-axis" className={`${input} w-28 font-mono`} value={axis} onChange={(e) => setAxis(e.target.value)} aria-invalid={zoneErr.has('axis')} />
              {zoneErr.get('axis') ? <p className="max-w-56 text-xs text-clay">{zoneErr.get('axis')}</p> : null}
            </div>
            <div>
              <label htmlFor="zone-qmax" className="block text-xs text-ink-soft">
                |Q| up to (Å⁻¹)
              </label>
              <input id="zone-qmax" className={`${input} w-20 font-mono`} value={qmax} onChange={(e) => setQmax(e.target.value)} aria-invalid={zoneErr.has('qmax')} />
              {zoneErr.get('qmax') ? <p className="max-w-56 text-xs text-clay">{zoneErr.get('qmax')}</p> : null}
            </div>
            <div>
              <label htmlFor="zone-rad" className="block text-xs text-ink-soft">
                Radiation
              </label>
              <select id="zone-rad" className={input} value={radiation} onChange={(e) => setRadiation(e.target.value as DiffractionForm['radiation'])}>
                <option value="xray">X-ray</option>
                <option value="neutron">Neutron</option>
                <option value="electron">Electron</option>
              </select>
            </div>
            <button type="submit" className={btn} disabled={!zoneCheck.success || zone.running}>
              Compute pattern
            </button>
            <div className="min-w-48 flex-1">
              <Progress label="Zone axis" running={zone.running} stage={zone.stage} fraction={zone.fraction} startedAt={zone.startedAt} onCancel={zone.cancel} />
            </div>
          </form>
          {zone.error ? <p className="text-sm text-clay">{zone.error.message}</p> : null}
          <div className="min-h-0 flex-1">{zone.result ? <ZonePattern result={zone.result} fileBase={fileBase} /> : <p className="text-sm text-ink-soft">Choose an axis and compute the pattern.</p>}</div>
        </>
      ) : (
        <div className="min-h-0 flex-1 space-y-2 overflow-y-auto">
          <form
            className="flex flex-wrap items-end gap-3"
            onSubmit={(e) => {
              e.preventDefault();
              if (lambda === null || !powderCheck.success || fwhmErr || dMinErr) return;
              const p = powderCheck.data;
              void store().run(powderKey, 'diffraction', { kind: 'powder', structure, wavelength: lambda, radiation, twoThetaMin: p.twoThetaMin, twoThetaMax: p.twoThetaMax, step: p.profile.step, fwhm: Number(fwhm), wavelength2: ka2?.wavelength, ratio2: ka2?.ratio, dMin });
            }}
          >
            <div>
              <label htmlFor="pw-wl" className="block text-xs text-ink-soft">
                Wavelength (line name or Å)
              </label>
              <input id="pw-wl" className={`${input} w-28 font-mono`} value={wl} onChange={(e) => setWl(e.target.value)} aria-invalid={!!wlErr} />
              {wlErr ? <p className="max-w-56 text-xs text-clay">{wlErr}</p> : null}
            </div>
            <div>
              <span className="block text-xs text-ink-soft">2θ from – to (°)</span>
              <input aria-label="2θ start in degrees" className={`${input} w-16 font-mono`} value={tt0} onChange={(e) => setTt0(e.target.value)} aria-invalid={powderErr.has('twoThetaMin')} />
              <input aria-label="2θ end in degrees" className={`${input} ml-1 w-16 font-mono`} value={tt1} onChange={(e) => setTt1(e.target.value)} aria-invalid={powderErr.has('twoThetaMax')} />
              {rangeErr.map((m) => (
                <p key={m} className="max-w-56 text-xs text-clay">
                  {m}
                </p>
              ))}
            </div>
            <div>
              <label htmlFor="pw-fwhm" className="block text-xs text-ink-soft">
                Peak width FWHM (°)
              </label>
              <input id="pw-fwhm" className={`${input} w-20 font-mono`} value={fwhm} onChange={(e) => setFwhm(e.target.value)} aria-invalid={!!fwhmErr} />
              {fwhmErr ? <p className="text-xs text-clay">{fwhmErr}</p> : null}
            </div>
            <div>
              <label htmlFor="pw-rad" className="block text-xs text-ink-soft">
                Radiation
              </label>
              <select id="pw-rad" className={input} value={radiation} onChange={(e) => setRadiation(e.target.value as DiffractionForm['radiation'])}>
                <option value="xray">X-ray</option>
                <option value="neutron">Neutron</option>
                <option value="electron">Electron</option>
              </select>
            </div>
            {radiation === 'electron' ? (
              <div>
                <label htmlFor="pw-dmin" className="block text-xs text-ink-soft">
                  d min (Å, default 0.5)
                </label>
                <input id="pw-dmin" className={`${input} w-20 font-mono`} value={dMinText} onChange={(e) => setDMinText(e.target.value)} aria-invalid={!!dMinErr} placeholder="0.5" />
                {dMinErr ? <p className="text-xs text-clay">{dMinErr}</p> : null}
              </div>
            ) : null}
            {line2 ? (
              <label className="flex items-center gap-1 text-xs text-ink-soft" title={`Kα2 at ${line2.wavelength} Å with ${line2.ratio} of the Kα1 intensity`}>
                <input type="checkbox" checked={withKa2} onChange={(e) => setWithKa2(e.target.checked)} /> with Kα2
              </label>
            ) : null}
            <button type="submit" className={btn} disabled={lambda === null || !powderCheck.success || !!fwhmErr || !!dMinErr || powder.running}>
              Compute powder pattern
            </button>
          </form>
          <div className="flex flex-wrap items-center gap-3 rounded-md border border-rule bg-card p-2 text-sm">
            <span className="font-medium">Measured pattern to compare</span>
            <label className="cursor-pointer rounded border border-tide px-2 py-0.5 text-xs text-tide hover:bg-tide-pale has-[:focus-visible]:outline-2">
              Open a file (2θ, intensity[, σ])
              <input
                type="file"
                accept=".xy,.dat,.txt,.csv,.xye"
                className="sr-only"
                aria-label="Measured pattern file"
                onChange={(e) => {
                  const f = e.target.files?.[0];
                  e.target.value = '';
                  if (f) void f.text().then((t) => loadText(f.name, t, { file: f }));
                }}
              />
            </label>
            {datasets.length ? (
              <select
                aria-label="Dataset from this project"
                className={input}
                value={measured?.datasetId ?? ''}
                onChange={(e) => {
                  const d = datasets.find((x) => x.id === e.target.value);
                  if (!d) return setMeasured(null);
                  void fetch(d.url)
                    .then((r) => (r.ok ? r.text() : Promise.reject(new Error(`${d.name}: could not be loaded (HTTP ${r.status})`))))
                    .then(
                      (t) => loadText(d.name, t, { datasetId: d.id }),
                      (err: Error) => {
                        setMeasured(null);
                        setMeasErr(err.message);
                      },
                    );
                }}
              >
                <option value="">…or a dataset of this project</option>
                {datasets.map((d) => (
                  <option key={d.id} value={d.id}>
                    {d.name}
                  </option>
                ))}
              </select>
            ) : null}
            {measured ? (
              <span className="min-w-0 break-all text-xs text-ink-soft">
                {measured.name}: {measured.data.x.length} points{measured.data.axis !== '2theta' ? ` (read as ${measured.data.axis === 'q' ? '|Q|' : 'd'}, converted to 2θ)` : ''}
                <button type="button" className="ml-2 text-clay underline" onClick={() => setMeasured(null)}>
                  remove
                </button>
              </span>
            ) : null}
            {measured?.file && target?.canEdit ? (
              <button type="button" disabled={keepState.busy} className="rounded border border-rule px-2 py-0.5 text-xs hover:border-tide disabled:opacity-50" onClick={() => void keepInProject(measured.file!)}>
                {keepState.busy ? 'Storing…' : 'Keep in this project'}
              </button>
            ) : null}
            {keepState.busy && keepState.progress ? (
              <span className="flex items-center gap-1 text-xs text-ink-soft" role="status" data-testid="keep-progress">
                queued on the server: {keepState.progress}
                <span className="inline-block h-1.5 w-16 overflow-hidden rounded bg-tide-pale" role="progressbar" aria-label="Reading the file" aria-valuemin={0} aria-valuemax={100} aria-valuenow={Math.round(100 * (keepState.fraction ?? 0))}>
                  <span className="block h-full bg-tide" style={{ width: `${Math.max(5, 100 * (keepState.fraction ?? 0))}%` }} />
                </span>
              </span>
            ) : null}
            {keepState.ok ? <span className="text-xs text-tide" role="status">{keepState.ok}</span> : null}
            {keepState.error ? <span className="text-xs text-clay" role="alert">{keepState.error}</span> : null}
            {measErr ? (
              <span className="text-xs text-clay" role="alert">
                {measErr}
              </span>
            ) : null}
            {canFit ? (
              <button type="button" disabled={fit.running} className="rounded border border-tide px-2 py-0.5 text-xs text-tide hover:bg-tide-pale disabled:opacity-50" onClick={runFit} data-testid="fit-button">
                {fit.running ? 'Fitting…' : fitted ? 'Fit again' : 'Fit zero shift, background, widths and cell'}
              </button>
            ) : null}
            {fit.running ? (
              <button type="button" className="text-xs text-clay underline" onClick={fit.cancel}>
                cancel the fit
              </button>
            ) : null}
            {fit.result && !fit.running ? (
              <button type="button" className="text-xs text-ink-soft underline" onClick={() => setShowFit(!showFit)}>
                {showFit ? 'show the unfitted overlay' : 'show the fit'}
              </button>
            ) : null}
            {fit.error ? (
              <span className="basis-full text-xs text-clay" role="alert">
                Fit failed: {fit.error.message}
              </span>
            ) : null}
            {compareErr ? (
              <span className="basis-full text-xs text-clay" role="alert" data-testid="compare-error">
                {compareErr}
              </span>
            ) : null}
          </div>
          {powder.error ? <p className="text-sm text-clay">{powder.error.message}</p> : null}
          {powder.result?.warnings?.length ? (
            <ul className="text-xs text-clay" role="alert">
              {powder.result.warnings.map((w) => (
                <li key={w}>{w}</li>
              ))}
            </ul>
          ) : null}
          {/* The progress strip lies over the top of the plot while a profile is computed, so it leaves no empty
              band above the plot the rest of the time (and lets clicks through when idle). */}
          <div className="relative">
            <div className={`absolute inset-x-0 top-0 z-10 rounded-md ${powder.running ? 'bg-card/95 px-2' : 'pointer-events-none'}`}>
              <Progress label="Powder" running={powder.running} stage={powder.stage} fraction={powder.fraction} startedAt={powder.startedAt} onCancel={powder.cancel} />
            </div>
            {powder.result ? <PowderPlot curve={powder.result} comparison={comparison} measuredName={measured?.name} fileBase={fileBase} /> : <p className="py-2 text-sm text-ink-soft">Compute the powder pattern; open a measured one to lay over it.</p>}
          </div>
        </div>
      )}
    </div>
  );
}

/** The comparison's own reason, with both 2θ ranges when the measured and simulated ones do not overlap. */
function compareMessage(reason: string, m: MeasuredPattern, simTwoTheta: ArrayLike<number>): string {
  const text = reason.replace(/^[a-z]+: /, '');
  if (!/range/.test(reason) || m.axis !== '2theta') return `Cannot compare: ${text}.`;
  const s0 = simTwoTheta[0];
  const s1 = simTwoTheta[simTwoTheta.length - 1];
  return `Cannot compare: ${text}. The measured pattern covers 2θ ${m.x[0].toFixed(2)}–${m.x[m.x.length - 1].toFixed(2)}°, the simulation ${s0.toFixed(2)}–${s1.toFixed(2)}°; set the 2θ range to overlap and compute again.`;
}
