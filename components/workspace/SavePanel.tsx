'use client';
/**
 * Save a new revision (with a message, against the revision the edits started from). Forking is components/projects/fork.ts.
 * On 409 the newer revision is shown and the user's edits stay in the form.
 * The Check step's warnings for the cut on screen are shown before saving; a severe one must be acknowledged.
 */
import { useState } from 'react';
import { useExportState } from './downloads';

export interface RevisionRef {
  id: string;
  number?: number;
  message?: string;
  author?: string;
  createdAt?: string;
  params?: unknown;
}

export interface SaveResult {
  saved?: RevisionRef;
  conflict?: RevisionRef;
  error?: string;
  fieldErrors?: Record<string, string>;
}

function revisionFrom(body: unknown): RevisionRef | undefined {
  const b = body as Record<string, unknown> | null;
  const r = (b?.revision ?? b?.head ?? b?.current ?? b) as Record<string, unknown> | null;
  if (!r || (r.id === undefined && r.number === undefined)) return undefined;
  return {
    id: String(r.id ?? r.number),
    number: typeof r.number === 'number' ? r.number : undefined,
    message: typeof r.message === 'string' ? r.message : undefined,
    author: typeof r.authorName === 'string' ? r.authorName : undefined,
    createdAt: typeof r.createdAt === 'string' ? r.createdAt : undefined,
    params: r.params,
  };
}

export async function postRevision(projectId: string, params: unknown, message: string, baseRevision: string | null): Promise<SaveResult> {
  let res: Response;
  try {
    res = await fetch(`/api/projects/${encodeURIComponent(projectId)}/revisions`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ params, message, baseRevision: baseRevision === null ? null : Number(baseRevision) }),
    });
  } catch {
    return { error: 'The server could not be reached; your edits are still here.' };
  }
  const body = (await res.json().catch(() => null)) as { error?: { code?: string; message?: string; details?: { head?: unknown; fields?: Record<string, string> } | null } } | null;
  if (res.status === 409) return { conflict: revisionFrom(body?.error?.details?.head) ?? { id: '?' } };
  if (!res.ok) {
    const fields = body?.error?.details?.fields;
    return { error: body?.error?.message ?? `Saving failed (HTTP ${res.status}).`, fieldErrors: fields && typeof fields === 'object' ? fields : undefined };
  }
  return { saved: revisionFrom(body) };
}

export function SaveDialog({
  open,
  onClose,
  onSave,
  conflict,
  error,
  busy,
  onTakeTheirs,
}: {
  open: boolean;
  onClose: () => void;
  onSave: (message: string, overwriteBase?: string) => void;
  conflict: RevisionRef | null;
  error: string | null;
  busy: boolean;
  onTakeTheirs: () => void;
}) {
  const [message, setMessage] = useState('');
  const [acknowledged, setAcknowledged] = useState(false);
  const report = useExportState((s) => s.report);
  if (!open) return null;
  const problems = report?.warnings.filter((w) => w.severity !== 'info') ?? [];
  const mustAcknowledge = !!report?.severe && !acknowledged;
  const msgErr = message.trim().length === 0 ? 'message: say in a few words what changed' : message.length > 500 ? 'message: at most 500 characters' : null;
  return (
    <div role="dialog" aria-modal="false" aria-labelledby="save-title" className="absolute right-0 top-full z-20 mt-1 w-96 rounded-lg border border-rule bg-card p-3 shadow-lg">
      <h2 id="save-title" className="text-sm font-semibold">
        Save as a new revision
      </h2>
      <form
        onSubmit={(e) => {
          e.preventDefault();
          if (!msgErr && !mustAcknowledge) onSave(message.trim());
        }}
        className="mt-2 space-y-2"
      >
        <label htmlFor="save-message" className="block text-xs text-ink-soft">
          What changed
        </label>
        <textarea id="save-message" autoFocus rows={2} className="w-full rounded-md border border-rule bg-paper px-2 py-1 text-sm" value={message} onChange={(e) => setMessage(e.target.value)} aria-invalid={!!msgErr && message.length > 0} />
        {msgErr && message.length > 0 ? <p className="text-xs text-clay">{msgErr}</p> : null}
        {problems.length ? (
          <div className={`rounded-md border p-2 text-xs ${report?.severe ? 'border-clay bg-clay-pale' : 'border-brass bg-brass-pale'}`} data-testid="save-check">
            <p className="font-medium">The check of the last cut found:</p>
            <ul className="mt-1 list-disc space-y-0.5 pl-4">
              {problems.map((w, k) => (
                <li key={k} className={w.severity === 'severe' ? 'text-clay' : undefined}>
                  {w.severity === 'severe' ? 'Severe: ' : ''}
                  {w.message}
                </li>
              ))}
            </ul>
            {report?.severe ? (
              <label className="mt-2 flex items-start gap-1.5">
                <input type="checkbox" checked={acknowledged} onChange={(e) => setAcknowledged(e.target.checked)} />
                <span>Save anyway: I know this model has severe problems.</span>
              </label>
            ) : null}
          </div>
        ) : null}
        {conflict ? (
          <div className="rounded-md border border-brass bg-brass-pale p-2 text-xs">
            <p className="font-medium">Someone saved a newer revision while you were editing.</p>
            <p className="mt-1">
              Revision {conflict.number ?? conflict.id}
              {conflict.author ? ` by ${conflict.author}` : ''}
              {conflict.createdAt ? `, ${new Date(conflict.createdAt).toLocaleString()}` : ''}: “{conflict.message ?? 'no message'}”
            </p>
            <p className="mt-1">Your edits are still in the form. Save them on top of the newer revision, or load the newer one instead.</p>
            <div className="mt-2 flex gap-2">
              <button type="button" disabled={!!msgErr || busy || mustAcknowledge} className="rounded bg-tide px-2 py-1 text-white disabled:opacity-50" onClick={() => onSave(message.trim(), conflict.id)}>
                Save mine on top
              </button>
              <button type="button" className="rounded border border-rule px-2 py-1" onClick={onTakeTheirs}>
                Load theirs (drop my edits)
              </button>
            </div>
          </div>
        ) : null}
        {error ? <p className="text-xs text-clay">{error}</p> : null}
        <div className="flex justify-end gap-2">
          <button type="button" className="rounded-md border border-rule px-3 py-1 text-sm" onClick={onClose}>
            Close
          </button>
          <button type="submit" disabled={!!msgErr || busy || !!conflict || mustAcknowledge} title={mustAcknowledge ? 'Tick the box above to save a model with severe problems' : undefined} className="rounded-md bg-tide px-3 py-1 text-sm font-medium text-white hover:bg-tide-deep disabled:opacity-50">
            {busy ? 'Saving…' : 'Save revision'}
          </button>
        </div>
      </form>
    </div>
  );
}
