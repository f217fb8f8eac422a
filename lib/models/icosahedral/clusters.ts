import type { SiteClass, Structure } from '../../structure/types';
import { validateStructure } from '../../structure/validate';
import { polyhedronVertices, vertexCount, type PolyhedronName } from './polyhedra';

/** One concentric shell of a cluster: a polyhedron's vertices at a radius, all of one kind of site. */
export interface ClusterShell {
  /** Label, e.g. "inner icosahedron". */
  name: string;
  polyhedron: PolyhedronName;
  /** Circumradius in Å. */
  radius: number;
  /** Majority atomic number (0 = unassigned). */
  species: number;
  /** Mixed occupancy, atomic number → fraction. */
  mix?: Record<number, number>;
  /** Site occupancy 0..1 (e.g. a partly occupied inner shell). */
  occupancy?: number;
}

export interface ClusterTemplate {
  /** Short name used in site-class labels, e.g. "Mackay". */
  name: string;
  /** Where the shell radii come from (and how sure we are). */
  reference: string;
  /** Optional atom at the centre. */
  centre?: { name: string; species: number; mix?: Record<number, number>; occupancy?: number };
  /** Shells from the inside out. */
  shells: ClusterShell[];
  /** Presets: the site class the cluster is meant to be centred on. */
  site?: PresetSite;
  /** Presets: the quasilattice constant a_R (Å) the shells are sized for; neighbouring clusters share atoms only then. */
  aR?: number;
  /** Presets: the crystal the cluster is modelled on. */
  phase?: ReferencePhase;
  /** Presets: site classes of atoms between the clusters ("glue") that the preset's default decoration adds. */
  companions?: PresetCompanion[];
}

/** A 6D position in the hyperlattice cell: a named site or six fractional coordinates in [0, 1). */
export type PresetPosition = 'node' | 'body' | readonly [number, number, number, number, number, number];

/** A site class offered with a preset: atoms the published phase has between its clusters. */
export interface PresetCompanion {
  name: string;
  position: PresetPosition;
  /** Window: the canonical (triacontahedral) occupation domain scaled by this factor. */
  windowScale: number;
  /** Element symbol. */
  species: string;
  /** What it models, where from, and what is still missing. */
  note: string;
}

const TAU = (1 + Math.sqrt(5)) / 2;
/** Quasilattice constant a_R of a 1/1 cubic approximant of lattice constant a: a = 2(τ + 1)·a_R/√(2 + τ) (Elser & Henley 1985). */
export function aROf11(a: number): number {
  return (a * Math.sqrt(2 + TAU)) / (2 * (TAU + 1));
}

/** The 6D position ½(1,…,1) − ½e_(k+1), i.e. ½ in every coordinate but the k-th (0-based), which is 0. */
function bodyMinusHalfEdge(k: number): PresetPosition {
  const p: [number, number, number, number, number, number] = [0.5, 0.5, 0.5, 0.5, 0.5, 0.5];
  p[k] = 0;
  return p;
}

/** The crystal a preset is modelled on: its cubic 1/1 approximant, for the density check and the preset's scale. */
export interface ReferencePhase {
  /** Phase name, e.g. "YbCd6 (1/1 approximant)". */
  name: string;
  /** Cubic lattice constant, Å. */
  a: number;
  /** Atoms per conventional cell. */
  atomsPerCell: number;
  /** Where a and the count come from (and how sure we are). */
  source: string;
}

/** The site a preset is meant for: a site class of the cut whose points are the cluster centres. */
export interface PresetSite {
  /** Suggested class name. */
  name: string;
  position: 'node' | 'body';
  /** Window: the canonical (triacontahedral) occupation domain scaled by this factor. */
  windowScale: number;
}

/**
 * The cluster-centre site of every preset: the vertices (position node) whose perpendicular image lies in the
 * canonical window shrunk by τ² — a window scaled with a_R, so it keeps the same vertices at every a_R (a fixed
 * sphere radius in Å did not: at the 2/1's symmetric window position the origin lies 2.0 Å (Bergman) and 2.2 Å
 * (Tsai) from the window centre, and a 2 Å sphere kept no centre at all). The vertices it keeps have all twelve
 * five-fold neighbours at a_R (the icosahedral star around a cluster centre) and lie at least 2.384·a_R apart — the
 * three-fold linkage of the canonical cells (Henley, PRB 43 (1991) 993, from memory): 2 per cell in the 1/1 (the
 * bcc sites), 8 in the 2/1, 32 in the 3/2 — checked in tests/unit/models/icosahedral/presets.test.ts.
 */
