'use client';
/**
 * A group the model may go without (a periodic approximant, a decoration, mixed occupancy): a switch, and when
 * it is on, the group's fields in a box under it. Switching on starts from the schema's example.
 */
import type { ReactNode } from 'react';
import { initialValue } from './describe';
import { ErrorText, Hint, useFieldText, type FieldProps } from './field-parts';

export function OptionalGroup(props: FieldProps & { children: (inner: FieldProps) => ReactNode }) {
  const { errId, err, title, help } = useFieldText(props);
  const { info, value, onChange, children } = props;
  const on = value !== undefined;
  const inner: FieldProps = { ...props, info: { ...info, optional: false }, bare: true, labelOverride: title };
  return (
    <div className="space-y-1">
      <label className="flex items-center gap-2 text-sm font-medium">
        <input type="checkbox" checked={on} onChange={(e) => onChange(e.target.checked ? initialValue(inner.info) : undefined)} className="accent-tide" aria-describedby={err && !on ? errId : undefined} />
        {title}
      </label>
      {on ? <div className={info.shape.kind === 'object' ? 'ml-5 rounded-md border border-rule p-2' : 'ml-5'}>{children(inner)}</div> : null}
      <Hint text={help} />
      {on ? null : <ErrorText id={errId} message={err} />}
    </div>
  );
}
