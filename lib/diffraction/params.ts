/**
 * Diffraction settings, shared by the CLI, the API and the forms. Units: 2θ in degrees, |Q| in Å⁻¹
 * (|Q| = 4π sinθ/λ = 2π/d, phase Q·r), d and λ in Å, B in Å², Caglioti U, V, W in degrees².
 */
import { z } from 'zod';

export const radiationSchema = z.enum(['xray', 'neutron', 'electron'], {
  message: 'radiation must be xray, neutron or electron',
});

/** A line name (CuKa1, MoKa, …), "<n>kV" for electrons, or a number in Å. */
export const wavelengthSchema = z.union([z.number().positive('wavelength must be positive (Å)'), z.string().min(1)]);

/** The 2θ every powder calculation accepts, degrees: 0 is the direct beam, 180 straight back. */
export const TWO_THETA_LIMITS = { min: 0, max: 180 } as const;
/** Default profile step, degrees: fine enough for peaks of ~0.1° width, and the largest step allowed. */
export const POWDER_STEP = { default: 0.02, max: 5 } as const;

export const profileSchema = z.object({
  U: z.number().default(0.01),
  V: z.number().default(-0.005),
  W: z.number().default(0.005),
  eta: z.number().min(0, 'eta must be between 0 and 1').max(1, 'eta must be between 0 and 1').default(0.5),
  step: z.number().positive('step must be positive (degrees)').max(POWDER_STEP.max).meta({ title: 'Step', unit: '°' }).default(POWDER_STEP.default),
  background: z.array(z.number()).max(8, 'at most 8 background coefficients').default([]),
});

export const powderParamsSchema = z
  .object({
    wavelength: wavelengthSchema.default('CuKa1'),
    radiation: radiationSchema.default('xray'),
    twoThetaMin: z
      .number()
      .min(TWO_THETA_LIMITS.min, `must be at least ${TWO_THETA_LIMITS.min}°`)
      .max(TWO_THETA_LIMITS.max, `must be at most ${TWO_THETA_LIMITS.max}°`)
      .meta({ title: '2θ start', unit: '°' })
      .default(10),
    twoThetaMax: z
      .number()
      .min(TWO_THETA_LIMITS.min, `must be at least ${TWO_THETA_LIMITS.min}°`)
      .max(TWO_THETA_LIMITS.max, `must be at most ${TWO_THETA_LIMITS.max}°`)
      .meta({ title: '2θ end', unit: '°' })
      .default(120),
    monochromator2Theta: z.number().min(0).max(180).optional(),
    /** Add the Kα2 line (same element) to the profile with intensity ratio 0.5. */
    kalpha2: z.boolean().default(false),
    profile: profileSchema.default(profileSchema.parse({})),
    /** Histogram bin (Å) for the Debye route (finite patches). */
    binWidth: z.number().positive().max(0.1).default(0.005),
  })
  .refine((p) => p.twoThetaMax > p.twoThetaMin, { message: 'must be larger than the 2θ start', path: ['twoThetaMax'] });
export type PowderParams = z.infer<typeof powderParamsSchema>;

export const zoneParamsSchema = z.object({
  /** "5", "3", "2" (icosahedral axes of lib/models/icosahedral/hyperlattice.ts) or "u,v,w". */
  axis: z
    .string()
    .regex(/^(5|3|2|-?\d+,-?\d+,-?\d+)$/, 'must be 5, 3 or 2 (an icosahedral axis) or three integers u,v,w')
    .meta({ title: 'Zone axis' }),
  qmax: z.number().positive('must be positive').max(50, 'must be at most 50 Å⁻¹').meta({ title: '|Q| up to', unit: 'Å⁻¹' }),
  radiation: radiationSchema.default('xray'),
  /** Half-thickness of the included reciprocal slab in Å⁻¹ (patches) / highest Laue zone |n| (crystals). */
  laueZones: z.number().int().min(0).max(10).default(0),
  slab: z.number().min(0).max(5).default(0),
  /** Grid points per side for patch maps. */
  grid: z.number().int().min(16).max(1024).default(201),
  /** Spots weaker than this fraction of the strongest are left out. */
  threshold: z.number().min(0).max(1).default(1e-3),
});
export type ZoneParams = z.infer<typeof zoneParamsSchema>;

export const hyperspaceParamsSchema = z.object({
  family: z.enum(['icosahedral', 'penrose', 'octagonal', 'fibonacci'], { message: 'family must be icosahedral, penrose, octagonal or fibonacci' }),
  /** Quasilattice constant in Å: rhombohedron edge (icosahedral), tile edge (penrose, octagonal), long segment (fibonacci). */
  aR: z.number().positive('aR must be a positive length in Å'),
  qmax: z.number().positive('qmax must be positive (Å⁻¹)').max(30),
  /** Largest |Q⊥| kept, Å⁻¹ (bounds the enumeration; the window transform decays as |Q⊥|⁻²). */
  qperpMax: z.number().positive().optional(),
  radiation: radiationSchema.default('xray'),
  /** Species decorating every vertex (0 = unit form factor). */
  species: z.number().int().min(0).max(98).default(0),
  biso: z.number().min(0).default(0),
  threshold: z.number().min(0).max(1).default(1e-4),
  /** Icosahedral hyperlattice type. */
  lattice: z.enum(['P', 'F', 'I'], { message: 'lattice must be P, F or I' }).default('P'),
});
export type HyperspaceParams = z.infer<typeof hyperspaceParamsSchema>;

export const compareParamsSchema = z.object({
  background: z.boolean().default(true),
  /** Peaks: measured local maxima above this fraction of the largest. */
  peakThreshold: z.number().min(0).max(1).default(0.02),
});
export type CompareParams = z.infer<typeof compareParamsSchema>;
