import { ProjectHeader } from '@/components/projects/ProjectHeader';
import { loadProject } from '@/lib/server/page-data';

/**
 * Every tab of a project (overview, history, members, exports, datasets, settings) under one header.
 * The workspace sits outside this group: it is a full-height tool with its own top bar.
 * loadProject is cached per request, so the page below reads the same project without a second query.
 */
export default async function ProjectTabsLayout({ children, params }: { children: React.ReactNode; params: Promise<{ id: string }> }) {
  const { id } = await params;
  const { project } = await loadProject(id);
  // A project this actor cannot see gets no header; the page answers 404, or sends a signed-out
  // visitor to sign in and back to the very tab they asked for (only the page knows its address).
  if (!project) return children;
  return (
    <div className="space-y-6">
      <ProjectHeader project={project} />
      {children}
    </div>
  );
}
