'use client';
import Link from 'next/link';
import type { ColumnDef } from '@tanstack/react-table';
import { ServerTable } from '@/components/ui/ServerTable';
import type { ProjectSummary } from '@/lib/server/projects';

const when = (s: string) => new Date(s).toISOString().slice(0, 16).replace('T', ' ');

export function ProjectTable({ scope }: { scope: 'mine' | 'public' }) {
  const columns: ColumnDef<ProjectSummary, unknown>[] = [
    { id: 'name', header: 'Name', cell: ({ row }) => (
      <div>
        <Link href={`/projects/${row.original.id}`} className="font-medium text-tide hover:underline">{row.original.name}</Link>
        <p className="line-clamp-1 text-xs text-ink-soft">{row.original.description}</p>
      </div>
    ) },
    { id: 'owner', header: 'Owner', cell: ({ row }) => row.original.ownerName },
    ...(scope === 'mine' ? [{ id: 'role', header: 'Your role', cell: ({ row }: { row: { original: ProjectSummary } }) => row.original.role }] : []),
    { id: 'visibility', header: 'Visibility', cell: ({ row }) => row.original.visibility },
    { id: 'tags', header: 'Tags', cell: ({ row }) => row.original.tags.join(', ') },
    { id: 'head', header: 'Revision', cell: ({ row }) => (row.original.headNumber ? `r${row.original.headNumber}` : '—') },
    { id: 'updated_at', header: 'Updated', cell: ({ row }) => when(row.original.updatedAt) },
  ];
  return (
    <ServerTable<ProjectSummary>
      label={scope === 'mine' ? 'Your projects' : 'Public projects'}
      endpoint={`/api/projects?scope=${scope}`}
      columns={columns}
      sortable={['name', 'updated_at']}
      defaultSort="updated_at"
      filterLabel="Filter by name or description"
      empty={scope === 'mine' ? 'No projects yet. Start one from a model.' : 'No public projects yet.'}
    />
  );
}
