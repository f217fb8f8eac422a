import type { Metadata } from 'next';
import { NewProjectForm } from '@/components/projects/NewProjectForm';
import { STARTERS } from '@/lib/models/starters';
import { requireSignedIn } from '@/lib/server/page-data';

export const metadata: Metadata = { title: 'New project' };

export default async function NewProjectPage() {
  await requireSignedIn('/projects/new');
  return (
    <div className="mx-auto max-w-3xl space-y-4">
      <h1 className="text-3xl font-semibold tracking-tight">New project</h1>
      <NewProjectForm starters={STARTERS} />
    </div>
  );
}
