import { z } from 'zod'
import { mirrorPolicies, rotationPolicies } from './nesting.js'

/**
 * The layout contract: a stock, the items wanted (designs × quantities with their rotation rules), where each
 * piece sits, and options. Figures are computed by the server from the stored design geometry on every save;
 * whatever figures a client sends are ignored.
 */

const point = z.tuple([z.number(), z.number()])
const sizeMm = (field: string) =>
  z.number({ error: `${field} must be a number` }).positive({ error: `${field} must be above 0` }).max(100_000, { error: `${field} must be at most 100 m` })

export const layoutStockSchema = z.discriminatedUnion('kind', [
  /** Sheets of one size; `sheetCount` sheets are drawn side by side (pieces say which one they are on). */
  z.object({
    kind: z.literal('sheets'),
    widthMm: sizeMm('Sheet width'),
    heightMm: sizeMm('Sheet height'),
    sheetCount: z.number().int({ error: 'Sheet count must be a whole number' }).min(1, { error: 'Use at least one sheet' }).max(200, { error: 'Use at most 200 sheets' }),
  }),
  /** A roll of fixed width; `lengthMm` is the length drawn (the used length is measured from the pieces). */
  z.object({ kind: z.literal('roll'), widthMm: sizeMm('Roll width'), lengthMm: sizeMm('Roll length') }),
  /**
   * One piece of stock with its own outline (a remnant kept from a job): outline and holes in millimetres from the
   * top-left of the widthMm × heightMm box it is drawn in. It is one lane (sheet 0); the layout's margin is kept inside
   * the outline (a remnant's outline already lies inside its old sheet's margin, so it is usually laid out with 0).
   */
  z
    .object({
      kind: z.literal('polygon'),
      widthMm: sizeMm('Stock width'),
      heightMm: sizeMm('Stock height'),
      outline: z.array(point).min(3, { error: 'The stock outline needs at least 3 points' }).max(5000, { error: 'Use at most 5000 outline points' }),
      holes: z.array(z.array(point).min(3, { error: 'A hole needs at least 3 points' })).max(200, { error: 'Use at most 200 holes' }).optional(),
      /** The stock item it was taken from, for the record (left out when typed in). */
      stockItemId: z.uuid({ error: 'Not a valid stock id' }).nullable().optional(),
    })
    .superRefine((stock, context) => {
      // A small tolerance: outlines come from floating-point clipping and may stick out by a rounding error.
      const slackMm = 1e-6
      const outside = (ring: [number, number][]) => ring.some(([x, y]) => x < -slackMm || y < -slackMm || x > stock.widthMm + slackMm || y > stock.heightMm + slackMm)
      if (outside(stock.outline)) context.addIssue({ code: 'custom', path: ['outline'], message: 'The stock outline must lie inside its width × height, from (0, 0)' })
      for (const [index, hole] of (stock.holes ?? []).entries()) {
        if (outside(hole)) context.addIssue({ code: 'custom', path: ['holes', index], message: 'Each hole must lie inside the stock width × height' })
      }
      let twiceArea = 0
      stock.outline.forEach(([x, y], index) => {
        const [nextX, nextY] = stock.outline[(index + 1) % stock.outline.length]!
        twiceArea += x * nextY - nextX * y
      })
      if (Math.abs(twiceArea) / 2 <= 0) context.addIssue({ code: 'custom', path: ['outline'], message: 'The stock outline has no area' })
    }),
])
export type LayoutStock = z.infer<typeof layoutStockSchema>
export type PolygonLayoutStock = Extract<LayoutStock, { kind: 'polygon' }>

export const layoutItemSchema = z.object({
  designId: z.uuid({ error: 'Not a valid design id' }),
  quantity: z.number().int({ error: 'Quantity must be a whole number' }).min(1, { error: 'Quantity must be at least 1' }).max(2000, { error: 'Quantity must be at most 2000' }),
  rotation: z.enum(rotationPolicies).default('quarter-turns'),
  rotationStepDeg: z.number().min(1, { error: 'Use a step of at least 1°' }).max(180).optional(),
  mirror: z.enum(mirrorPolicies).default('never'),
  grainLock: z.boolean().default(false),
})
export type LayoutItem = z.infer<typeof layoutItemSchema>

/**
 * One placed piece. The design geometry (design millimetres, y down) is mirrored first (x → −x) if `mirrored`,
 * then rotated by `angleDeg` about the origin, then moved by (xMm, yMm) into sheet coordinates (origin at the
 * sheet's top-left corner, y down). Same transform as a nest-run placement, so a nest result maps 1:1.
 */
