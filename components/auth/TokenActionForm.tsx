'use client';
/** One button that posts a link's token (verify) or a token + new password (reset). */
import { useState } from 'react';
import { useRouter } from 'next/navigation';
import { send, ApiClientError } from '@/components/ui/api';
import { buttonClass } from '@/components/ui/buttons';
import { Field, inputClass } from '@/components/ui/fields';
import { Notice } from '@/components/ui/messages';

export function VerifyButton({ token }: { token: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  return (
    <div className="space-y-3">
      {error && <Notice tone="error">{error}</Notice>}
      <button
        type="button"
        disabled={busy}
        className={buttonClass}
        onClick={async () => {
          setBusy(true);
          try {
            await send('POST', '/api/account/verify', { token });
            router.push('/signin?notice=verified');
          } catch (e) {
            setError(e instanceof ApiClientError ? e.message : 'The server could not be reached.');
            setBusy(false);
          }
        }}
      >
        Confirm my address
      </button>
    </div>
  );
}

export function ResetRequestForm() {
  const [email, setEmail] = useState('');
  const [msg, setMsg] = useState<{ tone: 'ok' | 'error'; text: string } | null>(null);
  const [busy, setBusy] = useState(false);
  return (
    <form
      className="space-y-4"
      noValidate
      onSubmit={async (e) => {
        e.preventDefault();
        setBusy(true);
        try {
          const r = await send<{ message: string }>('POST', '/api/account/reset', { email });
          setMsg({ tone: 'ok', text: r.message });
        } catch (err) {
          setMsg({ tone: 'error', text: err instanceof ApiClientError ? err.message : 'The server could not be reached.' });
        } finally {
          setBusy(false);
        }
      }}
    >
      {msg && <Notice tone={msg.tone}>{msg.text}</Notice>}
      <Field label="E-mail">
        <input name="email" type="email" value={email} onChange={(e) => setEmail(e.target.value)} className={inputClass} />
      </Field>
      <button type="submit" disabled={busy} className={buttonClass}>Send me a reset link</button>
    </form>
  );
}

export function ResetConfirmForm({ token }: { token: string }) {
  const router = useRouter();
  const [password, setPassword] = useState('');
  const [error, setError] = useState<string | null>(null);
  const [field, setField] = useState<string | undefined>();
  const [busy, setBusy] = useState(false);
  return (
    <form
      className="space-y-4"
      noValidate
      onSubmit={async (e) => {
        e.preventDefault();
        setBusy(true);
        setError(null);
        try {
          await send('POST', '/api/account/reset/confirm', { token, password });
          router.push('/signin?notice=reset');
        } catch (err) {
          if (err instanceof ApiClientError) {
            setField(err.fields.password);
            setError(err.message);
          } else setError('The server could not be reached.');
          setBusy(false);
        }
      }}
    >
      {error && <Notice tone="error">{error}</Notice>}
      <Field label="New password" error={field} hint="At least 10 characters.">
        <input name="password" type="password" autoComplete="new-password" value={password} onChange={(e) => setPassword(e.target.value)} className={inputClass} />
      </Field>
      <button type="submit" disabled={busy} className={buttonClass}>Set the new password</button>
    </form>
  );
}
