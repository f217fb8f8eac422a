import type { Metadata } from 'next';
import { Card } from '@/components/ui/Card';
import { Notice } from '@/components/ui/messages';
import { VerifyButton } from '@/components/auth/TokenActionForm';

export const metadata: Metadata = { title: 'Confirm your address' };

export default async function VerifyPage({ searchParams }: { searchParams: Promise<Record<string, string | undefined>> }) {
  const { token } = await searchParams;
  return (
    <Card title="Confirm your address">
      {token ? (
        <>
          <p className="text-sm text-ink-soft">One click and your account is ready.</p>
          <VerifyButton token={token} />
        </>
      ) : (
        <Notice tone="error">This link is incomplete. Open the link from the message exactly as it was sent.</Notice>
      )}
    </Card>
  );
}
