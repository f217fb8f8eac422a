import type { Metadata } from 'next';
import { TokensView } from '@/components/auth/TokensView';
import { SessionsPanel } from '@/components/auth/SessionsPanel';
import { requireSignedIn } from '@/lib/server/page-data';
import { siteUrl } from '@/lib/server/mail';

export const metadata: Metadata = { title: 'API tokens' };

export default async function TokensPage() {
  const actor = await requireSignedIn('/settings/tokens');
  return (
    <div className="space-y-4">
      <h1 className="text-3xl font-semibold tracking-tight">API tokens</h1>
      <p className="max-w-2xl text-ink-soft">
        Signed in as {actor.email} ({actor.siteRole}). A token lets a script act as you: send it as <code>Authorization: Bearer …</code>. Give each script the least it needs: a read-only token cannot change anything, and a token with an end date stops working by itself. The API is described at <a className="text-tide underline" href="/api/openapi.json">/api/openapi.json</a>.
      </p>
      <TokensView origin={siteUrl()} />
      <SessionsPanel />
    </div>
  );
}
