'use client';
import { useState } from 'react';
import { useRouter } from 'next/navigation';
import { send, ApiClientError } from '@/components/ui/api';
import { buttonClass } from '@/components/ui/buttons';
import { Notice } from '@/components/ui/messages';

export function AcceptInvite({ token }: { token: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  return (
    <div className="space-y-3">
      {error && <Notice tone="error">{error}</Notice>}
      <button
        type="button"
        className={buttonClass}
        onClick={async () => {
          try {
            const r = await send<{ projectId: number }>('POST', '/api/invitations', { token });
            router.push(`/projects/${r.projectId}`);
          } catch (e) {
            setError(e instanceof ApiClientError ? e.message : 'The server could not be reached.');
          }
        }}
      >
        Join the project
      </button>
    </div>
  );
}
