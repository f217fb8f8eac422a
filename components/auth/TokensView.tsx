'use client';
import { useState } from 'react';
import useSWR from 'swr';
import { fetcher, send } from '@/components/ui/api';
import { buttonClass, dangerButtonClass } from '@/components/ui/buttons';
import { inputClass } from '@/components/ui/fields';
import { Notice } from '@/components/ui/messages';
import type { ApiTokenInfo } from '@/lib/server/tokens';

export function TokensView({ origin }: { origin: string }) {
  const { data, mutate } = useSWR<{ items: ApiTokenInfo[] }>('/api/tokens', fetcher);
  const [name, setName] = useState('');
  const [scope, setScope] = useState<'read' | 'write'>('read');
  const [days, setDays] = useState('90');
  const [fresh, setFresh] = useState<string | null>(null);
  const [msg, setMsg] = useState<{ tone: 'ok' | 'error'; text: string } | null>(null);
  return (
    <div className="space-y-4">
      {msg && <Notice tone={msg.tone}>{msg.text}</Notice>}
      {fresh && (
        <div className="space-y-2 rounded-md border border-brass bg-brass-pale p-3 text-sm">
          <p>Copy this token now; it is shown only once and the server keeps only a hash of it.</p>
          <code data-testid="new-token" className="block break-all rounded bg-card p-2 font-mono text-xs">{fresh}</code>
          <pre className="overflow-auto rounded bg-card p-2 font-mono text-xs">{`curl -H "Authorization: Bearer ${fresh}" ${origin}/api/projects`}</pre>
        </div>
      )}
      <form className="flex items-end gap-2" onSubmit={async (e) => {
        e.preventDefault();
        try {
          const r = await send<{ token: string }>('POST', '/api/tokens', { name, scope, expiresInDays: days === 'never' ? null : Number(days) });
          setFresh(r.token);
          setName('');
          setMsg(null);
          await mutate();
        } catch (err) {
          setMsg({ tone: 'error', text: (err as Error).message });
        }
      }}>
        <label className="text-sm">Name of the new token<input name="token-name" value={name} onChange={(e) => setName(e.target.value)} placeholder="e.g. laptop scripts" className={`${inputClass} w-72`} /></label>
        <label className="text-sm">May
          <select name="token-scope" value={scope} onChange={(e) => setScope(e.target.value as 'read' | 'write')} className={`${inputClass} w-48`}>
            <option value="read">only read</option>
            <option value="write">read and change</option>
          </select>
        </label>
        <label className="text-sm">Stops working after
          <select name="token-days" value={days} onChange={(e) => setDays(e.target.value)} className={`${inputClass} w-40`}>
            <option value="7">7 days</option>
            <option value="30">30 days</option>
            <option value="90">90 days</option>
            <option value="365">a year</option>
            <option value="never">never (until revoked)</option>
          </select>
        </label>
        <button type="submit" className={buttonClass}>Create token</button>
      </form>
      <table className="w-full rounded-lg border border-rule bg-card text-sm" aria-label="API tokens">
        <thead className="bg-paper text-left text-xs uppercase text-ink-soft"><tr><th className="px-3 py-2">Name</th><th>Starts with</th><th>May</th><th>Created</th><th>Last used</th><th>Expires</th><th>State</th><th /></tr></thead>
        <tbody>
          {(data?.items ?? []).map((t) => (
            <tr key={t.id} className="border-t border-rule">
              <td className="px-3 py-2">{t.name}</td>
              <td className="font-mono text-xs">{t.prefix}…</td>
              <td>{t.scope === 'read' ? 'read' : 'read, change'}</td>
              <td>{t.createdAt.slice(0, 10)}</td>
              <td>{t.lastUsedAt?.slice(0, 16).replace('T', ' ') ?? 'never'}</td>
              <td>{t.expiresAt ? t.expiresAt.slice(0, 10) : 'never'}</td>
              <td>{t.revokedAt ? 'revoked' : t.expired ? 'expired' : 'active'}</td>
              <td>{!t.revokedAt && <button type="button" className={dangerButtonClass} onClick={async () => { await send('DELETE', `/api/tokens?id=${t.id}`); await mutate(); setMsg({ tone: 'ok', text: `${t.name} revoked.` }); }}>Revoke</button>}</td>
            </tr>
          ))}
          {data?.items.length === 0 && <tr><td colSpan={8} className="px-3 py-4 text-center text-ink-soft">No tokens yet.</td></tr>}
        </tbody>
      </table>
    </div>
  );
}
