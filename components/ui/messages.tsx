/** A one-line outcome: errors are alerts (read out at once by screen readers), the rest are polite status. */
export function Notice(props: { tone?: 'ok' | 'warn' | 'error'; children: React.ReactNode }) {
  const tone = props.tone ?? 'ok';
  const cls = tone === 'ok' ? 'border-tide bg-tide-pale text-tide-deep' : tone === 'warn' ? 'border-brass bg-brass-pale text-ink' : 'border-clay bg-clay-pale text-clay';
  return (
    <p role={tone === 'error' ? 'alert' : 'status'} className={`rounded-md border px-3 py-2 text-sm ${cls}`}>
      {props.children}
    </p>
  );
}
