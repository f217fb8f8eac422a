'use client';
import { useState } from 'react';
import useSWR from 'swr';
import { fetcher } from '@/components/ui/api';
import { quietButtonClass } from '@/components/ui/buttons';
import { inputClass } from '@/components/ui/fields';

interface Mail { id: number; from: string; to: string; subject: string; text: string; receivedAt: string }

/** Turns URLs in a message body into links, leaving the rest as text. */
function Linked({ text }: { text: string }) {
  const parts = text.split(/(https?:\/\/[^\s<>"]+)/g);
  return <>{parts.map((p, i) => (i % 2 ? <a key={i} href={p} className="break-all text-tide underline">{p}</a> : <span key={i}>{p}</span>))}</>;
}

export function MailboxView() {
  const [page, setPage] = useState(1);
  const [to, setTo] = useState('');
  const { data } = useSWR<{ items: Mail[]; total: number }>(`/api/admin/mail?page=${page}&pageSize=20${to ? `&to=${encodeURIComponent(to)}` : ''}`, fetcher, { refreshInterval: 3000 });
  const pages = Math.max(1, Math.ceil((data?.total ?? 0) / 20));
  return (
    <div className="space-y-3">
      <label className="flex items-center gap-2 text-sm text-ink-soft">Filter by recipient<input type="search" value={to} onChange={(e) => { setTo(e.target.value); setPage(1); }} className={`${inputClass} w-72`} /></label>
      <ul className="space-y-3" aria-label="Messages">
        {(data?.items ?? []).map((m) => (
          <li key={m.id} className="rounded-lg border border-rule bg-card p-4" data-testid="mail">
            <p className="text-xs text-ink-soft">{m.receivedAt.slice(0, 19).replace('T', ' ')} · from {m.from} · to <span data-testid="mail-to">{m.to}</span></p>
            <h2 className="font-semibold">{m.subject}</h2>
            <pre className="mt-2 whitespace-pre-wrap font-sans text-sm"><Linked text={m.text} /></pre>
          </li>
        ))}
        {data?.items.length === 0 && <li className="text-ink-soft">No messages.</li>}
      </ul>
      <div className="flex items-center gap-2 text-xs text-ink-soft">
        <button type="button" className={quietButtonClass} disabled={page <= 1} onClick={() => setPage(page - 1)}>Newer</button>
        page {page} of {pages}
        <button type="button" className={quietButtonClass} disabled={page >= pages} onClick={() => setPage(page + 1)}>Older</button>
      </div>
    </div>
  );
}
