import { projectForPage } from '@/lib/server/page-data';

/**
 * The gate for everything under /projects/[id]: a project this visitor may not see answers 404 (or
 * sign-in for a signed-out visitor) here, before any loading state streams, so the status code is a
 * real 404 or redirect. The project read is cached for the request; the layouts and pages below reuse it.
 */
export default async function ProjectLayout({ children, params }: { children: React.ReactNode; params: Promise<{ id: string }> }) {
  const { id } = await params;
  await projectForPage(id, `/projects/${id}`);
  return children;
}
