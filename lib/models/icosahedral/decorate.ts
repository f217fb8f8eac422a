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
import type { DecorationParams, SiteClassParams } from './decoration-schema';
import type { CutClass } from './cut';
import { vertexClass } from './cut';
import { CLUSTER_PRESETS, clusterSize, placeClusters, type ClusterTemplate } from './clusters';
import { mergeClose } from '../../structure/merge';

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

/** Place the decoration's cluster templates on their site classes, then merge close atoms. */
export function applyClusters<S extends Structure>(s: S, decoration?: DecorationParams): S {
  if (!decoration?.clusters?.length) return s;
  let out: Structure = s;
  const notes: string[] = [];
  for (const c of decoration.clusters) {
    const template: ClusterTemplate = c.preset
      ? CLUSTER_PRESETS[c.preset]
      : {
          name: 'cluster',
          reference: 'user-defined shells',
          shells: c.shells!.map((sh, k) => ({
            name: sh.name ?? `shell ${k + 1}`,
            polyhedron: sh.polyhedron,
            radius: sh.radius,
            species: atomicNumber(sh.species),
          })),
        };
    const classes = out.siteClasses ?? [];
    const site = out.site;
    const target = classes.findIndex((k) => k.name === c.at);
    let centres = 0;
    out = placeClusters(out, template, (i) => {
      const hit = site !== undefined && site[i] === target;
      if (hit) centres++;
      return hit;
    });
    notes.push(`${template.name} clusters on "${c.at}": ${centres} placed, ${centres * clusterSize(template)} atoms added`);
  }
  if (decoration.mergeTolerance > 0) {
    const m = mergeClose(out, decoration.mergeTolerance);
    out = m.structure;
    notes.push(`merged ${m.count} atoms closer than ${decoration.mergeTolerance} Å (${m.conflicts} with differing species or site class)`);
  }
  out.notes = [...(s.notes ?? []), ...notes];
  return Object.assign(out, s.cell ? { cell: s.cell } : {}) as S;
}
