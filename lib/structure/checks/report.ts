/**
 * The Check step: one verdict on a cut before anyone spends simulation time on it — shortest distances per
 * species pair against the metallic radii (../radii.ts), pairs that are too close, coordination per site class,
 * density against the ideal and a plausible range, composition, atoms outside the cell and (when a finder is
 * given) the space group. Every problem becomes a warning with a severity and a plain message; `severe` ones are
 * physically impossible and ask for confirmation before saving or exporting.
 */
import { composition, type Composition } from './composition';
import { contacts, COORDINATION_FACTOR, type CloseContact, type SpeciesPairDistance } from './contacts';
import { modelDensity, type ModelDensity } from './model-density';
import { atomContributions } from './weights';
import { atomicWeight, symbolOf } from '../elements';
import { contactRadius, TOO_CLOSE_FRACTION } from '../radii';
import type { Structure } from '../types';
import { validateStructure } from '../validate';
import { atomsOutsideCell } from '../wrap';
import { U_PER_A3_TO_G_PER_CM3 } from './density';

export type Severity = 'severe' | 'warning' | 'info';

export interface CheckWarning {
  severity: Severity;
  /** Stable key for tests and the UI, e.g. "too-close", "density-high". */
  code: string;
  message: string;
}

export interface SpaceGroupInfo {
  number: number;
  symbol: string;
}

/** A general-purpose symmetry finder (the lead wires in one built on moyo-wasm); null when it finds none. */
export type SpaceGroupProvider = (s: Structure) => SpaceGroupInfo | null;

export interface CoordinationStats {
  /** Site class name, or the element when the structure has no site classes. */
  name: string;
  atoms: number;
  mean: number;
  min: number;
  max: number;
}

export interface DensityCheck extends ModelDensity {
  /** Ideal number density from the radii (Zen's law, see idealNumberDensity), atoms/Å³; 3D with radii only. */
  idealNumber?: number;
  /** Ideal mass density at that number density, g/cm³. */
  idealMass?: number;
  /** number / idealNumber. */
  ratio?: number;
  /** The plausible band for number / ideal (intermetallics). */
  plausible?: [number, number];
}

export interface CheckReport {
  atoms: number;
  dim: 1 | 2 | 3;
  periodic: boolean;
  composition: Composition;
  pairs: SpeciesPairDistance[];
  /** Shortest pairs below TOO_CLOSE_FRACTION·(r₁ + r₂) (at most maxListed), and how many there are in all. */
  tooClose: CloseContact[];
  tooCloseCount: number;
  tooCloseFraction: number;
  shortest: number | null;
  coordination: CoordinationStats[];
  coordinationFactor: number;
  density: DensityCheck | null;
  outsideCell: number;
  /** undefined: not computed (see spaceGroupNote); null: the finder found none. */
  spaceGroup?: SpaceGroupInfo | null;
  /** Why a periodic cell's space group was not computed (too many atoms for the finder here, no finder loaded). */
  spaceGroupNote?: string;
  warnings: CheckWarning[];
  severe: boolean;
}

export interface CheckOptions {
  spaceGroup?: SpaceGroupProvider;
  /** Cells with more atoms than this are not given to the finder (its time grows steeply); the report says so. */
  spaceGroupMaxAtoms?: number;
  /** Without a finder: why (shown in the report instead of the space group). */
  spaceGroupWhyNot?: string;
  /** Most too-close pairs listed (default 50). */
  maxListed?: number;
}

/**
 * Number density a close-packed alloy of this composition would have: Zen's law (Zen, Am. Mineral. 41 (1956) 523,
 * from memory) adds the elements' atomic volumes, and a close-packed element's atomic volume follows from its CN-12
 * radius, 4√2·r³ (fcc, a = 2√2·r). Checked in the tests against fcc Al (0.0602 atoms/Å³, handbook a = 4.0495 Å).
 * NaN when some element has no radius (X).
 */
export function idealNumberDensity(c: Composition): number {
  let v = 0;
  for (const e of c.entries) v += e.fraction * 4 * Math.SQRT2 * contactRadius(e.z) ** 3;
  return 1 / v;
}

/**
 * Plausible band for number density / ideal. Intermetallics contract against Zen's law by a few per cent and
 * strongly bonded Al–transition-metal phases by up to about 15 % (B2 NiAl: 0.0831 atoms/Å³ against 0.0728 ideal,
 * ratio 1.14 — lattice constant 2.887 Å, from memory); open quasicrystal models stay within a few per cent of
 * their approximants. Outside ±20 % is unusual (warning), outside ±40 % impossible for a metal (severe).
 */
