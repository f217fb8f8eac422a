import type { Metadata } from 'next';
import { Card } from '@/components/ui/Card';
import { ResetConfirmForm, ResetRequestForm } from '@/components/auth/TokenActionForm';

export const metadata: Metadata = { title: 'Reset your password' };

export default async function ResetPage({ searchParams }: { searchParams: Promise<Record<string, string | undefined>> }) {
  const { token } = await searchParams;
  return <Card title={token ? 'Choose a new password' : 'Reset your password'}>{token ? <ResetConfirmForm token={token} /> : <ResetRequestForm />}</Card>;
}
