/**
 * Decoration by site classes.
 * Each site class is generated as its own cut: the hyperlattice shifted by the class's 6D position, with
 * the class's occupation domain (scaled projected hypercube, sphere or spherical shell) centred on the
 * phason offset, all with the same projection (Duneau & Katz 1985; the "atomic surfaces" picture —
 * common practice). Cluster templates are then centred on the points of chosen site classes, and atoms
 * that land closer than the merge tolerance are merged (lib/structure/merge.ts), with a note of what merged.
 */
import type { Structure } from '../../structure/types';
import { atomicNumber } from '../../structure/elements';
import type { ClusterPlacementParams, DecorationParams, SiteClassParams } from './decoration-schema';
import { DEFAULT_MERGE_TOLERANCE } from './decoration-schema';
import { checkPointCap } from '../point-cap';
import type { CutClass } from './cut';
import { vertexClass } from './cut';
import { CLUSTER_PRESETS, clusterSize, placeClusters, type ClusterTemplate } from './clusters';
import { mergeClose, wrapCounting } from '../../structure/merge';
import { TOO_CLOSE_FRACTION, tooCloseThreshold } from '../../structure/radii';
import { forEachPairWithin } from '../../math/cell-list';

/** 6D fractional position of a named site (or the explicit six numbers). */
export function sitePosition(position: SiteClassParams['position']): Float64Array {
  const v = new Float64Array(6);
  if (typeof position !== 'string') {
    v.set(position);
    return v;
  }
  if (position === 'body') v.fill(0.5);
  else if (position.startsWith('edge')) v[Number(position.slice(4)) - 1] = 0.5;
  return v;
}

/** Majority element of a mix (largest fraction; ties broken by smaller atomic number). */
function majority(mix: Record<number, number>): number {
  let best = 0;
  let bestF = -1;
  for (const [z, f] of Object.entries(mix).map(([k, x]) => [Number(k), x] as const).sort((a, b) => a[0] - b[0]))
    if (f > bestF) {
      best = z;
      bestF = f;
    }
  return best;
}

/** Site classes for a cut: the decoration's, or one vertex class of the given element (default X). */
export function resolveClasses(decoration?: DecorationParams, species?: string): CutClass[] {
  if (!decoration) return [vertexClass(species ? atomicNumber(species) : 0)];
  return decoration.classes.map((c) => {
    const cl: CutClass = { name: c.name, position: sitePosition(c.position), window: c.window, species: 0 };
    if (c.mix) {
      const mix: Record<number, number> = {};
      for (const [sym, f] of Object.entries(c.mix)) mix[atomicNumber(sym)] = f;
      cl.mix = mix;
      cl.species = majority(mix);
    } else if (c.species) cl.species = atomicNumber(c.species);
    if (c.occupancy !== undefined) cl.occupancy = c.occupancy;
    return cl;
  });
}

/** The cluster template of one placement: the preset (with the placement's species per shell, if given) or the user's shells. */
export function placementTemplate(c: ClusterPlacementParams): ClusterTemplate {
  if (c.preset) {
    const t = CLUSTER_PRESETS[c.preset];
    if (!c.species) return t;
    if (c.species.length !== t.shells.length) {
      throw new Error(`${t.name} preset: species per shell needs ${t.shells.length} elements (one per shell: ${t.shells.map((x) => x.name).join(', ')}), got ${c.species.length}`);
    }
    return { ...t, shells: t.shells.map((sh, k) => ({ name: sh.name, polyhedron: sh.polyhedron, radius: sh.radius, species: atomicNumber(c.species![k]) })) };
  }
  return {
    name: 'cluster',
    reference: 'user-defined shells',
    shells: c.shells!.map((sh, k) => ({
      name: sh.name ?? `shell ${k + 1}`,
      polyhedron: sh.polyhedron,
      radius: sh.radius,
      species: atomicNumber(sh.species),
    })),
  };
}

/**
 * Atoms after placing clusters, from the number of points of each site class: each centre is replaced by its
 * cluster (counted before merging, which only removes atoms).
 */
export function decoratedCount(classCounts: ReadonlyMap<string, number>, total: number, decoration?: DecorationParams): number {
  let n = total;
  for (const c of decoration?.clusters ?? []) n += (classCounts.get(c.at) ?? 0) * (clusterSize(placementTemplate(c)) - 1);
  return n;
}

/**
 * A decoration that puts a preset on the site it is meant for: one site class of cluster centres (the
 * preset's position and window), the preset with its usual species, and the preset's companion classes (glue
 * atoms of the published phase, e.g. the Mackay preset's), every field editable.
 */
