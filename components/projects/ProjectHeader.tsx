import Link from 'next/link';
import type { ProjectDetail } from '@/lib/server/projects';
import { buttonClass } from '@/components/ui/buttons';
import { ProjectTabs } from './ProjectTabs';

export function VisibilityBadge({ v }: { v: string }) {
  const cls = v === 'public' ? 'bg-tide-pale text-tide-deep' : v === 'unlisted' ? 'bg-brass-pale text-ink' : 'bg-paper text-ink-soft border border-rule';
  return <span className={`rounded px-1.5 py-0.5 text-xs font-medium ${cls}`}>{v}</span>;
}

/** Name, owner, lineage, tags and tabs of a project: rendered once by the tabs' layout, above every tab. */
export function ProjectHeader({ project }: { project: ProjectDetail }) {
  return (
    <header className="space-y-3">
      <div className="flex flex-wrap items-start justify-between gap-4">
        <div className="space-y-1">
          <p className="text-xs text-ink-soft">
            <Link href="/projects" className="hover:text-tide">Projects</Link> / {project.ownerName}
          </p>
          <h1 className="flex items-center gap-3 text-3xl font-semibold tracking-tight">
            {project.name} <VisibilityBadge v={project.visibility} />
          </h1>
          {project.parent && (
            <p className="text-sm text-ink-soft" data-testid="forked-from">
              Forked from{' '}
              {project.parent.visible ? (
                <Link href={`/projects/${project.parent.id}`} className="text-tide underline">{project.parent.name}</Link>
              ) : (
                project.parent.name
              )}
              {project.parent.revisionNumber ? ` at revision ${project.parent.revisionNumber}` : ''}
            </p>
          )}
          {project.tags.length > 0 && (
            <p className="flex flex-wrap gap-1">
              {project.tags.map((t) => (
                <span key={t} className="rounded-full border border-rule px-2 py-0.5 text-xs text-ink-soft">{t}</span>
              ))}
            </p>
          )}
        </div>
        <Link href={`/projects/${project.id}/workspace`} className={buttonClass}>
          Open workspace
        </Link>
      </div>
      <ProjectTabs projectId={project.id} canReadMembers={project.permissions['members.read']} canManage={project.permissions.manage} />
    </header>
  );
}
