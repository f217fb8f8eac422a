'use client';
/** A list of like items (site classes, clusters, shells): add, remove, and each item drawn as its own group. */
import { initialValue, titleOf, type FieldInfo } from './describe';
import { ErrorText, Hint, useFieldText, type ContainerProps } from './field-parts';

/** A new item; one with a name gets a name no other item has yet, so clusters can point at it. */
function newItem(element: FieldInfo, items: unknown[], word: string): unknown {
  const v = initialValue(element);
  if (!v || typeof v !== 'object' || Array.isArray(v) || typeof (v as { name?: unknown }).name !== 'string') return v;
  const taken = new Set(items.map((x) => (x && typeof x === 'object' ? (x as { name?: unknown }).name : undefined)));
  let name = (v as { name: string }).name;
  for (let n = items.length + 1; taken.has(name); n++) name = `${word} ${n}`;
  return { ...v, name };
}

export function ArrayField(props: ContainerProps) {
  const { errId, err, title, help } = useFieldText(props);
  const { Field, info, value, path, errors, name, bare, onChange } = props;
  if (info.shape.kind !== 'array') return null;
  const { element, max } = info.shape;
  const arr = Array.isArray(value) ? value : [];
  // Items are named by their own title ("Site class 2"), or by the list's for plain numbers ("Grid offsets γ 2").
  const word = element.title ?? (element.shape.kind === 'object' ? titleOf(element, 'item') : title);
  const lower = element.title ? word.toLowerCase() : 'entry';
  return (
    <div className="space-y-2">
      <div className="flex items-center justify-between">
        <span className="text-xs font-semibold text-ink">
          {/* Under its own on/off switch the list is already named. */}
          {bare ? null : `${title} `}
          <span className="font-normal text-ink-soft">({arr.length})</span>
        </span>
        <button
          type="button"
          disabled={max !== undefined && arr.length >= max}
          className="rounded border border-tide px-2 py-0.5 text-xs text-tide hover:bg-tide-pale disabled:opacity-40"
          onClick={() => onChange([...arr, newItem(element, arr, lower)])}
        >
          Add {lower}
        </button>
      </div>
      {arr.map((item, i) => (
        <div key={i} className="relative rounded-md border border-rule bg-paper/60 p-2">
          <button type="button" aria-label={`Remove ${lower} ${i + 1}`} className="absolute right-1 top-1 rounded px-1.5 text-xs text-clay hover:bg-clay-pale" onClick={() => onChange(arr.filter((_, j) => j !== i))}>
            Remove
          </button>
          <Field
            name={name}
            labelOverride={`${word} ${i + 1}`}
            path={[...path, i]}
            info={element}
            value={item}
            errors={errors}
            onChange={(v) => {
              const next = [...arr];
              next[i] = v;
              onChange(next);
            }}
          />
        </div>
      ))}
      {err ? <ErrorText id={errId} message={err} /> : arr.length === 0 ? <Hint text={help} /> : null}
    </div>
  );
}
