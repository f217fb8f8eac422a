'use client';
/**
 * The workspace: the model on the left (every parameter, checked as you type, with the expected size), the
 * cut in the middle (3D, tiling, perpendicular space, diffraction, series), and saving, forking and
 * downloads along the top. All heavy work runs in the engine worker; the page only draws.
 */
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { useRouter } from 'next/navigation';
import { LazyStructureViewer } from '@/components/viewer/LazyStructureViewer';
import { ModelPanel, useValidation } from '@/components/forms/ModelPanel';
import { icoMode, validationInput, type Params } from '@/components/forms/families';
import { PerpView } from '@/components/perp/PerpView';
import { TilingView } from '@/components/tiling2d/TilingView';
import { SeriesTable } from '@/components/plots/SeriesTable';
import { DiffractionPanel, type DatasetRef } from './DiffractionPanel';
import { IndexingPanel } from './IndexingPanel';
import { Progress } from './Progress';
import { ViewBoundary } from './ViewBoundary';
import { useJob } from './useJob';
import { engineMessage, overCapReason } from './cut-limits';
import { FORMAT_NAMES, formatUnavailable, saveStructure, slug, type StructureFormat } from './downloads';
import { SaveDialog, postRevision, type RevisionRef } from './SavePanel';
import { CheckPanel } from './CheckPanel';
import { JobsPanel } from './JobsPanel';
import { forkProject as postFork } from '@/components/projects/fork';

export interface WorkspaceProps {
  project?: { id: string; name: string; canEdit: boolean };
  initialParams: Params;
  head?: RevisionRef | null;
  datasets?: DatasetRef[];
  /** Lab page: no saving or forking. */
  lab?: boolean;
}

type View = '3d' | 'tiling' | 'perp' | 'diffraction' | 'series' | 'jobs';

const VIEW_NAMES: Record<View, string> = { '3d': '3D model', tiling: 'Tiling', perp: 'Perpendicular space', diffraction: 'Diffraction', series: 'Series', jobs: 'Jobs' };

const stable = (v: unknown) => JSON.stringify(v);

