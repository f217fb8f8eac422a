'use client';
/**
 * The project's queued work: a progress bar and Cancel for every waiting or running job, the finished
 * ones below (exports to download, errors in plain words), a sweep form and a sweep's ranked points.
 */
import { useState } from 'react';
import useSWR from 'swr';
import { fetcher, getBlob, send } from '@/components/ui/api';
import { quietButtonClass } from '@/components/ui/buttons';
import { Notice } from '@/components/ui/messages';
import { saveAs } from 'file-saver';
import { isActive, type JobInfo } from './jobs-client';
import { SweepForm, SweepTable } from './JobsSweep';
import type { DatasetRef } from './DiffractionPanel';

const KIND_NAMES: Record<string, string> = {
  export: 'Export',
  diffraction: 'Powder pattern (server)',
  parse: 'Reading an upload',
  index: 'Peak search for indexing',
  sweep: 'Sweep',
  point: 'Sweep point',
};

function what(j: JobInfo): string {
  const i = j.input as Record<string, unknown>;
  if (j.kind === 'export') return `revision ${i.revision} as ${i.format}`;
  if (j.kind === 'parse') return String(i.filename ?? '');
  if (j.kind === 'sweep') return `${j.total ?? '?'} points over ${((i.axes as { path: string }[]) ?? []).map((a) => a.path).join(' × ')}`;
  if (j.kind === 'index') return `dataset ${i.dataset}`;
  if (j.kind === 'diffraction') return `revision ${i.revision}`;
  return '';
}

function took(j: JobInfo): string {
  if (!j.startedAt) return '—';
  const end = j.finishedAt ? Date.parse(j.finishedAt) : Date.now();
  return `${((end - Date.parse(j.startedAt)) / 1000).toFixed(1)} s`;
}

function Bar({ job, onCancel }: { job: JobInfo; onCancel: () => void }) {
  const pct = Math.round(100 * job.progress);
  return (
    <li className="flex items-center gap-3 rounded-md border border-rule px-3 py-2" data-testid="active-job">
      <div className="min-w-0 flex-1">
        <div className="flex justify-between gap-2 text-xs">
          <span className="truncate">
            <span className="font-medium text-ink">{KIND_NAMES[job.kind] ?? job.kind}</span> <span className="text-ink-soft">{what(job)}</span>
          </span>
          <span className="shrink-0 font-mono text-ink-soft">{job.state === 'queued' ? 'waiting' : `${job.stage ?? 'running'} · ${pct} %`}</span>
        </div>
        <div className="mt-1 h-1.5 overflow-hidden rounded bg-tide-pale" role="progressbar" aria-label={`${KIND_NAMES[job.kind] ?? job.kind} ${job.id}`} aria-valuemin={0} aria-valuemax={100} aria-valuenow={pct}>
          <div className={`h-full transition-[width] ${job.state === 'queued' ? 'bg-rule' : 'bg-tide'}`} style={{ width: `${Math.max(3, pct)}%` }} />
        </div>
      </div>
      <button type="button" onClick={onCancel} className="rounded-md border border-clay px-2 py-1 text-xs text-clay hover:bg-clay-pale">
        Cancel
      </button>
    </li>
  );
}

