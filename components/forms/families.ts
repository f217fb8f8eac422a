/**
 * Which family schema (lib/models/<family>/schema.ts) edits and validates each model family. The workspace's form is drawn from
 * these schemas; the params object keeps `family` (and, for icosahedral models, `mode`) beside the fields.
 */
import type { z } from 'zod';
import { FAMILIES, type Family } from '@/lib/models/params';
import { chainModelSchema } from '@/lib/models/chain/schema';
import { penroseModelSchema } from '@/lib/models/penrose/schema';
import { octagonalModelSchema } from '@/lib/models/octagonal/schema';
import { decagonalModelSchema } from '@/lib/models/decagonal/schema';
import { icosahedralApproximantModelSchema, icosahedralPatchModelSchema } from '@/lib/models/icosahedral/schema';
import { STARTERS } from '@/lib/models/starters';
import { plainError } from '@/lib/zod-text';
import { describeSchema, fieldAt, initialValue } from './describe';
import { firstPerField } from './messages';

export type Params = Record<string, unknown> & { family: string };

export const FAMILY_NAMES: Record<Family, string> = {
  fibonacci: 'Fibonacci chain (1D)',
  penrose: 'Penrose rhombus tiling (2D)',
  octagonal: 'Octagonal tiling (2D)',
  icosahedral: 'Icosahedral (3D)',
  decagonal: 'Decagonal (layers)',
};

export { FAMILIES };

export const ICO_MODES = ['approximant', 'patch'] as const;
export type IcoMode = (typeof ICO_MODES)[number];

/** Keys the form draws itself (family picker, cut picker) rather than from the schema. */
export const FRAME_KEYS = new Set(['family', 'mode']);

export function icoMode(p: Params): IcoMode {
  return p.mode === 'patch' ? 'patch' : 'approximant';
}

/** The schema for the fields of these params, or null when the family's schema has not landed. */
export function schemaFor(p: Params): z.ZodType | null {
  switch (p.family) {
    case 'fibonacci':
      return chainModelSchema;
    case 'penrose':
      return penroseModelSchema;
    case 'octagonal':
      return octagonalModelSchema;
    case 'decagonal':
      return decagonalModelSchema;
    case 'icosahedral':
      return icoMode(p) === 'patch' ? icosahedralPatchModelSchema : icosahedralApproximantModelSchema;
    default:
      return null;
  }
}

/** What the schema is asked to check: icosahedral params always say which cut they are. */
export function validationInput(p: Params): unknown {
  return p.family === 'icosahedral' ? { ...p, mode: icoMode(p) } : p;
}

/**
 * The schema's verdict in the form's words: zod's own wording replaced by plain words where the schema gives
 * none (lib/zod-text.ts), and one issue per field — the one shown beside it, so counting issues counts messages.
 */
export function validate(p: Params): z.ZodError | undefined {
  const s = schemaFor(p);
  if (!s) return undefined;
  const r = s.safeParse(validationInput(p), { error: plainError });
  return r.success ? undefined : firstPerField(r.error);
}

/** A family's starter model, or, for a family without one, the model its schema gives as an example. */
export function starterParams(family: string): Params {
  const s = STARTERS.find((x) => x.params.family === family);
  if (s) return structuredClone(s.params) as Params;
  const schema = schemaFor({ family });
  const start = schema ? initialValue(describeSchema(schema)) : undefined;
  return { ...(start && typeof start === 'object' ? start : {}), family };
}

/** Where a field of a schema starts (its default or example), e.g. the patch radius offered on switching. */
function startOf(schema: z.ZodType, key: string): unknown {
  const f = fieldAt(describeSchema(schema), key, undefined);
  return f ? initialValue(f) : undefined;
}

/** Switch an icosahedral model between a p/q approximant and a finite patch, keeping the shared fields. */
export function withIcoMode(p: Params, mode: IcoMode): Params {
  const { order: _o, radius: _r, centre: _c, ...rest } = p;
  return mode === 'patch'
    ? { ...rest, mode, radius: typeof p.radius === 'number' ? p.radius : startOf(icosahedralPatchModelSchema, 'radius') }
    : { ...rest, mode, order: typeof p.order === 'string' ? p.order : startOf(icosahedralApproximantModelSchema, 'order') };
}
