/** Plain words and units for the params fields, by key (the schemas carry the rules, this the wording). */
export interface Label {
  label: string;
  unit?: string;
  hint?: string;
  /** Title of the box an optional group opens into, when the switch's own words would only repeat. */
  group?: string;
  /** Allowed values, shown inside that box. */
  groupHint?: string;
}

export const LABELS: Record<string, Label> = {
  family: { label: 'Model family' },
  mode: { label: 'What to cut' },
  aR: { label: 'Rhombohedron edge a_R', unit: 'Å', hint: 'Quasilattice constant; the edge of both rhombohedra.' },
  lattice: { label: 'Hyperlattice type', hint: 'P simple, F face-centred, I body-centred 6D lattice.' },
  order: { label: 'Order p/q', hint: 'Consecutive Fibonacci numbers: 1/1, 2/1, 3/2, 5/3, 8/5 …' },
  radius: { label: 'Patch radius', unit: 'Å' },
  centre: { label: 'Patch centre', unit: 'Å' },
  offset: { label: 'Phason offset', unit: 'Å, perp. space', hint: 'Shifts the occupation domain in perpendicular space.' },
  species: { label: 'Species', hint: 'Element symbol, e.g. Al.' },
  maxPoints: { label: 'Point cap', unit: 'points', hint: 'Generation stops with an error above this many points.' },
  decoration: { label: 'Decoration' },
  classes: { label: 'Site classes' },
  name: { label: 'Name' },
  position: { label: 'Position in the 6D cell', hint: 'Named site or six fractional coordinates in [0, 1).' },
  window: { label: 'Occupation domain' },
  kind: { label: 'Shape' },
  scale: { label: 'Window scaling', unit: '× triacontahedron' },
  r1: { label: 'Inner radius r1', unit: 'Å, perp. space' },
  r2: { label: 'Outer radius r2', unit: 'Å, perp. space' },
  mix: { label: 'Mixed occupancy', hint: 'Element → fraction; fractions sum to at most 1.' },
  occupancy: { label: 'Occupancy', unit: '0–1' },
  edge: { label: 'Edge length', unit: 'Å' },
  approximant: { label: 'Periodic approximant', group: 'Order p/q', groupHint: 'Convergents of τ: 1/1, 2/1, 3/2, 5/3, 8/5 …' },
  p: { label: 'p' },
  q: { label: 'q' },
  gamma: { label: 'Grid offsets γ', hint: 'Σγ = 0 gives the tiling proper.' },
  long: { label: 'Long segment', unit: 'Å' },
  ratio: { label: 'Long/short ratio', hint: 'τ ≈ 1.618 for the ideal chain.' },
  layers: { label: 'Layers per period', hint: 'Penrose layers in one period along the tenfold axis.' },
  spacing: { label: 'Layer spacing', unit: 'Å', hint: 'Distance between neighbouring layers along the tenfold axis.' },
  shift: { label: 'Layer shift', unit: 'Å, in plane', hint: 'How far each layer sits sideways from the one below.' },
  c: { label: 'Period along the axis', unit: 'Å' },
};

/** Wording that differs by model family (the octagonal tiling's approximants follow 1+√2, not τ). */
const FAMILY_LABELS: Record<string, Record<string, Partial<Label>>> = {
  octagonal: { approximant: { groupHint: 'Convergents of 1+√2 (Pell ratios): 2/1, 5/2, 12/5, 29/12 …' } },
};

export function labelOf(key: string, family?: string): Label {
  const base = LABELS[key] ?? { label: key.replace(/([a-z])([A-Z])/g, '$1 $2').replace(/^./, (c) => c.toUpperCase()) };
  const own = family ? FAMILY_LABELS[family]?.[key] : undefined;
  return own ? { ...base, ...own } : base;
}
