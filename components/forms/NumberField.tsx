'use client';
/** A number with its label, unit, help line and message. */
import { FieldLabel, Note, shownValue, useFieldText, type FieldProps } from './field-parts';
import { NumberBox } from './NumberBox';

export function NumberField(props: FieldProps) {
  const { id, errId, err, title, unit, help } = useFieldText(props);
  const integer = props.info.shape.kind === 'number' && props.info.shape.integer;
  return (
    <div>
      <FieldLabel htmlFor={id} title={title} unit={unit} />
      <NumberBox id={id} value={shownValue(props)} onChange={props.onChange} integer={integer} invalid={!!err} describedBy={err ? errId : undefined} optional={props.info.optional} />
      <Note errId={errId} err={err} help={help} />
    </div>
  );
}
