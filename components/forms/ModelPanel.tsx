'use client';
/**
 * The model panel: family, what to cut, and every field of the family's shared schema, with inline messages
 * from that schema and the expected number of points before anything is generated.
 */
import { useMemo } from 'react';
import { Field } from './Field';
import { PresetPicker } from './PresetPicker';
import { describeSchema, fieldAt, type FieldInfo } from './describe';
import { fieldName, formMessages } from './messages';
import { FAMILIES, FAMILY_NAMES, FRAME_KEYS, ICO_MODES, icoMode, schemaFor, starterParams, validate, withIcoMode, type Params } from './families';

export interface ModelPanelProps {
  params: Params;
  onChange: (p: Params) => void;
  /** Messages from the engine that name a field (e.g. "order: …"), keyed by field path, without the path. */
  engineErrors?: Map<string, string>;
}

function describedFor(params: Params): FieldInfo | null {
  const schema = schemaFor(params);
  return schema ? describeSchema(schema) : null;
}

/**
 * The schema's verdict on the params: the error (one issue per field, so its length is the number of messages
 * the panel shows), the messages by field path, and whether the params may be generated.
 */
export function useValidation(params: Params) {
  return useMemo(() => {
    const error = validate(params);
    return { error, byPath: formMessages(error, describedFor(params), params), ok: !error && schemaFor(params) !== null };
  }, [params]);
}

const selectCls = 'w-full rounded-md border border-rule bg-card px-2 py-1 text-sm';

export function ModelPanel({ params, onChange, engineErrors }: ModelPanelProps) {
  const info = useMemo(() => describedFor(params), [params]);
  const { byPath } = useValidation(params);
  const errors = useMemo(() => {
    if (!engineErrors?.size) return byPath;
    const m = new Map(byPath);
    for (const [k, v] of engineErrors) {
      const name = info && k ? fieldName(info, k, params) : '';
      if (!m.has(k)) m.set(k, name ? `${name}: ${v}` : v);
    }
    return m;
  }, [byPath, engineErrors, info, params]);
  // A periodic approximant (planar and decagonal families) has no patch radius; do not offer a field it ignores.
  const periodic = typeof params.approximant === 'object' && params.approximant !== null;
  const skip = useMemo(() => (periodic ? new Set([...FRAME_KEYS, 'radius']) : FRAME_KEYS), [periodic]);
  // Messages no control shows (about the whole model, or a field not drawn) are listed under the form.
  const extra = [...errors.entries()].filter(([k]) => k === '' || skip.has(k.split('.')[0]) || !info || !fieldAt(info, k, params));

  return (
    <div className="space-y-3">
      <div>
        <label htmlFor="model-family" className="block text-xs font-medium text-ink-soft">
          Model family
        </label>
        <select id="model-family" className={selectCls} value={params.family} onChange={(e) => onChange(starterParams(e.target.value))}>
          {FAMILIES.map((f) => (
            <option key={f} value={f}>
              {FAMILY_NAMES[f]}
            </option>
          ))}
        </select>
      </div>
      {params.family === 'icosahedral' ? (
        <fieldset>
          <legend className="text-xs font-medium text-ink-soft">What to cut</legend>
          <div className="mt-1 grid grid-cols-2 gap-1" role="radiogroup">
            {ICO_MODES.map((m) => (
              <label
                key={m}
                className={`flex cursor-pointer items-center justify-center gap-1 rounded-md border px-2 py-1 text-sm has-[:focus-visible]:outline-2 has-[:focus-visible]:outline-tide ${icoMode(params) === m ? 'border-tide bg-tide-pale text-tide-deep' : 'border-rule bg-card'}`}
              >
                <input type="radio" name="ico-mode" value={m} className="sr-only" checked={icoMode(params) === m} onChange={() => onChange(withIcoMode(params, m))} />
                {m === 'approximant' ? 'Periodic approximant' : 'Finite patch'}
              </label>
            ))}
          </div>
        </fieldset>
      ) : null}
      {params.family === 'icosahedral' && info ? <PresetPicker params={params} onChange={onChange} /> : null}
      {info ? (
        <Field name="" path={[]} info={info} value={params} errors={errors} skip={skip} onChange={(v) => onChange({ ...(v as Params), family: params.family, ...(params.mode ? { mode: params.mode } : {}) })} />
      ) : (
        <p className="rounded-md border border-brass bg-brass-pale p-2 text-sm">The {params.family} engine has not arrived in this build yet; pick another family.</p>
      )}
      {extra.map(([k, v]) => (
        <p key={k} className="text-xs text-clay">
          {v}
        </p>
      ))}
    </div>
  );
}
