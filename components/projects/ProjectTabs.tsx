'use client';
/**
 * The project's tab bar. It lives in the tabs' layout, which stays mounted while the pages under it
 * change, so the current tab comes from the URL (the layout's selected segment), not from a prop.
 */
import Link from 'next/link';
import { useSelectedLayoutSegment } from 'next/navigation';

const TABS = [
  [null, 'Overview'],
  ['history', 'History'],
  ['members', 'Members'],
  ['exports', 'Exports'],
  ['datasets', 'Datasets'],
  ['settings', 'Settings'],
] as const;

export function ProjectTabs({ projectId, canReadMembers, canManage }: { projectId: number; canReadMembers: boolean; canManage: boolean }) {
  const current = useSelectedLayoutSegment();
  const base = `/projects/${projectId}`;
  const tabs = TABS.filter(([segment]) => (segment !== 'settings' || canManage) && (segment !== 'members' || canReadMembers));
  return (
    <nav className="flex gap-1 border-b border-rule text-sm" aria-label="Project">
      {tabs.map(([segment, label]) => {
        const here = segment === current;
        return (
          <Link
            key={label}
            href={segment ? `${base}/${segment}` : base}
            aria-current={here ? 'page' : undefined}
            className={`-mb-px border-b-2 px-3 py-2 ${here ? 'border-tide font-medium text-tide' : 'border-transparent text-ink-soft hover:text-ink'}`}
          >
            {label}
          </Link>
        );
      })}
    </nav>
  );
}
