import type { Metadata } from 'next';
import { MembersView } from '@/components/projects/MembersView';
import { Notice } from '@/components/ui/messages';
import { projectForPage } from '@/lib/server/page-data';

export const metadata: Metadata = { title: 'Members' };

export default async function MembersPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const { actor, project } = await projectForPage(id, `/projects/${id}/members`);
  return project.permissions['members.read'] ? (
    <MembersView projectId={project.id} canManage={project.permissions.manage} myId={actor?.id ?? null} />
  ) : (
    <Notice tone="warn">Only members of this project can see who works on it.</Notice>
  );
}
