/**
 * Tauforge species colours and drawn radii.
 *
 * Colours follow one rule of our own, anchored on the design tokens in app/globals.css, so a picture reads
 * as "ours" and neighbouring elements stay apart:
 *   • hue by block and group — s-block (groups 1–2) in the brass family, 26° at Li turning 17° towards
 *     yellow per period and 12° more for group 2 (it has only two columns, so the period helps); d-block (groups 3–12)
 *     sweeps from clay (11°) backwards round the wheel through rose and violet to ink blue (215°),
 *     odd groups 6 points lighter and even groups 6 points darker so neighbours (Mn, Fe, Co…) separate;
 *     p-block (groups 13–18) starts at tide teal (180°) and steps 24° per group towards yellow-green;
 *     f-block (lanthanides, actinides) is a muted band from indigo to plum (250° → 20°), odd Z 5 points
 *     lighter and even Z 5 points darker, because fifteen neighbours share a period;
 *   • saturation 58 % (s-block 62 %, f-block 40 %, noble gases 22 %);
 *   • outside the s-block the hue turns by 22° per period (period 4 untouched), so period neighbours differ in hue too;
 *   • lightness by period — 72 % in period 1, 6 points darker per period, so heavier reads darker;
 *   • X (0, an unassigned tiling vertex) is the warm grey of our rule token.
 * Radii: covalent radius (lib/structure/elements.ts) × a scale; X and elements without a tabulated radius
 * use PLACEHOLDER_RADIUS.
 */
import { covalentRadius, MAX_Z } from '../structure/elements';

/** Drawn radius in Å (before the scale) for X and elements with no covalent radius. */
export const PLACEHOLDER_RADIUS = 0.8;
/** Default radius scale: covalent radii touch at a bond; 0.45 leaves the bonds visible. */
export const DEFAULT_RADIUS_SCALE = 0.45;

const PERIOD_ENDS = [2, 10, 18, 36, 54, 86, 118];

export interface TablePlace {
  period: number;
  /** 1..18, or 0 for the f-block. */
  group: number;
}

/** Period and group of an element from its atomic number (IUPAC 18-column layout, La–Lu and Ac–Lr in the f-block). */
export function tablePlace(z: number): TablePlace {
  if (!Number.isInteger(z) || z < 1 || z > 118) throw new RangeError(`atomic number ${z} has no place in the table`);
  const period = PERIOD_ENDS.findIndex((end) => z <= end) + 1;
  const first = period === 1 ? 1 : PERIOD_ENDS[period - 2] + 1;
  const p = z - first;
  if (period === 1) return { period, group: z === 1 ? 1 : 18 };
  if (period <= 3) return { period, group: p < 2 ? p + 1 : p + 11 };
  if (period <= 5) return { period, group: p + 1 };
  if (p < 2) return { period, group: p + 1 };
  if (p <= 16) return { period, group: 0 };
  return { period, group: p - 13 };
}

function hslToHex(h: number, s: number, l: number): string {
  // CSS Color 4 HSL → sRGB.
  const hue = ((h % 360) + 360) % 360;
  const f = (k: number) => {
    const t = (k + hue / 30) % 12;
    const a = s * Math.min(l, 1 - l);
    return l - a * Math.max(-1, Math.min(t - 3, 9 - t, 1));
  };
  const byte = (x: number) => Math.round(Math.max(0, Math.min(1, x)) * 255).toString(16).padStart(2, '0');
  return `#${byte(f(0))}${byte(f(8))}${byte(f(4))}`;
}

/** Our HSL for a species (degrees, 0..1, 0..1). */
export function speciesHsl(z: number): [number, number, number] {
  if (z === 0) return [43, 0.2, 0.83];
  const { period, group } = tablePlace(z);
  const l = 0.72 - 0.06 * (period - 1);
  // A twist of the hue with the period keeps the two s-block columns (and period neighbours) apart.
  const twist = (period - 4) * 22;
  if (group === 0) {
    const first = period === 6 ? 57 : 89;
    return [250 + ((z - first) * 130) / 14, 0.4, l + (z % 2 ? 0.05 : -0.05)];
  }
  if (group <= 2) return [26 + 17 * (period - 2) + 12 * (group - 1), 0.62, l];
  if (group <= 12) return [11 - ((group - 3) * (11 + 360 - 215)) / 9 + twist, 0.58, l + (group % 2 ? 0.06 : -0.06)];
  if (group === 18) return [180 + twist, 0.22, l];
  return [180 - (group - 13) * 24 + twist, 0.58, l];
}

/** Our colour for a species as #rrggbb (sRGB). */
export function speciesColour(z: number): string {
  const [h, s, l] = speciesHsl(z);
  return hslToHex(h, s, l);
}

/** Drawn radius of a species in Å. */
export function speciesRadius(z: number, radiusScale = DEFAULT_RADIUS_SCALE): number {
  const r = z >= 1 && z <= MAX_Z ? covalentRadius(z) : NaN;
  return (Number.isFinite(r) ? r : PLACEHOLDER_RADIUS) * radiusScale;
}

/** The distinct species of a structure in first-seen order. */
export function distinctSpecies(species: ArrayLike<number>): number[] {
  const seen = new Set<number>();
  for (let i = 0; i < species.length; i++) seen.add(species[i]);
  return [...seen].sort((a, b) => a - b);
}
