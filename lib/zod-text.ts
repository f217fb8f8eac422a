/**
 * The one place a zod error becomes text: for a line (CLI, thrown errors) or per field (forms, API).
 * Paths are dotted ("decoration.classes.0.name") so a form can find the control an issue belongs to.
 */
import type { z } from 'zod';

type Issue = z.core.$ZodIssue;

/** "a.b.0.c" for an issue's path ("" at the root). */
export function issuePath(issue: Pick<Issue, 'path'>): string {
  return issue.path.map(String).join('.');
}

/** Dotted path → the first message for it, in issue order. The root is keyed `root`. */
export function fieldMessages(error: z.ZodError, root = ''): Record<string, string> {
  const out: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issuePath(issue) || root;
    if (!(key in out)) out[key] = issue.message;
  }
  return out;
}

/** One readable line naming every bad field: "order: must be …; aR: …". */
export function zodText(error: z.ZodError, root = 'input'): string {
  return error.issues.map((i) => `${issuePath(i) || root}: ${i.message}`).join('; ');
}