export const CLUSTER_CENTRE_SITE: PresetSite = { name: 'cluster centre', position: 'node', windowScale: 1 / (TAU * TAU) };

/**
 * Mackay-type cluster as in α-(Al,Mn)Si (cP138, Pm-3): an Al icosahedron, an Al icosidodecahedron and a Mn
 * icosahedron capping its pentagons at about the same radius (54 atoms, centre empty). Cooper & Robinson, Acta
 * Cryst. 20 (1966) 614 (structure of α-AlMnSi, a = 12.68 Å — from memory); Elser & Henley, Phys. Rev. Lett. 55
 * (1985) 2883 (the cluster as the building unit of the icosahedral phase; Mackay clusters on the bcc sites of
 * the 1/1, quasilattice constant a_R = a/2.7528 = 4.61 Å). Radii from memory: inner Al icosahedron 2.45 Å, Al
 * icosidodecahedron 4.5 Å, Mn icosahedron 4.8 Å, chosen so every contact is at least 0.85 of the CN-12
 * metallic-radius sum. Measured in the published structure (Sugiyama, Kaji & Hiraga, Acta Cryst. C54 (1998) 445,
 * COD 2007194: Pm-3, a = 12.643 Å, 138 atoms; scripts/checks/alpha_almnsi.py): 2.45 / 4.65–4.71 / 4.82 Å about
 * the origin, 2.43 / 4.72–4.75 / 4.73 Å about the body centre; our 1/1 atoms lie 0.02–0.26 Å from those sites.
 *
 * Atom count of the published phase: 138 = 2 Mackay clusters (2 × 54 = 108: the clusters at the origin and the
 * body centre are 10.95 Å apart and share no atom) + 30 glue atoms: Al6 (12j) and Al7 (12k), three on each of
 * the 8 three-fold linkages per cell (6.6–6.8 Å from both cluster centres, 3.9 Å off the axis that joins them),
 * and Si3 (6f, 7.3 Å from the origin cluster). The published cell is body-centred to within 0.13 Å except there:
 * Al6 and Al7 are each other's body-centred image to 0.62 Å, and Si3 has no image (it would sit 1.96 Å from Al7).
 * The preset's companions (MACKAY_GLUE) are the six 6D positions ½(1,…,1) − ½e_k with the window scaled by 1/τ²:
 * in the 1/1 their points are exactly the 24 Al6/Al7 sites, 0.18 and 0.48 Å from the published ones — 132 of the
 * 138 atoms (density 4–5 % low). Si3 is not modelled: an Im-3 cut would bring it with a body-centred copy where
 * the published phase has no atom, and in our cut (Al6 and Al7 on one averaged orbit) both copies would sit 2.3 Å
 * from the glue (the published Si3 has Al6 and Al7 at 2.56 Å). The window is the smallest of the 1/τⁿ family
 * that holds the 1/1 glue (1/τ holds the same 24 there); in the 2/1 it keeps 24 glue atoms, all on three-fold
 * linkages like the published ones (density 0.78 of the α-phase's) — there is no published 2/1 to compare with.
 */
const MACKAY_GLUE: PresetCompanion[] = [0, 1, 2, 3, 4, 5].map((k) => ({
  name: `glue ${k + 1}`,
  position: bodyMinusHalfEdge(k),
  windowScale: 1 / (TAU * TAU),
  species: 'Al',
  note:
    `Al at the 6D position ½(1,…,1) − ½e${k + 1}, canonical window scaled by 1/τ² (one of six such classes): in the 1/1 the glue of α-(AlMnSi) (Sugiyama, Kaji & Hiraga, Acta Cryst. C54 (1998) 445): Al6 and Al7, three on each three-fold linkage between neighbouring clusters, 6.6–6.8 Å from both centres. The six classes give 24 of the α-phase’s 30 glue atoms per cell (132 of its 138 atoms, density 4–5 % low); Si3 (6 per cell, round the origin cluster only) has no place in a body-centred cut.`,
}));

