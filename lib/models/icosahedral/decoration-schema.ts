/**
 * Decoration by site classes: each class is a shifted copy of the hyperlattice (a 6D position in the
 * hyperlattice unit cell) with its own occupation domain in perpendicular space and its own species.
 * Lengths (sphere and shell radii) are perpendicular-space Å on the scale of hyperlattice.ts (|e_i⊥| = aR).
 */
import { z } from 'zod';
import { elementSymbolSchema } from '../element-schema';
import { tryAtomicNumber } from '../../structure/elements';
import { POLYHEDRON_NAMES, type PolyhedronName } from './polyhedra';


/** Named positions in the hyperlattice cell: node 0, body centre ½(1,…,1), edge centres ½e_i. */
export const SITE_POSITIONS = ['node', 'body', 'edge1', 'edge2', 'edge3', 'edge4', 'edge5', 'edge6'] as const;

/** How a form names the positions (the ids stay short for files and the command line). */
const POSITION_WORDS: Record<(typeof SITE_POSITIONS)[number], string> = {
  node: 'node — lattice point 0',
  body: 'body centre ½(1,…,1)',
  edge1: 'edge centre ½e₁',
  edge2: 'edge centre ½e₂',
  edge3: 'edge centre ½e₃',
  edge4: 'edge centre ½e₄',
  edge5: 'edge centre ½e₅',
  edge6: 'edge centre ½e₆',
};

const fraction6 = z
  .tuple([z.number(), z.number(), z.number(), z.number(), z.number(), z.number()])
  .refine((v) => v.every((x) => Number.isFinite(x) && x >= 0 && x < 1), {
    message: 'each of the six fractional coordinates must be in [0, 1)',
  })
  .meta({ title: 'Six fractional coordinates', examples: [[0.5, 0, 0, 0, 0, 0]] });

export const windowSpecSchema = z
  .discriminatedUnion('kind', [
    z
      .object({
        kind: z.literal('hypercube').meta({ title: 'Shape' }),
        scale: z.number().positive().max(10).meta({ title: 'Window scaling', unit: '× triacontahedron' }).default(1),
      })
      .meta({ title: 'Triacontahedron' }),
    z
      .object({
        kind: z.literal('sphere').meta({ title: 'Shape' }),
        radius: z.number().positive().max(1000).meta({ title: 'Sphere radius', unit: 'Å, perp. space', examples: [2] }),
      })
      .meta({ title: 'Sphere' }),
    z
      .object({
        kind: z.literal('shell').meta({ title: 'Shape' }),
        r1: z.number().min(0).max(1000).meta({ title: 'Inner radius r1', unit: 'Å, perp. space', examples: [1] }),
        r2: z.number().positive().max(1000).meta({ title: 'Outer radius r2', unit: 'Å, perp. space', examples: [2] }),
      })
      .refine((w) => w.r2 > w.r1, { message: 'must be greater than the inner radius r1', path: ['r2'] })
      .meta({ title: 'Spherical shell' }),
  ])
  .meta({ title: 'Occupation domain', description: 'The window in perpendicular space that selects this class’s points.' });

export const siteClassSchema = z
  .object({
    name: z.string().min(1).max(60).meta({ title: 'Name', description: 'Clusters are placed on a class by this name.' }),
    position: z
      .union([z.enum(SITE_POSITIONS).meta({ optionLabels: POSITION_WORDS }), fraction6])
      .meta({ title: 'Position in the 6D cell', description: 'A named site or six fractional coordinates in [0, 1).' })
      .default('node'),
    window: windowSpecSchema.default({ kind: 'hypercube', scale: 1 }),
    species: elementSymbolSchema.meta({ title: 'Species', description: 'Element on this class’s sites, e.g. Al.' }).optional(),
    /** Mixed occupancy: element symbol → fraction, fractions sum to ≤ 1. */
    mix: z
      .record(z.string(), z.number().min(0).max(1).meta({ title: 'Fraction' }))
      .meta({ title: 'Mixed occupancy', description: 'Element → fraction; the fractions sum to at most 1.', examples: [{ Al: 0.7, Pd: 0.3 }] })
      .optional(),
    occupancy: z.number().min(0).max(1).meta({ title: 'Occupancy', description: 'Fraction of the sites that hold an atom, 0–1.' }).optional(),
  })
  .superRefine((c, ctx) => {
    if (c.mix) {
      for (const k of Object.keys(c.mix))
        if (tryAtomicNumber(k) === undefined) ctx.addIssue({ code: 'custom', message: `unknown element symbol "${k}"`, path: ['mix', k] });
      const sum = Object.values(c.mix).reduce((a, b) => a + b, 0);
      if (sum > 1 + 1e-9) ctx.addIssue({ code: 'custom', message: `fractions sum to ${sum}, more than 1`, path: ['mix'] });
      if (Object.keys(c.mix).length === 0) ctx.addIssue({ code: 'custom', message: 'needs at least one element', path: ['mix'] });
    }
    if (c.species && c.mix) ctx.addIssue({ code: 'custom', message: 'give either species or mix, not both', path: ['mix'] });
  })
  .meta({ title: 'Site class', examples: [{ name: 'vertex', position: 'node', window: { kind: 'hypercube', scale: 1 }, species: 'Al' }] });

