import type { Metadata } from 'next';
import { notFound } from 'next/navigation';
import { UsersView } from '@/components/auth/UsersView';
import { requireSignedIn } from '@/lib/server/page-data';

export const metadata: Metadata = { title: 'Users' };

export default async function UsersPage() {
  const actor = await requireSignedIn('/admin/users');
  if (actor.siteRole !== 'admin') notFound();
  return (
    <div className="space-y-4">
      <h1 className="text-3xl font-semibold tracking-tight">Users</h1>
      <UsersView myId={actor.id} />
    </div>
  );
}
