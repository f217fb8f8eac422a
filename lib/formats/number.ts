/** Decimal places for coordinates and cell vectors: 1e-8 Å keeps round trips exact to well below 1e-6 Å. */
export const COORD_DECIMALS = 8;

/**
 * Fixed-point formatting, the same bytes on every platform (Number.prototype.toFixed is exact per
 * ECMA-262). A negative value that rounds to zero is written "0.000…" so -0 and +0 give the same bytes.
 */
export function fixed(x: number, decimals: number = COORD_DECIMALS): string {
  const s = x.toFixed(decimals);
  return /^-0\.?0*$/.test(s) ? s.slice(1) : s;
}

/** Compact JSON with object keys sorted, so the same value always gives the same bytes. */
export function canonicalJson(value: unknown): string {
  return JSON.stringify(sortKeys(value)) ?? 'null';
}

function sortKeys(v: unknown): unknown {
  if (Array.isArray(v)) return v.map(sortKeys);
  if (ArrayBuffer.isView(v) && !(v instanceof DataView)) return Array.from(v as unknown as ArrayLike<number>);
  if (v !== null && typeof v === 'object') {
    const o = v as Record<string, unknown>;
    const out: Record<string, unknown> = {};
    for (const k of Object.keys(o).sort()) out[k] = sortKeys(o[k]);
    return out;
  }
  return v;
}

/** Parse a decimal number token strictly (no trailing junk, no empty string); NaN when invalid. */
export function parseNumber(token: string): number {
  if (!/^[+-]?(\d+\.?\d*|\.\d+)([eEdD][+-]?\d+)?$/.test(token)) return NaN;
  return Number(token.replace(/[dD]/, 'e'));
}
