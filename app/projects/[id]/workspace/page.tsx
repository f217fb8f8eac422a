import type { Metadata } from 'next';
import Link from 'next/link';
import { projectForPage } from '@/lib/server/page-data';
import { currentActor } from '@/lib/server/session';
import { idSchema } from '@/lib/server/http';
import { datasetListQuery, listDatasets } from '@/lib/server/datasets';
import { Workspace } from '@/components/workspace/Workspace';
import { starterParams, type Params } from '@/components/forms/families';

export const metadata: Metadata = { title: 'Workspace' };

export default async function WorkspacePage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  // The project and its measured patterns are read side by side; the project decides 404 or sign-in.
  const [{ project }, datasets] = await Promise.all([projectForPage(id, `/projects/${id}/workspace`), measuredPatterns(id)]);
  const head = project.head;
  const initial = (head?.params as Params | undefined) ?? starterParams('icosahedral');
  return (
    <div className="space-y-2">
      <nav aria-label="Breadcrumb" className="text-xs text-ink-soft">
        <Link href="/projects" className="hover:text-tide">
          Projects
        </Link>{' '}
        /{' '}
        <Link href={`/projects/${project.id}`} className="hover:text-tide">
          {project.name}
        </Link>{' '}
        / Workspace
      </nav>
      <Workspace
        project={{ id: String(project.id), name: project.name, canEdit: !!project.permissions.edit }}
        initialParams={initial}
        head={head ? { id: String(head.id), number: head.number, message: head.message, author: head.authorName ?? undefined, createdAt: head.createdAt, params: head.params } : null}
        datasets={datasets}
      />
    </div>
  );
}

/** The project's measured patterns for the diffraction panel; none when they cannot be read. */
async function measuredPatterns(id: string): Promise<{ id: string; name: string; url: string }[]> {
  const projectId = idSchema.safeParse(id);
  if (!projectId.success) return [];
  try {
    const page = await listDatasets(await currentActor(), projectId.data, datasetListQuery.parse({}));
    return page.items.filter((d) => d.kind === 'pattern').map((d) => ({ id: String(d.id), name: d.filename, url: d.downloadUrl }));
  } catch {
    return [];
  }
}
