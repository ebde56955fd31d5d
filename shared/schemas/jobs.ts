import { z } from 'zod'

/**
 * The job contract: a production run of a saved layout on a stock item with a cutter, `quantity` times.
 * Status moves `planned → cutting → done`, or to `scrapped` (see shared/jobs/status.ts for the allowed moves).
 * `usage` is filled by the server when the job is marked done (what was used, in millimetres); `plannedUsage` is the
 * same figure worked out now from the saved layout, so a quote or the "mark done" dialog can show it beforehand.
 */

export const jobStatuses = ['planned', 'cutting', 'done', 'scrapped'] as const
export const jobStatusSchema = z.enum(jobStatuses, { error: 'Status must be planned, cutting, done or scrapped' })
export type JobStatus = z.infer<typeof jobStatusSchema>

const idOf = (what: string) => z.uuid({ error: `Not a valid ${what} id` })
/** A calendar day as the studio writes it: YYYY-MM-DD. */
const dayString = (field: string) =>
  z
    .string({ error: `${field} must be a date (YYYY-MM-DD)` })
    .regex(/^\d{4}-\d{2}-\d{2}$/, { error: `${field} must be a date (YYYY-MM-DD)` })
    .refine((value) => !Number.isNaN(Date.parse(`${value}T00:00:00Z`)) && new Date(`${value}T00:00:00Z`).toISOString().startsWith(value), {
      error: `${field} is not a real date`,
    })

const titleSchema = z.string({ error: 'Enter a title' }).trim().min(1, { error: 'Enter a title' }).max(120, { error: 'Use at most 120 characters' })
const quantitySchema = z
  .number({ error: 'The quantity must be a number' })
  .int({ error: 'The quantity must be a whole number' })
  .min(1, { error: 'The quantity must be at least 1' })
  .max(10_000, { error: 'The quantity must be at most 10,000' })
const customerNameSchema = z.string({ error: 'The customer name must be text' }).trim().max(120, { error: 'Use at most 120 characters' })
const notesSchema = z.string({ error: 'Notes must be text' }).trim().max(2000, { error: 'Use at most 2000 characters' })

/** POST /jobs. The layout is required (a comparison row is first opened as a layout by the client). */
export const createJobRequestSchema = z.object({
  /** Left out: the layout's name. */
  title: titleSchema.optional(),
  layoutId: idOf('layout'),
  /** The comparison the layout was made from, when it came from a comparison row. */
  comparisonId: idOf('comparison').nullable().default(null),
  stockItemId: idOf('stock item'),
  /** Left out: the stock item's material. */
  materialId: idOf('material').nullable().optional(),
  cutterId: idOf('cutter').nullable().default(null),
  quantity: quantitySchema.default(1),
  customerName: customerNameSchema.default(''),
  dueDate: dayString('The due date').nullable().default(null),
  notes: notesSchema.default(''),
})
export type CreateJobRequest = z.input<typeof createJobRequestSchema>

/** PATCH /jobs/:jobId: details of a job that is not done or scrapped yet; carries the version it edited. */
export const updateJobRequestSchema = z
  .object({
    version: z.number({ error: 'Send the version you edited' }).int().min(1),
    title: titleSchema.optional(),
    stockItemId: idOf('stock item').optional(),
    materialId: idOf('material').nullable().optional(),
    cutterId: idOf('cutter').nullable().optional(),
    quantity: quantitySchema.optional(),
    customerName: customerNameSchema.optional(),
    dueDate: dayString('The due date').nullable().optional(),
    notes: notesSchema.optional(),
  })
  .refine((body) => Object.entries(body).some(([key, value]) => key !== 'version' && value !== undefined), { error: 'Send at least one field to change' })
export type UpdateJobRequest = z.input<typeof updateJobRequestSchema>

/** POST /jobs/:jobId/status: move the job on. `version` is the job version the person saw (a stale one answers 409). */
export const jobStatusRequestSchema = z.object({
  status: jobStatusSchema,
  version: z.number({ error: 'Send the version you saw' }).int({ error: 'The version must be a whole number' }).min(1, { error: 'The version must be at least 1' }),
  note: z.string({ error: 'The note must be text' }).trim().max(500, { error: 'Use at most 500 characters' }).default(''),
  /** On done: keep the leftover (the last sheet's unused area, or the rest of the roll) as a remnant stock item. */
  keepRemnant: z.boolean({ error: 'keepRemnant must be true or false' }).default(false),
  /** On done: take the stock down to 0 even when less is on hand than the job used (otherwise 409). */
  allowShortStock: z.boolean({ error: 'allowShortStock must be true or false' }).default(false),
})
export type JobStatusRequest = z.input<typeof jobStatusRequestSchema>

