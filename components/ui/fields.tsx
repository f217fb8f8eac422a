/** A labelled form field: the label wraps the control, so clicking the text focuses it; the error replaces the hint. */
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

/** The look of every text input, textarea and select. */
export const inputClass = 'w-full rounded-md border border-rule bg-card px-3 py-2 text-ink focus:border-tide';
