'use client';
/**
 * Controls drawn from a zod schema (see introspect.ts): numbers, choices, switches, vectors, nested groups,
 * lists of site classes, occupation-domain shapes. Every control has a label, its unit, and the schema's
 * message for it, shown inline as soon as the value is wrong.
 */
import { createContext, useContext, useId, useState } from 'react';
import type { FieldInfo } from './introspect';
import { initialValue } from './introspect';
import { labelOf } from './labels';

export interface FieldProps {
  name: string;
  path: (string | number)[];
  info: FieldInfo;
  value: unknown;
  onChange: (v: unknown) => void;
  errors: Map<string, string>;
  /** Keys not to draw (only at the top level). */
  skip?: Set<string>;
  labelOverride?: string;
  /** Allowed values shown inside a group's box (see Label.groupHint). */
  groupHint?: string;
}

/** The model family being edited, for wording that differs by family (labels.ts). */
export const FieldFamily = createContext<string | undefined>(undefined);

const inputCls =
  'w-full rounded-md border border-rule bg-card px-2 py-1 text-sm text-ink focus:border-tide aria-[invalid=true]:border-clay aria-[invalid=true]:bg-clay-pale/40';

function ErrorText({ id, message }: { id: string; message?: string }) {
  if (!message) return null;
  return (
    <p id={id} className="mt-0.5 text-xs text-clay">
      {message}
    </p>
  );
}

function Hint({ text }: { text?: string }) {
  return text ? <p className="mt-0.5 text-xs text-ink-soft">{text}</p> : null;
}

function NumberBox(props: { id: string; value: unknown; onChange: (v: unknown) => void; integer: boolean; min?: number; max?: number; invalid: boolean; describedBy?: string; label?: string; optional?: boolean }) {
  const { value, onChange } = props;
  const shown = typeof value === 'number' ? String(value) : typeof value === 'string' ? value : '';
  const [text, setText] = useState(shown);
  const [last, setLast] = useState<unknown>(value);
  // Follow outside changes (a new starter, a series row) without losing what is being typed.
  if (last !== value) {
    setLast(value);
    if (!(typeof value === 'number' && Number(text) === value)) setText(shown);
  }
  return (
    <input
      id={props.id}
      type="text"
      inputMode={props.integer ? 'numeric' : 'decimal'}
      className={`${inputCls} font-mono`}
      value={text}
      aria-label={props.label}
      aria-invalid={props.invalid}
      aria-describedby={props.describedBy}
      onChange={(e) => {
        const t = e.target.value;
        setText(t);
        const n = Number(t);
        if (t.trim() === '') onChange(props.optional ? undefined : t);
        else onChange(Number.isFinite(n) ? n : t);
      }}
    />
  );
}

function joinPath(p: (string | number)[]): string {
  return p.map(String).join('.');
}

const TUPLE_NAMES: Record<number, string[]> = { 2: ['x', 'y'], 3: ['x', 'y', 'z'], 6: ['1', '2', '3', '4', '5', '6'] };