export const MACKAY: ClusterTemplate = {
  name: 'Mackay',
  reference:
    'Cooper & Robinson, Acta Cryst. 20 (1966) 614; Elser & Henley, PRL 55 (1985) 2883. Radii from memory, approximate (in the 1/1, 0.02–0.26 Å from the published sites of Sugiyama, Kaji & Hiraga, Acta Cryst. C54 (1998) 445, COD 2007194, which also give the glue); cut with a_R ≈ 4.61 Å (α-AlMnSi, a = 12.68 Å).',
  shells: [
    { name: 'inner icosahedron', polyhedron: 'icosahedron', radius: 2.45, species: 13 },
    { name: 'icosidodecahedron', polyhedron: 'icosidodecahedron', radius: 4.5, species: 13 },
    { name: 'Mn icosahedron', polyhedron: 'icosahedron', radius: 4.8, species: 25 },
  ],
  site: CLUSTER_CENTRE_SITE,
  aR: aROf11(12.68),
  phase: { name: 'α-AlMnSi (cP138)', a: 12.68, atomsPerCell: 138, source: 'Cooper & Robinson, Acta Cryst. 20 (1966) 614 — from memory' },
  companions: MACKAY_GLUE,
};

/**
 * Bergman cluster as in the R-phase Mg32(Al,Zn)49 (cI162, Im-3, a = 14.16 Å): (Al,Zn) icosahedron; Mg
 * dodecahedron and (Al,Zn) icosahedron capping its faces (together a 32-vertex rhombic triacontahedron, the
 * icosahedron at 1/0.9106 of the dodecahedron's radius); a 60-atom (Al,Zn) truncated icosahedron; 12 Mg on the
 * five-fold axes capping its pentagons. Bergman, Waugh & Pauling, Acta Cryst. 10 (1957) 254. Radii from
 * memory (2.5, 4.6, 5.05, 6.7, 7.9 Å), tuned so that clusters on the bcc sites of the 1/1 (a_R = 5.14 Å) share
 * their outer shells without contacts below 0.95 of the metallic-radius sum; Al:Zn taken 1:1.
 */
export const BERGMAN: ClusterTemplate = {
  name: 'Bergman',
  reference:
    'Bergman, Waugh & Pauling, Acta Cryst. 10 (1957) 254. Radii from memory, approximate; Al:Zn set to 1:1; cut with a_R ≈ 5.14 Å (R-phase, a = 14.16 Å).',
  shells: [
    { name: 'inner icosahedron', polyhedron: 'icosahedron', radius: 2.5, species: 30, mix: { 13: 0.5, 30: 0.5 } },
    { name: 'Mg dodecahedron', polyhedron: 'dodecahedron', radius: 4.6, species: 12 },
    { name: 'outer icosahedron', polyhedron: 'icosahedron', radius: 4.6 / 0.910593, species: 30, mix: { 13: 0.5, 30: 0.5 } },
    { name: 'truncated icosahedron', polyhedron: 'truncated-icosahedron', radius: 6.7, species: 30, mix: { 13: 0.5, 30: 0.5 } },
    { name: 'Mg icosahedron', polyhedron: 'icosahedron', radius: 7.9, species: 12 },
  ],
  site: CLUSTER_CENTRE_SITE,
  aR: aROf11(14.16),
  phase: { name: 'R-phase Mg32(Al,Zn)49 (cI162)', a: 14.16, atomsPerCell: 162, source: 'Bergman, Waugh & Pauling, Acta Cryst. 10 (1957) 254 — from memory' },
};

/**
 * Tsai-type cluster as in YbCd5.7 (the i-phase) and its 1/1 approximant YbCd6 (cI168, Im-3, a = 15.64 Å):
 * Cd4 tetrahedron, Cd20 dodecahedron, Yb12 icosahedron, Cd30 icosidodecahedron and the 92-atom Cd rhombic
 * triacontahedron (32 vertices and 60 edge midpoints). Its inradius is half the 1/1 cell constant, so its
 * edge is the quasilattice constant a_R = 15.64/2.7528 = 5.68 Å (circumradius τ·a_R = 9.19 Å): neighbouring
 * clusters of the 1/1 share a rhombus face along the two-fold axes and interpenetrate along the three-fold
 * axes, where their triacontahedron atoms fall on the neighbour's dodecahedron and icosidodecahedron
 * (merged). Tsai et al., Nature 408 (2000) 537; Gómez & Lidin, Angew. Chem. Int. Ed. 40 (2001) 4037;
 * Takakura et al., Nature Materials 6 (2007) 58. Inner radii from memory, adjusted (tetrahedron 1.6,
 * dodecahedron 4.3, icosahedron 5.6, icosidodecahedron 6.1 Å) so the merged 1/1 has no contact below 0.82 of
 * the metallic-radius sum; the published tetrahedron is orientationally disordered.
 */