export function JobsPanel({ projectId, headRevision, datasets, canEdit }: { projectId: string; headRevision: string | null; datasets: DatasetRef[]; canEdit: boolean }) {
  const url = `/api/projects/${projectId}/jobs?pageSize=50`;
  const { data, error, mutate } = useSWR<{ items: JobInfo[] }>(url, fetcher, {
    refreshInterval: (d) => (d?.items.some(isActive) ? 1000 : 5000),
  });
  const [message, setMessage] = useState<{ tone: 'ok' | 'error'; text: string } | null>(null);
  const [open, setOpen] = useState<number | null>(null);
  const jobs = data?.items ?? [];
  const active = jobs.filter(isActive);
  const finished = jobs.filter((j) => !isActive(j));

  const act = async (fn: () => Promise<unknown>, ok?: string) => {
    setMessage(null);
    try {
      await fn();
      if (ok) setMessage({ tone: 'ok', text: ok });
    } catch (e) {
      setMessage({ tone: 'error', text: e instanceof Error ? e.message : String(e) });
    }
    void mutate();
  };
  const cancel = (j: JobInfo) => act(() => send('DELETE', j.url));
  const start = (body: Record<string, unknown>) => act(() => send('POST', `/api/projects/${projectId}/jobs`, body), 'Queued.');

  return (
    <div className="flex h-full flex-col gap-3 overflow-y-auto p-1 text-sm">
      <div className="flex flex-wrap items-center gap-2">
        <h2 className="mr-auto font-medium text-ink">Jobs</h2>
        {headRevision ? (
          <button type="button" className={quietButtonClass} onClick={() => void start({ kind: 'diffraction', revision: Number(headRevision) })}>
            Powder pattern of the saved revision on the server
          </button>
        ) : null}
      </div>
      {message ? <Notice tone={message.tone}>{message.text}</Notice> : null}
      {error ? <Notice tone="error">{error.message}</Notice> : null}

      <section aria-label="Waiting and running">
        <h3 className="mb-1 text-xs font-medium uppercase tracking-wide text-ink-soft">Waiting and running</h3>
        {active.length ? (
          <ul className="space-y-1.5">
            {active.map((j) => (
              <Bar key={j.id} job={j} onCancel={() => void cancel(j)} />
            ))}
          </ul>
        ) : (
          <p className="text-ink-soft">Nothing queued. Exports, uploads, server powder patterns and sweeps run here, on the queue workers.</p>
        )}
      </section>

      {canEdit && headRevision ? <SweepForm datasets={datasets} onStart={(body) => start({ kind: 'sweep', revision: Number(headRevision), ...body })} /> : null}

      <section aria-label="Finished">
        <h3 className="mb-1 text-xs font-medium uppercase tracking-wide text-ink-soft">Finished</h3>
        {finished.length ? (
          <table className="w-full text-left text-xs">
            <thead className="text-ink-soft">
              <tr>
                <th className="py-1 font-normal">Job</th>
                <th className="font-normal">What</th>
                <th className="font-normal">Outcome</th>
                <th className="font-normal">Took</th>
                <th className="font-normal">By</th>
                <th />
              </tr>
            </thead>
            <tbody>
              {finished.map((j) => (
                <tr key={j.id} className="border-t border-rule align-top">
                  <td className="py-1.5 pr-2">{KIND_NAMES[j.kind] ?? j.kind}</td>
                  <td className="pr-2 text-ink-soft">{what(j)}</td>
                  <td className="pr-2">
                    {j.state === 'done' ? <span className="text-tide-deep">{outcome(j)}</span> : j.state === 'cancelled' ? <span className="text-ink-soft">cancelled</span> : <span className="text-clay">{j.error?.message ?? 'failed'}</span>}
                  </td>
                  <td className="pr-2 font-mono">{took(j)}</td>
                  <td className="pr-2 text-ink-soft">{j.createdBy ?? '—'}</td>
                  <td className="text-right">
                    {j.kind === 'export' && j.state === 'done' ? (
                      <button type="button" className="text-tide underline" onClick={() => void act(async () => saveAs(await getBlob(`/api/exports/${(j.result as { export: number }).export}/download`), `export-${(j.result as { export: number }).export}.${String(j.input.format)}`))}>
                        Download
                      </button>
                    ) : j.kind === 'sweep' && j.state !== 'cancelled' ? (
                      <button type="button" className="text-tide underline" onClick={() => setOpen(open === j.id ? null : j.id)}>
                        {open === j.id ? 'Hide points' : 'Ranked points'}
                      </button>
                    ) : null}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        ) : (
          <p className="text-ink-soft">No finished jobs yet.</p>
        )}
      </section>
      {open !== null ? <SweepTable jobId={open} canEdit={canEdit} onSaved={(n) => setMessage({ tone: 'ok', text: `Saved as revision ${n}.` })} /> : null}
      {active.filter((j) => j.kind === 'sweep').map((j) => (open === j.id ? null : <SweepTable key={j.id} jobId={j.id} canEdit={false} live />))}
    </div>
  );
}

function outcome(j: JobInfo): string {
  const r = j.result as Record<string, unknown> | null;
  if (!r) return 'done';
  if (j.kind === 'export') return `${(Number(r.size ?? 0) / 1024).toFixed(1)} KiB stored`;
  if (j.kind === 'sweep') {
    const best = r.best as { point: number; rwp: number } | null;
    return best ? `best R_wp ${(100 * best.rwp).toFixed(2)} % (point ${best.point})${Number(r.failedPoints) ? `, ${r.failedPoints} points failed` : ''}` : 'no point could be compared';
  }
  if (j.kind === 'diffraction') return `${(r.peaks as unknown[]).length} reflections, ${r.atoms} atoms`;
  if (j.kind === 'index') return typeof r.aR === 'number' ? `aR ${r.aR.toFixed(4)} ± ${Number(r.aRSigma).toPrecision(2)} Å, zero shift ${Number(r.zeroShift).toFixed(3)}°, ${r.indexed} of ${(r.peaks as unknown[]).length} peaks indexed` : `${(r.peaks as unknown[]).length} peaks found`;
  if (j.kind === 'parse') return `dataset ${r.dataset}`;
  return 'done';
}
