'use client';
/** A named value or something spelt out (a site position: "body", or six coordinates). */
import { initialValue } from './describe';
import { FieldLabel, Note, inputCls, useFieldText, type ContainerProps } from './field-parts';

const SPELT_OUT = '__custom';

export function ChoiceField(props: ContainerProps) {
  const { id, errId, err, title, unit, help } = useFieldText(props);
  const { Field, info, value, path, errors, name, onChange } = props;
  if (info.shape.kind !== 'choice') return null;
  const named = info.shape.options.find((o) => o.shape.kind === 'enum');
  const other = info.shape.options.find((o) => o.shape.kind !== 'enum');
  const isNamed = typeof value === 'string' || value === undefined;
  const names = named?.shape.kind === 'enum' ? named.shape.options : [];
  return (
    <div>
      <FieldLabel htmlFor={id} title={title} unit={unit} />
      <select
        id={id}
        className={inputCls}
        value={isNamed ? String(value ?? names[0] ?? '') : SPELT_OUT}
        aria-invalid={!!err}
        aria-describedby={err ? errId : undefined}
        onChange={(e) => onChange(e.target.value === SPELT_OUT ? (other ? initialValue(other) : undefined) : e.target.value)}
      >
        {names.map((o) => (
          <option key={o} value={o}>
            {named?.optionLabels?.[o] ?? o}
          </option>
        ))}
        {other ? <option value={SPELT_OUT}>{other.title ?? 'spelt out'}…</option> : null}
      </select>
      {/* Spelt out, the vector below shows the message itself. */}
      {!isNamed && other ? (
        <div className="mt-1">
          <Field name={name} path={path} info={other} value={value} onChange={onChange} errors={errors} />
        </div>
      ) : (
        <Note errId={errId} err={err} help={help} />
      )}
    </div>
  );
}
