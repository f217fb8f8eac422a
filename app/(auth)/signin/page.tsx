import type { Metadata } from 'next';
import { Card } from '@/components/ui/Card';
import { SignInForm } from '@/components/auth/SignInForm';

export const metadata: Metadata = { title: 'Sign in' };

export default async function SignInPage({ searchParams }: { searchParams: Promise<Record<string, string | undefined>> }) {
  const sp = await searchParams;
  return (
    <Card title="Sign in">
      <SignInForm callbackUrl={sp.callbackUrl} error={sp.error} notice={sp.notice === 'verified' ? 'Your address is confirmed. Sign in to start.' : sp.notice === 'reset' ? 'Your password is changed. Sign in with the new one.' : undefined} />
    </Card>
  );
}
