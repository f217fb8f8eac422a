/**
 * A sweep's grid: the Cartesian product of its axes, point i in mixed radix (last axis fastest), each
 * point the base params with the axis values written at their paths. Pure; the same index always
 * names the same point, which is what makes a retried point overwrite its own record.
 */
export interface Axis {
  path: string;
  values: (number | string)[];
}

export function gridSize(axes: Axis[]): number {
  return axes.reduce((n, a) => n * a.values.length, 1);
}

export function gridValues(axes: Axis[], index: number): (number | string)[] {
  const out = new Array(axes.length);
  let rest = index;
  for (let k = axes.length - 1; k >= 0; k--) {
    const n = axes[k].values.length;
    out[k] = axes[k].values[rest % n];
    rest = Math.floor(rest / n);
  }
  return out;
}

function setPath(target: Record<string, unknown>, path: string, value: unknown): void {
  const keys = path.split('.');
  let o: Record<string, unknown> | unknown[] = target;
  for (let i = 0; i < keys.length - 1; i++) {
    const k = keys[i];
    const cur = (o as Record<string, unknown>)[k];
    const next = Array.isArray(cur) ? [...cur] : cur && typeof cur === 'object' ? { ...(cur as object) } : /^\d+$/.test(keys[i + 1]) ? [] : {};
    (o as Record<string, unknown>)[k] = next;
    o = next as Record<string, unknown>;
  }
  (o as Record<string, unknown>)[keys[keys.length - 1]] = value;
}

export function gridPoint(base: unknown, axes: Axis[], index: number): Record<string, unknown> {
  const params = structuredClone(base) as Record<string, unknown>;
  gridValues(axes, index).forEach((v, k) => setPath(params, axes[k].path, v));
  return params;
}
