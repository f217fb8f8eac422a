/**
 * The one place a zod error becomes text: for a line (CLI, thrown errors) or per field (forms, API).
 * Paths are dotted ("decoration.classes.0.name") so a form can find the control an issue belongs to.
 *
 * Schemas state their own message where a rule needs explaining ("must be a ratio of consecutive Fibonacci
 * numbers …"). Where they do not, zod would fall back to its own wording ("Too small: expected number to be
 * >0"); `plainError`, passed as the `error` option of a parse, says the same in plain words instead, with the
 * unit the schema's `.meta({ unit })` gives. zod asks it only for issues whose schema set no message, so the
 * schemas' own words always win.
 */
import { z } from 'zod';

type Issue = z.core.$ZodIssue;
type RawIssue = z.core.$ZodRawIssue;

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

/** Large bounds with thousands separators (50,000,000 reads; 50000000 does not). */
function amount(n: number | bigint): string {
  const x = Number(n);
  return Math.abs(x) >= 10_000 ? x.toLocaleString('en-US') : String(x);
}

function unitOf(schema: unknown): string {
  const meta = schema ? z.globalRegistry.get(schema as z.core.$ZodType) : undefined;
  return typeof meta?.unit === 'string' ? ` ${meta.unit}` : '';
}

function entries(n: number | bigint): string {
  return Number(n) === 1 ? '1 entry' : `${amount(n)} entries`;
}

/** zod's issues in plain words, as the end of a sentence that starts with the field's name. */
export function plainWords(issue: RawIssue): string | undefined {
  switch (issue.code) {
    case 'invalid_type': {
      const input = issue.input;
      if (input === undefined || input === null || input === '') return 'needs a value';
      if (issue.expected === 'int') return 'must be a whole number';
      if (issue.expected === 'number') return 'must be a number';
      if (issue.expected === 'string') return 'must be text';
      if (issue.expected === 'boolean') return 'must be on or off';
      if (issue.expected === 'array' || issue.expected === 'tuple') return 'must be a list';
      return 'has the wrong kind of value';
    }
    case 'too_small':
    case 'too_big': {
      const small = issue.code === 'too_small';
      const bound = small ? issue.minimum : issue.maximum;
      if (issue.origin === 'string') {
        if (small && Number(bound) === 1) return 'must not be empty';
        return `${issue.exact ? 'must have exactly' : small ? 'needs at least' : 'may have at most'} ${amount(bound)} characters`;
      }
      if (issue.origin === 'array' || issue.origin === 'set') {
        return `${issue.exact ? 'must have exactly' : small ? 'needs at least' : 'may have at most'} ${entries(bound)}`;
      }
      const word = small ? (issue.inclusive ? 'at least' : 'more than') : issue.inclusive ? 'at most' : 'less than';
      return `must be ${word} ${amount(bound)}${unitOf(issue.schema)}`;
    }
    case 'invalid_value':
      return issue.values.length === 1 ? `must be ${String(issue.values[0])}` : `must be one of ${issue.values.map(String).join(', ')}`;
    case 'invalid_union': {
      const options = (issue as { options?: unknown[] }).options;
      if (issue.discriminator && options?.length) return `must be one of ${options.map(String).join(', ')}`;
      return 'matches none of the forms it may take';
    }
    case 'invalid_format':
      return issue.format === 'regex' ? 'is not written in the expected form' : `must be a valid ${issue.format}`;
    case 'not_multiple_of':
      return `must be a multiple of ${issue.divisor}`;
    case 'unrecognized_keys':
      return `has fields it does not take: ${issue.keys.join(', ')}`;
    case 'invalid_key':
      return 'has a name that is not allowed';
    case 'invalid_element':
      return 'has an entry that is not allowed';
    default:
      return undefined;
  }
}

/** Pass as `schema.safeParse(input, { error: plainError })`. */
export const plainError: z.core.$ZodErrorMap = (issue) => plainWords(issue);
