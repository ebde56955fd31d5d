import { z } from 'zod'

const point = z.tuple([z.number(), z.number()])
const ring = z.array(point)
const box = z.object({ minX: z.number(), minY: z.number(), maxX: z.number(), maxY: z.number() })

export const readWarningSchema = z.object({ code: z.string(), message: z.string(), count: z.number() })
export type ReadWarningDto = z.infer<typeof readWarningSchema>

export const designPieceSchema = z.object({
  /** Outer outline in design millimetres (y down, as drawn), positive shoelace area. */
  outline: ring,
  holes: z.array(ring),
  areaMm2: z.number(),
  cutLengthMm: z.number(),
  bbox: box,
})
export type DesignPiece = z.infer<typeof designPieceSchema>

export const designCutLineSchema = z.object({ points: z.array(point), lengthMm: z.number() })

export const designGeometrySchema = z.object({
  pieces: z.array(designPieceSchema),
  cutLines: z.array(designCutLineSchema),
})
export type DesignGeometry = z.infer<typeof designGeometrySchema>

/** A light drawing of the design for cards: SVG path data in millimetres, simplified, built from our geometry. */
export const designPreviewSchema = z.object({
  viewBox: z.tuple([z.number(), z.number(), z.number(), z.number()]),
  /** One path per piece (outline + holes, even-odd) followed by the cut lines. */
  piecePaths: z.array(z.string()),
  cutLinePaths: z.array(z.string()),
})
export type DesignPreview = z.infer<typeof designPreviewSchema>

export const designSummarySchema = z.object({
  id: z.string(),
  name: z.string(),
  tags: z.array(z.string()),
  originalFilename: z.string(),
  widthMm: z.number(),
  heightMm: z.number(),
  bbox: box,
  areaMm2: z.number(),
  cutLengthMm: z.number(),
  pieceCount: z.number(),
  holeCount: z.number(),
  cutLineCount: z.number(),
  warningCount: z.number(),
  /** Pieces move together as one group in layouts; false = each piece is placed on its own. */
  keepTogether: z.boolean(),
  toleranceMm: z.number(),
  preview: designPreviewSchema,
  createdAt: z.string(),
  updatedAt: z.string(),
})
export type DesignSummary = z.infer<typeof designSummarySchema>

export const designDetailSchema = designSummarySchema.extend({
  geometry: designGeometrySchema,
  warnings: z.array(readWarningSchema),
  createdByName: z.string().nullable(),
})
export type DesignDetail = z.infer<typeof designDetailSchema>

export const designListQuerySchema = z.object({
  search: z.string().trim().max(100).optional(),
  tag: z.string().trim().max(40).optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(24),
})

export const designListResponseSchema = z.object({
  items: z.array(designSummarySchema),
  total: z.number(),
  page: z.number(),
  pageSize: z.number(),
  /** Every tag used in the workspace, for the filter. */
  tags: z.array(z.string()),
})
export type DesignListResponse = z.infer<typeof designListResponseSchema>

const tagSchema = z.string().trim().min(1, { error: 'A tag cannot be empty' }).max(40, { error: 'Use at most 40 characters per tag' })

export const updateDesignRequestSchema = z
  .object({
    name: z.string().trim().min(1, { error: 'Enter a name' }).max(120, { error: 'Use at most 120 characters' }).optional(),
    tags: z.array(tagSchema).max(20, { error: 'Use at most 20 tags' }).optional(),
    keepTogether: z.boolean().optional(),
  })
  .refine((body) => Object.values(body).some((value) => value !== undefined), { error: 'Send a name, tags or keepTogether to change' })
export type UpdateDesignRequest = z.input<typeof updateDesignRequestSchema>

/** Multipart text fields sent with the files. */
export const uploadDesignOptionsSchema = z.object({
  toleranceMm: z.coerce.number().min(0.001, { error: 'Use a tolerance of at least 0.001 mm' }).max(1, { error: 'Use a tolerance of at most 1 mm' }).optional(),
  minSpeckAreaMm2: z.coerce.number().min(0, { error: 'Use 0 or more' }).max(1000).optional(),
})

export const uploadRejectionSchema = z.object({ filename: z.string(), code: z.string(), message: z.string() })
export const uploadDesignsResponseSchema = z.object({
  designs: z.array(designSummarySchema),
  rejected: z.array(uploadRejectionSchema),
})
export type UploadDesignsResponse = z.infer<typeof uploadDesignsResponseSchema>

export const designParamsSchema = z.object({ workspaceId: z.uuid({ error: 'Not a valid id' }), designId: z.uuid({ error: 'Not a valid id' }) })
