import { z } from 'zod'
import { originCorners } from '../cutplan/profile.js'

/**
 * Cutters (the studio's machines and how they move), the blades fitted to them with their wear, the care log and the
 * studio's wear settings. Lengths are millimetres, speeds mm/s, acceleration mm/s², lift/lower seconds, force in the
 * machine's own units; wear limits are metres of cut.
 */

export const cutterToolKinds = ['blade', 'pen', 'laser'] as const
export const cutterToolKindSchema = z.enum(cutterToolKinds, { error: 'Tool kind must be blade, pen or laser' })
export type CutterToolKind = z.infer<typeof cutterToolKindSchema>

export const careEventKinds = ['blade_swap', 'blade_cleaned', 'housing_cleaned', 'roller_checked', 'spring_checked', 'other'] as const
export const careEventKindSchema = z.enum(careEventKinds, { error: `Care kind must be one of ${careEventKinds.join(', ')}` })
export type CareEventKind = z.infer<typeof careEventKindSchema>

export const wearLevels = ['ok', 'near', 'over'] as const
export const wearLevelSchema = z.enum(wearLevels)

const number = (field: string) => z.number({ error: `${field} must be a number` })
const positive = (field: string, max: number, unit: string) =>
  number(field).positive({ error: `${field} must be above 0` }).max(max, { error: `${field} must be at most ${max} ${unit}` })

const cutterNameSchema = z.string({ error: 'Enter a name' }).trim().min(1, { error: 'Enter a name' }).max(80, { error: 'Use at most 80 characters for the name' })
const cuttingWidthSchema = number('Cutting width').min(10, { error: 'Cutting width must be at least 10 mm' }).max(5000, { error: 'Cutting width must be at most 5000 mm' })
const maxLengthSchema = number('Maximum length').min(10, { error: 'Maximum length must be at least 10 mm' }).max(100_000, { error: 'Maximum length must be at most 100 m' })
// Same bounds as the cut-plan profile (shared/cutplan/profile.ts) so a cutter always makes a valid profile.
const cutSpeedSchema = positive('Cut speed', 2000, 'mm/s')
const travelSpeedSchema = positive('Travel speed', 3000, 'mm/s')
const accelerationSchema = positive('Acceleration', 100_000, 'mm/s²')
const liftLowerSchema = number('Lift/lower time').min(0, { error: 'Lift/lower time cannot be negative' }).max(10, { error: 'Lift/lower time must be at most 10 s' })
const cornerAngleSchema = number('Corner angle').min(0, { error: 'Corner angle cannot be negative' }).max(180, { error: 'Corner angle must be at most 180°' })
const forceBound = (field: string) =>
  number(field)
    .int({ error: `${field} must be a whole number` })
    .min(1, { error: `${field} must be at least 1` })
    .max(10_000, { error: `${field} must be at most 10,000` })
const originSchema = z.enum(originCorners, { error: `Origin must be one of ${originCorners.join(', ')}` })
const notesSchema = z.string({ error: 'Notes must be text' }).trim().max(2000, { error: 'Use at most 2000 characters for the notes' })

export const careReminderSchema = z.object({
  kind: careEventKindSchema,
  intervalDays: number('Reminder interval')
    .int({ error: 'Reminder interval must be a whole number of days' })
    .min(1, { error: 'Reminder interval must be at least 1 day' })
    .max(365, { error: 'Reminder interval must be at most 365 days' }),
})
export type CareReminder = z.infer<typeof careReminderSchema>

const careRemindersSchema = z.array(careReminderSchema).max(careEventKinds.length, { error: 'One reminder per care kind' })

interface ForceAndReminders {
  forceMin?: number | null
  forceMax?: number | null
  careReminders?: { kind: string }[]
}

/** Checks across fields, shared by create and by the server after merging a change into the stored cutter. */
export function checkCutterCrossFields(cutter: ForceAndReminders, context: z.RefinementCtx): void {
  if (cutter.forceMin != null && cutter.forceMax != null && cutter.forceMin > cutter.forceMax) {
    context.addIssue({ code: 'custom', path: ['forceMin'], message: 'Lowest force must not be above the highest force' })
  }
  const kinds = (cutter.careReminders ?? []).map((reminder) => reminder.kind)
  const repeated = kinds.find((kind, index) => kinds.indexOf(kind) !== index)
  if (repeated) context.addIssue({ code: 'custom', path: ['careReminders'], message: `Only one reminder per care kind (${repeated} is repeated)` })
}