export const DENSITY_PLAUSIBLE: [number, number] = [0.8, 1.2];
export const DENSITY_IMPOSSIBLE: [number, number] = [0.6, 1.4];
/** Osmium, the densest element, 22.59 g/cm³ (CRC Handbook, from memory): no alloy is denser. */
export const MAX_MASS_DENSITY = 22.6;

function fmt(x: number, d = 3): string {
  return x.toFixed(d);
}

export function checkStructure(s: Structure, opts: CheckOptions = {}): CheckReport {
  validateStructure(s);
  const warnings: CheckWarning[] = [];
  const warn = (severity: Severity, code: string, message: string) => warnings.push({ severity, code, message });
  const n = s.species.length;
  const dim = s.dim ?? 3;
  const comp = composition(s);
  const report: CheckReport = {
    atoms: n,
    dim,
    periodic: !!s.cell,
    composition: comp,
    pairs: [],
    tooClose: [],
    tooCloseCount: 0,
    tooCloseFraction: TOO_CLOSE_FRACTION,
    shortest: null,
    coordination: [],
    coordinationFactor: COORDINATION_FACTOR,
    density: null,
    outsideCell: 0,
    warnings,
    severe: false,
  };
  if (n === 0) {
    warn('severe', 'empty', 'The structure has no atoms.');
    report.severe = true;
    return report;
  }

  // Distances and coordination.
  const c = contacts(s, { maxListed: opts.maxListed });
  report.pairs = c.pairs;
  report.tooClose = c.tooClose;
  report.tooCloseCount = c.tooCloseCount;
  report.shortest = Number.isFinite(c.shortest) ? c.shortest : null;
  if (c.tooCloseCount > 0) {
    const worst = c.tooClose[0];
    const kinds = c.pairs.filter((p) => p.tooClose > 0).map((p) => `${p.a}–${p.b} ${p.tooClose}`);
    warn(
      'severe',
      'too-close',
      `${c.tooCloseCount.toLocaleString('en-US')}${c.truncated ? '+' : ''} pair${c.tooCloseCount === 1 ? '' : 's'} closer than ${Math.round(100 * TOO_CLOSE_FRACTION)} % of the sum of metallic radii ` +
        `(${c.atomsInTooClose.toLocaleString('en-US')} atoms; ${kinds.join(', ')}); shortest ${worst.a}–${worst.b} ${fmt(worst.distance)} Å, limit ${fmt(worst.threshold)} Å. ` +
        'Atoms overlap: lower the merge tolerance, or change the decoration.',
    );
  }
  if (c.truncated) warn('warning', 'search-truncated', `Atoms are so crowded that the neighbour search stopped at ${fmt(c.searchRadius, 2)} Å; counts are lower bounds.`);

  // Coordination per site class (or per element).
  const groups = new Map<string, number[]>();
  for (let i = 0; i < n; i++) {
    const name = s.site && s.siteClasses ? s.siteClasses[s.site[i]].name : symbolOf(s.species[i]);
    let g = groups.get(name);
    if (!g) groups.set(name, (g = []));
    g.push(c.coordination[i]);
  }
  for (const [name, cn] of groups) {
    let sum = 0;
    let min = Infinity;
    let max = 0;
    for (const v of cn) {
      sum += v;
      min = Math.min(min, v);
      max = Math.max(max, v);
    }
    report.coordination.push({ name, atoms: cn.length, mean: sum / cn.length, min, max });
  }
  const hasX = comp.entries.some((e) => e.z === 0);
  if (s.cell && dim === 3 && !hasX) {
    let isolated = 0;
    for (let i = 0; i < n; i++) if (c.coordination[i] === 0) isolated++;
    if (isolated > 0) warn('warning', 'isolated', `${isolated.toLocaleString('en-US')} atom${isolated === 1 ? ' has' : 's have'} no neighbour within ${COORDINATION_FACTOR}·(r₁ + r₂): a hole in the decoration?`);
  }

  // Density.
  try {
    const d: DensityCheck = modelDensity(s);
    if (d.dim === 3 && !hasX && comp.entries.every((e) => Number.isFinite(contactRadius(e.z)))) {
      d.idealNumber = idealNumberDensity(comp);
      const meanMass = comp.entries.reduce((a, e) => a + e.fraction * atomicWeight(e.z), 0);
      d.idealMass = d.idealNumber * meanMass * U_PER_A3_TO_G_PER_CM3;
      d.ratio = d.number / d.idealNumber;
      d.plausible = DENSITY_PLAUSIBLE;
      const pct = `${fmt(100 * d.ratio, 0)} % of the close-packed ideal ${fmt(d.idealNumber, 4)} atoms/Å³`;
      if (d.ratio > DENSITY_IMPOSSIBLE[1] || d.ratio < DENSITY_IMPOSSIBLE[0]) {
        warn('severe', d.ratio > 1 ? 'density-high' : 'density-low', `Atomic density ${fmt(d.number, 4)} atoms/Å³ is ${pct} (${d.region}): impossible for a metal.`);
      } else if (d.ratio > DENSITY_PLAUSIBLE[1] || d.ratio < DENSITY_PLAUSIBLE[0]) {
        warn('warning', d.ratio > 1 ? 'density-high' : 'density-low', `Atomic density ${fmt(d.number, 4)} atoms/Å³ is ${pct} (${d.region}): unusual for an intermetallic (plausible 80–120 %).`);
      }
    }
    if (d.mass !== undefined && d.mass > MAX_MASS_DENSITY && !warnings.some((w) => w.code === 'density-high' && w.severity === 'severe')) {
      warn('severe', 'density-high', `Mass density ${fmt(d.mass, 2)} g/cm³ is above that of osmium (22.6 g/cm³), the densest element.`);
    }
    report.density = d;
  } catch (e) {
    warn('info', 'density-unavailable', `No density: ${(e as Error).message.replace(/^density: /, '')}.`);
  }

  // Cell and sites.
  if (s.cell) {
    report.outsideCell = atomsOutsideCell(s);
    if (report.outsideCell > 0) warn('warning', 'outside-cell', `${report.outsideCell.toLocaleString('en-US')} atoms lie outside the cell; exports wrap them in.`);
  }
  if (hasX) {
    const x = comp.entries.find((e) => e.z === 0)!;
    warn('info', 'unassigned', `${Math.round(x.count).toLocaleString('en-US')} unassigned vertices (X): no element, so no radii or density limits apply to them; decorate the model before exporting to a simulation code.`);
  }
  let mixed = 0;
  for (let i = 0; i < n; i++) {
    const a = atomContributions(s, i);
    if (a.length > 1 || Math.abs(a[0][1] - 1) > 1e-9) mixed++;
  }
  if (mixed > 0) warn('info', 'mixed-sites', `${mixed.toLocaleString('en-US')} mixed or partially occupied sites: CIF and extended XYZ keep them; POSCAR and LAMMPS need an ordered variant.`);

  // Space group.
  if (s.cell && opts.spaceGroup && opts.spaceGroupMaxAtoms !== undefined && n > opts.spaceGroupMaxAtoms) {
    report.spaceGroupNote = `not computed: ${n.toLocaleString('en-US')} atoms, above the ${opts.spaceGroupMaxAtoms.toLocaleString('en-US')}-atom limit of the symmetry finder here (its time grows steeply with the cell)`;
  } else if (s.cell && !opts.spaceGroup && opts.spaceGroupWhyNot) {
    report.spaceGroupNote = `not computed: ${opts.spaceGroupWhyNot}`;
  } else if (opts.spaceGroup && s.cell) {
    let g: SpaceGroupInfo | null;
    try {
      g = opts.spaceGroup(s);
    } catch (e) {
      g = null;
      warn('warning', 'no-space-group', `The symmetry finder failed: ${(e as Error).message}`);
    }
    return withSpaceGroup(report, g);
  }
  return withSpaceGroup(report, undefined);
}

