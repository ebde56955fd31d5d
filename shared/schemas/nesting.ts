import { z } from 'zod'

const positive = (field: string) => z.number({ error: `${field} must be a number` }).positive({ error: `${field} must be above 0` }).max(100_000, { error: `${field} must be at most 100 m` })
const point = z.tuple([z.number(), z.number()])

export const rotationPolicies = ['none', 'half-turn', 'quarter-turns', 'any-step'] as const
export const mirrorPolicies = ['never', 'allowed', 'always'] as const

export const nestRunItemSchema = z.object({
  designId: z.uuid({ error: 'Not a valid design id' }),
  quantity: z.number().int({ error: 'Quantity must be a whole number' }).min(1, { error: 'Quantity must be at least 1' }).max(2000, { error: 'Quantity must be at most 2000' }),
  /** none: as drawn; half-turn: 0° or 180°; quarter-turns: 0/90/180/270; any-step: every multiple of rotationStepDeg. */
  rotation: z.enum(rotationPolicies).default('quarter-turns'),
  rotationStepDeg: z.number().min(1, { error: 'Use a step of at least 1°' }).max(180).optional(),
  mirror: z.enum(mirrorPolicies).default('never'),
  /** Fabric and faux leather: the grain must keep its direction, so only 0° and 180° remain. */
  grainLock: z.boolean().default(false),
})
export type NestRunItem = z.input<typeof nestRunItemSchema>

export const nestStockSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('roll'), widthMm: positive('Roll width'), maxLengthMm: positive('Roll length').optional() }),
  z.object({ kind: z.literal('sheets'), widthMm: positive('Sheet width'), heightMm: positive('Sheet height'), maxSheets: z.number().int().min(1).max(500).optional() }),
  z.object({ kind: z.literal('polygon'), outline: z.array(point).min(3, { error: 'The stock outline needs at least 3 points' }), holes: z.array(z.array(point)).optional() }),
])
export type NestStockInput = z.infer<typeof nestStockSchema>

/** Sheets a run may use at most (nestStockSchema's maxSheets), so a zone names a sheet index below it. */
const MAX_RUN_SHEETS = 500
const zoneOutline = z.array(point).min(3, { error: 'An excluded zone needs at least 3 points' })
/**
 * An area of the stock that must stay clear. An outline alone keeps it clear on every sheet (the original form, kept
 * for stored runs and files); `{ sheet, outline }` on that sheet only (0-based; a roll or a stock outline is sheet 0).
 */
export const nestExcludedZoneSchema = z.union(
  [
    zoneOutline,
    z.object({
      sheet: z
        .number({ error: 'The zone’s sheet must be a number' })
        .int({ error: 'The zone’s sheet must be a whole number' })
        .min(0, { error: 'The zone’s sheet counts from 0' })
        .max(MAX_RUN_SHEETS - 1, { error: `The zone’s sheet must be below ${MAX_RUN_SHEETS}` }),
      outline: zoneOutline,
    }),
  ],
  { error: 'An excluded zone is an outline of at least 3 points, or { sheet, outline }' },
)
export type NestExcludedZone = z.infer<typeof nestExcludedZoneSchema>

export const createNestRunRequestSchema = z
  .object({
    items: z.array(nestRunItemSchema).min(1, { error: 'Add at least one design' }).max(100, { error: 'Use at most 100 designs' }),
    stock: nestStockSchema,
    spacingMm: z.number().min(0, { error: 'Spacing cannot be negative' }).max(100).default(2),
    marginMm: z.number().min(0, { error: 'Margin cannot be negative' }).max(500).default(5),
    excludedZones: z.array(nestExcludedZoneSchema).max(50, { error: 'Use at most 50 excluded zones' }).default([]),
    timeBudgetSeconds: z.number().min(1, { error: 'Give the search at least 1 second' }).max(600, { error: 'At most 10 minutes' }).default(20),
    seed: z.number().int().min(1).max(2 ** 31 - 1).optional(),
  })
  .superRefine((request, context) => {
    // A zone on a sheet the run can never use would silently do nothing: more likely a mistake than meant.
    const sheets = request.stock.kind === 'sheets' ? (request.stock.maxSheets ?? MAX_RUN_SHEETS) : 1
    for (const [index, zone] of request.excludedZones.entries()) {
      if (Array.isArray(zone) || zone.sheet < sheets) continue
      const message = request.stock.kind === 'sheets' ? `The run uses at most ${sheets} sheets: the zone’s sheet must be below ${sheets}` : 'A roll or a stock outline is one sheet: the zone’s sheet must be 0'
      context.addIssue({ code: 'custom', path: ['excludedZones', index, 'sheet'], message })
    }
  })
export type CreateNestRunRequest = z.input<typeof createNestRunRequestSchema>

export const nestRunStatuses = ['queued', 'running', 'succeeded', 'failed', 'cancelled'] as const
export type NestRunStatus = (typeof nestRunStatuses)[number]

export const nestProgressSchema = z.object({
  evaluations: z.number(),
  elapsedMs: z.number(),
  bestUtilisation: z.number(),
  placedCount: z.number(),
  bestLengthMm: z.number().optional(),
  bestSheets: z.number().optional(),
})
export type NestProgressDto = z.infer<typeof nestProgressSchema>

export const nestPlacementSchema = z.object({
  designId: z.string(),
  /** Index of the piece within the design, or -1 for a design kept together as one group. */
  pieceIndex: z.number(),
  copy: z.number(),
  sheet: z.number(),
  angleDeg: z.number(),
  mirrored: z.boolean(),
  xMm: z.number(),
  yMm: z.number(),
  outline: z.array(point),
  holes: z.array(z.array(point)),
})
export type NestPlacementDto = z.infer<typeof nestPlacementSchema>

export const nestResultSchema = z.object({
  mode: z.enum(['roll', 'sheets', 'polygon']),
  placements: z.array(nestPlacementSchema),
  unplaced: z.array(z.object({ designId: z.string(), pieceIndex: z.number(), copy: z.number(), reason: z.string() })),
  lengthMm: z.number(),
  sheetCount: z.number(),
  utilisation: z.number(),
  perSheetUtilisation: z.array(z.number()),
  pieceAreaMm2: z.number(),
  usedStockAreaMm2: z.number(),
  evaluations: z.number(),
  elapsedMs: z.number(),
  firstFeasibleMs: z.number(),
  seed: z.number(),
  /** The independent check passed (overlap, containment, spacing). A result is never stored without it. */
  verified: z.literal(true),
})
export type NestResultDto = z.infer<typeof nestResultSchema>

export const nestRunSchema = z.object({
  id: z.string(),
  status: z.enum(nestRunStatuses),
  request: createNestRunRequestSchema,
  progress: nestProgressSchema.nullable(),
  result: nestResultSchema.nullable(),
  error: z.string().nullable(),
  createdAt: z.string(),
  startedAt: z.string().nullable(),
  finishedAt: z.string().nullable(),
  createdByName: z.string().nullable(),
})
export type NestRunDto = z.infer<typeof nestRunSchema>

export const nestRunParamsSchema = z.object({ workspaceId: z.uuid({ error: 'Not a valid id' }), runId: z.uuid({ error: 'Not a valid id' }) })
