import type { Metadata } from 'next';
import { notFound } from 'next/navigation';
import { MailboxView } from '@/components/auth/MailboxView';
import { requireSignedIn } from '@/lib/server/page-data';

export const metadata: Metadata = { title: 'Mailbox' };

export default async function MailboxPage() {
  const actor = await requireSignedIn('/admin/mailbox');
  if (actor.siteRole !== 'admin') notFound();
  return (
    <div className="space-y-4">
      <h1 className="text-3xl font-semibold tracking-tight">Mailbox</h1>
      <p className="max-w-2xl text-ink-soft">Every message the site sent through the local mail fake (development and tests). With a real SMTP relay configured, this list stays empty.</p>
      <MailboxView />
    </div>
  );
}