export const TSAI: ClusterTemplate = {
  name: 'Tsai',
  reference:
    'Tsai et al., Nature 408 (2000) 537; Gómez & Lidin, Angew. Chem. 40 (2001) 4037; Takakura et al., Nat. Mater. 6 (2007) 58. Inner radii from memory, approximate; cut with a_R ≈ 5.68 Å (YbCd6, a = 15.64 Å).',
  shells: [
    { name: 'Cd tetrahedron', polyhedron: 'tetrahedron', radius: 1.6, species: 48 },
    { name: 'Cd dodecahedron', polyhedron: 'dodecahedron', radius: 4.3, species: 48 },
    { name: 'Yb icosahedron', polyhedron: 'icosahedron', radius: 5.6, species: 70 },
    { name: 'Cd icosidodecahedron', polyhedron: 'icosidodecahedron', radius: 6.1, species: 48 },
    // Edge a_R = 15.64/2.7528 Å; circumradius (five-fold vertices) τ·a_R.
    { name: 'Cd triacontahedron', polyhedron: 'rhombic-triacontahedron-92', radius: TAU * aROf11(15.64), species: 48 },
  ],
  site: CLUSTER_CENTRE_SITE,
  aR: aROf11(15.64),
  phase: { name: 'YbCd6 (cI168)', a: 15.64, atomsPerCell: 168, source: 'Gómez & Lidin, Angew. Chem. Int. Ed. 40 (2001) 4037 (a = 15.638 Å, Yb24Cd144) — from memory' },
};

export const CLUSTER_PRESETS: Readonly<Record<string, ClusterTemplate>> = { mackay: MACKAY, bergman: BERGMAN, tsai: TSAI };

/** Number of atoms in one cluster of a template. */
export function clusterSize(t: ClusterTemplate): number {
  return (t.centre ? 1 : 0) + t.shells.reduce((a, s) => a + vertexCount(s.polyhedron), 0);
}

/** The template's atoms about the origin: positions, and for each the shell index (−1 = centre). */
export function clusterAtoms(t: ClusterTemplate): { positions: Float64Array; species: Uint16Array; shell: Int16Array } {
  checkTemplate(t);
  const pos: number[] = [];
  const sp: number[] = [];
  const sh: number[] = [];
  if (t.centre) {
    pos.push(0, 0, 0);
    sp.push(t.centre.species);
    sh.push(-1);
  }
  t.shells.forEach((s, k) => {
    const v = polyhedronVertices(s.polyhedron, s.radius);
    for (let i = 0; i < v.length; i += 3) {
      pos.push(v[i], v[i + 1], v[i + 2]);
      sp.push(s.species);
      sh.push(k);
    }
  });
  return { positions: Float64Array.from(pos), species: Uint16Array.from(sp), shell: Int16Array.from(sh) };
}

function checkTemplate(t: ClusterTemplate): void {
  if (t.shells.length === 0 && !t.centre) throw new Error(`cluster "${t.name}": no shells and no centre`);
  t.shells.forEach((s, k) => {
    if (!(s.radius >= 0) || !Number.isFinite(s.radius)) throw new Error(`cluster "${t.name}" shell ${k + 1} (${s.name}): radius must be ≥ 0 Å`);
    if (s.occupancy !== undefined && !(s.occupancy >= 0 && s.occupancy <= 1)) {
      throw new Error(`cluster "${t.name}" shell ${k + 1} (${s.name}): occupancy must be within 0..1`);
    }
  });
}

export interface PlaceOptions {
  /** Keep the input's own atoms (default true); atoms chosen as centres by a predicate are always replaced. */
  keepOthers?: boolean;
}

/**
 * Put a copy of the cluster at each centre. Centres are packed xyz positions, or a predicate on the
 * input's atoms (those atoms become centres and are replaced by the cluster). Output: the input's
 * remaining atoms first (their site classes kept; one class per species is made when they had none),
 * then, cluster by cluster in centre order, the centre atom and the shells from inside out, with one
 * new site class per shell ("Mackay: Mn icosahedron"). Overlaps between neighbouring clusters are
 * left in place: follow with mergeClose. Cell and provenance are kept; perp and tiles are dropped
 * (cluster atoms have no perpendicular-space coordinate, and tile corners would no longer match).
 */
