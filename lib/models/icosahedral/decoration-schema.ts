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

const fraction6 = z.tuple([z.number(), z.number(), z.number(), z.number(), z.number(), z.number()]).refine((v) => v.every((x) => Number.isFinite(x) && x >= 0 && x < 1), {
  message: 'each of the six fractional coordinates must be in [0, 1)',
});

export const windowSpecSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('hypercube'), scale: z.number().positive().max(10).default(1) }),
  z.object({ kind: z.literal('sphere'), radius: z.number().positive().max(1000) }),
  z
    .object({ kind: z.literal('shell'), r1: z.number().min(0).max(1000), r2: z.number().positive().max(1000) })
    .refine((w) => w.r2 > w.r1, { message: 'r2 must be greater than r1', path: ['r2'] }),
]);

export const siteClassSchema = z
  .object({
    name: z.string().min(1).max(60),
    position: z.union([z.enum(SITE_POSITIONS), fraction6]).default('node'),
    window: windowSpecSchema.default({ kind: 'hypercube', scale: 1 }),
    species: elementSymbolSchema.optional(),
    /** Mixed occupancy: element symbol → fraction, fractions sum to ≤ 1. */
    mix: z.record(z.string(), z.number().min(0).max(1)).optional(),
    occupancy: z.number().min(0).max(1).optional(),
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
  });

/** One shell of a cluster template: a polyhedron of a given circumradius (Å) carrying one element. */
export const clusterShellSchema = z.object({
  name: z.string().min(1).max(60).optional(),
  polyhedron: z.enum(POLYHEDRON_NAMES as [PolyhedronName, ...PolyhedronName[]], { message: `must be one of ${POLYHEDRON_NAMES.join(', ')}` }),
  radius: z.number().positive().max(50),
  species: elementSymbolSchema,
});

export const CLUSTER_PRESET_NAMES = ['mackay', 'bergman', 'tsai'] as const;

/** Clusters centred on every point of one site class: a published preset or shells of one's own. */
export const clusterPlacementSchema = z
  .object({
    at: z.string().min(1).max(60),
    preset: z.enum(CLUSTER_PRESET_NAMES, { message: `must be one of ${CLUSTER_PRESET_NAMES.join(', ')}` }).optional(),
    shells: z.array(clusterShellSchema).min(1).max(12).optional(),
  })
  .refine((c) => (c.preset === undefined) !== (c.shells === undefined), { message: 'give either preset or shells', path: ['preset'] });

export const decorationSchema = z
  .object({
    classes: z.array(siteClassSchema).min(1, { message: 'needs at least one site class' }).max(64),
    clusters: z.array(clusterPlacementSchema).max(8).optional(),
    /** Atoms closer than this (Å) are merged after placing clusters, across periodic boundaries too; 0 = off. */
    mergeTolerance: z.number().min(0).max(5).default(0),
  })
  .superRefine((d, ctx) => {
    const names = new Set(d.classes.map((c) => c.name));
    d.clusters?.forEach((c, i) => {
      if (!names.has(c.at)) ctx.addIssue({ code: 'custom', path: ['clusters', i, 'at'], message: `no site class is named "${c.at}"` });
    });
  });

export type WindowSpecParams = z.infer<typeof windowSpecSchema>;
export type SiteClassParams = z.infer<typeof siteClassSchema>;
export type DecorationParams = z.infer<typeof decorationSchema>;
export type ClusterPlacementParams = z.infer<typeof clusterPlacementSchema>;