/**
 * The report with a space group found later (the page loads its finder after the first check): its warnings
 * (P 1, none found) added and sorted. `undefined` only sorts. Returns a new report; the input is not changed.
 */
export function withSpaceGroup(r: CheckReport, g: SpaceGroupInfo | null | undefined): CheckReport {
  const warnings = [...r.warnings];
  const out: CheckReport = { ...r, warnings };
  if (g !== undefined) {
    out.spaceGroup = g;
    delete out.spaceGroupNote;
    if (g === null && !warnings.some((w) => w.code === 'no-space-group')) warnings.push({ severity: 'warning', code: 'no-space-group', message: 'The symmetry finder found no space group for this cell.' });
    else if (g?.number === 1) warnings.push({ severity: 'info', code: 'p1', message: 'Space group P1: the cell has no symmetry beyond its translations.' });
  }
  const order: Record<Severity, number> = { severe: 0, warning: 1, info: 2 };
  warnings.sort((a, b) => order[a.severity] - order[b.severity]);
  out.severe = warnings.some((w) => w.severity === 'severe');
  return out;
}

/**
 * One line for a file's comment (XYZ comment, CIF comment, POSCAR and LAMMPS first line): the severe problems and
 * warnings, shortened; undefined when there are none.
 */
export function checkComment(r: CheckReport, maxLength = 400): string | undefined {
  const shown = r.warnings.filter((w) => w.severity !== 'info');
  if (shown.length === 0) return undefined;
  const text = ascii(`check: ${shown.map((w) => `${w.severity.toUpperCase()} ${w.message}`).join(' ')}`).replace(/\s+/g, ' ');
  return text.length > maxLength ? `${text.slice(0, maxLength - 3)}...` : text;
}

