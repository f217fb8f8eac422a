/**
 * What the form says about wrong values: one message per field, naming the field as the form labels it
 * ("Point cap: must be at most 50,000,000 points"), so a message read on its own — in the list under the form,
 * by a screen reader — still says which control it is about. The wording of the rule itself comes from the
 * schema or, where the schema gives none, from lib/zod-text.ts.
 */
import { z } from 'zod';
import { issuePath } from '@/lib/zod-text';
import { fieldAt, titleOf, type FieldInfo } from './describe';

/** How the form names the entries of a vector: x, y, z for lengths in space, 1…n otherwise. */
export function itemName(count: number, i: number): string {
  return count === 2 || count === 3 ? 'xyz'[i] : String(i + 1);
}

/** The error with only the first issue of each field: the issues a form shows, and so the ones it counts. */
export function firstPerField(error: z.ZodError | undefined): z.ZodError | undefined {
  if (!error) return undefined;
  const seen = new Set<string>();
  const issues = error.issues.filter((i) => {
    const key = issuePath(i);
    if (seen.has(key)) return false;
    seen.add(key);
    return true;
  });
  return new z.ZodError(issues);
}

/** The words a message starts with for the field at `path` (empty at the root). */
export function fieldName(info: FieldInfo, path: string, value: unknown): string {
  if (path === '') return '';
  const segs = path.split('.');
  const last = segs[segs.length - 1];
  const parentPath = segs.slice(0, -1).join('.');
  const parent = fieldAt(info, parentPath, value);
  const parentName = () => titleOf(parent, segs[segs.length - 2] ?? '');
  switch (parent?.shape.kind) {
    case 'tuple':
      return `${parentName()} ${itemName(parent.shape.items.length, Number(last))}`;
    case 'record':
      return `${parentName()} ${last}`;
    case 'array':
      return `${titleOf(parent.shape.element, 'item')} ${Number(last) + 1}`;
    default:
      return titleOf(fieldAt(info, path, value), last);
  }
}

/** Dotted path → "Label: message" for every field with a wrong value. */
export function formMessages(error: z.ZodError | undefined, info: FieldInfo | null, value: unknown): Map<string, string> {
  const out = new Map<string, string>();
  for (const issue of error?.issues ?? []) {
    const key = issuePath(issue);
    if (out.has(key)) continue;
    const name = info ? fieldName(info, key, value) : key;
    out.set(key, name ? `${name}: ${issue.message}` : issue.message);
  }
  return out;
}
