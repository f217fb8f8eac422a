'use client';
import { useState } from 'react';
import useSWR from 'swr';
import { useReactTable, getCoreRowModel, getSortedRowModel, getFilteredRowModel, getPaginationRowModel, flexRender, type ColumnDef, type SortingState } from '@tanstack/react-table';
import { fetcher, send } from '@/components/ui/api';
import { buttonClass, dangerButtonClass, quietButtonClass } from '@/components/ui/buttons';
import { inputClass } from '@/components/ui/fields';
import { Notice } from '@/components/ui/messages';
import type { InvitationInfo, MemberInfo } from '@/lib/server/members';

const ROLES = ['owner', 'editor', 'viewer'] as const;

export function MembersView({ projectId, canManage, myId }: { projectId: number; canManage: boolean; myId: number | null }) {
  const url = `/api/projects/${projectId}/members`;
  const { data, mutate, error } = useSWR<{ members: MemberInfo[]; invitations: InvitationInfo[] }>(url, fetcher);
  const [msg, setMsg] = useState<{ tone: 'ok' | 'error'; text: string } | null>(null);
  const [email, setEmail] = useState('');
  const [role, setRole] = useState<string>('viewer');
  const [sorting, setSorting] = useState<SortingState>([]);
  const [filter, setFilter] = useState('');

  async function act(fn: () => Promise<unknown>, ok: string) {
    setMsg(null);
    try {
      await fn();
      setMsg({ tone: 'ok', text: ok });
      await mutate();
    } catch (e) {
      setMsg({ tone: 'error', text: (e as Error).message });
    }
  }

  const columns: ColumnDef<MemberInfo, unknown>[] = [
    { accessorKey: 'name', header: 'Name' },
    { accessorKey: 'email', header: 'E-mail' },
    { accessorKey: 'role', header: 'Role', cell: ({ row }) => canManage ? (
      <select aria-label={`Role of ${row.original.email}`} value={row.original.role} className={`${inputClass} w-auto py-1`} onChange={(e) => act(() => send('PATCH', url, { userId: row.original.userId, role: e.target.value }), `${row.original.email} is now ${e.target.value}.`)}>
        {ROLES.map((r) => <option key={r} value={r}>{r}</option>)}
      </select>
    ) : row.original.role },
    { accessorKey: 'since', header: 'Since', cell: ({ row }) => row.original.since.slice(0, 10) },
    { id: 'remove', header: '', enableSorting: false, cell: ({ row }) => (canManage || row.original.userId === myId) ? (
      <button type="button" className={dangerButtonClass} onClick={() => act(() => send('DELETE', `${url}?userId=${row.original.userId}`), row.original.userId === myId ? 'You left the project.' : `${row.original.email} was removed.`)}>
        {row.original.userId === myId ? 'Leave' : 'Remove'}
      </button>
    ) : null },
  ];
  // eslint-disable-next-line react-hooks/incompatible-library -- TanStack Table is built for this use
  const table = useReactTable({
    data: data?.members ?? [],
    columns,
    state: { sorting, globalFilter: filter },
    onSortingChange: setSorting,
    onGlobalFilterChange: setFilter,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
    getPaginationRowModel: getPaginationRowModel(),
    initialState: { pagination: { pageSize: 20 } },
  });

  return (
    <div className="space-y-4">
      {msg && <Notice tone={msg.tone}>{msg.text}</Notice>}
      {error && <Notice tone="error">{(error as Error).message}</Notice>}
      {canManage && (
        <form className="flex flex-wrap items-end gap-2 rounded-lg border border-rule bg-card p-4" onSubmit={(e) => { e.preventDefault(); void act(() => send('POST', url, { email, role }), `Invitation sent to ${email}.`).then(() => setEmail('')); }}>
          <label className="text-sm">Invite by e-mail<input type="email" value={email} onChange={(e) => setEmail(e.target.value)} className={`${inputClass} w-72`} /></label>
          <label className="text-sm">as<select value={role} onChange={(e) => setRole(e.target.value)} className={`${inputClass} w-auto`}>{ROLES.map((r) => <option key={r}>{r}</option>)}</select></label>
          <button type="submit" className={buttonClass}>Send invitation</button>
        </form>
      )}
      <input type="search" placeholder="Filter members" value={filter} onChange={(e) => setFilter(e.target.value)} className={`${inputClass} w-64`} />
      <table className="w-full rounded-lg border border-rule bg-card text-sm" aria-label="Members">
        <thead className="bg-paper text-left text-xs uppercase text-ink-soft">
          {table.getHeaderGroups().map((hg) => (
            <tr key={hg.id}>{hg.headers.map((h) => (
              <th key={h.id} className="px-3 py-2">
                {h.column.getCanSort() ? <button type="button" onClick={h.column.getToggleSortingHandler()}>{flexRender(h.column.columnDef.header, h.getContext())} {{ asc: '▲', desc: '▼' }[h.column.getIsSorted() as string] ?? ''}</button> : flexRender(h.column.columnDef.header, h.getContext())}
              </th>
            ))}</tr>
          ))}
        </thead>
        <tbody>
          {table.getRowModel().rows.map((r) => (
            <tr key={r.id} className="border-t border-rule">{r.getVisibleCells().map((c) => <td key={c.id} className="px-3 py-2">{flexRender(c.column.columnDef.cell, c.getContext())}</td>)}</tr>
          ))}
        </tbody>
      </table>
      <div className="flex gap-2 text-xs text-ink-soft">
        <button type="button" className={quietButtonClass} disabled={!table.getCanPreviousPage()} onClick={() => table.previousPage()}>Previous</button>
        <span>page {table.getState().pagination.pageIndex + 1} of {Math.max(1, table.getPageCount())}</span>
        <button type="button" className={quietButtonClass} disabled={!table.getCanNextPage()} onClick={() => table.nextPage()}>Next</button>
      </div>
      {canManage && (data?.invitations.length ?? 0) > 0 && (
        <section className="space-y-2">
          <h2 className="font-semibold">Pending invitations</h2>
          <ul className="space-y-1 text-sm">
            {data!.invitations.map((i) => (
              <li key={i.id} className="flex items-center gap-3">
                {i.email} as {i.role}, until {i.expiresAt.slice(0, 10)}
                <button type="button" className={quietButtonClass} onClick={() => act(() => send('DELETE', `${url}?invitation=${i.id}`), 'Invitation withdrawn.')}>Withdraw</button>
              </li>
            ))}
          </ul>
        </section>
      )}
    </div>
  );
}
