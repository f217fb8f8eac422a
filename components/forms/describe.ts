/**
 * A zod schema read as a form: which control each field needs, its bounds, its starting value and its words.
 * The reading goes through zod's public JSON Schema output (`z.toJSONSchema`, the input side, so fields with a
 * default are not required), never through zod's internals. The words come from the schemas' own
 * `.meta()` (lib/models/<family>/schema.ts): `title` (the label), `unit`, `description` (the help line),
 * `examples` (the value a new or switched-on field starts from when it has no default) and `optionLabels`
 * (how a choice's values read), `namesOf` (the value names an entry of the enclosing list with that key, so
 * the form offers those names). A field added to a schema shows up here without a code change.
 */
import { z } from 'zod';

type Json = z.core.JSONSchema.JSONSchema;

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
  /** May be left out: not required and without a default. */
  optional: boolean;
  /** The schema's default, when it has one. */
  fallback?: unknown;
  /** The schema's first example: where a field with no default starts. */
  example?: unknown;
  /** The label; absent when the schema gives none (the form then words the key). */
  title?: string;
  unit?: string;
  help?: string;
  /** Value → words for enum choices. */
  optionLabels?: Record<string, string>;
  /** The key of an enclosing list whose entries' names this text must be one of. */
  namesOf?: string;
}

// Schemas are module constants, so each is converted once.
const described = new WeakMap<z.ZodType, FieldInfo>();

/** The form description of a schema, from its JSON Schema (input side; refinements are not representable). */
export function describeSchema(schema: z.ZodType): FieldInfo {
  let info = described.get(schema);
  if (!info) {
    info = describeJson(z.toJSONSchema(schema, { io: 'input', unrepresentable: 'any', reused: 'inline', cycles: 'throw' }) as Json, false);
    described.set(schema, info);
  }
  return info;
}

/** Bounds of ±2^53 are zod's way of saying "an integer"; they are not limits a modeller set. */
function bound(v: unknown): number | undefined {
  return typeof v === 'number' && Number.isFinite(v) && Math.abs(v) < Number.MAX_SAFE_INTEGER ? v : undefined;
}

function text(v: unknown): string | undefined {
  return typeof v === 'string' && v !== '' ? v : undefined;
}

function isJson(v: unknown): v is Json {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

/** The key every option fixes to a constant, when the options are objects (a discriminated union). */
function discriminatorOf(options: Json[]): string | undefined {
  const first = options[0]?.properties;
  if (!first) return undefined;
  return Object.keys(first).find((key) => options.every((o) => isJson(o.properties?.[key]) && (o.properties[key] as Json).const !== undefined));
}

function shapeOf(node: Json): FieldShape {
  const union = node.oneOf ?? node.anyOf;
  if (union) {
    const options = union.filter(isJson);
    const key = discriminatorOf(options);
    if (key) return { kind: 'variants', discriminator: key, options: options.map((o) => ({ value: String((o.properties![key] as Json).const), info: describeJson(o, false) })) };
    return { kind: 'choice', options: options.map((o) => describeJson(o, false)) };
  }
  if (node.const !== undefined) return { kind: 'literal', value: node.const };
  if (Array.isArray(node.enum)) return { kind: 'enum', options: node.enum.map(String) };
  switch (node.type) {
    case 'number':
    case 'integer': {
      const min = bound(node.minimum) ?? bound(node.exclusiveMinimum);
      const max = bound(node.maximum) ?? bound(node.exclusiveMaximum);
      return { kind: 'number', integer: node.type === 'integer', min, max };
    }
    case 'string':
      return { kind: 'string' };
    case 'boolean':
      return { kind: 'boolean' };
    case 'array':
      if (node.prefixItems) return { kind: 'tuple', items: node.prefixItems.filter(isJson).map((n) => describeJson(n, false)) };
      return { kind: 'array', element: describeJson(isJson(node.items) ? node.items : {}, false), min: bound(node.minItems), max: bound(node.maxItems) };
    case 'object': {
      if (node.properties) {
        const required = new Set(node.required ?? []);
        return { kind: 'object', fields: Object.entries(node.properties).map(([key, v]) => ({ key, info: describeJson(isJson(v) ? v : {}, !required.has(key)) })) };
      }
      if (isJson(node.additionalProperties)) return { kind: 'record', value: describeJson(node.additionalProperties, false) };
      return { kind: 'unknown' };
    }
    default:
      return { kind: 'unknown' };
  }
}

/** One node of the JSON Schema; `notRequired` says the parent object does not require it. */
export function describeJson(node: Json, notRequired: boolean): FieldInfo {
  const labels = node.optionLabels;
  return {
    shape: shapeOf(node),
    // A field with a default is filled in by the schema; the form treats it as always there.
    optional: notRequired && node.default === undefined,
    fallback: node.default,
    example: Array.isArray(node.examples) ? node.examples[0] : undefined,
    title: text(node.title),
    unit: text(node.unit),
    help: text(node.description),
    optionLabels: isJson(labels) ? (Object.fromEntries(Object.entries(labels).filter(([, v]) => typeof v === 'string')) as Record<string, string>) : undefined,
    namesOf: text(node.namesOf),
  };
}

/** The label of a field: the schema's title, else its key in words ("mergeTolerance" → "Merge tolerance"). */
export function titleOf(info: FieldInfo | undefined, key: string): string {
  if (info?.title) return info.title;
  const words = key.replace(/([a-z])([A-Z])/g, '$1 $2').toLowerCase();
  return words.charAt(0).toUpperCase() + words.slice(1);
}

/** A starting value for a field: its default, else its example, else something that satisfies the control. */
export function initialValue(f: FieldInfo): unknown {
  if (f.fallback !== undefined) return structuredClone(f.fallback);
  if (f.example !== undefined) return structuredClone(f.example);
  const s = f.shape;
  switch (s.kind) {
    case 'number':
      return s.min !== undefined && s.min > 0 ? s.min : 1;
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
      return Array.from({ length: s.min ?? 0 }, () => initialValue(s.element));
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

/** The description of the field at a dotted path, following the value (which variant it is) where it must. */
export function fieldAt(info: FieldInfo, path: string, value: unknown): FieldInfo | undefined {
  let f: FieldInfo | undefined = info;
  let v = value;
  for (const seg of path === '' ? [] : path.split('.')) {
    if (!f) return undefined;
    const s: FieldShape = f.shape;
    const here = v as Record<string, unknown> | unknown[] | undefined;
    const next = here && typeof here === 'object' ? (here as Record<string, unknown>)[seg] : undefined;
    if (s.kind === 'variants') {
      const tag = here && typeof here === 'object' && !Array.isArray(here) ? String(here[s.discriminator]) : s.options[0].value;
      f = fieldAt((s.options.find((o) => o.value === tag) ?? s.options[0]).info, seg, here);
      v = next;
      continue;
    }
    if (s.kind === 'choice') {
      f = s.options.find((o) => o.shape.kind === 'tuple' || o.shape.kind === 'object');
      if (!f) return undefined;
      f = fieldAt(f, seg, here);
      v = next;
      continue;
    }
    if (s.kind === 'object') f = s.fields.find((x) => x.key === seg)?.info;
    else if (s.kind === 'tuple') f = s.items[Number(seg)];
    else if (s.kind === 'array') f = /^\d+$/.test(seg) ? s.element : undefined;
    else if (s.kind === 'record') f = s.value;
    else return undefined;
    v = next;
  }
  return f;
}
