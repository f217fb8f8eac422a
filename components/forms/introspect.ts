/**
 * Reading a zod 4 schema as a form: which control each field needs, its bounds and its default. The form
 * follows the family schemas in lib/models/<family>/schema.ts, so a field added there shows up here without a code change.
 */
import type { z } from 'zod';
import { fieldMessages } from '@/lib/zod-text';

export type FieldShape =
  | { kind: 'number'; integer: boolean; min?: number; max?: number }
  | { kind: 'string' }
  | { kind: 'boolean' }
  | { kind: 'enum'; options: string[] }
  | { kind: 'literal'; value: unknown }
  | { kind: 'tuple'; items: FieldInfo[] }
  | { kind: 'object'; fields: { key: string; info: FieldInfo }[] }
  | { kind: 'array'; element: FieldInfo; min?: number; max?: number }
  | { kind: 'variants'; discriminator: string; options: { value: string; info: FieldInfo }[] }
  | { kind: 'choice'; options: FieldInfo[] }
  | { kind: 'record'; value: FieldInfo }
  | { kind: 'unknown' };

export interface FieldInfo {
  shape: FieldShape;
  optional: boolean;
  /** Default value when the schema gives one. */
  fallback?: unknown;
  schema: z.ZodType;
}

// zod 4 keeps a schema's definition on `_zod.def`; only the parts read here are typed.
interface Def {
  type: string;
  innerType?: z.ZodType;
  defaultValue?: unknown;
  shape?: Record<string, z.ZodType>;
  items?: z.ZodType[];
  element?: z.ZodType;
  options?: z.ZodType[];
  discriminator?: string;
  entries?: Record<string, string>;
  values?: unknown[];
  valueType?: z.ZodType;
  in?: z.ZodType;
  out?: z.ZodType;
  checks?: { _zod: { def: { check: string; minimum?: number; maximum?: number; length?: number } } }[];
}

function defOf(s: z.ZodType): Def {
  return (s as unknown as { _zod: { def: Def } })._zod.def;
}

function numberBounds(s: z.ZodType): { integer: boolean; min?: number; max?: number } {
  const n = s as unknown as { minValue: number | null; maxValue: number | null; isInt: boolean };
  const finite = (v: number | null) => (v !== null && Number.isFinite(v) && Math.abs(v) < Number.MAX_SAFE_INTEGER ? v : undefined);
  return { integer: !!n.isInt, min: finite(n.minValue), max: finite(n.maxValue) };
}

export function introspect(schema: z.ZodType): FieldInfo {
  let s = schema;
  let optional = false;
  let fallback: unknown;
  for (;;) {
    const d = defOf(s);
    if (d.type === 'optional' || d.type === 'nullable') {
      optional = true;
      s = d.innerType!;
    } else if (d.type === 'default' || d.type === 'prefault') {
      fallback = typeof d.defaultValue === 'function' ? (d.defaultValue as () => unknown)() : d.defaultValue;
      s = d.innerType!;
    } else if (d.type === 'pipe') {
      s = d.in!;
    } else if (d.type === 'readonly' || d.type === 'catch') {
      s = d.innerType!;
    } else break;
  }
  const d = defOf(s);
  const info = (shape: FieldShape): FieldInfo => ({ shape, optional, fallback, schema: s });
  switch (d.type) {
    case 'number':
      return info({ kind: 'number', ...numberBounds(s) });
    case 'string':
      return info({ kind: 'string' });
    case 'boolean':
      return info({ kind: 'boolean' });
    case 'enum':
      return info({ kind: 'enum', options: Object.values(d.entries ?? {}) });
    case 'literal':
      return info({ kind: 'literal', value: d.values?.[0] });
    case 'tuple':
      return info({ kind: 'tuple', items: (d.items ?? []).map(introspect) });
    case 'object':
      return info({ kind: 'object', fields: Object.entries(d.shape ?? {}).map(([key, v]) => ({ key, info: introspect(v) })) });
    case 'array': {
      let min: number | undefined;
      let max: number | undefined;
      for (const c of d.checks ?? []) {
        const cd = c._zod.def;
        if (cd.check === 'min_length') min = cd.minimum;
        if (cd.check === 'max_length') max = cd.maximum;
      }
      return info({ kind: 'array', element: introspect(d.element!), min, max });
    }
    case 'union': {
      const opts = (d.options ?? []).map(introspect);
      if (d.discriminator) {
        const key = d.discriminator;
        return info({
          kind: 'variants',
          discriminator: key,
          options: opts.map((o) => {
            const f = o.shape.kind === 'object' ? o.shape.fields.find((x) => x.key === key) : undefined;
            const v = f && f.info.shape.kind === 'literal' ? String(f.info.shape.value) : '?';
            return { value: v, info: o };
          }),
        });
      }
      return info({ kind: 'choice', options: opts });
    }
    case 'record':
      return info({ kind: 'record', value: introspect(d.valueType!) });
    default:
      return info({ kind: 'unknown' });
  }
}

/** A starting value for a field: its default, else something that satisfies the control. */
export function initialValue(f: FieldInfo): unknown {
  if (f.fallback !== undefined) return structuredClone(f.fallback);
  const s = f.shape;
  switch (s.kind) {
    case 'number':
      return s.min !== undefined && s.min > 0 ? s.min : s.integer ? 1 : 1;
    case 'string':
      return '';
    case 'boolean':
      return false;
    case 'enum':
      return s.options[0];
    case 'literal':
      return s.value;
    case 'tuple':
      return s.items.map(initialValue);
    case 'object': {
      const o: Record<string, unknown> = {};
      for (const { key, info } of s.fields) if (!info.optional || info.shape.kind === 'literal') o[key] = initialValue(info);
      return o;
    }
    case 'array':
      return [];
    case 'variants':
      return initialValue(s.options[0].info);
    case 'choice':
      return initialValue(s.options[0]);
    case 'record':
      return {};
    default:
      return undefined;
  }
}

/** zod issues → "a.b.0.c" → first message, for inline display beside each control. */
export function issuesByPath(error: z.ZodError | undefined): Map<string, string> {
  return new Map(error ? Object.entries(fieldMessages(error)) : []);
}
