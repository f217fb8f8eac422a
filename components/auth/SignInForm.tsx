'use client';
import { useState } from 'react';
import { useRouter } from 'next/navigation';
import Link from 'next/link';
import { signIn } from 'next-auth/react';
import { buttonClass } from '@/components/ui/buttons';
import { Field, inputClass } from '@/components/ui/fields';
import { Notice } from '@/components/ui/messages';
import { signinMessage } from './messages';
import { safeCallbackPath } from '@/lib/auth/callback';

export function SignInForm(props: { callbackUrl?: string; error?: string; notice?: string }) {
  const router = useRouter();
  const [email, setEmail] = useState('');
  const [password, setPassword] = useState('');
  const [error, setError] = useState<string | null>(signinMessage(props.error));
  const [busy, setBusy] = useState(false);

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    const r = await signIn('credentials', { email, password, redirect: false });
    setBusy(false);
    if (!r || r.error) {
      setError(signinMessage(r?.error ?? 'CredentialsSignin'));
      return;
    }
    // Parsed against our own origin: only a path on this site is followed (lib/auth/callback.ts).
    router.push(safeCallbackPath(props.callbackUrl, window.location.origin));
    router.refresh();
  }

  return (
    <form onSubmit={submit} className="space-y-4" noValidate>
      {props.notice && <Notice>{props.notice}</Notice>}
      {error && <Notice tone="error">{error}</Notice>}
      <Field label="E-mail">
        <input name="email" type="email" autoComplete="email" required value={email} onChange={(e) => setEmail(e.target.value)} className={inputClass} />
      </Field>
      <Field label="Password">
        <input name="password" type="password" autoComplete="current-password" required value={password} onChange={(e) => setPassword(e.target.value)} className={inputClass} />
      </Field>
      <button type="submit" disabled={busy} className={buttonClass}>
        {busy ? 'Signing in…' : 'Sign in'}
      </button>
      <p className="text-sm text-ink-soft">
        New here? <Link href="/signup" className="text-tide underline">Create an account</Link> · <Link href="/reset" className="text-tide underline">Forgot your password?</Link>
      </p>
    </form>
  );
}