export function Workspace({ project, initialParams, head: initialHead = null, datasets, lab }: WorkspaceProps) {
  const router = useRouter();
  const [params, setParams] = useState<Params>(initialParams);
  const [saved, setSaved] = useState<Params>(initialParams);
  const [head, setHead] = useState<RevisionRef | null>(initialHead);
  const [view, setView] = useState<View>('3d');
  // The model panel folds away to a narrow strip so the view can take the width.
  const [modelOpen, setModelOpen] = useState(true);
  const [saveOpen, setSaveOpen] = useState(false);
  const [saveBusy, setSaveBusy] = useState(false);
  const [saveError, setSaveError] = useState<string | null>(null);
  const [conflict, setConflict] = useState<RevisionRef | null>(null);
  const [forkError, setForkError] = useState<string | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const [datasetList, setDatasetList] = useState<DatasetRef[]>(datasets ?? []);
  const cut = useJob<'generate'>('cut');
  const [cutFor, setCutFor] = useState<string | null>(null);
  const estimate = useJob<'estimate'>('estimate');
  const seriesJob = useJob<'series'>('series');
  const { ok, error: invalid } = useValidation(params);
  const overCap = overCapReason(params, ok && estimate.result ? estimate.result.estimate : null);
  const withClusters = 'decoration' in params && !!(params.decoration as { clusters?: unknown[] } | undefined)?.clusters?.length;
  const dirty = stable(params) !== stable(saved);
  const structure = cut.result?.structure ?? null;
  const summary = cut.result?.summary ?? null;
  const stale = cut.result ? cutFor !== stable(params) : false;
  const dim = structure?.dim ?? (params.family === 'icosahedral' || params.family === 'decagonal' ? 3 : params.family === 'fibonacci' ? 1 : 2);
  const fileBase = useMemo(() => {
    const order = typeof params.order === 'string' ? params.order.replace('/', '-') : params.mode === 'patch' ? `r${params.radius}` : '';
    return slug(`${project?.name ?? params.family} ${order}`);
  }, [params, project]);

  // Expected size, quietly, a moment after each valid edit.
  const startEstimate = estimate.start;
  useEffect(() => {
    if (!ok) return;
    const t = setTimeout(() => void startEstimate({ kind: 'estimate', params: validationInput(params) }), 250);
    return () => clearTimeout(t);
  }, [params, ok, startEstimate]);

  const generate = useCallback(
    (p: Params = params) => {
      setCutFor(stable(p));
      void cut.start({ kind: 'generate', params: validationInput(p) });
    },
    [cut, params],
  );

  // Unsaved edits: warn when leaving the page, and when following a link inside the app.
  useEffect(() => {
    if (!dirty || lab) return;
    const before = (e: BeforeUnloadEvent) => {
      e.preventDefault();
      e.returnValue = '';
    };
    const click = (e: MouseEvent) => {
      const a = (e.target as HTMLElement | null)?.closest?.('a[href]') as HTMLAnchorElement | null;
      if (!a || a.target === '_blank' || a.hasAttribute('download')) return;
      if (!window.confirm('You have edits that are not saved as a revision. Leave the workspace anyway?')) {
        e.preventDefault();
        e.stopPropagation();
      }
    };
    window.addEventListener('beforeunload', before);
    document.addEventListener('click', click, true);
    return () => {
      window.removeEventListener('beforeunload', before);
      document.removeEventListener('click', click, true);
    };
  }, [dirty, lab]);

  // Views that make sense for this cut.
  const views: View[] = useMemo(() => {
    const v: View[] = [];
    if (dim === 3) v.push('3d');
    else v.push('tiling');
    v.push('perp', 'diffraction');
    if (params.family === 'icosahedral') v.push('series');
    if (project && !lab) v.push('jobs');
    return v;
  }, [dim, params.family, project, lab]);
  const shownView = views.includes(view) ? view : views[0];

  const save = async (message: string, overBase?: string) => {
    if (!project) return;
    setSaveBusy(true);
    setSaveError(null);
    const base = overBase ?? head?.id ?? null;
    const r = await postRevision(project.id, params, message, base);
    setSaveBusy(false);
    if (r.conflict) {
      setConflict(r.conflict);
      return;
    }
    if (r.error) {
      setSaveError(r.error + (r.fieldErrors && Object.keys(r.fieldErrors).length ? ` ${Object.entries(r.fieldErrors).map(([k, v]) => `${k}: ${v}`).join('; ')}` : ''));
      return;
    }
    setConflict(null);
    setSaved(params);
    setHead(r.saved ?? head);
    setSaveOpen(false);
    setNotice(`Saved revision ${r.saved?.number ?? r.saved?.id ?? ''}.`);
    router.refresh();
  };

  const fork = async () => {
    if (!project) return;
    setForkError(null);
    if (dirty && !window.confirm('Your unsaved edits stay here and are not carried into the fork. Fork the saved model?')) return;
    const r = await postFork(project.id);
    if (r.error) setForkError(r.error);
    else if (r.id) {
      setSaved(params);
      router.push(`/projects/${r.id}/workspace`);
    }
  };

  const [format, setFormat] = useState<StructureFormat>('xyz');
  const formatBlock = structure ? formatUnavailable(structure, format) : 'generate a cut first';

  return (
    // The workspace is a tool, not a page of text: it takes the window’s width (about 20 px from each edge) rather
    // than the site's reading column, centred on that column so it lines up however wide the window is.
    <div className="ml-[calc(50%-50vw+1.25rem)] flex h-[calc(100vh-9.5rem)] min-h-[600px] w-[calc(100vw-2.5rem)] flex-col gap-3">
      {/* Top bar: where we are, save, fork, download. */}
      <div className="flex flex-wrap items-center gap-3 rounded-lg border border-rule bg-card px-3 py-2">
        <div className="min-w-0">
          <h1 className="truncate text-base font-semibold">{project?.name ?? 'Model lab'}</h1>
          <p className="text-xs text-ink-soft">
            {head ? `Revision ${head.number ?? head.id}${head.message ? ` — ${head.message}` : ''}` : lab ? 'Not saved anywhere: a scratch model' : 'No saved revision yet'}
            {dirty && !lab ? <span className="ml-2 rounded bg-brass-pale px-1.5 text-brass">unsaved edits</span> : null}
          </p>
        </div>
        {/* The Check step's one line sits beside the downloads it guards, so the view below keeps its height. */}
        <CheckPanel structure={structure} />
        <div className="ml-auto flex flex-wrap items-center gap-2">
          <label htmlFor="dl-format" className="sr-only">
            File format
          </label>
          <select id="dl-format" className="rounded-md border border-rule bg-card px-2 py-1 text-sm" value={format} onChange={(e) => setFormat(e.target.value as StructureFormat)}>
            {(Object.keys(FORMAT_NAMES) as StructureFormat[]).map((f) => (
              <option key={f} value={f}>
                {FORMAT_NAMES[f]}
              </option>
            ))}
          </select>
          <button type="button" className="rounded-md border border-tide px-3 py-1 text-sm text-tide hover:bg-tide-pale disabled:opacity-40" disabled={!!formatBlock} title={formatBlock ?? undefined} onClick={() => structure && saveStructure(structure, format, fileBase)}>
            Download
          </button>
          {!lab && project ? (
            <>
              <button type="button" className="rounded-md border border-rule px-3 py-1 text-sm hover:border-tide" onClick={() => void fork()}>
                Fork
              </button>
              <div className="relative">
                <button
                  type="button"
                  disabled={!project.canEdit || !ok}
                  title={!project.canEdit ? 'You can view this project but not save to it; fork it to make your own' : !ok ? 'Fix the marked fields first' : undefined}
                  className="rounded-md bg-tide px-3 py-1 text-sm font-medium text-white hover:bg-tide-deep disabled:opacity-50"
                  onClick={() => {
                    setSaveOpen((o) => !o);
                    setNotice(null);
                  }}
                  aria-expanded={saveOpen}
                >
                  Save revision…
                </button>
                <SaveDialog
                  open={saveOpen}
                  busy={saveBusy}
                  error={saveError}
                  conflict={conflict}
                  onClose={() => setSaveOpen(false)}
                  onSave={(m, base) => void save(m, base)}
                  onTakeTheirs={() => {
                    if (conflict?.params && typeof conflict.params === 'object') {
                      setParams(conflict.params as Params);
                      setSaved(conflict.params as Params);
                    }
                    setHead(conflict);
                    setConflict(null);
                    setSaveOpen(false);
                  }}
                />
              </div>
            </>
          ) : null}
        </div>
        {notice || forkError || (structure && formatBlock && format === 'cif') ? (
          <p className={`basis-full text-xs ${forkError ? 'text-clay' : 'text-ink-soft'}`} role="status">
            {forkError ?? notice ?? formatBlock}
          </p>
        ) : null}
      </div>

      <div className={`grid min-h-0 flex-1 gap-3 ${modelOpen ? 'lg:grid-cols-[320px_minmax(0,1fr)]' : 'grid-cols-[2.25rem_minmax(0,1fr)]'}`}>
        {!modelOpen ? (
          <button
            type="button"
            aria-expanded={false}
            aria-controls="model-panel"
            onClick={() => setModelOpen(true)}
            aria-label="Show the model panel"
            title="Show the model panel"
            className="flex min-h-0 flex-col items-center gap-2 rounded-lg border border-rule bg-card py-2 text-sm font-semibold text-ink hover:border-tide hover:text-tide"
          >
            <span aria-hidden="true">»</span>
            <span className="[writing-mode:vertical-rl]">Model</span>
          </button>
        ) : null}
        {/* Model panel: folded, it stays mounted (hidden) so nothing typed in it is lost. */}
        <section id="model-panel" aria-labelledby="model-title" hidden={!modelOpen} className="flex min-h-0 flex-col rounded-lg border border-rule bg-card">
          <div className="flex items-center justify-between border-b border-rule px-3 py-2">
            <h2 id="model-title" className="text-sm font-semibold">
              Model
            </h2>
            <button
              type="button"
              aria-expanded={true}
              aria-controls="model-panel"
              onClick={() => setModelOpen(false)}
              aria-label="Hide the model panel"
              title="Fold the model panel away to give the view more room"
              className="rounded-md border border-rule px-2 py-0.5 text-xs text-ink-soft hover:border-tide hover:text-tide"
            >
              <span aria-hidden="true">«</span> Hide
            </button>
          </div>
          <div className="min-h-0 flex-1 overflow-y-auto px-3 py-2">
            <ModelPanel params={params} onChange={setParams} engineErrors={cut.error?.field && !cut.running ? new Map([[cut.error.field, cut.error.message.replace(/^[^:]+: /, '')]]) : undefined} />
          </div>
          <div className="border-t border-rule px-3 py-2">
            <div className="flex items-baseline justify-between text-xs">
              {/* With clusters the estimate is each class's density times the volume, every cluster atom counted
                  before shared atoms merge: in a small cell it can be well off either way (the cut counts exactly). */}
              <span
                className="text-ink-soft"
                title={withClusters ? 'Each site class’s density times the volume, and every cluster atom counted before atoms that neighbouring clusters share are merged. In a small cell this can be well off either way; the cut gives the exact count.' : undefined}
              >
                {withClusters ? 'Atoms, rough estimate before merging' : 'Expected points'}
              </span>
              <span className="font-mono" data-testid="estimate">
                {!ok ? '—' : estimate.result ? `${withClusters ? '≈ ' : ''}${Math.round(estimate.result.estimate).toLocaleString('en-US')}` : '…'}
              </span>
            </div>
            {invalid ? <p className="text-xs text-clay">{invalid.issues.length === 1 ? '1 field needs attention' : `${invalid.issues.length} fields need attention`}</p> : <p className="text-xs text-transparent">.</p>}
            {overCap ? <p className="text-xs text-clay" data-testid="over-cap">{overCap}</p> : null}
            <div className="mt-1 flex gap-2">
              <button type="button" disabled={!ok || cut.running || !!overCap} title={overCap ?? undefined} onClick={() => generate()} className="flex-1 rounded-md bg-tide px-3 py-1.5 text-sm font-semibold text-white hover:bg-tide-deep disabled:opacity-50">
                {structure && !stale ? 'Cut again' : 'Generate'}
              </button>
            </div>
            <Progress label="Cut" running={cut.running} stage={cut.stage} fraction={cut.fraction} startedAt={cut.startedAt} onCancel={cut.cancel} />
            {cut.error && !cut.running ? <p className="text-xs text-clay" role="alert">{engineMessage(params, cut.error)}</p> : null}
          </div>
        </section>

        {/* The cut */}
        <section aria-label="The cut" className="flex min-h-0 flex-col gap-2">
          <div className="flex flex-wrap items-center gap-2">
            <div role="tablist" aria-label="Views" className="flex gap-1">
              {views.map((v) => (
                <button
                  key={v}
                  type="button"
                  role="tab"
                  aria-selected={shownView === v}
                  onClick={() => setView(v)}
                  className={`rounded-md px-3 py-1 text-sm ${shownView === v ? 'bg-ink text-paper' : 'border border-rule bg-card hover:border-tide'}`}
                >
                  {VIEW_NAMES[v]}
                </button>
              ))}
            </div>
            <CutFacts summary={summary} stale={stale} ms={cut.ms} />
          </div>
          <div className="min-h-0 flex-1 rounded-lg border border-rule bg-card p-2">
            <ViewBoundary name={VIEW_NAMES[shownView]} resetKeys={[shownView, structure, seriesJob.result]}>
            {shownView === 'jobs' && project ? (
              <JobsPanel projectId={project.id} headRevision={head?.id ?? null} datasets={datasetList} canEdit={project.canEdit} />
            ) : shownView === 'series' ? (
              <div className="h-full overflow-y-auto">
                <div className="mb-2 flex items-center gap-2">
                  <button type="button" disabled={!ok || seriesJob.running} className="rounded-md bg-tide px-3 py-1 text-sm text-white disabled:opacity-50" onClick={() => void seriesJob.start({ kind: 'series', params: validationInput(params) })}>
                    Tabulate 1/1 … 21/13
                  </button>
                  <div className="flex-1">
                    <Progress label="Series" running={seriesJob.running} stage={seriesJob.stage} fraction={seriesJob.fraction} startedAt={seriesJob.startedAt} onCancel={seriesJob.cancel} />
                  </div>
                </div>
                {seriesJob.error ? <p className="text-sm text-clay">{seriesJob.error.message}</p> : null}
                {seriesJob.result ? (
                  <SeriesTable
                    rows={seriesJob.result.rows}
                    quasicrystalDensity={seriesJob.result.quasicrystalDensity}
                    current={icoMode(params) === 'approximant' ? String(params.order) : undefined}
                    fileBase={fileBase}
                    onPick={(order) => {
                      const next: Params = { ...params, mode: 'approximant', order };
                      delete next.radius;
                      delete next.centre;
                      setParams(next);
                      setView('3d');
                      generate(next);
                    }}
                  />
                ) : (
                  <p className="text-sm text-ink-soft">The series lists every cubic approximant of this model from 1/1 to 21/13: lattice constant, atoms per cell, density, composition and strain.</p>
                )}
              </div>
            ) : !structure ? (
              <div className="grid h-full place-items-center text-center text-sm text-ink-soft">
                <div>
                  <p className="font-medium text-ink">Nothing cut yet.</p>
                  <p>Set the model on the left and press Generate.</p>
                </div>
              </div>
            ) : shownView === '3d' ? (
              <LazyStructureViewer structure={structure} className="h-full" exposeTestHook />
            ) : shownView === 'tiling' ? (
              <TilingView structure={structure} fileBase={fileBase} />
            ) : shownView === 'perp' ? (
              <PerpView structure={structure} fileBase={fileBase} />
            ) : (
              <div className="flex h-full min-h-0 flex-col gap-2">
              <div className="min-h-0 flex-1">
              <DiffractionPanel
                structure={structure}
                fileBase={fileBase}
                modelKey={cutFor ?? undefined}
                datasets={datasetList}
                target={project && !lab ? { projectId: project.id, canEdit: project.canEdit, onStored: (d) => setDatasetList((l) => [d, ...l.filter((x) => x.id !== d.id)]) } : undefined}
              />
              </div>
              {params.family === 'icosahedral' ? (
                <div className="max-h-[55%] shrink-0 overflow-auto">
                <IndexingPanel scope={project && !lab ? project.id : 'scratch'} params={params as Record<string, unknown>} projectId={project && !lab ? project.id : undefined} canEdit={project?.canEdit} baseRevision={head?.id ?? null} onSaved={(next, rev) => { setParams(next as Params); setSaved(next as Params); setHead({ id: String(rev.id), number: rev.number }); router.refresh(); }} />
                </div>
              ) : null}
              </div>
            )}
            </ViewBoundary>
          </div>
        </section>
      </div>
    </div>
  );
}