export function presetDecoration(preset: ClusterPlacementParams['preset'] & string): DecorationParams {
  const t = CLUSTER_PRESETS[preset];
  const site = t.site!;
  return {
    classes: [
      { name: site.name, position: site.position, window: { kind: 'hypercube', scale: site.windowScale } },
      ...(t.companions ?? []).map((c) => ({
        name: c.name,
        position: typeof c.position === 'string' ? c.position : ([...c.position] as [number, number, number, number, number, number]),
        window: { kind: 'hypercube' as const, scale: c.windowScale },
        species: c.species,
      })),
    ],
    clusters: [{ at: site.name, preset }],
    mergeTolerance: DEFAULT_MERGE_TOLERANCE,
  };
}

export interface ClusterOptions {
  /** Point cap: refuse before allocating when the clusters would exceed it. */
  maxPoints?: number;
  /** Quasilattice constant of the cut, Å, to warn when a preset was sized for another. */
  aR?: number;
}

/**
 * Place the decoration's cluster templates on their site classes, wrap atoms that land outside the cell
 * back in (periodic cuts), then merge atoms closer than the merge tolerance across periodic boundaries
 * (minimum image), with notes of what was placed, wrapped and merged.
 */
export function applyClusters<S extends Structure>(s: S, decoration?: DecorationParams, opts: ClusterOptions = {}): S {
  if (!decoration?.clusters?.length) return s;
  let out: Structure = s;
  const notes: string[] = [];
  for (const c of decoration.clusters) {
    const template = placementTemplate(c);
    const classes = out.siteClasses ?? [];
    const site = out.site;
    const target = classes.findIndex((k) => k.name === c.at);
    let centres = 0;
    if (site) for (let i = 0; i < site.length; i++) if (site[i] === target) centres++;
    const size = clusterSize(template);
    if (opts.maxPoints !== undefined) {
      checkPointCap(out.species.length + centres * (size - 1), opts.maxPoints, `${centres} ${template.name} clusters of ${size} atoms`);
    }
    out = placeClusters(out, template, (i) => site !== undefined && site[i] === target);
    notes.push(`${template.name} clusters on "${c.at}": ${centres} placed, ${centres * size} atoms added`);
    if (centres === 0) {
      notes.push(
        `warning: no point of site class "${c.at}" lies in its window here, so no ${template.name} cluster was placed — widen the class's window or move its position`,
      );
    }
    if (template.aR !== undefined && opts.aR !== undefined && Math.abs(opts.aR / template.aR - 1) > 0.02) {
      notes.push(
        `warning: the ${template.name} preset is sized for a_R = ${template.aR.toFixed(2)} Å (${template.phase?.name ?? 'its phase'}); this cut has a_R = ${opts.aR} Å, so neighbouring clusters will not share their atoms — expect close pairs`,
      );
    }
  }
  if (out.cell) {
    const w = wrapCounting(out);
    out = w.structure;
    if (w.count > 0) notes.push(`wrapped ${w.count} cluster atoms that fell outside the cell back into it`);
  }
  const tol = decoration.mergeTolerance;
  if (tol > 0) {
    // Mean positions: two cluster atoms that are symmetry images of each other merge onto the symmetry
    // element, so the decorated cell keeps the cut's space group (keeping one of them would break it).
    // A mean can land within the tolerance of a third atom: merge again until no pair is left (a few rounds).
    let count = 0;
    let conflicts = 0;
    for (let round = 0; round < 8; round++) {
      const m = mergeClose(out, tol, { position: 'mean' });
      out = m.structure;
      if (out.cell) out = wrapCounting(out).structure;
      count += m.count;
      conflicts += m.conflicts;
      if (m.count === 0) break;
    }
    notes.push(
      `merged ${count} atoms closer than ${tol} Å${out.cell ? ' (across the cell boundary too, minimum image)' : ''} (${conflicts} with differing species or site class)`,
    );
  }
  const close = closePairs(out);
  if (close.count > 0) {
    notes.push(
      `warning: ${close.count.toLocaleString('en-US')} pairs are closer than ${TOO_CLOSE_FRACTION} of their metallic radii sum (shortest ${close.shortest.toFixed(3)} Å) — the clusters overlap; centre them on a sparser site class or fit a_R to the preset`,
    );
  }
  out.notes = [...(s.notes ?? []), ...notes];
  return Object.assign(out, s.cell ? { cell: s.cell } : {}) as S;
}

/** Pairs closer than the Check step's threshold (radii.ts), periodic images included; unassigned sites (X) are skipped. */
function closePairs(s: Structure): { count: number; shortest: number } {
  let rMax = 0;
  const seen = new Set<number>();
  for (const z of s.species) {
    if (seen.has(z)) continue;
    seen.add(z);
    const t = tooCloseThreshold(z, z);
    if (Number.isFinite(t)) rMax = Math.max(rMax, t);
  }
  let count = 0;
  let shortest = Infinity;
  if (rMax > 0 && s.species.length > 1) {
    forEachPairWithin(s.positions, s.cell, rMax, (i, j, d) => {
      if (i === j) return;
      const t = tooCloseThreshold(s.species[i], s.species[j]);
      if (d < t) {
        count++;
        shortest = Math.min(shortest, d);
      }
    });
  }
  return { count, shortest };
}
