import { z } from 'zod'
import { nestProgressSchema, nestRunItemSchema, nestRunStatuses } from './nesting.js'

/**
 * Stock comparison: the same items nested onto two to eight stocks, one nest run per stock. A stock is either an item
 * from the workspace's shelf (`stock-item`) or given inline (`sheets`, `roll`); either way the comparison stores a
 * snapshot of size and price, so it can be re-run after the shelf changed.
 */

const sizeMm = (field: string) =>
  z.number({ error: `${field} must be a number` }).positive({ error: `${field} must be above 0` }).max(100_000, { error: `${field} must be at most 100 m` })
const price = (field: string) =>
  z.number({ error: `${field} must be a number` }).min(0, { error: `${field} cannot be negative` }).max(1_000_000, { error: `${field} must be at most 1,000,000` })
const label = z.string({ error: 'Enter a label' }).trim().min(1, { error: 'Enter a label' }).max(120, { error: 'Use at most 120 characters' })
const currency = z
  .string()
  .trim()
  .regex(/^[A-Za-z]{3}$/, { error: 'Use a three-letter currency code such as EUR' })
  .transform((code) => code.toUpperCase())

export const comparisonStockInputSchema = z.discriminatedUnion(
  'kind',
  [
    z.object({ kind: z.literal('stock-item'), stockItemId: z.uuid({ error: 'Not a valid stock item id' }) }),
    z.object({ kind: z.literal('sheets'), label, widthMm: sizeMm('Sheet width'), heightMm: sizeMm('Sheet height'), pricePerSheet: price('The price per sheet').nullable().default(null), currency: currency.optional() }),
    z.object({ kind: z.literal('roll'), label, widthMm: sizeMm('Roll width'), pricePerMetre: price('The price per metre').nullable().default(null), currency: currency.optional() }),
  ],
  { error: 'Kind must be stock-item, sheets or roll' },
)
export type ComparisonStockInput = z.input<typeof comparisonStockInputSchema>

export const minComparisonStocks = 2
export const maxComparisonStocks = 8

export const createComparisonRequestSchema = z.object({
  name: z.string().trim().max(120, { error: 'Use at most 120 characters' }).default(''),
  items: z.array(nestRunItemSchema).min(1, { error: 'Add at least one design' }).max(100, { error: 'Use at most 100 designs' }),
  stocks: z
    .array(comparisonStockInputSchema)
    .min(minComparisonStocks, { error: `Pick at least ${minComparisonStocks} stocks to compare` })
    .max(maxComparisonStocks, { error: `Compare at most ${maxComparisonStocks} stocks at once` }),
  spacingMm: z.number().min(0, { error: 'Spacing cannot be negative' }).max(100).default(2),
  /** The least margin on every stock; a shelf item with wider margins keeps its own widest one. */
  marginMm: z.number().min(0, { error: 'Margin cannot be negative' }).max(500).default(5),
  timeBudgetSeconds: z.number().min(1, { error: 'Give each search at least 1 second' }).max(600, { error: 'At most 10 minutes' }).default(10),
  seed: z.number().int().min(1).max(2 ** 31 - 1).optional(),
})
export type CreateComparisonRequest = z.input<typeof createComparisonRequestSchema>

/** A stock as the comparison nests and prices it, frozen when the comparison was made. */
export const comparisonStockSchema = z.object({
  label: z.string(),
  kind: z.enum(['sheets', 'roll']),
  widthMm: z.number(),
  /** Sheets only. */
  heightMm: z.number().nullable(),
  marginMm: z.number(),
  /** Per sheet, or per metre of roll; null when not known. */
  price: z.number().nullable(),
  priceUnit: z.enum(['sheet', 'metre']),
  currency: z.string().nullable(),
  /** The shelf item it came from, if any. */
  stockItemId: z.string().nullable(),
})
export type ComparisonStock = z.infer<typeof comparisonStockSchema>

/** What one stock's layout uses and costs (see shared/comparisons/costs.ts for how each is computed). */
export const comparisonFiguresSchema = z.object({
  sheetsUsed: z.number(),
  /** Roll: used length including the end margin; sheets: 0. */
  usedLengthMm: z.number(),
  usedAreaMm2: z.number(),
  pieceAreaMm2: z.number(),
  utilisation: z.number(),
  wasteAreaMm2: z.number(),
  materialCost: z.number().nullable(),
  costPerPiece: z.number().nullable(),
  placedCount: z.number(),
  wantedCount: z.number(),
  cutLengthMm: z.number(),
  /** Estimated cutting time; null while no cut-time model is available. */
  cutTimeSeconds: z.number().nullable(),
  /** Every wanted piece was placed; only complete rows compete for "best". */
  complete: z.boolean(),
})
export type ComparisonFigures = z.infer<typeof comparisonFiguresSchema>

export const comparisonColumns = ['utilisation', 'wasteAreaMm2', 'materialCost', 'costPerPiece', 'cutLengthMm', 'cutTimeSeconds'] as const
export type ComparisonColumn = (typeof comparisonColumns)[number]

export const comparisonRowSchema = z.object({
  stock: comparisonStockSchema,
  runId: z.string(),
  runStatus: z.enum(nestRunStatuses),
  progress: nestProgressSchema.nullable(),
  /** Figures of the run's layout: once it succeeded, or the best so far of a cancelled run. */
  figures: comparisonFiguresSchema.nullable(),
  error: z.string().nullable(),
  /** Columns in which this row holds the best value. */
  best: z.array(z.enum(comparisonColumns)),
})
export type ComparisonRow = z.infer<typeof comparisonRowSchema>

export const comparisonStatuses = ['queued', 'running', 'succeeded', 'failed', 'cancelled'] as const
export type ComparisonStatus = (typeof comparisonStatuses)[number]

export const comparisonOptionsSchema = z.object({
  spacingMm: z.number(),
  marginMm: z.number(),
  timeBudgetSeconds: z.number(),
  seed: z.number().optional(),
})

export const comparisonSummarySchema = z.object({
  id: z.string(),
  name: z.string(),
  status: z.enum(comparisonStatuses),
  stockLabels: z.array(z.string()),
  itemCount: z.number(),
  pieceQuantity: z.number(),
  createdAt: z.string(),
  updatedAt: z.string(),
  createdByName: z.string().nullable(),
})
export type ComparisonSummary = z.infer<typeof comparisonSummarySchema>

export const comparisonDetailSchema = comparisonSummarySchema.extend({
  items: z.array(nestRunItemSchema),
  options: comparisonOptionsSchema,
  rows: z.array(comparisonRowSchema),
})
export type ComparisonDetail = z.infer<typeof comparisonDetailSchema>

export const comparisonParamsSchema = z.object({ workspaceId: z.uuid({ error: 'Not a valid id' }), comparisonId: z.uuid({ error: 'Not a valid id' }) })
