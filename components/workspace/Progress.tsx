'use client';
/** A fixed-height progress strip: the space is always there, so nothing jumps when a job starts. */
import { useEffect, useState } from 'react';

export function Progress({ running, stage, fraction, startedAt, label, onCancel }: { running: boolean; stage: string | null; fraction: number | null; startedAt: number | null; label: string; onCancel?: () => void }) {
  const [now, setNow] = useState(() => Date.now());
  useEffect(() => {
    if (!running) return;
    const t = setInterval(() => setNow(Date.now()), 250);
    return () => clearInterval(t);
  }, [running]);
  const secs = running && startedAt ? Math.max(0, (now - startedAt) / 1000) : 0;
  return (
    <div className="h-9" aria-live="polite">
      {running ? (
        <div className="flex h-full items-center gap-2">
          <div className="flex-1">
            <div className="flex justify-between text-[11px] text-ink-soft">
              <span>
                {label}: {stage}
              </span>
              <span className="font-mono">{secs.toFixed(1)} s</span>
            </div>
            <div className="mt-0.5 h-1.5 overflow-hidden rounded bg-tide-pale" role="progressbar" aria-label={label} aria-valuemin={0} aria-valuemax={100} aria-valuenow={Math.round(100 * (fraction ?? 0))}>
              <div className="h-full bg-tide transition-[width]" style={{ width: `${Math.max(5, 100 * (fraction ?? 0))}%` }} />
            </div>
          </div>
          {onCancel ? (
            <button type="button" onClick={onCancel} className="rounded-md border border-clay px-2 py-1 text-xs text-clay hover:bg-clay-pale">
              Cancel
            </button>
          ) : null}
        </div>
      ) : null}
    </div>
  );
}
