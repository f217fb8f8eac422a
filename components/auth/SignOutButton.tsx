'use client';
import { signOut } from 'next-auth/react';

export function SignOutButton() {
  return (
    <button type="button" onClick={() => signOut({ callbackUrl: '/' })} className="rounded-md border border-rule px-3 py-1.5 text-sm hover:border-tide">
      Sign out
    </button>
  );
}
