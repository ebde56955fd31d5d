import { z } from 'zod'

/**
 * Stock: what a studio cuts into. A `sheet` has a fixed width × height; a `roll` a fixed width and the length on
 * hand. Sizes and margins are millimetres; the price is per sheet, or per metre of a roll, in the studio's currency.
 */

export const stockKinds = ['sheet', 'roll'] as const
export const stockKindSchema = z.enum(stockKinds, { error: 'Kind must be sheet or roll' })
export type StockKind = z.infer<typeof stockKindSchema>

const sizeMm = (field: string) =>
  z.number({ error: `${field} must be a number` }).positive({ error: `${field} must be above 0` }).max(100_000, { error: `${field} must be at most 100 m` })
const marginMm = (side: string) =>
  z.number({ error: `The ${side} margin must be a number` }).min(0, { error: `The ${side} margin cannot be negative` }).max(500, { error: `The ${side} margin must be at most 500 mm` })

export const stockMarginsSchema = z.object({
  topMm: marginMm('top').default(0),
  rightMm: marginMm('right').default(0),
  bottomMm: marginMm('bottom').default(0),
  leftMm: marginMm('left').default(0),
})
export type StockMargins = z.infer<typeof stockMarginsSchema>

const stockNameSchema = z.string({ error: 'Enter a name' }).trim().min(1, { error: 'Enter a name' }).max(120, { error: 'Use at most 120 characters' })
const priceSchema = z
  .number({ error: 'The price must be a number' })
  .min(0, { error: 'The price cannot be negative' })
  .max(1_000_000, { error: 'The price must be at most 1,000,000' })
const quantitySchema = z
  .number({ error: 'The quantity must be a number' })
  .int({ error: 'The quantity must be a whole number' })
  .min(0, { error: 'The quantity cannot be negative' })
  .max(1_000_000, { error: 'The quantity must be at most 1,000,000' })
const supplierNoteSchema = z.string().trim().max(500, { error: 'Use at most 500 characters' })

const stockCommon = {
  name: stockNameSchema,
  materialId: z.uuid({ error: 'Not a valid material id' }).nullable().default(null),
  margins: stockMarginsSchema.default({ topMm: 0, rightMm: 0, bottomMm: 0, leftMm: 0 }),
  /** Per sheet for sheets, per metre for rolls; null when not known. */
  price: priceSchema.nullable().default(null),
  /** Sheets: how many sheets; rolls: how many rolls of the length on hand. */
  quantityOnHand: quantitySchema.default(0),
  supplierNote: supplierNoteSchema.default(''),
}

const sheetStockSchema = z.object({ kind: z.literal('sheet'), widthMm: sizeMm('Sheet width'), heightMm: sizeMm('Sheet height'), ...stockCommon })
const rollStockSchema = z.object({ kind: z.literal('roll'), widthMm: sizeMm('Roll width'), lengthMm: sizeMm('Roll length on hand'), ...stockCommon })

/** Margins must leave something to cut on, across and along. */
function checkMargins(stock: z.infer<typeof sheetStockSchema> | z.infer<typeof rollStockSchema>, context: z.RefinementCtx): void {
  const { margins } = stock
  if (margins.leftMm + margins.rightMm >= stock.widthMm) {
    context.addIssue({ code: 'custom', path: ['margins', 'leftMm'], message: 'The left and right margins together must be smaller than the width' })
  }
  const along = stock.kind === 'sheet' ? stock.heightMm : stock.lengthMm
  if (margins.topMm + margins.bottomMm >= along) {
    context.addIssue({
      code: 'custom',
      path: ['margins', 'topMm'],
      message: `The top and bottom margins together must be smaller than the ${stock.kind === 'sheet' ? 'height' : 'length'}`,
    })
  }
}

export const createStockRequestSchema = z.discriminatedUnion('kind', [sheetStockSchema, rollStockSchema], { error: 'Kind must be sheet or roll' }).superRefine(checkMargins)
export type CreateStockRequest = z.input<typeof createStockRequestSchema>

/** A partial change; the server merges it into the stored item and checks the whole again. */
export const updateStockRequestSchema = z
  .object({
    kind: stockKindSchema.optional(),
    name: stockNameSchema.optional(),
    widthMm: sizeMm('Width').optional(),
    heightMm: sizeMm('Sheet height').optional(),
    lengthMm: sizeMm('Roll length on hand').optional(),
    materialId: z.uuid({ error: 'Not a valid material id' }).nullable().optional(),
    margins: z
      .object({ topMm: marginMm('top').optional(), rightMm: marginMm('right').optional(), bottomMm: marginMm('bottom').optional(), leftMm: marginMm('left').optional() })
      .optional(),
    price: priceSchema.nullable().optional(),
    quantityOnHand: quantitySchema.optional(),
    supplierNote: supplierNoteSchema.optional(),
    /** Archived stock stays readable (layouts made with it keep their size) but leaves pickers. */
    archived: z.boolean({ error: 'archived must be true or false' }).optional(),
  })
  .refine((body) => Object.values(body).some((value) => value !== undefined), { error: 'Send at least one field to change' })
export type UpdateStockRequest = z.input<typeof updateStockRequestSchema>

export const stockMaterialRefSchema = z.object({ id: z.string(), name: z.string(), category: z.string() })

export const stockItemSchema = z.object({
  id: z.string(),
  name: z.string(),
  kind: stockKindSchema,
  widthMm: z.number(),
  /** Sheets only. */
  heightMm: z.number().nullable(),
  /** Rolls only: the length on hand of one roll. */
  lengthMm: z.number().nullable(),
  margins: z.object({ topMm: z.number(), rightMm: z.number(), bottomMm: z.number(), leftMm: z.number() }),
  material: stockMaterialRefSchema.nullable(),
  price: z.number().nullable(),
  priceUnit: z.enum(['sheet', 'metre']),
  quantityOnHand: z.number(),
  supplierNote: z.string(),
  archived: z.boolean(),
  /** A leftover kept from a job: sheets carry the unused area as `outline` rings (outer first, then holes; mm, from the item's top-left). */
  isRemnant: z.boolean(),
  remnantOfJobId: z.string().nullable(),
  outline: z.array(z.array(z.tuple([z.number(), z.number()]))).nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
})
export type StockItem = z.infer<typeof stockItemSchema>

export const stockStatuses = ['active', 'archived', 'all'] as const

export const stockListQuerySchema = z.object({
  search: z.string().trim().max(100).optional(),
  kind: stockKindSchema.optional(),
  materialId: z.uuid({ error: 'Not a valid material id' }).optional(),
  status: z.enum(stockStatuses, { error: 'Status must be active, archived or all' }).default('active'),
  /** only: remnants only; exclude: no remnants; left out: both. */
  remnants: z.enum(['only', 'exclude'], { error: 'Remnants must be only or exclude' }).optional(),
  page: z.coerce.number({ error: 'Page must be a number' }).int().min(1, { error: 'Page must be at least 1' }).default(1),
  pageSize: z.coerce.number({ error: 'Page size must be a number' }).int().min(1).max(100, { error: 'Page size must be at most 100' }).default(50),
})
export type StockListQuery = z.input<typeof stockListQuerySchema>

export const stockListResponseSchema = z.object({
  items: z.array(stockItemSchema),
  total: z.number(),
  page: z.number(),
  pageSize: z.number(),
})
export type StockListResponse = z.infer<typeof stockListResponseSchema>

export const stockParamsSchema = z.object({ workspaceId: z.uuid({ error: 'Not a valid id' }), stockId: z.uuid({ error: 'Not a valid id' }) })
