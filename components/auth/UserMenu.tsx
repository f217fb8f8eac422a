import Link from 'next/link';
import { currentActor } from '@/lib/server/session';
import { SignOutButton } from './SignOutButton';

/** Right end of the header: who is signed in, their settings, admin pages, sign-out. */
export async function UserMenu() {
  const actor = await currentActor();
  if (!actor) {
    return (
      <Link href="/signin" className="rounded-md border border-tide px-3 py-1.5 text-sm font-medium text-tide hover:bg-tide-pale">
        Sign in
      </Link>
    );
  }
  return (
    <div className="flex items-center gap-3 text-sm">
      {actor.siteRole === 'admin' && (
        <>
          <Link href="/admin/users" className="text-ink-soft hover:text-tide">Users</Link>
          <Link href="/admin/mailbox" className="text-ink-soft hover:text-tide">Mailbox</Link>
        </>
      )}
      <Link href="/settings/tokens" className="text-ink-soft hover:text-tide" title={actor.email} data-testid="signed-in-as">
        {actor.name || actor.email}
      </Link>
      <SignOutButton />
    </div>
  );
}
