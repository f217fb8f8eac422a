import type { Metadata } from 'next';
import { Card } from '@/components/ui/Card';
import { SignUpForm } from '@/components/auth/SignUpForm';
import { checkInvitation } from '@/lib/server/members';

export const metadata: Metadata = { title: 'Create an account' };

export default async function SignUpPage({ searchParams }: { searchParams: Promise<Record<string, string | undefined>> }) {
  const sp = await searchParams;
  const inv = sp.invite ? await checkInvitation(sp.invite) : null;
  return (
    <Card title="Create an account">
      <SignUpForm invite={inv ? sp.invite : undefined} invitedEmail={inv?.email} projectName={inv?.projectName} />
    </Card>
  );
}
