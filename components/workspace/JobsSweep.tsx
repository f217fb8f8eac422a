'use client';
/** A sweep: the grid form (paths into the params and their values) and the ranked points with one-click save. */
import { useState } from 'react';
import useSWR from 'swr';
import { fetcher, send } from '@/components/ui/api';
import { buttonClass, quietButtonClass } from '@/components/ui/buttons';
import { inputClass } from '@/components/ui/fields';
import type { DatasetRef } from './DiffractionPanel';

interface AxisRow {
  path: string;
  values: string;
}

/** "4.4:4.8:0.1" is a range (inclusive), "Al, Cu" or "1/1, 2/1" a list; numbers stay numbers. */
export function parseValues(text: string): (number | string)[] {
  const range = /^\s*(-?[\d.]+)\s*:\s*(-?[\d.]+)\s*:\s*([\d.]+)\s*$/.exec(text);
  if (range) {
    const [a, b, s] = range.slice(1).map(Number);
    if (!(s > 0)) return [];
    const n = Math.floor((b - a) / s + 1e-9) + 1;
    return Array.from({ length: Math.max(0, Math.min(n, 500)) }, (_, i) => Number((a + i * s).toPrecision(12)));
  }
  return text.split(',').map((v) => v.trim()).filter(Boolean).map((v) => (/^-?\d+(\.\d+)?(e-?\d+)?$/i.test(v) ? Number(v) : v));
}

export function SweepForm({ datasets, onStart }: { datasets: DatasetRef[]; onStart: (body: Record<string, unknown>) => void }) {
  const [axes, setAxes] = useState<AxisRow[]>([
    { path: 'aR', values: '4.4:4.8:0.05' },
    { path: 'offset.0', values: '0, 0.5, 1' },
  ]);
  const [dataset, setDataset] = useState(datasets[0]?.id ?? '');
  const parsed = axes.filter((a) => a.path.trim()).map((a) => ({ path: a.path.trim(), values: parseValues(a.values) }));
  const points = parsed.reduce((n, a) => n * a.values.length, 1);
  return (
    <section aria-label="New sweep" className="rounded-md border border-rule p-3">
      <h3 className="mb-2 text-xs font-medium uppercase tracking-wide text-ink-soft">New sweep from the saved revision</h3>
      <div className="space-y-1.5">
        {axes.map((a, i) => (
          <div key={i} className="flex gap-2">
            <input aria-label={`Axis ${i + 1} parameter`} className="w-44 shrink-0 rounded-md border border-rule bg-card px-2 py-1 font-mono text-xs text-ink focus:border-tide" value={a.path} placeholder="aR, offset.0, order, decoration…" onChange={(e) => setAxes(axes.map((x, k) => (k === i ? { ...x, path: e.target.value } : x)))} />
            <input aria-label={`Axis ${i + 1} values`} className="min-w-0 flex-1 rounded-md border border-rule bg-card px-2 py-1 font-mono text-xs text-ink focus:border-tide" value={a.values} placeholder="from:to:step or a, b, c" onChange={(e) => setAxes(axes.map((x, k) => (k === i ? { ...x, values: e.target.value } : x)))} />
            <button type="button" aria-label={`Remove axis ${i + 1}`} className="px-2 text-ink-soft hover:text-clay" onClick={() => setAxes(axes.filter((_, k) => k !== i))}>
              ×
            </button>
          </div>
        ))}
      </div>
      <div className="mt-2 flex flex-wrap items-center gap-2">
        <button type="button" className={quietButtonClass} disabled={axes.length >= 6} onClick={() => setAxes([...axes, { path: 'order', values: '1/1, 2/1' }])}>
          Add axis
        </button>
        <select aria-label="Measured pattern" className={`${inputClass} w-auto py-1 text-xs`} value={dataset} onChange={(e) => setDataset(e.target.value)}>
          {datasets.length ? datasets.map((d) => <option key={d.id} value={d.id}>{d.name}</option>) : <option value="">no measured pattern in this project</option>}
        </select>
        <span className="text-xs text-ink-soft">{points} points</span>
        <button type="button" className={`${buttonClass} ml-auto py-1 text-sm`} disabled={!dataset || points < 1} onClick={() => onStart({ dataset: Number(dataset), axes: parsed })}>
          Start sweep
        </button>
      </div>
    </section>
  );
}

interface Point {
  idx: number;
  params: Record<string, unknown>;
  rwp: number | null;
  rp: number | null;
  atoms: number | null;
  error: string | null;
  rank: number | null;
}

export function SweepTable({ jobId, canEdit, live, onSaved }: { jobId: number; canEdit: boolean; live?: boolean; onSaved?: (revisionNumber: number) => void }) {
  const { data: job } = useSWR<{ input: { axes: { path: string }[] } }>(`/api/jobs/${jobId}`, fetcher);
  const { data } = useSWR<{ items: Point[]; total: number }>(`/api/jobs/${jobId}/points?pageSize=20`, fetcher, { refreshInterval: live ? 1500 : 0 });
  const [busy, setBusy] = useState(false);
  const [err, setErr] = useState<string | null>(null);
  const paths = job?.input.axes.map((a) => a.path) ?? [];
  const get = (o: Record<string, unknown>, path: string) => path.split('.').reduce<unknown>((v, k) => (v && typeof v === 'object' ? (v as Record<string, unknown>)[k] : undefined), o);
  return (
    <section aria-label={`Sweep ${jobId} ranking`} className="rounded-md border border-rule p-3">
      <div className="mb-2 flex items-center gap-2">
        <h3 className="text-xs font-medium uppercase tracking-wide text-ink-soft">Sweep {jobId}: best points {live ? '(so far)' : ''}</h3>
        {canEdit ? (
          <button
            type="button"
            className={`${quietButtonClass} ml-auto`}
            disabled={busy || !data?.items.some((p) => p.rwp !== null)}
            onClick={async () => {
              setBusy(true);
              setErr(null);
              try {
                const r = await send<{ number: number }>('POST', `/api/jobs/${jobId}/save`, {});
                onSaved?.(r.number);
              } catch (e) {
                setErr(e instanceof Error ? e.message : String(e));
              } finally {
                setBusy(false);
              }
            }}
          >
            Save the best point as a revision
          </button>
        ) : null}
      </div>
      {err ? <p className="text-xs text-clay">{err}</p> : null}
      <table className="w-full text-left text-xs">
        <thead className="text-ink-soft">
          <tr>
            <th className="py-1 font-normal">Rank</th>
            {paths.map((p) => (
              <th key={p} className="font-mono font-normal">{p}</th>
            ))}
            <th className="font-normal">R_wp</th>
            <th className="font-normal">R_p</th>
            <th className="font-normal">Atoms</th>
          </tr>
        </thead>
        <tbody>
          {(data?.items ?? []).map((p) => (
            <tr key={p.idx} className="border-t border-rule">
              <td className="py-1">{p.rank ?? '—'}</td>
              {paths.map((path) => (
                <td key={path} className="font-mono">{String(get(p.params, path) ?? '—')}</td>
              ))}
              <td className="font-mono">{p.rwp === null ? <span className="text-clay" title={p.error ?? ''}>{p.error ? 'failed' : '…'}</span> : `${(100 * p.rwp).toFixed(2)} %`}</td>
              <td className="font-mono">{p.rp === null ? '—' : `${(100 * p.rp).toFixed(2)} %`}</td>
              <td className="font-mono">{p.atoms ?? '—'}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {data ? <p className="mt-1 text-[11px] text-ink-soft">{data.total} points in the grid; R_wp after a least-squares scale and flat background against the measured pattern.</p> : null}
    </section>
  );
}
