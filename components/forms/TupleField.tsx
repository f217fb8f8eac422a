'use client';
/** A vector of a fixed length (a phason offset, a centre, six fractional coordinates): one box per entry. */
import { initialValue } from './describe';
import { ErrorText, Hint, joinPath, useFieldText, type FieldProps } from './field-parts';
import { itemName } from './messages';
import { NumberBox } from './NumberBox';

export function TupleField(props: FieldProps) {
  const { id, errId, err, title, unit, help } = useFieldText(props);
  const { info, value, path, errors, onChange } = props;
  const items = info.shape.kind === 'tuple' ? info.shape.items : [];
  const arr = Array.isArray(value) ? value : (initialValue(info) as unknown[]);
  // A message about one entry is shown under the vector, as the entries sit side by side.
  const itemErrors = items.map((_, i) => errors.get(joinPath([...path, i])));
  const messages = [err, ...itemErrors].filter((m): m is string => !!m);
  return (
    <fieldset aria-describedby={messages.length ? errId : undefined}>
      <legend className="text-xs font-medium text-ink-soft">
        {title}
        {unit ? <span className="ml-1 font-normal">({unit})</span> : null}
      </legend>
      <div className="mt-0.5 grid gap-1" style={{ gridTemplateColumns: `repeat(${Math.min(items.length, 3)}, minmax(0, 1fr))` }}>
        {items.map((it, i) => (
          <NumberBox
            key={i}
            id={`${id}-${i}`}
            label={`${title} ${itemName(items.length, i)}`}
            value={arr[i]}
            integer={it.shape.kind === 'number' && it.shape.integer}
            invalid={!!(err || itemErrors[i])}
            describedBy={messages.length ? errId : undefined}
            onChange={(v) => {
              const next = [...arr];
              next[i] = v;
              onChange(next);
            }}
          />
        ))}
      </div>
      {messages.length ? (
        <div id={errId}>
          {messages.map((m, i) => (
            <ErrorText key={i} message={m} />
          ))}
        </div>
      ) : (
        <Hint text={help} />
      )}
    </fieldset>
  );
}
