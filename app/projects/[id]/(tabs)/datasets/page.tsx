import type { Metadata } from 'next';
import { DatasetsView } from '@/components/projects/DatasetsView';
import { projectForPage } from '@/lib/server/page-data';

export const metadata: Metadata = { title: 'Datasets' };

export default async function DatasetsPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const { project } = await projectForPage(id, `/projects/${id}/datasets`);
  return <DatasetsView projectId={project.id} canEdit={project.permissions.edit} />;
}
