'use client';
/**
 * A table over one of our list endpoints (`?page&pageSize&sort&dir&q` → `{items, total}`):
 * sorting, filtering and pagination happen on the server; @tanstack/react-table lays it out.
 */
import { useState } from 'react';
import useSWR from 'swr';
import { flexRender, getCoreRowModel, useReactTable, type ColumnDef, type SortingState } from '@tanstack/react-table';
import { fetcher } from './api';

export interface ServerTableProps<T> {
  endpoint: string;
  columns: ColumnDef<T, unknown>[];
  /** Column ids the server can sort by. */
  sortable: string[];
  defaultSort: string;
  defaultDir?: 'asc' | 'desc';
  filterLabel?: string;
  pageSize?: number;
  extraQuery?: Record<string, string>;
  empty?: React.ReactNode;
  /** Bump to refetch after a change made elsewhere on the page. */
  refreshKey?: number;
  label: string;
}

interface PageOf<T> {
  items: T[];
  total: number;
}

export function ServerTable<T>(props: ServerTableProps<T>) {
  const [page, setPage] = useState(1);
  const [q, setQ] = useState('');
  const [sorting, setSorting] = useState<SortingState>([{ id: props.defaultSort, desc: (props.defaultDir ?? 'desc') === 'desc' }]);
  const pageSize = props.pageSize ?? 20;
  const sort = sorting[0] ?? { id: props.defaultSort, desc: true };
  const params = new URLSearchParams({ page: String(page), pageSize: String(pageSize), sort: sort.id, dir: sort.desc ? 'desc' : 'asc', ...(q ? { q } : {}), ...props.extraQuery });
  const sep = props.endpoint.includes('?') ? '&' : '?';
  const { data, error, isLoading } = useSWR<PageOf<T>>(`${props.endpoint}${sep}${params}#${props.refreshKey ?? 0}`, (u: string) => fetcher<PageOf<T>>(u.replace(/#\d+$/, '')), { keepPreviousData: true });
  // eslint-disable-next-line react-hooks/incompatible-library -- TanStack Table is built for this use
  const table = useReactTable<T>({
    data: data?.items ?? [],
    columns: props.columns,
    getCoreRowModel: getCoreRowModel(),
    manualSorting: true,
    manualPagination: true,
    state: { sorting },
    onSortingChange: (u) => {
      setSorting(u);
      setPage(1);
    },
    enableSortingRemoval: false,
  });
  const pages = Math.max(1, Math.ceil((data?.total ?? 0) / pageSize));
  return (
    <div className="space-y-2">
      {props.filterLabel && (
        <label className="flex items-center gap-2 text-sm text-ink-soft">
          {props.filterLabel}
          <input
            type="search"
            value={q}
            onChange={(e) => {
              setQ(e.target.value);
              setPage(1);
            }}
            className="w-64 rounded-md border border-rule bg-card px-2 py-1 text-ink"
          />
        </label>
      )}
      <div className="overflow-x-auto rounded-lg border border-rule bg-card">
        <table className="w-full text-left text-sm" aria-label={props.label}>
          {/* Mixed case for every header: sort buttons do not inherit text-transform, so plain headers must not have one either. */}
          <thead className="border-b border-rule bg-paper text-xs tracking-wide text-ink-soft">
            {table.getHeaderGroups().map((hg) => (
              <tr key={hg.id}>
                {hg.headers.map((h) => {
                  const canSort = props.sortable.includes(h.column.id);
                  const dir = h.column.getIsSorted();
                  return (
                    <th key={h.id} className="px-3 py-2 font-medium" aria-sort={dir ? (dir === 'desc' ? 'descending' : 'ascending') : undefined}>
                      {canSort ? (
                        <button type="button" className="hover:text-tide" onClick={h.column.getToggleSortingHandler()}>
                          {flexRender(h.column.columnDef.header, h.getContext())}
                          <span aria-hidden> {dir === 'asc' ? '▲' : dir === 'desc' ? '▼' : '·'}</span>
                        </button>
                      ) : (
                        flexRender(h.column.columnDef.header, h.getContext())
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {table.getRowModel().rows.map((r) => (
              <tr key={r.id} className="border-b border-rule last:border-0">
                {r.getVisibleCells().map((c) => (
                  <td key={c.id} className="px-3 py-2 align-top">
                    {flexRender(c.column.columnDef.cell, c.getContext())}
                  </td>
                ))}
              </tr>
            ))}
            {!isLoading && !error && data?.items.length === 0 && (
              <tr>
                <td colSpan={props.columns.length} className="px-3 py-6 text-center text-ink-soft">
                  {props.empty ?? 'Nothing here yet.'}
                </td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
      {error && <p className="text-sm text-clay">{(error as Error).message}</p>}
      <div className="flex items-center justify-between text-xs text-ink-soft">
        <span>{isLoading ? 'Loading…' : `${data?.total ?? 0} in all`}</span>
        <span className="flex items-center gap-2">
          <button type="button" disabled={page <= 1} onClick={() => setPage(page - 1)} className="rounded border border-rule px-2 py-0.5 disabled:opacity-40">
            Previous
          </button>
          page {page} of {pages}
          <button type="button" disabled={page >= pages} onClick={() => setPage(page + 1)} className="rounded border border-rule px-2 py-0.5 disabled:opacity-40">
            Next
          </button>
        </span>
      </div>
    </div>
  );
}
