/**
 * The kinds of queued work and the bodies that start them. `export` is started through
 * lib/server/exports.ts (its format list is the one in EXPORT_FORMATS there, so a new format drops in),
 * `parse` by a dataset upload, `point` by a sweep; the rest through POST /api/projects/{id}/jobs.
 */
import { z } from 'zod';

export const JOB_KINDS = ['export', 'diffraction', 'parse', 'index', 'sweep', 'point'] as const;
export type JobKind = (typeof JOB_KINDS)[number];

/** Kinds a client may start through POST /api/projects/{id}/jobs (export included, handled by exports.ts). */
export const STARTABLE = ['export', 'diffraction', 'index', 'sweep'] as const;

const radiation = z.enum(['xray', 'neutron', 'electron'], { message: 'radiation is xray, neutron or electron' }).default('xray');

/** Powder settings shared by diffraction jobs and sweeps; Cu Kα1 X-rays by default (1.5406 Å). */
export const powderSettings = {
  radiation,
  wavelength: z.number().positive().max(10).default(1.5406),
  twoThetaMin: z.number().min(0).max(179).default(10),
  twoThetaMax: z.number().min(1).max(180).default(90),
  step: z.number().min(0.001).max(1).default(0.02),
  fwhm: z.number().min(0.005).max(5).default(0.15),
};

export const diffractionJobSchema = z.strictObject({
  kind: z.literal('diffraction'),
  revision: z.number({ message: 'send the revision id' }).int().positive(),
  ...powderSettings,
});

/**
 * Indexing a measured icosahedral powder pattern (lib/diffraction/quasicrystal/index-icosahedral.ts, the code
 * behind `diffract index`): wavelength (Cu Kα1 by default), P or F hyperlattice, an optional aR guess (search
 * ±3 % about it) or search range, and the peak finder's minimum prominence.
 */
export const indexJobSchema = z
  .strictObject({
    kind: z.literal('index'),
    dataset: z.number({ message: 'send the id of a measured pattern' }).int().positive(),
    wavelength: z.number().positive().max(10).default(1.5406),
    lattice: z.enum(['P', 'F'], { message: 'lattice is P or F' }).default('P'),
    radiation,
    aR: z.number().min(1).max(50).optional(),
    aRMin: z.number().min(1).max(50).optional(),
    aRMax: z.number().min(1).max(50).optional(),
    prominence: z.number().gt(0, 'prominence is a fraction between 0 and 1').lt(1, 'prominence is a fraction between 0 and 1').optional(),
  })
  .refine((o) => o.aRMin === undefined || o.aRMax === undefined || o.aRMin < o.aRMax, { message: 'aRMin must be below aRMax', path: ['aRMin'] });

/** One axis of a sweep: a path into the params ("aR", "offset.2", "order", "decoration.…") and its values. */
export const sweepAxisSchema = z.strictObject({
  path: z.string().regex(/^[A-Za-z_][A-Za-z0-9_]*(\.[A-Za-z0-9_]+)*$/, { message: 'a dotted path into the params, e.g. aR or offset.0' }).max(120),
  values: z.array(z.union([z.number().refine(Number.isFinite, 'must be finite'), z.string().max(40)])).min(1, 'give at least one value').max(500),
});

export const sweepJobSchema = z.strictObject({
  kind: z.literal('sweep'),
  revision: z.number({ message: 'send the revision the grid starts from' }).int().positive(),
  dataset: z.number({ message: 'send the id of a measured pattern to compare with' }).int().positive(),
  axes: z.array(sweepAxisSchema).min(1, 'give at least one axis').max(6, 'at most six axes'),
  ...powderSettings,
});

export const startJobSchema = z.discriminatedUnion('kind', [
  z.strictObject({ kind: z.literal('export'), revision: z.number().int().positive(), format: z.string() }),
  diffractionJobSchema,
  indexJobSchema,
  sweepJobSchema,
]);

/** A task thread's answer when a sweep point names a measured pattern the thread has not read yet (a fresh thread). */
export const NEED_MEASURED = 'need_measured';

export type DiffractionJob = z.infer<typeof diffractionJobSchema>;
export type IndexJob = z.infer<typeof indexJobSchema>;
export type SweepJob = z.infer<typeof sweepJobSchema>;
export type PowderSettings = Pick<DiffractionJob, 'radiation' | 'wavelength' | 'twoThetaMin' | 'twoThetaMax' | 'step' | 'fwhm'>;