/** What a job used, all runs together. Millimetres and square millimetres. */
export const jobUsageSchema = z.object({
  /** Sheets of the layout × quantity (0 for a roll). */
  sheetsUsed: z.number(),
  /** Used roll length × quantity (0 for sheets). */
  rollLengthUsedMm: z.number(),
  stockAreaMm2: z.number(),
  pieceAreaMm2: z.number(),
  wasteAreaMm2: z.number(),
  /** Cut-plan cut length (already × passes) × quantity: what the blade wears by. */
  cutLengthMm: z.number(),
  passes: z.number(),
})
export type JobUsage = z.infer<typeof jobUsageSchema>

const wearLevels = ['ok', 'near', 'over'] as const

/** The cutter's current blade and its wear (null: no cutter, not a blade cutter, or no blade fitted). */
export const jobBladeWearSchema = z.object({
  bladeId: z.string(),
  bladeType: z.string(),
  fittedAt: z.string(),
  wornMm: z.number(),
  limitMm: z.number(),
  /** worn / limit (0 when there is no limit). */
  wearRatio: z.number(),
  wearLevel: z.enum(wearLevels),
})
export type JobBladeWear = z.infer<typeof jobBladeWearSchema>

/** After a blade is fitted, the first job of each material on that cutter asks for a test cut first. */
export const jobTestCutPromptSchema = z.object({
  needed: z.boolean(),
  bladeId: z.string().nullable(),
  fittedAt: z.string().nullable(),
  reason: z.string(),
})
export type JobTestCutPrompt = z.infer<typeof jobTestCutPromptSchema>

export const jobEventSchema = z.object({
  fromStatus: jobStatusSchema.nullable(),
  toStatus: jobStatusSchema,
  byName: z.string().nullable(),
  at: z.string(),
  note: z.string(),
})
export type JobEvent = z.infer<typeof jobEventSchema>

export const jobRemnantSchema = z.object({
  id: z.string(),
  name: z.string(),
  kind: z.enum(['sheet', 'roll']),
  /** Sheet remnants: the area of the kept outline; roll remnants: width × rest of the roll. */
  areaMm2: z.number(),
  /** Roll remnants: the rest of the roll. */
  lengthMm: z.number().nullable(),
})
export type JobRemnant = z.infer<typeof jobRemnantSchema>

const refSchema = z.object({ id: z.string(), name: z.string() })

/** API paths of the job's cut files: the layout's cut plan, per-sheet SVG / HP-GL and the job sheet PDF. */
export const jobLinksSchema = z.object({
  cutPlan: z.string(),
  jobSheetPdf: z.string(),
  sheets: z.array(z.object({ sheet: z.number(), svg: z.string(), hpgl: z.string() })),
})
export type JobLinks = z.infer<typeof jobLinksSchema>

export const jobSummarySchema = z.object({
  id: z.string(),
  /** Per workspace, from 1: shown as "Job 12". */
  number: z.number(),
  title: z.string(),
  status: jobStatusSchema,
  layout: refSchema.nullable(),
  comparisonId: z.string().nullable(),
  material: refSchema.nullable(),
  stock: z.object({ id: z.string(), name: z.string(), kind: z.enum(['sheet', 'roll']), isRemnant: z.boolean() }).nullable(),
  cutter: z.object({ id: z.string(), name: z.string(), toolKind: z.enum(['blade', 'pen', 'laser']) }).nullable(),
  quantity: z.number(),
  customerName: z.string(),
  /** YYYY-MM-DD or null. */
  dueDate: z.string().nullable(),
  /** `overdue` / `due-soon` (within the studio's due-soon days) for open jobs; null otherwise. */
  dueState: z.enum(['overdue', 'due-soon']).nullable(),
  notes: z.string(),
  /** Filled when the job is done. */
  usage: jobUsageSchema.nullable(),
  /** The blade the job's wear went to (done jobs). */
  usedBladeId: z.string().nullable(),
  /** Wear of the cutter's current blade. */
  bladeWear: jobBladeWearSchema.nullable(),
  remnant: jobRemnantSchema.nullable(),
  version: z.number(),
  createdAt: z.string(),
  updatedAt: z.string(),
  doneAt: z.string().nullable(),
})
export type JobSummary = z.infer<typeof jobSummarySchema>

