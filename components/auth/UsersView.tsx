'use client';
import { useState } from 'react';
import type { ColumnDef } from '@tanstack/react-table';
import { ServerTable } from '@/components/ui/ServerTable';
import { send } from '@/components/ui/api';
import { dangerButtonClass, quietButtonClass } from '@/components/ui/buttons';
import { inputClass } from '@/components/ui/fields';
import { Notice } from '@/components/ui/messages';
import type { UserInfo } from '@/lib/server/users';

export function UsersView({ myId }: { myId: number }) {
  const [key, setKey] = useState(0);
  const [msg, setMsg] = useState<{ tone: 'ok' | 'error'; text: string } | null>(null);
  async function patch(u: UserInfo, body: Record<string, unknown>, ok: string) {
    try {
      await send('PATCH', `/api/admin/users/${u.id}`, body);
      setMsg({ tone: 'ok', text: ok });
      setKey((k) => k + 1);
    } catch (e) {
      setMsg({ tone: 'error', text: (e as Error).message });
    }
  }
  const columns: ColumnDef<UserInfo, unknown>[] = [
    { id: 'name', header: 'Name', cell: ({ row }) => row.original.name },
    { id: 'email', header: 'E-mail', cell: ({ row }) => row.original.email },
    { id: 'site_role', header: 'Site role', cell: ({ row }) => (
      <select aria-label={`Site role of ${row.original.email}`} value={row.original.siteRole} className={`${inputClass} w-auto py-1`} onChange={(e) => patch(row.original, { siteRole: e.target.value }, `${row.original.email} is now ${e.target.value}.`)}>
        <option value="member">member</option><option value="admin">admin</option>
      </select>
    ) },
    { id: 'state', header: 'State', cell: ({ row }) => (row.original.disabled ? 'disabled' : row.original.verified ? 'active' : 'not confirmed') },
    { id: 'created_at', header: 'Joined', cell: ({ row }) => row.original.createdAt.slice(0, 10) },
    { id: 'actions', header: '', cell: ({ row }) => row.original.id === myId ? <span className="text-xs text-ink-soft">you</span> : row.original.disabled ? (
      <button type="button" className={quietButtonClass} onClick={() => patch(row.original, { disabled: false }, `${row.original.email} can sign in again.`)}>Enable</button>
    ) : (
      <button type="button" className={dangerButtonClass} onClick={() => patch(row.original, { disabled: true }, `${row.original.email} is disabled.`)}>Disable</button>
    ) },
  ];
  return (
    <div className="space-y-3">
      {msg && <Notice tone={msg.tone}>{msg.text}</Notice>}
      <ServerTable<UserInfo> label="Users" endpoint="/api/admin/users" columns={columns} sortable={['name', 'email', 'site_role', 'created_at']} defaultSort="created_at" filterLabel="Filter by name or e-mail" refreshKey={key} />
    </div>
  );
}