export function placeClusters(
  s: Structure,
  template: ClusterTemplate,
  centres: Float64Array | ((i: number) => boolean),
  opts: PlaceOptions = {},
): Structure {
  validateStructure(s);
  const c = clusterAtoms(template);
  const n = s.species.length;
  let centreXyz: Float64Array;
  const keep = new Uint8Array(n).fill(opts.keepOthers === false ? 0 : 1);
  if (typeof centres === 'function') {
    const idx: number[] = [];
    for (let i = 0; i < n; i++)
      if (centres(i)) {
        idx.push(i);
        keep[i] = 0;
      }
    centreXyz = new Float64Array(3 * idx.length);
    idx.forEach((i, k) => centreXyz.set(s.positions.subarray(3 * i, 3 * i + 3), 3 * k));
  } else {
    if (centres.length % 3 !== 0) throw new Error(`placeClusters: centres must be packed xyz (length ${centres.length} is not a multiple of 3)`);
    centreXyz = centres;
  }
  // Site classes: the input's, or one per species when it has none.
  let classes: SiteClass[];
  let baseSite: Uint16Array;
  if (s.site && s.siteClasses) {
    classes = s.siteClasses.map((x) => ({ ...x }));
    baseSite = s.site;
  } else {
    classes = [];
    baseSite = new Uint16Array(n);
    const bySpecies = new Map<number, number>();
    for (let i = 0; i < n; i++) {
      if (!keep[i]) continue;
      const z = s.species[i];
      if (!bySpecies.has(z)) {
        bySpecies.set(z, classes.length);
        classes.push({ name: z === 0 ? 'vertex' : `input ${z}`, species: z });
      }
      baseSite[i] = bySpecies.get(z)!;
    }
  }
  const shellClass: number[] = [];
  const centreClass = template.centre ? classes.length : -1;
  if (template.centre) {
    const t = template.centre;
    classes.push({ name: `${template.name}: ${t.name}`, species: t.species, ...(t.mix ? { mix: { ...t.mix } } : {}), ...(t.occupancy !== undefined ? { occupancy: t.occupancy } : {}) });
  }
  for (const sh of template.shells) {
    shellClass.push(classes.length);
    classes.push({ name: `${template.name}: ${sh.name}`, species: sh.species, ...(sh.mix ? { mix: { ...sh.mix } } : {}), ...(sh.occupancy !== undefined ? { occupancy: sh.occupancy } : {}) });
  }
  if (classes.length > 65535) throw new Error('placeClusters: more than 65535 site classes');
  let kept = 0;
  for (let i = 0; i < n; i++) kept += keep[i];
  const nc = centreXyz.length / 3;
  const per = c.species.length;
  const total = kept + nc * per;
  const positions = new Float64Array(3 * total);
  const species = new Uint16Array(total);
  const site = new Uint16Array(total);
  const anyOcc = s.occupancy !== undefined;
  const occupancy = anyOcc ? new Float64Array(total).fill(1) : undefined;
  let m = 0;
  for (let i = 0; i < n; i++) {
    if (!keep[i]) continue;
    positions.set(s.positions.subarray(3 * i, 3 * i + 3), 3 * m);
    species[m] = s.species[i];
    site[m] = baseSite[i];
    if (occupancy && s.occupancy) occupancy[m] = s.occupancy[i];
    m++;
  }
  for (let k = 0; k < nc; k++) {
    const x = centreXyz[3 * k];
    const y = centreXyz[3 * k + 1];
    const z = centreXyz[3 * k + 2];
    for (let a = 0; a < per; a++) {
      positions[3 * m] = x + c.positions[3 * a];
      positions[3 * m + 1] = y + c.positions[3 * a + 1];
      positions[3 * m + 2] = z + c.positions[3 * a + 2];
      species[m] = c.species[a];
      const sh = c.shell[a];
      site[m] = sh < 0 ? centreClass : shellClass[sh];
      if (occupancy) occupancy[m] = classes[site[m]].occupancy ?? 1;
      m++;
    }
  }
  const out: Structure = { positions, species, site, siteClasses: classes, provenance: s.provenance };
  if (s.cell) out.cell = s.cell;
  if (s.dim !== undefined) out.dim = s.dim;
  if (occupancy) out.occupancy = occupancy;
  return out;
}
