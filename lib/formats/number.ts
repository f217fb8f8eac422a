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

/** Parse a decimal number token strictly (no trailing junk, no empty string); NaN when invalid. */
export function parseNumber(token: string): number {
  if (!/^[+-]?(\d+\.?\d*|\.\d+)([eEdD][+-]?\d+)?$/.test(token)) return NaN;
  return Number(token.replace(/[dD]/, 'e'));
}
