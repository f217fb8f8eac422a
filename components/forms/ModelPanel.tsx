'use client';
/**
 * The model panel: family, what to cut, and every field of the family's shared schema, with inline messages
 * from that schema and the expected number of points before anything is generated.
 */
import { useMemo } from 'react';
import { Field, FieldFamily } from './SchemaFields';
import { introspect, issuesByPath } from './introspect';
import { FAMILIES, FAMILY_NAMES, FRAME_KEYS, ICO_MODES, icoMode, schemaFor, starterParams, validate, withIcoMode, type Params } from './families';

export interface ModelPanelProps {
  params: Params;
  onChange: (p: Params) => void;
  /** Messages from the engine that name a field (e.g. "order: …"), keyed by field path. */
  engineErrors?: Map<string, string>;
}

export function useValidation(params: Params) {
  return useMemo(() => {
    const error = validate(params);
    return { error, byPath: issuesByPath(error), ok: !error && schemaFor(params) !== null };
  }, [params]);
}

const selectCls = 'w-full rounded-md border border-rule bg-card px-2 py-1 text-sm';

export function ModelPanel({ params, onChange, engineErrors }: ModelPanelProps) {
  const schema = schemaFor(params);
  const info = useMemo(() => (schema ? introspect(schema) : null), [schema]);
  const { byPath } = useValidation(params);
  const errors = useMemo(() => {
    if (!engineErrors?.size) return byPath;
    const m = new Map(byPath);
    for (const [k, v] of engineErrors) if (!m.has(k)) m.set(k, v);
    return m;
  }, [byPath, engineErrors]);
  // A periodic approximant (planar and decagonal families) has no patch radius; do not offer a field it ignores.
  const periodic = typeof params.approximant === 'object' && params.approximant !== null;
  const skip = useMemo(() => (periodic ? new Set([...FRAME_KEYS, 'radius']) : FRAME_KEYS), [periodic]);
  const extra = [...errors.entries()].filter(([k]) => k === '' || k === 'family' || (info?.shape.kind === 'object' && !info.shape.fields.some((f) => k === f.key || k.startsWith(`${f.key}.`))));

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
      {info ? (
        <FieldFamily.Provider value={params.family}>
          <Field name="" path={[]} info={info} value={params} errors={errors} skip={skip} onChange={(v) => onChange({ ...(v as Params), family: params.family, ...(params.mode ? { mode: params.mode } : {}) })} />
        </FieldFamily.Provider>
      ) : (
        <p className="rounded-md border border-brass bg-brass-pale p-2 text-sm">The {params.family} engine has not arrived in this build yet; pick another family.</p>
      )}
      {extra.map(([k, v]) => (
        <p key={k} className="text-xs text-clay">
          {k ? `${k}: ` : ''}
          {v}
        </p>
      ))}
    </div>
  );
}