export const createCutterRequestSchema = z
  .object({
    name: cutterNameSchema,
    toolKind: cutterToolKindSchema,
    cuttingWidthMm: cuttingWidthSchema,
    maxLengthMm: maxLengthSchema,
    cutSpeedMmS: cutSpeedSchema,
    travelSpeedMmS: travelSpeedSchema,
    accelerationMmS2: accelerationSchema,
    liftLowerS: liftLowerSchema,
    cornerAngleDeg: cornerAngleSchema.default(30),
    forceMin: forceBound('Lowest force').nullable().default(null),
    forceMax: forceBound('Highest force').nullable().default(null),
    origin: originSchema.default('bottom-left'),
    swapAxes: z.boolean({ error: 'swapAxes must be true or false' }).default(false),
    careReminders: careRemindersSchema.default([]),
    notes: notesSchema.default(''),
  })
  .superRefine(checkCutterCrossFields)
export type CreateCutterRequest = z.input<typeof createCutterRequestSchema>

/** A partial change; the server merges it into the stored cutter and checks the force range again. */
export const updateCutterRequestSchema = z
  .object({
    name: cutterNameSchema.optional(),
    toolKind: cutterToolKindSchema.optional(),
    cuttingWidthMm: cuttingWidthSchema.optional(),
    maxLengthMm: maxLengthSchema.optional(),
    cutSpeedMmS: cutSpeedSchema.optional(),
    travelSpeedMmS: travelSpeedSchema.optional(),
    accelerationMmS2: accelerationSchema.optional(),
    liftLowerS: liftLowerSchema.optional(),
    cornerAngleDeg: cornerAngleSchema.optional(),
    forceMin: forceBound('Lowest force').nullable().optional(),
    forceMax: forceBound('Highest force').nullable().optional(),
    origin: originSchema.optional(),
    swapAxes: z.boolean({ error: 'swapAxes must be true or false' }).optional(),
    careReminders: careRemindersSchema.optional(),
    notes: notesSchema.optional(),
    /** Archived cutters stay readable (jobs and blades refer to them) but leave pickers. */
    archived: z.boolean({ error: 'archived must be true or false' }).optional(),
  })
  .refine((body) => Object.values(body).some((value) => value !== undefined), { error: 'Send at least one field to change' })
  .superRefine(checkCutterCrossFields)
export type UpdateCutterRequest = z.input<typeof updateCutterRequestSchema>

/** The fitted blade of a cutter with its wear against the workspace's limit for its type. */
export const currentBladeSchema = z.object({
  id: z.string(),
  bladeType: z.string(),
  angleDeg: z.number(),
  label: z.string(),
  fittedAt: z.string(),
  fittedByName: z.string().nullable(),
  wornMm: z.number(),
  limitMm: z.number(),
  /** worn / limit (0 when there is no limit). */
  wearRatio: z.number(),
  wearLevel: wearLevelSchema,
})
export type CurrentBlade = z.infer<typeof currentBladeSchema>

/** A care reminder with when that care was last done and when it is due next. */
export const careDueSchema = z.object({
  kind: careEventKindSchema,
  intervalDays: z.number(),
  lastDoneAt: z.string().nullable(),
  /** lastDoneAt + interval; a care never logged is due from the cutter's creation + interval. */
  dueAt: z.string(),
  overdue: z.boolean(),
})
export type CareDue = z.infer<typeof careDueSchema>

export const cutterSchema = z.object({
  id: z.string(),
  name: z.string(),
  toolKind: cutterToolKindSchema,
  cuttingWidthMm: z.number(),
  maxLengthMm: z.number(),
  cutSpeedMmS: z.number(),
  travelSpeedMmS: z.number(),
  accelerationMmS2: z.number(),
  liftLowerS: z.number(),
  cornerAngleDeg: z.number(),
  forceMin: z.number().nullable(),
  forceMax: z.number().nullable(),
  origin: originSchema,
  swapAxes: z.boolean(),
  careReminders: z.array(careReminderSchema),
  notes: z.string(),
  archived: z.boolean(),
  currentBlade: currentBladeSchema.nullable(),
  careDue: z.array(careDueSchema),
  createdAt: z.string(),
  updatedAt: z.string(),
})
export type Cutter = z.infer<typeof cutterSchema>

