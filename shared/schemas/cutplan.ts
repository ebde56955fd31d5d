import { z } from 'zod'
import { cutterProfileSchema, originCorners } from '../cutplan/profile.js'

/**
 * The cut-plan contract: figures per sheet and for the layout, with the profile and options they were worked out
 * with. Query strings may override any profile value and option; what is not given comes from the default profile.
 */

const queryBoolean = (field: string) =>
  z
    .enum(['true', 'false', '1', '0'], { error: `${field} must be true or false` })
    .transform((value) => value === 'true' || value === '1')
    .optional()

const profileFields = cutterProfileSchema.shape

export const cutPlanQuerySchema = z.object({
  /** A stored cutter of the workspace whose speeds, acceleration, lift time, origin and axes are the base profile. */
  cutterId: z.uuid({ error: 'Not a valid cutter id' }).optional(),
  cutSpeedMmS: profileFields.cutSpeedMmS.optional(),
  travelSpeedMmS: profileFields.travelSpeedMmS.optional(),
  accelerationMmS2: profileFields.accelerationMmS2.optional(),
  liftLowerS: profileFields.liftLowerS.optional(),
  cornerAngleDeg: z.coerce.number({ error: 'Corner angle must be a number' }).min(0, { error: 'Corner angle cannot be negative' }).max(180, { error: 'Corner angle must be at most 180°' }).optional(),
  origin: z.enum(originCorners, { error: `Origin must be one of ${originCorners.join(', ')}` }).optional(),
  swapAxes: queryBoolean('swapAxes'),
  passes: z.coerce.number({ error: 'Passes must be a number' }).int({ error: 'Passes must be a whole number' }).min(1, { error: 'Use at least one pass' }).max(10, { error: 'Use at most 10 passes' }).optional(),
  overcutMm: z.coerce.number({ error: 'Overcut must be a number' }).min(0, { error: 'Overcut cannot be negative' }).max(10, { error: 'Overcut must be at most 10 mm' }).optional(),
  order: z.enum(['optimised', 'as-placed'], { error: 'Order must be optimised or as-placed' }).optional(),
  commonLine: queryBoolean('commonLine'),
  weedingGapMm: z.coerce.number({ error: 'Weeding gap must be a number' }).min(0.5, { error: 'Use a weeding gap of at least 0.5 mm' }).max(100, { error: 'Use a weeding gap of at most 100 mm' }).optional(),
  weedingLines: queryBoolean('weedingLines'),
})
export type CutPlanQuery = z.output<typeof cutPlanQuerySchema>

export const exportFormats = ['svg', 'hpgl', 'pdf'] as const
export type ExportFormat = (typeof exportFormats)[number]

export const cutPlanExportQuerySchema = cutPlanQuerySchema.extend({
  format: z.enum(exportFormats, { error: `Choose a format: ${exportFormats.join(', ')}` }),
  /** 0-based sheet index, as in placements; the job sheet (pdf) covers every sheet when it is left out. */
  sheet: z.coerce.number({ error: 'Sheet must be a number' }).int({ error: 'Sheet must be a whole number' }).min(0, { error: 'Sheet cannot be negative' }).optional(),
  /** The job sheet names this material and prints its recipe for the cutter's tool (a job's own sheet). */
  materialId: z.uuid({ error: 'Not a valid material id' }).optional(),
})
export type CutPlanExportQuery = z.output<typeof cutPlanExportQuerySchema>

export const sheetCutFiguresSchema = z.object({
  sheet: z.number(),
  widthMm: z.number(),
  heightMm: z.number(),
  contourCount: z.number(),
  pieceCount: z.number(),
  /** True contour lengths × passes (less what common-line cutting saves; weeding aids included). */
  cutLengthMm: z.number(),
  overcutLengthMm: z.number(),
  travelLengthMm: z.number(),
  /** Travel of the same contours in placement order, to show what the ordering saves. */
  travelInPlacementOrderMm: z.number(),
  lifts: z.number(),
  commonLineSavedMm: z.number(),
  weedingLengthMm: z.number(),
  cutTimeS: z.number(),
  travelTimeS: z.number(),
  liftTimeS: z.number(),
  totalTimeS: z.number(),
})
export type SheetCutFiguresDto = z.infer<typeof sheetCutFiguresSchema>

export const cutPlanResponseSchema = z.object({
  layoutId: z.string(),
  layoutName: z.string(),
  version: z.number(),
  profile: cutterProfileSchema,
  options: z.object({
    passes: z.number(),
    overcutMm: z.number(),
    order: z.enum(['optimised', 'as-placed']),
    commonLine: z.boolean(),
    weedingGapMm: z.number().optional(),
    weedingLines: z.boolean(),
  }),
  sheets: z.array(sheetCutFiguresSchema),
  totals: sheetCutFiguresSchema.omit({ sheet: true, widthMm: true, heightMm: true }).extend({ sheetCount: z.number() }),
})
export type CutPlanResponse = z.infer<typeof cutPlanResponseSchema>
