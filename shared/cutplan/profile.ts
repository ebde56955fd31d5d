import { z } from 'zod'

/** Where the cutter's (0, 0) sits on the sheet as the maker loads it; sheet coordinates have their origin top-left, y down. */
export const originCorners = ['bottom-left', 'top-left', 'bottom-right', 'top-right'] as const
export type OriginCorner = (typeof originCorners)[number]

/**
 * How a blade cutter moves, for time estimates and for the HP-GL file. Speeds in mm/s, acceleration in mm/s².
 * A later issue stores real profiles per cutter; until then every plan uses `defaultCutterProfile` with overrides.
 */
export const cutterProfileSchema = z.object({
  name: z.string().trim().min(1).max(80).default('Default desktop cutter'),
  cutSpeedMmS: z.coerce.number().positive({ error: 'Cut speed must be above 0' }).max(2000, { error: 'Cut speed must be at most 2000 mm/s' }),
  travelSpeedMmS: z.coerce.number().positive({ error: 'Travel speed must be above 0' }).max(3000, { error: 'Travel speed must be at most 3000 mm/s' }),
  accelerationMmS2: z.coerce.number().positive({ error: 'Acceleration must be above 0' }).max(100_000, { error: 'Acceleration must be at most 100000 mm/s²' }),
  /** One lift and one lower of the blade, seconds. */
  liftLowerS: z.coerce.number().min(0, { error: 'Lift/lower time cannot be negative' }).max(10, { error: 'Lift/lower time must be at most 10 s' }),
  /** A turn sharper than this stops the carriage: the path is timed as separate moves between such corners. */
  cornerAngleDeg: z.coerce.number().min(0).max(180).default(30),
  origin: z.enum(originCorners, { error: `Origin must be one of ${originCorners.join(', ')}` }).default('bottom-left'),
  /** The cutter's x runs along the sheet's y (many cutters feed the material along their x axis). */
  swapAxes: z.boolean().default(false),
})
export type CutterProfile = z.infer<typeof cutterProfileSchema>

/**
 * Invented values in the range of small desktop blade cutters; not the data sheet of any machine. They give
 * believable times until cutter profiles are stored per workspace.
 */
export const defaultCutterProfile: CutterProfile = {
  name: 'Default desktop cutter',
  cutSpeedMmS: 100,
  travelSpeedMmS: 300,
  accelerationMmS2: 1500,
  liftLowerS: 0.15,
  cornerAngleDeg: 30,
  origin: 'bottom-left',
  swapAxes: false,
}

/** Options of a cut plan that are not about the machine. */
export const cutPlanOptionsSchema = z.object({
  /** Times each contour is cut (thick materials). */
  passes: z.coerce.number().int({ error: 'Passes must be a whole number' }).min(1, { error: 'Use at least one pass' }).max(10, { error: 'Use at most 10 passes' }).default(1),
  /** A closed contour is cut this far past its start so the ends meet cleanly. */
  overcutMm: z.coerce.number().min(0, { error: 'Overcut cannot be negative' }).max(10, { error: 'Overcut must be at most 10 mm' }).default(0),
  /** 'optimised' orders for short travel; 'as-placed' cuts in the order pieces were placed (for comparison). */
  order: z.enum(['optimised', 'as-placed']).default('optimised'),
  /** Straight edges of pieces that lie on each other (zero spacing) are cut once. */
  commonLine: z.boolean().default(false),
  /** Weeding border around each group of pieces, this far from them; absent = no border. */
  weedingGapMm: z.coerce.number().min(0.5, { error: 'Use a weeding gap of at least 0.5 mm' }).max(100, { error: 'Use a weeding gap of at most 100 mm' }).optional(),
  /** Weeding lines from each border to the nearest stock edge (needs a weeding border). */
  weedingLines: z.boolean().default(false),
})
export type CutPlanOptions = z.infer<typeof cutPlanOptionsSchema>
export type CutPlanOptionsInput = z.input<typeof cutPlanOptionsSchema>

export const defaultCutPlanOptions: CutPlanOptions = cutPlanOptionsSchema.parse({})

/** A profile with some values replaced; unknown keys are ignored by the schema. */
export function profileWith(overrides: Partial<CutterProfile> = {}): CutterProfile {
  return cutterProfileSchema.parse({ ...defaultCutterProfile, ...Object.fromEntries(Object.entries(overrides).filter(([, value]) => value !== undefined)) })
}
