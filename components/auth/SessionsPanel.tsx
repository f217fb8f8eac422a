'use client';
import { useState } from 'react';
import { signOut } from 'next-auth/react';
import { send } from '@/components/ui/api';
import { dangerButtonClass } from '@/components/ui/buttons';
import { Notice } from '@/components/ui/messages';

/** Sign out everywhere: ends every session of the account on every device (this one too). */
export function SessionsPanel() {
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  return (
    <section className="space-y-2 rounded-lg border border-rule bg-card p-4" aria-label="Sessions">
      <h2 className="font-semibold">Signed-in browsers</h2>
      <p className="text-sm text-ink-soft">
        Signing out here removes this browser’s session. If you signed in on a computer you no longer use, or think someone else has, end every
        session at once; you will need to sign in again everywhere. A password reset does the same. API tokens are separate: revoke them above.
      </p>
      {error && <Notice tone="error">{error}</Notice>}
      <button type="button" disabled={busy} className={dangerButtonClass} onClick={async () => {
        setBusy(true);
        try {
          await send('DELETE', '/api/account/sessions');
          await signOut({ callbackUrl: '/signin' });
        } catch (e) {
          setError((e as Error).message);
          setBusy(false);
        }
      }}>{busy ? 'Signing out everywhere…' : 'Sign out everywhere'}</button>
    </section>
  );
}
