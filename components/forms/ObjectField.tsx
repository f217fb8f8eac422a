'use client';
/** A group of fields: the model itself at the top, or a nested group (an approximant's p and q) in a box. */
import { useContext } from 'react';
import type { FieldInfo } from './describe';
import { ErrorText, Hint, useFieldText, type ContainerProps } from './field-parts';
import { EnclosingValues } from './scope';

/** The fields a modeller sets first come first; the rest keep the schema's order. */
const FIRST = ['order', 'radius', 'approximant', 'aR', 'edge', 'lattice'];
function priority(key: string): number {
  const i = FIRST.indexOf(key);
  return i < 0 ? FIRST.length : i;
}

function sortedFields(info: FieldInfo, skip?: Set<string>) {
  const fields = info.shape.kind === 'object' ? info.shape.fields : [];
  return [...fields].sort((a, b) => priority(a.key) - priority(b.key)).filter((f) => !skip?.has(f.key));
}

export function ObjectField(props: ContainerProps) {
  const { errId, err, title, help } = useFieldText(props);
  const { Field, info, path, errors, skip, bare, onChange } = props;
  const obj = (props.value && typeof props.value === 'object' ? props.value : {}) as Record<string, unknown>;
  const scopes = useContext(EnclosingValues);
  const body = (
    <EnclosingValues.Provider value={[...scopes, obj]}>
      <div className="space-y-2">
        {sortedFields(info, skip).map((f) => (
          <Field
            key={f.key}
            name={f.key}
            path={[...path, f.key]}
            info={f.info}
            value={obj[f.key]}
            errors={errors}
            onChange={(v) => {
              const next = { ...obj };
              if (v === undefined) delete next[f.key];
              else next[f.key] = v;
              onChange(next);
            }}
          />
        ))}
        <ErrorText id={errId} message={err} />
      </div>
    </EnclosingValues.Provider>
  );
  if (bare || path.length === 0) return body;
  return (
    <fieldset className="rounded-md border border-rule p-2">
      <legend className="px-1 text-xs font-semibold text-ink">{title}</legend>
      {body}
      {!err ? <Hint text={help} /> : null}
    </fieldset>
  );
}
