'use client';
import { useState } from 'react';
import { useRouter } from 'next/navigation';
import { saveAs } from 'file-saver';
import { getBlob } from '@/components/ui/api';
import { buttonClass, quietButtonClass } from '@/components/ui/buttons';
import { inputClass } from '@/components/ui/fields';
import { Notice } from '@/components/ui/messages';
import { forkProject } from './fork';
import { exportNow } from '@/components/workspace/jobs-client';

export function ForkButton({ projectId, revision, signedIn }: { projectId: number; revision?: number; signedIn: boolean }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  if (!signedIn) return <a href={`/signin?callbackUrl=/projects/${projectId}`} className={quietButtonClass}>Sign in to fork</a>;
  return (
    <span className="inline-flex flex-col gap-1">
      <button
        type="button"
        disabled={busy}
        className={quietButtonClass}
        onClick={async () => {
          setBusy(true);
          const r = await forkProject(projectId, revision);
          if (r.id) router.push(`/projects/${r.id}`);
          else {
            setError(r.error ?? null);
            setBusy(false);
          }
        }}
      >
        {busy ? 'Forking…' : revision ? 'Fork this revision' : 'Fork'}
      </button>
      {error && <span className="text-xs text-clay">{error}</span>}
    </span>
  );
}

export async function downloadExport(id: number, filename: string): Promise<void> {
  saveAs(await getBlob(`/api/exports/${id}/download`), filename);
}

const FORMATS = [
  ['xyz', 'XYZ'],
  ['extxyz', 'Extended XYZ'],
  ['cif', 'CIF (space group)'],
  ['cif-p1', 'CIF (P 1, all atoms)'],
  ['json', 'Tauforge JSON'],
  ['peaks-csv', 'Powder peak list (CSV, Cu Kα1)'],
] as const;

export function ExportPanel({ projectId, revision, revisionNumber }: { projectId: number; revision: number; revisionNumber: number }) {
  const [format, setFormat] = useState('xyz');
  const [state, setState] = useState<{ tone: 'ok' | 'error'; text: string } | null>(null);
  const [busy, setBusy] = useState(false);
  return (
    <div className="space-y-2">
      <div className="flex items-center gap-2">
        <select aria-label="Export format" value={format} onChange={(e) => setFormat(e.target.value)} className={`${inputClass} w-auto`}>
          {FORMATS.map(([v, l]) => (
            <option key={v} value={v}>{l}</option>
          ))}
        </select>
        <button
          type="button"
          disabled={busy}
          className={buttonClass}
          onClick={async () => {
            setBusy(true);
            setState(null);
            try {
              const e = await exportNow(projectId, revision, format);
              await downloadExport(e.id, e.filename);
              setState({ tone: 'ok', text: `${e.filename} (sha256 ${e.sha256.slice(0, 12)}…)${e.reused ? ', the stored copy' : ''}` });
            } catch (err) {
              setState({ tone: 'error', text: err instanceof Error ? err.message : 'Export failed.' });
            } finally {
              setBusy(false);
            }
          }}
        >
          {busy ? 'Generating…' : `Export revision ${revisionNumber}`}
        </button>
      </div>
      {state && <Notice tone={state.tone}>{state.text}</Notice>}
    </div>
  );
}
