import type { PowderPeak } from './powder';
import { UNITS_COMMENT } from './units';

/** Fixed decimals, and never "-0", so the same peaks always give the same bytes. */
function fixed(x: number, decimals: number): string {
  const s = x.toFixed(decimals);
  return /^-0\.?0*$/.test(s) ? s.slice(1) : s;
}

/**
 * The powder peak list as CSV: a units comment, a comment naming radiation and wavelength, a header,
 * then one powder line (all reflections at one d) a row: h k l of its strongest family, the total
 * multiplicity, and every family as "h k l x m" separated by ";". Used by the CLI (`diffract powder --format csv`) and by exports.
 */
export function peakTableCsv(peaks: readonly PowderPeak[], meta: { radiation: string; wavelength: number }): string {
  const lines = [UNITS_COMMENT, `# radiation ${meta.radiation}, wavelength ${meta.wavelength} Å; intensity = m|F|²Lp, largest = 100`];
  lines.push('twoTheta,d,q,h,k,l,multiplicity,intensity,families');
  for (const k of peaks) {
    const fam = k.families.map((f) => `${f.hkl.join(' ')} x ${f.multiplicity}`).join(';');
    lines.push([fixed(k.twoTheta, 6), fixed(k.d, 6), fixed(k.q, 6), ...k.hkl, k.multiplicity, fixed(k.intensity, 4), fam].join(','));
  }
  return lines.join('\n') + '\n';
}