export const jobSchema = jobSummarySchema.extend({
  /** What marking the job done now would use (from the saved layout); null when the layout is gone. */
  plannedUsage: jobUsageSchema.nullable(),
  /** On hand now of the job's stock: sheets, or the roll length in mm. */
  stockOnHand: z.object({ quantityOnHand: z.number(), lengthMm: z.number().nullable() }).nullable(),
  testCutPrompt: jobTestCutPromptSchema.nullable(),
  events: z.array(jobEventSchema),
  links: jobLinksSchema.nullable(),
})
export type Job = z.infer<typeof jobSchema>

export const jobListQuerySchema = z.object({
  search: z.string().trim().max(100, { error: 'Use at most 100 characters' }).optional(),
  status: z
    .union([jobStatusSchema, z.literal('open')], { error: 'Status must be planned, cutting, done, scrapped or open' })
    .optional(),
  materialId: idOf('material').optional(),
  cutterId: idOf('cutter').optional(),
  dueBefore: dayString('dueBefore').optional(),
  dueAfter: dayString('dueAfter').optional(),
  /** Open jobs due within the studio's due-soon days, and overdue ones; sorted by due date. */
  dueSoon: z
    .enum(['true', 'false'], { error: 'dueSoon must be true or false' })
    .transform((value) => value === 'true')
    .optional(),
  page: z.coerce.number({ error: 'Page must be a number' }).int().min(1, { error: 'Page must be at least 1' }).default(1),
  pageSize: z.coerce.number({ error: 'Page size must be a number' }).int().min(1).max(100, { error: 'Page size must be at most 100' }).default(25),
})
export type JobListQuery = z.input<typeof jobListQuerySchema>

export const jobListResponseSchema = z.object({
  items: z.array(jobSummarySchema),
  total: z.number(),
  page: z.number(),
  pageSize: z.number(),
  /** The studio's due-soon window, days. */
  dueSoonDays: z.number(),
})
export type JobListResponse = z.infer<typeof jobListResponseSchema>

export const jobParamsSchema = z.object({ workspaceId: z.uuid({ error: 'Not a valid id' }), jobId: z.uuid({ error: 'Not a valid id' }) })

/** GET /remnants: remnant stock items (the stock list's item shape). */
export const remnantListQuerySchema = z.object({
  materialId: idOf('material').optional(),
  status: z.enum(['active', 'archived', 'all'], { error: 'Status must be active, archived or all' }).default('active'),
  page: z.coerce.number({ error: 'Page must be a number' }).int().min(1, { error: 'Page must be at least 1' }).default(1),
  pageSize: z.coerce.number({ error: 'Page size must be a number' }).int().min(1).max(100, { error: 'Page size must be at most 100' }).default(50),
})

/** GET /dashboard: the workspace home. */
export const dashboardSchema = z.object({
  dueSoonDays: z.number(),
  dueJobs: z.array(jobSummarySchema),
  blades: z.array(
    z.object({
      cutter: z.object({ id: z.string(), name: z.string() }),
      bladeId: z.string(),
      bladeType: z.string(),
      fittedAt: z.string(),
      wornMm: z.number(),
      limitMm: z.number(),
      wearRatio: z.number(),
      wearLevel: z.enum(wearLevels),
    }),
  ),
  recentTestCuts: z.array(
    z.object({
      id: z.string(),
      material: refSchema,
      outcome: z.string(),
      cutterName: z.string().nullable(),
      byName: z.string().nullable(),
      at: z.string(),
    }),
  ),
  careReminders: z.array(
    z.object({
      cutter: z.object({ id: z.string(), name: z.string() }),
      kind: z.string(),
      intervalDays: z.number(),
      lastDoneAt: z.string().nullable(),
      dueAt: z.string(),
      overdue: z.boolean(),
    }),
  ),
  /** Last 6 months including this one, oldest first; from done jobs, by month of doneAt (UTC). Square metres. */
  materialByMonth: z.array(z.object({ month: z.string(), usedM2: z.number(), wastedM2: z.number(), jobs: z.number() })),
})
export type Dashboard = z.infer<typeof dashboardSchema>