const paged = <T extends z.ZodType>(item: T) => z.object({ items: z.array(item), total: z.number(), page: z.number(), pageSize: z.number() })

export const cutterListResponseSchema = paged(cutterSchema)
export type CutterListResponse = z.infer<typeof cutterListResponseSchema>

const pageSchema = z.coerce.number({ error: 'Page must be a number' }).int({ error: 'Page must be a whole number' }).min(1, { error: 'Page must be at least 1' }).default(1)
const pageSizeSchema = (fallback: number) =>
  z.coerce
    .number({ error: 'Page size must be a number' })
    .int({ error: 'Page size must be a whole number' })
    .min(1, { error: 'Page size must be at least 1' })
    .max(100, { error: 'Page size must be at most 100' })
    .default(fallback)

export const cutterStatuses = ['active', 'archived', 'all'] as const
export const cutterListQuerySchema = z.object({
  status: z.enum(cutterStatuses, { error: 'Status must be active, archived or all' }).default('active'),
  toolKind: cutterToolKindSchema.optional(),
  page: pageSchema,
  pageSize: pageSizeSchema(50),
})
export type CutterListQuery = z.input<typeof cutterListQuerySchema>

/** DELETE answers whether the cutter was removed or, because jobs or blades refer to it, archived. */
export const deleteCutterResponseSchema = z.object({ result: z.enum(['deleted', 'archived']), cutter: cutterSchema.nullable() })
export type DeleteCutterResponse = z.infer<typeof deleteCutterResponseSchema>

export const bladeWearByMaterialSchema = z.object({
  /** Null for wear carried over by hand or of a material since deleted. */
  materialId: z.string().nullable(),
  materialName: z.string(),
  cutLengthMm: z.number(),
})

export const bladeSchema = z.object({
  id: z.string(),
  cutterId: z.string(),
  bladeType: z.string(),
  angleDeg: z.number(),
  label: z.string(),
  fittedAt: z.string(),
  fittedByName: z.string().nullable(),
  retiredAt: z.string().nullable(),
  retiredByName: z.string().nullable(),
  retireReason: z.string(),
  current: z.boolean(),
  wornMm: z.number(),
  limitMm: z.number(),
  wearRatio: z.number(),
  wearLevel: wearLevelSchema,
  wearByMaterial: z.array(bladeWearByMaterialSchema),
})
export type Blade = z.infer<typeof bladeSchema>

export const bladeListResponseSchema = paged(bladeSchema)
export type BladeListResponse = z.infer<typeof bladeListResponseSchema>

export const bladeListQuerySchema = z.object({ page: pageSchema, pageSize: pageSizeSchema(20) })

const bladeTypeNameSchema = z
  .string({ error: 'Enter a blade type' })
  .trim()
  .min(1, { error: 'Enter a blade type' })
  .max(40, { error: 'Use at most 40 characters for the blade type' })
const isoInstantSchema = (field: string) => z.iso.datetime({ offset: true, error: `${field} must be a date and time (ISO 8601)` })

/** Fitting a blade retires the cutter's current one and logs a blade swap, in one step. */
export const fitBladeRequestSchema = z.object({
  bladeType: bladeTypeNameSchema,
  angleDeg: number('Blade angle').min(20, { error: 'Blade angle must be at least 20°' }).max(75, { error: 'Blade angle must be at most 75°' }),
  label: z.string({ error: 'Label must be text' }).trim().max(80, { error: 'Use at most 80 characters for the label' }).default(''),
  /** When the blade went in; defaults to now. Not in the future. */
  fittedAt: isoInstantSchema('Fitted date').optional(),
  /** A used blade: metres it had already cut before it was recorded here. */
  carriedOverWearM: number('Wear carried over').min(0, { error: 'Wear carried over cannot be negative' }).max(100_000, { error: 'Wear carried over must be at most 100,000 m' }).default(0),
  /** Why the previous blade comes out (stored as its retire reason). */
  previousRetireReason: z.string({ error: 'Reason must be text' }).trim().max(500, { error: 'Use at most 500 characters for the reason' }).default(''),
  note: z.string({ error: 'Note must be text' }).trim().max(500, { error: 'Use at most 500 characters for the note' }).default(''),
})
export type FitBladeRequest = z.input<typeof fitBladeRequestSchema>