/** Plain ASCII for comment lines that Fortran readers (VASP) and old tools see: Å → A, ³ → ^3, subscripts → digits. */
function ascii(text: string): string {
  const map: Record<string, string> = { 'Å': 'A', '³': '^3', '²': '^2', '₁': '1', '₂': '2', '·': '*', '–': '-', '—': '-', '…': '...', '≤': '<=', '≥': '>=', '×': 'x' };
  return text.replace(/[^\x20-\x7e]/g, (c) => map[c] ?? '?');
}

/** The report as plain text (the CLI's --format text). */
export function checkText(r: CheckReport): string {
  const out: string[] = [];
  out.push(`atoms: ${r.atoms}${r.periodic ? ' (periodic cell)' : ''}, ${r.dim}D`);
  out.push(`composition: ${r.composition.formula}`);
  if (r.spaceGroup !== undefined) out.push(`space group: ${r.spaceGroup ? `${r.spaceGroup.symbol} (${r.spaceGroup.number})` : 'none found'}`);
  else if (r.spaceGroupNote) out.push(`space group: ${r.spaceGroupNote}`);
  if (r.density) {
    const d = r.density;
    let line = `density: ${d.number.toFixed(5)} ${d.unit}`;
    if (d.mass !== undefined) line += `, ${d.mass.toFixed(3)} g/cm³`;
    line += ` over the ${d.region}`;
    if (d.ratio !== undefined) line += `; ${(100 * d.ratio).toFixed(0)} % of the ideal ${d.idealNumber!.toFixed(5)} atoms/Å³ (${d.idealMass!.toFixed(3)} g/cm³)`;
    out.push(line);
  }
  out.push(`shortest distance: ${r.shortest === null ? '—' : `${r.shortest.toFixed(3)} Å`}`);
  out.push(`pairs (shortest / limit ${Math.round(100 * r.tooCloseFraction)} % of r1+r2):`);
  for (const p of r.pairs) {
    out.push(`  ${`${p.a}–${p.b}`.padEnd(6)} ${p.shortest === null ? '   —   ' : `${p.shortest.toFixed(3)} Å`}  ${p.threshold === null ? 'no radius' : `limit ${p.threshold.toFixed(3)} Å`}${p.tooClose ? `  ${p.tooClose} too close` : ''}`);
  }
  out.push(`coordination (neighbours within ${r.coordinationFactor}·(r1+r2)):`);
  for (const c of r.coordination) out.push(`  ${c.name}: ${c.atoms} atoms, mean ${c.mean.toFixed(2)}, ${c.min}–${c.max}`);
  if (r.tooCloseCount > 0) {
    out.push(`too close: ${r.tooCloseCount} pairs; the shortest ${r.tooClose.length}:`);
    for (const p of r.tooClose.slice(0, 10)) out.push(`  ${p.a}${p.i + 1}–${p.b}${p.j + 1} ${p.distance.toFixed(3)} Å (limit ${p.threshold.toFixed(3)} Å)`);
  }
  if (r.periodic) out.push(`atoms outside the cell: ${r.outsideCell}`);
  out.push(r.warnings.length ? 'warnings:' : 'warnings: none');
  for (const w of r.warnings) out.push(`  [${w.severity}] ${w.message}`);
  return out.join('\n') + '\n';
}
