import { ProjectHeader } from '@/components/projects/ProjectHeader';
import { projectForPage } from '@/lib/server/page-data';

/**
 * Every tab of a project (overview, history, members, exports, datasets, settings) under one header.
 * The workspace sits outside this group: it is a full-height tool with its own top bar.
 */
export default async function ProjectTabsLayout({ children, params }: { children: React.ReactNode; params: Promise<{ id: string }> }) {
  const { id } = await params;
  const { project } = await projectForPage(id, `/projects/${id}`);
  return (
    <div className="space-y-6">
      <ProjectHeader project={project} />
      {children}
    </div>
  );
}