export const retireBladeRequestSchema = z.object({
  reason: z.string({ error: 'Enter a reason' }).trim().min(1, { error: 'Enter a reason' }).max(500, { error: 'Use at most 500 characters for the reason' }),
})
export type RetireBladeRequest = z.input<typeof retireBladeRequestSchema>

export const careEventSchema = z.object({
  id: z.string(),
  cutterId: z.string(),
  kind: careEventKindSchema,
  note: z.string(),
  doneAt: z.string(),
  doneByName: z.string().nullable(),
  /** Who logged it: members may delete their own entries, owners any. */
  doneById: z.string().nullable(),
})
export type CareEvent = z.infer<typeof careEventSchema>

export const careEventListResponseSchema = paged(careEventSchema)
export type CareEventListResponse = z.infer<typeof careEventListResponseSchema>

export const careEventListQuerySchema = z.object({ kind: careEventKindSchema.optional(), page: pageSchema, pageSize: pageSizeSchema(20) })

export const createCareEventRequestSchema = z.object({
  kind: careEventKindSchema,
  note: z.string({ error: 'Note must be text' }).trim().max(1000, { error: 'Use at most 1000 characters for the note' }).default(''),
  /** When the care was done; defaults to now. Not in the future. */
  doneAt: isoInstantSchema('Done date').optional(),
})
export type CreateCareEventRequest = z.input<typeof createCareEventRequestSchema>

/** Whether the next job of a material on a cutter should start with a test cut (after a blade was fitted). */
export const testCutPromptSchema = z.object({
  needed: z.boolean(),
  bladeId: z.string().nullable(),
  fittedAt: z.string().nullable(),
  reason: z.string(),
})
export type TestCutPromptDto = z.infer<typeof testCutPromptSchema>
export const testCutPromptQuerySchema = z.object({ materialId: z.uuid({ error: 'Not a valid material id' }) })

const wearLimitMSchema = number('Wear limit').positive({ error: 'Wear limit must be above 0 m' }).max(100_000, { error: 'Wear limit must be at most 100,000 m' })

export const studioSettingsSchema = z.object({
  /** Metres of cut per blade type: the workspace's values over the starting points. */
  bladeWearLimitsM: z.record(z.string(), z.number()),
  dueSoonDays: z.number(),
  /** The starting points the product ships with, for "reset" and for the note that they are only a start. */
  startingPointLimitsM: z.record(z.string(), z.number()),
  updatedAt: z.string().nullable(),
})
export type StudioSettings = z.infer<typeof studioSettingsSchema>

export const updateStudioSettingsRequestSchema = z
  .object({
    bladeWearLimitsM: z.record(bladeTypeNameSchema, wearLimitMSchema).optional(),
    dueSoonDays: number('Due-soon days')
      .int({ error: 'Due-soon days must be a whole number' })
      .min(0, { error: 'Due-soon days cannot be negative' })
      .max(90, { error: 'Due-soon days must be at most 90' })
      .optional(),
  })
  .refine((body) => body.bladeWearLimitsM !== undefined || body.dueSoonDays !== undefined, { error: 'Send at least one field to change' })
export type UpdateStudioSettingsRequest = z.input<typeof updateStudioSettingsRequestSchema>

const id = z.uuid({ error: 'Not a valid id' })
export const cutterWorkspaceParamsSchema = z.object({ workspaceId: id })
export const cutterParamsSchema = z.object({ workspaceId: id, cutterId: id })
export const bladeParamsSchema = z.object({ workspaceId: id, cutterId: id, bladeId: id })
export const careEventParamsSchema = z.object({ workspaceId: id, cutterId: id, careEventId: id })
