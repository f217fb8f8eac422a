import type { Metadata } from 'next';
import Link from 'next/link';
import { RevisionEditor } from '@/components/projects/RevisionEditor';
import { ExportPanel, ForkButton } from '@/components/projects/ProjectActions';
import { projectForPage } from '@/lib/server/page-data';

export const metadata: Metadata = { title: 'Project' };

export default async function ProjectPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const { actor, project } = await projectForPage(id, `/projects/${id}`);
  const head = project.head;
  return (
    <div className="grid gap-6 lg:grid-cols-[3fr_2fr]">
      <section className="space-y-3">
        {project.description && <p className="whitespace-pre-line leading-relaxed text-ink-soft">{project.description}</p>}
        <h2 className="text-sm font-semibold uppercase tracking-wider text-ink-soft">
          Head: revision {head?.number ?? '—'} {head && <span className="font-normal normal-case">“{head.message}” by {head.authorName ?? 'unknown'}</span>}
        </h2>
        {project.permissions.edit ? (
          <RevisionEditor projectId={project.id} head={head} />
        ) : (
          <pre className="overflow-auto rounded-lg border border-rule bg-card p-3 font-mono text-xs">{JSON.stringify(head?.params ?? {}, null, 2)}</pre>
        )}
        <p className="text-sm text-ink-soft">
          {project.revisionCount} revision{project.revisionCount === 1 ? '' : 's'} · <Link href={`/projects/${project.id}/history`} className="text-tide underline">history and differences</Link>
        </p>
      </section>
      <aside className="space-y-5">
        <div className="space-y-2 rounded-lg border border-rule bg-card p-4">
          <h2 className="font-semibold">Export</h2>
          {head && project.permissions.export ? (
            <ExportPanel projectId={project.id} revision={head.id} revisionNumber={head.number} />
          ) : (
            <p className="text-sm text-ink-soft">Sign in to export this model.</p>
          )}
        </div>
        <div className="space-y-2 rounded-lg border border-rule bg-card p-4">
          <h2 className="font-semibold">Lineage</h2>
          {project.parent ? (
            <p className="text-sm" data-testid="lineage-parent">
              Parent:{' '}
              {project.parent.visible ? <Link href={`/projects/${project.parent.id}`} className="text-tide underline">{project.parent.name}</Link> : project.parent.name}
              {project.parent.revisionNumber ? ` (revision ${project.parent.revisionNumber})` : ''}
            </p>
          ) : (
            <p className="text-sm text-ink-soft">An original project (not a fork).</p>
          )}
          <div className="text-sm" data-testid="lineage-forks">
            {project.hiddenForks > 0 && (
              <p className="text-ink-soft">{project.hiddenForks} private fork{project.hiddenForks === 1 ? '' : 's'} by others.</p>
            )}
            {project.forks.length === 0 ? (
              project.hiddenForks === 0 && <p className="text-ink-soft">No forks yet.</p>
            ) : (
              <ul className="list-inside list-disc">
                {project.forks.map((f) => (
                  <li key={f.id}>
                    <Link href={`/projects/${f.id}`} className="text-tide underline">{f.name}</Link> by {f.ownerName}
                    {f.revisionNumber ? `, from revision ${f.revisionNumber}` : ''}
                  </li>
                ))}
              </ul>
            )}
          </div>
          <ForkButton projectId={project.id} signedIn={Boolean(actor)} />
        </div>
        <p className="text-xs text-ink-soft">Your role: {project.role ?? (actor ? 'not a member' : 'visitor')}</p>
      </aside>
    </div>
  );
}
