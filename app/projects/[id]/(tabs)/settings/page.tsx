import type { Metadata } from 'next';
import { SettingsForm } from '@/components/projects/SettingsForm';
import { Notice } from '@/components/ui/messages';
import { projectForPage } from '@/lib/server/page-data';

export const metadata: Metadata = { title: 'Project settings' };

export default async function SettingsPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const { project } = await projectForPage(id, `/projects/${id}/settings`);
  return project.permissions.manage ? (
    <SettingsForm id={project.id} name={project.name} description={project.description} tags={project.tags} visibility={project.visibility} canDelete={project.permissions.delete} />
  ) : (
    <Notice tone="warn">Only owners of this project can change its settings.</Notice>
  );
}
