'use client';
import { signOut } from 'next-auth/react';
import { quietButtonClass } from '@/components/ui/buttons';

export function SignOutButton() {
  return (
    <button type="button" onClick={() => signOut({ callbackUrl: '/' })} className={quietButtonClass}>
      Sign out
    </button>
  );
}