/** One shell of a cluster template: a polyhedron of a given circumradius (Å) carrying one element. */
export const clusterShellSchema = z
  .object({
    name: z.string().min(1).max(60).meta({ title: 'Name' }).optional(),
    polyhedron: z
      .enum(POLYHEDRON_NAMES as [PolyhedronName, ...PolyhedronName[]], { message: `must be one of ${POLYHEDRON_NAMES.join(', ')}` })
      .meta({ title: 'Polyhedron' }),
    radius: z.number().positive().max(50).meta({ title: 'Circumradius', unit: 'Å', examples: [2.5] }),
    species: elementSymbolSchema.meta({ title: 'Species', examples: ['Al'] }),
  })
  .meta({ title: 'Shell' });

export const CLUSTER_PRESET_NAMES = ['mackay', 'bergman', 'tsai'] as const;

/** The presets by the compound each is modelled on and the a_R they are sized for (clusters.ts gives the shells and their sources). */
const PRESET_WORDS: Record<(typeof CLUSTER_PRESET_NAMES)[number], string> = {
  mackay: 'Mackay, 54 atoms + glue (α-AlMnSi; cut with a_R ≈ 4.61 Å)',
  bergman: 'Bergman, 116 atoms (Mg₃₂(Al,Zn)₄₉; a_R ≈ 5.14 Å)',
  tsai: 'Tsai, 158 atoms (YbCd₆; a_R ≈ 5.68 Å)',
};

/**
 * Default merge tolerance, Å: 1.1 Å, half the shortest nearest-neighbour distance in any metal (Be, CN-12
 * metallic diameter 2 × 1.12 Å, the radii table of the Check step). Two cluster atoms that close are one atom
 * counted twice by neighbouring clusters; pairs farther apart but still too close are not merged silently —
 * the Check step flags them.
 */
export const DEFAULT_MERGE_TOLERANCE = 1.1;

/** Clusters centred on every point of one site class: a preset modelled on a published cluster, or shells of one's own. */
export const clusterPlacementSchema = z
  .object({
    at: z
      .string()
      .min(1)
      .max(60)
      // namesOf: the value is the name of an entry of the decoration's `classes` list (checked below).
      .meta({ title: 'On site class', description: 'A cluster is centred on each point of this site class.', examples: ['vertex'], namesOf: 'classes' }),
    preset: z
      .enum(CLUSTER_PRESET_NAMES, { message: `must be one of ${CLUSTER_PRESET_NAMES.join(', ')}` })
      .meta({
        title: 'Cluster preset',
        optionLabels: PRESET_WORDS,
        description:
          'Each preset is meant for a site class of cluster centres — position node, the triacontahedral window scaled by 1/τ² ≈ 0.382, which keeps the vertices with all twelve five-fold neighbours (2 per 1/1 cell, 8 per 2/1) — cut with the a_R in its name. The Mackay preset goes with six glue classes: Al at the 6D positions ½(1,…,1) − ½eₖ, triacontahedral window scaled by 1/τ² (in the 1/1 the 24 Al glue atoms of α-AlMnSi: 132 of its 138 atoms per cell; its 6 Si glue atoms, round one of the two clusters only, are not modelled). The model panel’s “Decorate with a cluster preset” and the command line’s --preset add both classes. Species per shell below replaces its usual species.',
      })
      .optional(),
    shells: z.array(clusterShellSchema).min(1).max(12).meta({ title: 'Shells of one’s own' }).optional(),
    /** A preset's species, shell by shell from the inside out (replacing its usual species and mixes). */
    species: z
      .array(elementSymbolSchema)
      .min(1)
      .max(12)
      .meta({ title: 'Species per shell', description: 'For a preset: one element per shell, inside out; empty keeps the preset’s usual species.', examples: [['Al', 'Al', 'Mn']] })
      .optional(),
  })
  .refine((c) => (c.preset === undefined) !== (c.shells === undefined), { message: 'give either a preset or shells of one’s own, not both', path: ['preset'] })
  .refine((c) => c.species === undefined || c.preset !== undefined, { message: 'species per shell go with a preset; shells of one’s own carry their own species', path: ['species'] })
  .meta({ title: 'Cluster', examples: [{ at: 'vertex', preset: 'mackay' }] });

export const decorationSchema = z
  .object({
    classes: z.array(siteClassSchema).min(1, { message: 'needs at least one site class' }).max(64).meta({ title: 'Site classes' }),
    clusters: z.array(clusterPlacementSchema).max(8).meta({ title: 'Clusters', examples: [[]] }).optional(),
    /** Atoms closer than this (Å) are merged after placing clusters, across periodic boundaries too; 0 = off. */
    mergeTolerance: z
      .number()
      .min(0)
      .max(5)
      .meta({
        title: 'Merge tolerance',
        unit: 'Å',
        description: 'Atoms closer than this after placing clusters become one, across the cell boundary too; 0 merges nothing. Default 1.1 Å, half the shortest bond in any metal.',
      })
      .default(DEFAULT_MERGE_TOLERANCE),
  })
  .superRefine((d, ctx) => {
    const names = new Set(d.classes.map((c) => c.name));
    d.clusters?.forEach((c, i) => {
      if (!names.has(c.at)) ctx.addIssue({ code: 'custom', path: ['clusters', i, 'at'], message: `no site class is named "${c.at}"` });
    });
  })
  .meta({
    title: 'Decoration',
    description: 'Site classes with their occupation domains and species, and clusters placed on them.',
    examples: [{ classes: [{ name: 'vertex', position: 'node', window: { kind: 'hypercube', scale: 1 }, species: 'Al' }] }],
  });

export type WindowSpecParams = z.infer<typeof windowSpecSchema>;
export type SiteClassParams = z.infer<typeof siteClassSchema>;
export type DecorationParams = z.infer<typeof decorationSchema>;
export type ClusterPlacementParams = z.infer<typeof clusterPlacementSchema>;
