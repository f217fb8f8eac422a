import type { Metadata } from 'next';
import Link from 'next/link';
import { Card } from '@/components/ui/Card';
import { Notice } from '@/components/ui/messages';
import { AcceptInvite } from '@/components/auth/AcceptInvite';
import { checkInvitation } from '@/lib/server/members';
import { currentActor } from '@/lib/server/session';
import { buttonClass } from '@/components/ui/buttons';

export const metadata: Metadata = { title: 'Invitation' };

export default async function InvitePage({ searchParams }: { searchParams: Promise<Record<string, string | undefined>> }) {
  const { token } = await searchParams;
  const inv = token ? await checkInvitation(token) : null;
  const actor = await currentActor();
  if (!token || !inv) {
    return (
      <Card title="Invitation">
        <Notice tone="error">This invitation link is not valid any more (expired, used or withdrawn). Ask the project owner for a new one.</Notice>
      </Card>
    );
  }
  const back = `/invite?token=${encodeURIComponent(token)}`;
  return (
    <Card title={`Join “${inv.projectName}”`}>
      <p className="text-sm text-ink-soft">
        You are invited as <strong>{inv.role}</strong>. The invitation is for {inv.email} and runs until {new Date(inv.expiresAt).toUTCString()}.
      </p>
      {actor ? (
        actor.email === inv.email ? (
          <AcceptInvite token={token} />
        ) : (
          <Notice tone="warn">You are signed in as {actor.email}. Sign out and sign in as {inv.email} to accept.</Notice>
        )
      ) : (
        <div className="flex gap-3 text-sm">
          <Link href={`/signup?invite=${encodeURIComponent(token)}`} className={buttonClass}>Create an account</Link>
          <Link href={`/signin?callbackUrl=${encodeURIComponent(back)}`} className="rounded-md border border-rule px-4 py-2 font-medium">I have an account</Link>
        </div>
      )}
    </Card>
  );
}
