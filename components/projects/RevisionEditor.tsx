'use client';
/**
 * Save a new revision from a params JSON text. The save carries the revision it started from;
 * when someone else saved first the server answers 409 with their revision, and the text here
 * stays exactly as typed so nothing is lost.
 */
import { useState } from 'react';
import { useRouter } from 'next/navigation';
import { send, ApiClientError } from '@/components/ui/api';
import { buttonClass, quietButtonClass } from '@/components/ui/buttons';
import { Field, inputClass } from '@/components/ui/fields';
import { Notice } from '@/components/ui/messages';
import type { RevisionInfo } from '@/lib/server/revisions';

export function RevisionEditor({ projectId, head }: { projectId: number; head: RevisionInfo | null }) {
  const router = useRouter();
  const [base, setBase] = useState<RevisionInfo | null>(head);
  const [text, setText] = useState(JSON.stringify(head?.params ?? {}, null, 2));
  const [message, setMessage] = useState('');
  const [error, setError] = useState<string | null>(null);
  const [fields, setFields] = useState<Record<string, string>>({});
  const [conflict, setConflict] = useState<RevisionInfo | null>(null);
  const [saved, setSaved] = useState<number | null>(null);
  const [busy, setBusy] = useState(false);

  async function save(e: React.FormEvent) {
    e.preventDefault();
    setError(null);
    setFields({});
    setSaved(null);
    let params: unknown;
    try {
      params = JSON.parse(text);
    } catch (err) {
      setError(`The parameters are not valid JSON: ${(err as Error).message}`);
      return;
    }
    setBusy(true);
    try {
      const r = await send<RevisionInfo>('POST', `/api/projects/${projectId}/revisions`, { params, message, baseRevision: base?.id ?? null });
      setBase(r);
      setConflict(null);
      setMessage('');
      setSaved(r.number);
      router.refresh();
    } catch (err) {
      if (err instanceof ApiClientError) {
        if (err.status === 409) setConflict((err.details as { head: RevisionInfo | null })?.head ?? null);
        setFields(err.fields);
        setError(err.message);
      } else setError('The server could not be reached; nothing was saved.');
    } finally {
      setBusy(false);
    }
  }

  return (
    <form onSubmit={save} className="space-y-3" aria-label="Save a revision" noValidate>
      {saved && <Notice>Saved as revision {saved}.</Notice>}
      {error && <Notice tone="error">{error}</Notice>}
      {Object.entries(fields).length > 0 && (
        <ul className="list-inside list-disc text-xs text-clay">
          {Object.entries(fields).map(([k, v]) => (
            <li key={k}><code>{k}</code>: {v}</li>
          ))}
        </ul>
      )}
      {conflict && (
        <div className="space-y-2 rounded-md border border-brass bg-brass-pale p-3 text-sm">
          <p>
            Revision {conflict.number} by {conflict.authorName ?? 'someone'} (“{conflict.message}”) is newer than the one you edited. Its parameters:
          </p>
          <pre className="max-h-40 overflow-auto rounded bg-card p-2 font-mono text-xs">{JSON.stringify(conflict.params, null, 2)}</pre>
          <div className="flex gap-2">
            <button type="button" className={quietButtonClass} onClick={() => { setBase(conflict); setConflict(null); setError(null); }}>
              Keep my text and save on top of revision {conflict.number}
            </button>
            <button type="button" className={quietButtonClass} onClick={() => { setBase(conflict); setText(JSON.stringify(conflict.params, null, 2)); setConflict(null); setError(null); }}>
              Drop my text, load revision {conflict.number}
            </button>
          </div>
        </div>
      )}
      <Field label={`Model parameters (editing revision ${base?.number ?? '—'})`}>
        <textarea name="params" value={text} onChange={(e) => setText(e.target.value)} rows={10} spellCheck={false} className={`${inputClass} font-mono text-xs`} />
      </Field>
      <Field label="What changed" error={fields.message}>
        <input name="message" value={message} onChange={(e) => setMessage(e.target.value)} className={inputClass} placeholder="e.g. order 11, offset 0.2" />
      </Field>
      <button type="submit" disabled={busy} className={buttonClass}>{busy ? 'Saving…' : 'Save revision'}</button>
    </form>
  );
}
