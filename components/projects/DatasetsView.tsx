'use client';
import { useState } from 'react';
import type { ColumnDef } from '@tanstack/react-table';
import { saveAs } from 'file-saver';
import { ServerTable } from '@/components/ui/ServerTable';
import { getBlob, send } from '@/components/ui/api';
import { buttonClass, dangerButtonClass, quietButtonClass } from '@/components/ui/buttons';
import { inputClass } from '@/components/ui/fields';
import { Notice } from '@/components/ui/messages';
import type { DatasetInfo } from '@/lib/server/datasets';
import { jobProgressText, uploadDatasetNow, type JobInfo } from '@/components/workspace/jobs-client';
import { Progress } from '@/components/workspace/Progress';

/** The space group the upload's parse found (older uploads have none recorded; finite structures need none). */
function spaceGroupText(s: Record<string, unknown>): string {
  const g = s.spaceGroup as { number: number; symbol: string } | null | undefined;
  if (g) return `; space group ${g.symbol} (No. ${g.number})`;
  if (s.periodic && typeof s.spaceGroupNote === 'string') return `; space group ${s.spaceGroupNote}`;
  return '';
}

function summaryText(d: DatasetInfo): string {
  const s = d.summary as Record<string, unknown>;
  if (d.kind === 'structure') return `${s.atoms} atoms${s.periodic ? ', periodic' : ''}, ${Object.entries((s.composition ?? {}) as Record<string, number>).map(([k, v]) => `${k}${v}`).join(' ')}${spaceGroupText(s)}`;
  return `${s.points} points, ${s.axis} ${Number(s.xMin).toPrecision(4)}–${Number(s.xMax).toPrecision(4)}`;
}

export function DatasetsView({ projectId, canEdit }: { projectId: number; canEdit: boolean }) {
  const [file, setFile] = useState<File | null>(null);
  const [kind, setKind] = useState('auto');
  const [msg, setMsg] = useState<{ tone: 'ok' | 'error'; text: string } | null>(null);
  const [key, setKey] = useState(0);
  const [busy, setBusy] = useState(false);
  /** The parse job, when the server answered 202 (no worker free in time): followed until it ends. */
  const [job, setJob] = useState<{ info: JobInfo; since: number } | null>(null);
  const base = `/api/projects/${projectId}/datasets`;
  const columns: ColumnDef<DatasetInfo, unknown>[] = [
    { id: 'filename', header: 'File', cell: ({ row }) => <span className="font-mono text-xs">{row.original.filename}</span> },
    { id: 'kind', header: 'Kind', cell: ({ row }) => `${row.original.kind} (${row.original.format})` },
    { id: 'summary', header: 'Contents', cell: ({ row }) => summaryText(row.original) },
    { id: 'size', header: 'Size', cell: ({ row }) => `${(row.original.size / 1024).toFixed(1)} KiB` },
    { id: 'created_at', header: 'Uploaded', cell: ({ row }) => `${row.original.createdAt.slice(0, 10)} by ${row.original.uploadedBy ?? '—'}` },
    { id: 'actions', header: '', cell: ({ row }) => (
      <span className="flex gap-2">
        <button type="button" className={quietButtonClass} onClick={async () => {
          try { saveAs(await getBlob(row.original.downloadUrl), row.original.filename); } catch (e) { setMsg({ tone: 'error', text: (e as Error).message }); }
        }}>Download</button>
        {canEdit && <button type="button" className={dangerButtonClass} onClick={async () => {
          try { await send('DELETE', `${base}/${row.original.id}`); setKey((k) => k + 1); setMsg({ tone: 'ok', text: `${row.original.filename} deleted.` }); } catch (e) { setMsg({ tone: 'error', text: (e as Error).message }); }
        }}>Delete</button>}
      </span>
    ) },
  ];
  return (
    <div className="space-y-4">
      {msg && <Notice tone={msg.tone}>{msg.text}</Notice>}
      {canEdit && (
        <form className="flex flex-wrap items-end gap-3 rounded-lg border border-rule bg-card p-4" onSubmit={async (e) => {
          e.preventDefault();
          if (!file) return setMsg({ tone: 'error', text: 'Choose a file first.' });
          setBusy(true);
          const fd = new FormData();
          fd.set('file', file);
          fd.set('kind', kind);
          setMsg(null);
          try {
            const d = await uploadDatasetNow(projectId, fd, (info) => setJob((j) => ({ info, since: j?.since ?? Date.now() })));
            setMsg({ tone: 'ok', text: `${d.filename} stored: ${summaryText(d)}.` });
            setKey((k) => k + 1);
          } catch (err) {
            setMsg({ tone: 'error', text: `${file.name}: ${(err as Error).message}` });
          } finally {
            setBusy(false);
            setJob(null);
          }
        }}>
          <label className="text-sm">Measured pattern or structure file (≤ 20 MB)<input type="file" onChange={(e) => setFile(e.target.files?.[0] ?? null)} className={inputClass} /></label>
          <label className="text-sm">Read as<select value={kind} onChange={(e) => setKind(e.target.value)} className={`${inputClass} w-auto`}><option value="auto">tell from the file</option><option value="pattern">measured pattern</option><option value="structure">structure</option></select></label>
          <button type="submit" disabled={busy} className={buttonClass}>{busy ? (job ? 'Queued…' : 'Reading…') : 'Upload'}</button>
          {job && (
            <div className="basis-full" data-testid="upload-job">
              <p className="text-xs text-ink-soft">The workers are busy: the file waits in the queue and is read as soon as one is free. You can stay on this page.</p>
              <Progress running stage={jobProgressText(job.info)} fraction={job.info.progress} startedAt={job.since} label={`Reading ${file?.name ?? 'the file'}`} onCancel={() => void send('DELETE', job.info.url).catch((e) => setMsg({ tone: 'error', text: (e as Error).message }))} />
            </div>
          )}
        </form>
      )}
      <ServerTable<DatasetInfo> label="Datasets" endpoint={base} columns={columns} sortable={['created_at', 'filename', 'size', 'kind']} defaultSort="created_at" filterLabel="Filter by file name" refreshKey={key} empty="No datasets yet." />
    </div>
  );
}
