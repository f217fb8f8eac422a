'use client';
import { useState } from 'react';
import Link from 'next/link';
import { send, ApiClientError } from '@/components/ui/api';
import { buttonClass } from '@/components/ui/buttons';
import { Field, inputClass } from '@/components/ui/fields';
import { Notice } from '@/components/ui/messages';

export function SignUpForm(props: { invite?: string; invitedEmail?: string; projectName?: string }) {
  const [name, setName] = useState('');
  const [email, setEmail] = useState(props.invitedEmail ?? '');
  const [password, setPassword] = useState('');
  const [fields, setFields] = useState<Record<string, string>>({});
  const [error, setError] = useState<string | null>(null);
  const [done, setDone] = useState<{ message: string; verified: boolean } | null>(null);
  const [busy, setBusy] = useState(false);

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    setFields({});
    try {
      const r = await send<{ message: string; verified: boolean }>('POST', '/api/account/signup', { name, email, password, ...(props.invite ? { invite: props.invite } : {}) });
      setDone(r);
    } catch (err) {
      if (err instanceof ApiClientError) {
        setFields(err.fields);
        setError(err.message);
      } else setError('The server could not be reached.');
    } finally {
      setBusy(false);
    }
  }

  if (done) {
    return (
      <div className="space-y-3">
        <Notice>{done.message}</Notice>
        {done.verified && <Link href="/signin" className="text-tide underline">Sign in</Link>}
      </div>
    );
  }
  return (
    <form onSubmit={submit} className="space-y-4" noValidate>
      {props.projectName && <Notice tone="warn">You were invited to “{props.projectName}”. Create your account with the invited address to join it.</Notice>}
      {error && <Notice tone="error">{error}</Notice>}
      <Field label="Your name" error={fields.name}>
        <input name="name" autoComplete="name" value={name} onChange={(e) => setName(e.target.value)} className={inputClass} />
      </Field>
      <Field label="E-mail" error={fields.email}>
        <input name="email" type="email" autoComplete="email" value={email} onChange={(e) => setEmail(e.target.value)} className={inputClass} />
      </Field>
      <Field label="Password" error={fields.password} hint="At least 10 characters.">
        <input name="password" type="password" autoComplete="new-password" value={password} onChange={(e) => setPassword(e.target.value)} className={inputClass} />
      </Field>
      <button type="submit" disabled={busy} className={buttonClass}>
        {busy ? 'Creating…' : 'Create account'}
      </button>
      <p className="text-sm text-ink-soft">
        Already have one? <Link href="/signin" className="text-tide underline">Sign in</Link>
      </p>
    </form>
  );
}
