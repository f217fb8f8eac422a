/**
 * What the Generate button says before and after a cut: refused ahead of time when the expected number of
 * points passes the point cap (so nobody waits for a cut that will fail), and the engine's own refusal
 * named by the field as the form labels it ("Point cap: …", not "maxPoints: …").
 */
import { DEFAULT_MAX_POINTS } from '@/lib/models/point-cap';
import { describeSchema } from '@/components/forms/describe';
import { fieldName } from '@/components/forms/messages';
import { schemaFor, type Params } from '@/components/forms/families';

const count = (x: number) => Math.round(x).toLocaleString('en-US');

/** Why Generate is off when the estimate is above the cap, or null. */
export function overCapReason(params: Params, expected: number | null): string | null {
  const cap = typeof params.maxPoints === 'number' ? params.maxPoints : DEFAULT_MAX_POINTS;
  if (expected === null || !(expected > cap)) return null;
  return `About ${count(expected)} points expected, more than the point cap of ${count(cap)}: make the model smaller or raise the point cap.`;
}

/** An engine error as the user reads it: the field's label instead of its key. */
export function engineMessage(params: Params, error: { message: string; field?: string }): string {
  if (!error.field) return error.message;
  const schema = schemaFor(params);
  const label = schema ? fieldName(describeSchema(schema), error.field, params) : '';
  const rest = error.message.startsWith(`${error.field}: `) ? error.message.slice(error.field.length + 2) : error.message;
  return label ? `${label}: ${rest}` : rest;
}
