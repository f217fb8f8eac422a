/**
 * A JSON-path diff of two params objects: one entry per leaf that was added, removed or changed,
 * with paths in the JSONPath dot/bracket notation of RFC 9535 ($.a.b[2]). Arrays compare by index.
 */
export interface DiffEntry {
  path: string;
  kind: 'added' | 'removed' | 'changed';
  before?: unknown;
  after?: unknown;
}

const isObj = (v: unknown): v is Record<string, unknown> => v !== null && typeof v === 'object' && !Array.isArray(v);

function key(path: string, k: string): string {
  return /^[A-Za-z_][A-Za-z0-9_]*$/.test(k) ? `${path}.${k}` : `${path}[${JSON.stringify(k)}]`;
}

export function jsonDiff(before: unknown, after: unknown, path = '$', out: DiffEntry[] = []): DiffEntry[] {
  if (isObj(before) && isObj(after)) {
    const keys = [...new Set([...Object.keys(before), ...Object.keys(after)])].sort();
    for (const k of keys) {
      const p = key(path, k);
      if (!(k in after)) out.push({ path: p, kind: 'removed', before: before[k] });
      else if (!(k in before)) out.push({ path: p, kind: 'added', after: after[k] });
      else jsonDiff(before[k], after[k], p, out);
    }
    return out;
  }
  if (Array.isArray(before) && Array.isArray(after)) {
    const n = Math.max(before.length, after.length);
    for (let i = 0; i < n; i++) {
      const p = `${path}[${i}]`;
      if (i >= after.length) out.push({ path: p, kind: 'removed', before: before[i] });
      else if (i >= before.length) out.push({ path: p, kind: 'added', after: after[i] });
      else jsonDiff(before[i], after[i], p, out);
    }
    return out;
  }
  if (!Object.is(before, after)) out.push({ path, kind: 'changed', before, after });
  return out;
}
