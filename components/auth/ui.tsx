/** Small form pieces shared by the account pages. */
export function Field(props: { label: string; error?: string; children: React.ReactNode; hint?: string }) {
  return (
    <label className="block space-y-1 text-sm">
      <span className="font-medium text-ink">{props.label}</span>
      {props.children}
      {props.hint && !props.error && <span className="block text-xs text-ink-soft">{props.hint}</span>}
      {props.error && <span className="block text-xs text-clay">{props.error}</span>}
    </label>
  );
}

export const inputClass = 'w-full rounded-md border border-rule bg-card px-3 py-2 text-ink focus:border-tide';
export const buttonClass = 'rounded-md bg-tide px-4 py-2 font-medium text-white hover:bg-tide-deep disabled:opacity-50';
export const quietButtonClass = 'rounded-md border border-rule bg-card px-3 py-1.5 text-sm font-medium hover:border-tide disabled:opacity-50';
export const dangerButtonClass = 'rounded-md border border-clay px-3 py-1.5 text-sm font-medium text-clay hover:bg-clay-pale disabled:opacity-50';

export function Notice(props: { tone?: 'ok' | 'warn' | 'error'; children: React.ReactNode }) {
  const tone = props.tone ?? 'ok';
  const cls = tone === 'ok' ? 'border-tide bg-tide-pale text-tide-deep' : tone === 'warn' ? 'border-brass bg-brass-pale text-ink' : 'border-clay bg-clay-pale text-clay';
  return (
    <p role={tone === 'error' ? 'alert' : 'status'} className={`rounded-md border px-3 py-2 text-sm ${cls}`}>
      {props.children}
    </p>
  );
}

export function Card(props: { title: string; children: React.ReactNode }) {
  return (
    <div className="mx-auto max-w-md space-y-4 rounded-lg border border-rule bg-card p-6">
      <h1 className="text-2xl font-semibold tracking-tight">{props.title}</h1>
      {props.children}
    </div>
  );
}
