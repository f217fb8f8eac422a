'use client';
import type { ColumnDef } from '@tanstack/react-table';
import { ServerTable } from '@/components/ui/ServerTable';
import { quietButtonClass } from '@/components/ui/buttons';
import { downloadExport } from './ProjectActions';
import type { ExportInfo } from '@/lib/server/exports';

export function ExportsView({ projectId }: { projectId: number }) {
  const columns: ColumnDef<ExportInfo, unknown>[] = [
    { id: 'filename', header: 'File', cell: ({ row }) => <span className="font-mono text-xs">{row.original.filename}</span> },
    { id: 'format', header: 'Format', cell: ({ row }) => row.original.format },
    { id: 'revision', header: 'Revision', cell: ({ row }) => `r${row.original.revisionNumber}` },
    { id: 'size', header: 'Size', cell: ({ row }) => `${(row.original.size / 1024).toFixed(1)} KiB` },
    { id: 'provenance', header: 'Provenance', cell: ({ row }) => (
      <span className="font-mono text-xs" title={`sha256 ${row.original.sha256}\nparams ${row.original.paramsHash}`}>
        {row.original.sha256.slice(0, 10)}… · {row.original.engineVersion}
      </span>
    ) },
    { id: 'created_at', header: 'Made', cell: ({ row }) => row.original.createdAt.slice(0, 16).replace('T', ' ') },
    { id: 'download', header: '', cell: ({ row }) => (
      <button type="button" className={quietButtonClass} onClick={() => void downloadExport(row.original.id, row.original.filename)}>Download</button>
    ) },
  ];
  return <ServerTable<ExportInfo> label="Exports" endpoint={`/api/projects/${projectId}/exports`} columns={columns} sortable={['created_at', 'size', 'format']} defaultSort="created_at" filterLabel="Format (xyz, extxyz, cif, json)" empty="No exports yet. Export a revision from the overview." />;
}
