import type { Metadata } from 'next';
import { ExportsView } from '@/components/projects/ExportsView';
import { projectForPage } from '@/lib/server/page-data';

export const metadata: Metadata = { title: 'Exports' };

export default async function ExportsPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const { project } = await projectForPage(id, `/projects/${id}/exports`);
  return (
    <>
      <p className="text-sm text-ink-soft">Each file records the sha256 of its bytes, the sha256 of the parameters that made it and the engine version. The same revision and format always give the same file.</p>
      <ExportsView projectId={project.id} />
    </>
  );
}
