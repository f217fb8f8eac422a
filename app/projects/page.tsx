import type { Metadata } from 'next';
import Link from 'next/link';
import { ProjectTable } from '@/components/projects/ProjectTable';
import { requireSignedIn } from '@/lib/server/page-data';
import { buttonClass } from '@/components/ui/buttons';

export const metadata: Metadata = { title: 'Your projects' };

export default async function ProjectsPage() {
  await requireSignedIn('/projects');
  return (
    <div className="space-y-4">
      <div className="flex items-center justify-between">
        <h1 className="text-3xl font-semibold tracking-tight">Your projects</h1>
        <Link href="/projects/new" className={buttonClass}>New project</Link>
      </div>
      <ProjectTable scope="mine" />
    </div>
  );
}
