'use client';
import { buttonClass } from '@/components/ui/buttons';

export default function ErrorPage({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <div className="mx-auto max-w-md space-y-3 py-16 text-center" role="alert">
      <h1 className="text-2xl font-semibold">Something went wrong</h1>
      <p className="text-ink-soft">The page failed while loading. Your saved revisions are safe.</p>
      {error.digest ? <p className="font-mono text-xs text-ink-soft">reference {error.digest}</p> : null}
      <button type="button" onClick={reset} className={buttonClass}>
        Try again
      </button>
    </div>
  );
}
