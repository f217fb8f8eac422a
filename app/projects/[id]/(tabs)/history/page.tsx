import type { Metadata } from 'next';
import { HistoryView } from '@/components/projects/HistoryView';
import { projectForPage } from '@/lib/server/page-data';

export const metadata: Metadata = { title: 'History' };

export default async function HistoryPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const { project } = await projectForPage(id, `/projects/${id}/history`);
  return <HistoryView projectId={project.id} canEdit={project.permissions.edit} headId={project.headRevision} />;
}