export function Field({ name, path, info, value, onChange, errors, skip, labelOverride, groupHint: groupHintProp }: FieldProps) {
  const uid = useId();
  const family = useContext(FieldFamily);
  const key = joinPath(path);
  const id = `f-${key || 'root'}-${uid.replace(/:/g, '')}`;
  const errId = `${id}-err`;
  const err = errors.get(key);
  const { label, unit, hint, group, groupHint } = labelOf(name, family);
  const title = labelOverride ?? label;
  const s = info.shape;
  const labelEl = (
    <label htmlFor={id} className="block text-xs font-medium text-ink-soft">
      {title}
      {unit ? <span className="ml-1 font-normal text-ink-soft/80">({unit})</span> : null}
    </label>
  );

  // Optional groups get an on/off switch; optional scalars are simply left empty.
  if (info.optional && (s.kind === 'object' || s.kind === 'array' || s.kind === 'record' || s.kind === 'variants')) {
    const on = value !== undefined;
    return (
      <div className="space-y-1">
        <label className="flex items-center gap-2 text-sm font-medium">
          <input type="checkbox" checked={on} onChange={(e) => onChange(e.target.checked ? defaultFor(name, info) : undefined)} className="accent-tide" />
          {title}
        </label>
        {on ? <Field {...{ name, path, value, onChange, errors }} info={{ ...info, optional: false }} labelOverride={labelOverride ?? group} groupHint={groupHint} /> : <Hint text={hint} />}
        <ErrorText id={errId} message={on ? undefined : err} />
      </div>
    );
  }

  switch (s.kind) {
    case 'literal':
      return null;
    case 'number':
      return (
        <div>
          {labelEl}
          <NumberBox id={id} value={value} onChange={onChange} integer={s.integer} min={s.min} max={s.max} invalid={!!err} describedBy={err ? errId : undefined} optional={info.optional} />
          <ErrorText id={errId} message={err} />
          {!err && hint ? <Hint text={hint} /> : null}
        </div>
      );
    case 'string':
      return (
        <div>
          {labelEl}
          <input
            id={id}
            type="text"
            className={inputCls}
            value={typeof value === 'string' ? value : ''}
            aria-invalid={!!err}
            aria-describedby={err ? errId : undefined}
            onChange={(e) => onChange(e.target.value === '' && info.optional ? undefined : e.target.value)}
          />
          <ErrorText id={errId} message={err} />
          {!err && hint ? <Hint text={hint} /> : null}
        </div>
      );
    case 'boolean':
      return (
        <div>
          <label className="flex items-center gap-2 text-sm">
            <input id={id} type="checkbox" className="accent-tide" checked={value === true} onChange={(e) => onChange(e.target.checked)} aria-describedby={err ? errId : undefined} />
            {title}
          </label>
          <ErrorText id={errId} message={err} />
        </div>
      );
    case 'enum':
      return (
        <div>
          {labelEl}
          <select id={id} className={inputCls} value={String(value ?? '')} aria-invalid={!!err} onChange={(e) => onChange(e.target.value === '' ? undefined : e.target.value)}>
            {info.optional || value === undefined ? <option value="">—</option> : null}
            {s.options.map((o) => (
              <option key={o} value={o}>
                {o}
              </option>
            ))}
          </select>
          <ErrorText id={errId} message={err} />
          {!err && hint ? <Hint text={hint} /> : null}
        </div>
      );
    case 'tuple': {
      const arr = Array.isArray(value) ? value : (initialValue(info) as unknown[]);
      const names = TUPLE_NAMES[s.items.length] ?? s.items.map((_, i) => String(i + 1));
      return (
        <fieldset>
          <legend className="text-xs font-medium text-ink-soft">
            {title}
            {unit ? <span className="ml-1 font-normal">({unit})</span> : null}
          </legend>
          <div className="mt-0.5 grid gap-1" style={{ gridTemplateColumns: `repeat(${Math.min(s.items.length, 3)}, minmax(0, 1fr))` }}>
            {s.items.map((it, i) => {
              const ie = errors.get(joinPath([...path, i]));
              return (
                <NumberBox
                  key={i}
                  id={`${id}-${i}`}
                  label={`${title} ${names[i]}`}
                  value={arr[i]}
                  integer={it.shape.kind === 'number' && it.shape.integer}
                  invalid={!!(err || ie)}
                  describedBy={err ? errId : undefined}
                  onChange={(v) => {
                    const next = [...arr];
                    next[i] = v;
                    onChange(next);
                  }}
                />
              );
            })}
          </div>
          <ErrorText id={errId} message={err} />
          {!err && hint ? <Hint text={hint} /> : null}
        </fieldset>
      );
    }
    case 'object': {
      const obj = (value && typeof value === 'object' ? value : {}) as Record<string, unknown>;
      const body = (
        <div className="space-y-2">
          {[...s.fields]
            .sort((a, b) => priority(a.key) - priority(b.key))
            .filter((f) => !skip?.has(f.key))
            .map((f) => (
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
      );
      if (path.length === 0 || skip) return body;
      return (
        <fieldset className="rounded-md border border-rule p-2">
          <legend className="px-1 text-xs font-semibold text-ink">{title}</legend>
          {body}
          {!err && groupHintProp ? <Hint text={groupHintProp} /> : null}
        </fieldset>
      );
    }
    case 'array': {
      const arr = Array.isArray(value) ? value : [];
      const canAdd = s.max === undefined || arr.length < s.max;
      const itemWord = name === 'classes' ? 'site class' : 'item';
      return (
        <div className="space-y-2">
          <div className="flex items-center justify-between">
            <span className="text-xs font-semibold text-ink">
              {title} <span className="font-normal text-ink-soft">({arr.length})</span>
            </span>
            <button
              type="button"
              disabled={!canAdd}
              className="rounded border border-tide px-2 py-0.5 text-xs text-tide hover:bg-tide-pale disabled:opacity-40"
              onClick={() => onChange([...arr, defaultFor(name === 'classes' ? 'class' : name, s.element, arr.length)])}
            >
              Add {itemWord}
            </button>
          </div>
          {arr.map((item, i) => (
            <div key={i} className="relative rounded-md border border-rule bg-paper/60 p-2">
              <button
                type="button"
                aria-label={`Remove ${itemWord} ${i + 1}`}
                className="absolute right-1 top-1 rounded px-1.5 text-xs text-clay hover:bg-clay-pale"
                onClick={() => onChange(arr.filter((_, j) => j !== i))}
              >
                Remove
              </button>
              <Field
                name={name === 'classes' ? 'class' : name}
                labelOverride={`${itemWord[0].toUpperCase()}${itemWord.slice(1)} ${i + 1}`}
                path={[...path, i]}
                info={s.element}
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
          <ErrorText id={errId} message={err} />
        </div>
      );
    }
    case 'variants': {
      const obj = (value && typeof value === 'object' ? value : {}) as Record<string, unknown>;
      const current = String(obj[s.discriminator] ?? s.options[0].value);
      const opt = s.options.find((o) => o.value === current) ?? s.options[0];
      return (
        <fieldset className="rounded-md border border-rule p-2">
          <legend className="px-1 text-xs font-semibold text-ink">{title}</legend>
          <label htmlFor={id} className="block text-xs font-medium text-ink-soft">
            {labelOf(s.discriminator).label}
          </label>
          <select id={id} className={inputCls} value={current} onChange={(e) => onChange(initialValue(s.options.find((o) => o.value === e.target.value)!.info))}>
            {s.options.map((o) => (
              <option key={o.value} value={o.value}>
                {o.value}
              </option>
            ))}
          </select>
          <div className="mt-2">
            <Field name={name} path={path} info={opt.info} value={obj} onChange={onChange} errors={errors} skip={new Set([s.discriminator])} labelOverride={title} />
          </div>
        </fieldset>
      );
    }
    case 'choice': {
      // e.g. a named site ('node', 'body', …) or explicit coordinates.
      const named = s.options.find((o) => o.shape.kind === 'enum');
      const other = s.options.find((o) => o.shape.kind !== 'enum');
      const isNamed = typeof value === 'string' || value === undefined;
      const names = named && named.shape.kind === 'enum' ? named.shape.options : [];
      return (
        <div>
          {labelEl}
          <select
            id={id}
            className={inputCls}
            value={isNamed ? String(value ?? names[0] ?? '') : '__custom'}
            onChange={(e) => onChange(e.target.value === '__custom' ? (other ? initialValue(other) : undefined) : e.target.value)}
          >
            {names.map((o) => (
              <option key={o} value={o}>
                {o}
              </option>
            ))}
            {other ? <option value="__custom">coordinates…</option> : null}
          </select>
          {!isNamed && other ? (
            <div className="mt-1">
              <Field name={name} labelOverride="Coordinates" path={path} info={other} value={value} onChange={onChange} errors={errors} />
            </div>
          ) : (
            <ErrorText id={errId} message={err} />
          )}
          {!err && hint ? <Hint text={hint} /> : null}
        </div>
      );
    }
    case 'record': {
      const obj = (value && typeof value === 'object' ? value : {}) as Record<string, unknown>;
      const entries = Object.entries(obj);
      return (
        <fieldset className="rounded-md border border-rule p-2">
          <legend className="px-1 text-xs font-semibold text-ink">{title}</legend>
          {entries.map(([k, v], i) => (
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
              <NumberBox id={`${id}-${i}`} label={`${title} fraction ${i + 1}`} value={v} integer={false} invalid={!!errors.get(joinPath([...path, k]))} onChange={(nv) => onChange({ ...obj, [k]: nv })} />
              <button type="button" aria-label={`Remove ${k}`} className="px-1 text-xs text-clay" onClick={() => onChange(Object.fromEntries(entries.filter(([kk]) => kk !== k)))}>
                ✕
              </button>
              {errors.get(joinPath([...path, k])) ? <p className="col-span-3 text-xs text-clay">{errors.get(joinPath([...path, k]))}</p> : null}
            </div>
          ))}
          <button type="button" className="text-xs text-tide underline" onClick={() => onChange({ ...obj, [entries.length ? `El${entries.length + 1}` : 'Al']: 0.5 })}>
            Add element
          </button>
          {hint ? <Hint text={hint} /> : null}
          <ErrorText id={errId} message={err} />
        </fieldset>
      );
    }
    default:
      return (
        <div>
          {labelEl}
          <p className="text-xs text-ink-soft">Edited as JSON below.</p>
        </div>
      );
  }
}

/** The fields a modeller sets first come first; the rest keep the schema's order. */
const FIRST = ['order', 'radius', 'approximant', 'aR', 'edge', 'lattice'];
function priority(key: string): number {
  const i = FIRST.indexOf(key);
  return i < 0 ? FIRST.length : i;
}

/** Sensible new values for groups the user switches on. */
function defaultFor(name: string, info: FieldInfo, index = 0): unknown {
  if (name === 'decoration') return { classes: [{ name: 'vertex', position: 'node', window: { kind: 'hypercube', scale: 1 }, species: 'Al' }] };
  if (name === 'class') return { name: `class ${index + 1}`, position: index === 0 ? 'node' : 'body', window: { kind: 'hypercube', scale: 1 }, species: 'Al' };
  if (name === 'approximant') return { p: 2, q: 1 };
  if (name === 'mix') return { Al: 0.7, Pd: 0.3 };
  return initialValue({ ...info, optional: false });
}