export const layoutPlacementSchema = z.object({
  /** Stable id chosen by the client (selection, undo), unique within the layout. */
  id: z.string().min(1).max(64),
  designId: z.uuid({ error: 'Not a valid design id' }),
  /** Index of the piece within the design, or -1 for the whole design kept together as one group. */
  pieceIndex: z.number().int().min(-1),
  sheet: z.number().int().min(0, { error: 'Sheet index cannot be negative' }),
  xMm: z.number(),
  yMm: z.number(),
  angleDeg: z.number().min(-360).max(360),
  mirrored: z.boolean().default(false),
  locked: z.boolean().default(false),
})
export type LayoutPlacement = z.infer<typeof layoutPlacementSchema>

export const layoutOptionsSchema = z.object({
  spacingMm: z.number().min(0, { error: 'Spacing cannot be negative' }).max(100).default(2),
  marginMm: z.number().min(0, { error: 'Margin cannot be negative' }).max(500).default(5),
  /** Areas the cutter cannot reach or damaged areas, per sheet (sheet coordinates). */
  excludedZones: z.array(z.object({ sheet: z.number().int().min(0), outline: z.array(point).min(3) })).max(100).default([]),
  snapToGrid: z.boolean().default(false),
  gridMm: z.number().positive().max(500).default(5),
})
export type LayoutOptions = z.infer<typeof layoutOptionsSchema>

/** Figures the server computes from stored geometry on every save. */
export const layoutFiguresSchema = z.object({
  /** Piece area / used stock area (0..1). Sheets: every sheet that holds a piece, whole sheet area. Roll: width × used length. */
  utilisation: z.number(),
  perSheetUtilisation: z.array(z.number()),
  pieceAreaMm2: z.number(),
  usedStockAreaMm2: z.number(),
  wasteAreaMm2: z.number(),
  /** True contour length of every placed piece (outline, holes and cut lines). */
  cutLengthMm: z.number(),
  sheetsUsed: z.number(),
  /** Roll: furthest extent along x plus the margin; sheets: 0. */
  usedLengthMm: z.number(),
  placedCount: z.number(),
  wantedCount: z.number(),
})
export type LayoutFigures = z.infer<typeof layoutFiguresSchema>

const layoutName = z.string().trim().min(1, { error: 'Enter a name' }).max(120, { error: 'Use at most 120 characters' })

export const layoutBodySchema = z.object({
  name: layoutName,
  stock: layoutStockSchema,
  items: z.array(layoutItemSchema).max(100, { error: 'Use at most 100 designs' }),
  placements: z.array(layoutPlacementSchema).max(5000, { error: 'Use at most 5000 placed pieces' }),
  options: layoutOptionsSchema,
})

export const createLayoutRequestSchema = layoutBodySchema.extend({
  isTemplate: z.boolean().default(false),
})
export type CreateLayoutRequest = z.input<typeof createLayoutRequestSchema>

/** PUT carries the version it edited; a stale version answers 409 with code `layout_version_conflict`. */
export const updateLayoutRequestSchema = layoutBodySchema.extend({
  version: z.number().int().min(1),
  isTemplate: z.boolean().optional(),
})
export type UpdateLayoutRequest = z.input<typeof updateLayoutRequestSchema>

/** `error.details` of a 409 `layout_version_conflict`: what the stored layout is now, so the editor can offer a reload. */
export const layoutVersionConflictDetailsSchema = z.object({
  currentVersion: z.number(),
  updatedAt: z.string(),
  updatedByName: z.string().nullable(),
})
export type LayoutVersionConflictDetails = z.infer<typeof layoutVersionConflictDetailsSchema>

export const layoutSummarySchema = z.object({
  id: z.string(),
  name: z.string(),
  isTemplate: z.boolean(),
  version: z.number(),
  stock: layoutStockSchema,
  figures: layoutFiguresSchema,
  designIds: z.array(z.string()),
  createdAt: z.string(),
  updatedAt: z.string(),
  updatedByName: z.string().nullable(),
})
export type LayoutSummary = z.infer<typeof layoutSummarySchema>

export const layoutDetailSchema = layoutSummarySchema.extend({
  items: z.array(layoutItemSchema),
  placements: z.array(layoutPlacementSchema),
  options: layoutOptionsSchema,
})
export type LayoutDetail = z.infer<typeof layoutDetailSchema>

export const layoutListQuerySchema = z.object({
  search: z.string().trim().max(100).optional(),
  templates: z.enum(['only', 'exclude', 'include']).default('exclude'),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(24),
})

export const layoutListResponseSchema = z.object({
  items: z.array(layoutSummarySchema),
  total: z.number(),
  page: z.number(),
  pageSize: z.number(),
})
export type LayoutListResponse = z.infer<typeof layoutListResponseSchema>

/** POST …/layouts/:layoutId/copy: duplicate a layout, or start a layout from a template. */
export const copyLayoutRequestSchema = z.object({
  name: layoutName.optional(),
  isTemplate: z.boolean().default(false),
})

export const layoutParamsSchema = z.object({ workspaceId: z.uuid({ error: 'Not a valid id' }), layoutId: z.uuid({ error: 'Not a valid id' }) })
