import type { Metadata } from 'next';
import { ProjectHeader } from '@/components/projects/ProjectHeader';
import { HistoryView } from '@/components/projects/HistoryView';
import { projectForPage } from '@/lib/server/page-data';

export const metadata: Metadata = { title: 'History' };

export default async function HistoryPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const { project } = await projectForPage(id, `/projects/${id}/history`);
  return (
    <div className="space-y-6">
      <ProjectHeader project={project} tab="History" />
      <HistoryView projectId={project.id} canEdit={project.permissions.edit} headId={project.headRevision} />
    </div>
  );
}
