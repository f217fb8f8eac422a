'use client';
/** Names with a number each (a mixed occupancy: element → fraction): rename, change, remove, add. */
import { ErrorText, Hint, inputCls, joinPath, useFieldText, type FieldProps } from './field-parts';
import { NumberBox } from './NumberBox';

/** A symbol not yet in the list, so adding never overwrites an entry. */
function freshKey(taken: Record<string, unknown>): string {
  if (!('Al' in taken)) return 'Al';
  let n = Object.keys(taken).length + 1;
  while (`El${n}` in taken) n++;
  return `El${n}`;
}

export function RecordField(props: FieldProps) {
  const { id, errId, err, title, help } = useFieldText(props);
  const { value, path, errors, onChange } = props;
  const obj = (value && typeof value === 'object' ? value : {}) as Record<string, unknown>;
  const entries = Object.entries(obj);
  return (
    <fieldset className="rounded-md border border-rule p-2">
      <legend className="px-1 text-xs font-semibold text-ink">{title}</legend>
      {entries.map(([k, v], i) => {
        const entryErr = errors.get(joinPath([...path, k]));
        return (
          <div key={i} className="mb-1 grid grid-cols-[1fr_1fr_auto] items-start gap-1">
            <input
              aria-label={`${title} element ${i + 1}`}
              className={inputCls}
              value={k}
              onChange={(e) => {
                const next: Record<string, unknown> = {};
                for (const [kk, vv] of entries) next[kk === k ? e.target.value : kk] = vv;
                onChange(next);
              }}
            />
            <NumberBox id={`${id}-${i}`} label={`${title} fraction ${i + 1}`} value={v} integer={false} invalid={!!entryErr} onChange={(nv) => onChange({ ...obj, [k]: nv })} />
            <button type="button" aria-label={`Remove ${k}`} className="px-1 text-xs text-clay" onClick={() => onChange(Object.fromEntries(entries.filter(([kk]) => kk !== k)))}>
              ✕
            </button>
            {entryErr ? <p className="col-span-3 text-xs text-clay">{entryErr}</p> : null}
          </div>
        );
      })}
      <button type="button" className="text-xs text-tide underline" onClick={() => onChange({ ...obj, [freshKey(obj)]: 0.5 })}>
        Add element
      </button>
      <Hint text={help} />
      <ErrorText id={errId} message={err} />
    </fieldset>
  );
}
