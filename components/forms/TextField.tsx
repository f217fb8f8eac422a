'use client';
/** A line of text (a name, an element symbol, an order such as 3/2). */
import { FieldLabel, Note, inputCls, useFieldText, type FieldProps } from './field-parts';

export function TextField(props: FieldProps) {
  const { id, errId, err, title, unit, help } = useFieldText(props);
  return (
    <div>
      <FieldLabel htmlFor={id} title={title} unit={unit} />
      <input
        id={id}
        type="text"
        className={inputCls}
        value={typeof props.value === 'string' ? props.value : ''}
        aria-invalid={!!err}
        aria-describedby={err ? errId : undefined}
        onChange={(e) => props.onChange(e.target.value === '' && props.info.optional ? undefined : e.target.value)}
      />
      <Note errId={errId} err={err} help={help} />
    </div>
  );
}
