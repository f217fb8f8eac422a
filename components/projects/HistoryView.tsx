'use client';
import { useState } from 'react';
import useSWR from 'swr';
import { useRouter } from 'next/navigation';
import type { ColumnDef } from '@tanstack/react-table';
import { ServerTable } from '@/components/ui/ServerTable';
import { ApiClientError, fetcher, send } from '@/components/ui/api';
import { quietButtonClass } from '@/components/ui/buttons';
import { Notice } from '@/components/ui/messages';
import type { RevisionInfo } from '@/lib/server/revisions';
import type { DiffEntry } from '@/lib/server/json-diff';

export function HistoryView({ projectId, canEdit, headId }: { projectId: number; canEdit: boolean; headId: number | null }) {
  const router = useRouter();
  const [from, setFrom] = useState<number | null>(null);
  const [to, setTo] = useState<number | null>(headId);
  // The head this page last saw: a restore goes on top of it, and answers 409 when someone saved since.
  const [head, setHead] = useState<number | null>(headId);
  const [key, setKey] = useState(0);
  const [msg, setMsg] = useState<{ tone: 'ok' | 'error'; text: string } | null>(null);
  const diff = useSWR<{ from: RevisionInfo; to: RevisionInfo; changes: DiffEntry[] }>(from && to && from !== to ? `/api/projects/${projectId}/diff?from=${from}&to=${to}` : null, fetcher);
  const columns: ColumnDef<RevisionInfo, unknown>[] = [
    { id: 'number', header: 'Revision', cell: ({ row }) => <span className="font-mono">r{row.original.number}</span> },
    { id: 'message', header: 'Message', cell: ({ row }) => row.original.message },
    { id: 'author', header: 'Author', cell: ({ row }) => row.original.authorName ?? '—' },
    { id: 'created_at', header: 'Saved', cell: ({ row }) => new Date(row.original.createdAt).toISOString().slice(0, 16).replace('T', ' ') },
    { id: 'compare', header: 'Compare', cell: ({ row }) => (
      <span className="flex gap-2 text-xs">
        <label><input type="radio" name="from" checked={from === row.original.id} onChange={() => setFrom(row.original.id)} /> from</label>
        <label><input type="radio" name="to" checked={to === row.original.id} onChange={() => setTo(row.original.id)} /> to</label>
      </span>
    ) },
    ...(canEdit
      ? [{ id: 'restore', header: '', cell: ({ row }: { row: { original: RevisionInfo } }) => (
          <button type="button" className={quietButtonClass} onClick={async () => {
            try {
              const r = await send<RevisionInfo>('POST', `/api/projects/${projectId}/revisions/${row.original.id}/restore`, { baseRevision: head });
              setMsg({ tone: 'ok', text: `Restored revision ${row.original.number} as revision ${r.number}.` });
              setHead(r.id);
              setTo(r.id);
              setKey((k) => k + 1);
              router.refresh();
            } catch (e) {
              const newer = e instanceof ApiClientError && e.status === 409 ? (e.details as { head?: RevisionInfo | null } | null)?.head : null;
              if (newer) {
                // Show what changed; the next click restores on top of the newer head, on purpose.
                setHead(newer.id);
                setTo(newer.id);
                setKey((k) => k + 1);
                router.refresh();
                setMsg({ tone: 'error', text: `Nothing was restored: ${newer.authorName ?? 'someone'} saved revision ${newer.number} (“${newer.message}”) in the meantime. Look at it, then restore again if you still want revision ${row.original.number}.` });
              } else {
                setMsg({ tone: 'error', text: (e as Error).message });
              }
            }
          }}>Restore</button>
        ) }]
      : []),
  ];
  return (
    <div className="space-y-4">
      {msg && <Notice tone={msg.tone}>{msg.text}</Notice>}
      <ServerTable<RevisionInfo> label="Revisions" endpoint={`/api/projects/${projectId}/revisions`} columns={columns} sortable={['number', 'created_at']} defaultSort="number" filterLabel="Filter by message" refreshKey={key} />
      <section className="space-y-2 rounded-lg border border-rule bg-card p-4" aria-label="Differences">
        <h2 className="font-semibold">Differences</h2>
        {!from || !to || from === to ? (
          <p className="text-sm text-ink-soft">Pick a “from” and a “to” revision above.</p>
        ) : diff.error ? (
          <Notice tone="error">{(diff.error as Error).message}</Notice>
        ) : !diff.data ? (
          <p className="text-sm text-ink-soft">Comparing…</p>
        ) : diff.data.changes.length === 0 ? (
          <p className="text-sm">Revisions {diff.data.from.number} and {diff.data.to.number} have the same parameters.</p>
        ) : (
          <table className="w-full text-sm">
            <thead className="text-left text-xs uppercase text-ink-soft"><tr><th>Path</th><th>r{diff.data.from.number}</th><th>r{diff.data.to.number}</th></tr></thead>
            <tbody>
              {diff.data.changes.map((c) => (
                <tr key={c.path} className="border-t border-rule">
                  <td className="py-1 font-mono text-xs">{c.path}</td>
                  <td className="font-mono text-xs text-clay">{c.kind === 'added' ? '—' : JSON.stringify(c.before)}</td>
                  <td className="font-mono text-xs text-tide">{c.kind === 'removed' ? '—' : JSON.stringify(c.after)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>
    </div>
  );
}
