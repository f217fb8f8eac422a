'use client';
/** A name that must be one of a list's names (a cluster's site class): picked from those names. */
import { FieldLabel, Note, inputCls, useFieldText, type FieldProps } from './field-parts';
import { useNamesOf } from './scope';

export function NamePicker(props: FieldProps) {
  const { id, errId, err, title, help } = useFieldText(props);
  const names = useNamesOf(props.info.namesOf) ?? [];
  const value = typeof props.value === 'string' ? props.value : '';
  // A name that no longer exists (its class was renamed) stays visible, so the message beside it makes sense.
  const options = value && !names.includes(value) ? [value, ...names] : names;
  return (
    <div>
      <FieldLabel htmlFor={id} title={title} />
      <select id={id} className={inputCls} value={value} aria-invalid={!!err} aria-describedby={err ? errId : undefined} onChange={(e) => props.onChange(e.target.value)}>
        {value === '' ? <option value="">—</option> : null}
        {options.map((n) => (
          <option key={n} value={n}>
            {n}
          </option>
        ))}
      </select>
      <Note errId={errId} err={err} help={help} />
    </div>
  );
}