function CutFacts({ summary, stale, ms }: { summary: { count: number; numberDensity?: number; massDensity?: number; formula?: string; composition?: { symbol: string }[]; cellLengths?: [number, number, number] } | null; stale: boolean; ms: number | null }) {
  // Undecorated tiling vertices carry species 0 (written X); say so instead of a formula "X1.0000".
  const bare = summary?.composition?.length === 1 && summary.composition[0].symbol === 'X';
  const ref = useRef<HTMLDivElement>(null);
  return (
    <div ref={ref} className="ml-auto flex min-h-6 flex-wrap items-center gap-x-4 text-xs text-ink-soft" aria-live="polite">
      {summary ? (
        <>
          <span>
            <span className="font-mono text-ink" data-testid="atom-count">
              {summary.count.toLocaleString('en-US')}
            </span>{' '}
            points
          </span>
          {summary.cellLengths ? <span>{cellText(summary.cellLengths)}</span> : null}
          {summary.numberDensity ? <span>{summary.numberDensity.toFixed(5)} atoms/Å³</span> : null}
          {summary.massDensity ? <span>{summary.massDensity.toFixed(3)} g/cm³</span> : null}
          {bare ? <span title="Decorate the model to give the points species">vertices only, no species</span> : summary.formula ? <span>{summary.formula}</span> : null}
          {ms !== null ? <span>{(ms / 1000).toFixed(2)} s</span> : null}
          {stale ? <span className="rounded bg-brass-pale px-1.5 text-brass">model changed since this cut</span> : null}
        </>
      ) : null}
    </div>
  );
}

/** a = … Å for a cubic cell, otherwise a, b, c (a decagonal approximant is orthorhombic). */
function cellText([a, b, c]: [number, number, number]): string {
  const same = (x: number, y: number) => Math.abs(x - y) < 1e-6 * Math.max(x, y);
  return same(a, b) && same(b, c) ? `a = ${a.toFixed(3)} Å` : `a, b, c = ${a.toFixed(3)}, ${b.toFixed(3)}, ${c.toFixed(3)} Å`;
}
