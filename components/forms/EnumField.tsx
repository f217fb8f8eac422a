'use client';
/** One of a fixed list of values, each shown in the words the schema gives it. */
import { FieldLabel, Note, inputCls, shownValue, useFieldText, type FieldProps } from './field-parts';

export function EnumField(props: FieldProps) {
  const { id, errId, err, title, unit, help } = useFieldText(props);
  const { info, onChange } = props;
  const value = shownValue(props);
  const options = info.shape.kind === 'enum' ? info.shape.options : [];
  return (
    <div>
      <FieldLabel htmlFor={id} title={title} unit={unit} />
      <select id={id} className={inputCls} value={String(value ?? '')} aria-invalid={!!err} aria-describedby={err ? errId : undefined} onChange={(e) => onChange(e.target.value === '' ? undefined : e.target.value)}>
        {info.optional || value === undefined ? <option value="">—</option> : null}
        {options.map((o) => (
          <option key={o} value={o}>
            {info.optionLabels?.[o] ?? o}
          </option>
        ))}
      </select>
      <Note errId={errId} err={err} help={help} />
    </div>
  );
}
