import { z } from 'zod'
import { quoteLineKinds } from '../quotes/arithmetic.js'
import { emailSchema } from './auth.js'

/**
 * Quotes: a customer price built from a job's material, cut time and labour. Money is integer minor units (cents)
 * of the quote's currency. Status: draft → sent → accepted → paid, or declined / expired.
 */

export const quoteStatuses = ['draft', 'sent', 'accepted', 'declined', 'expired', 'paid'] as const
export const quoteStatusSchema = z.enum(quoteStatuses, { error: `Status must be one of ${quoteStatuses.join(', ')}` })
export type QuoteStatus = z.infer<typeof quoteStatusSchema>

const uuid = z.uuid({ error: 'Not a valid id' })

export const quoteLineInputSchema = z
  .object({
    kind: z.enum(quoteLineKinds, { error: `Kind must be one of ${quoteLineKinds.join(', ')}` }).default('custom'),
    description: z.string({ error: 'Enter a description' }).trim().min(1, { error: 'Enter a description' }).max(200, { error: 'Use at most 200 characters' }),
    quantity: z
      .number({ error: 'The quantity must be a number' })
      .min(0, { error: 'The quantity cannot be negative' })
      .max(1_000_000, { error: 'The quantity must be at most 1,000,000' }),
    unit: z.string().trim().max(12, { error: 'Use at most 12 characters for the unit' }).default(''),
    /** A custom line may be negative (a discount); computed lines are not. */
    unitPriceMinor: z
      .number({ error: 'The unit price must be a number' })
      .int({ error: 'The unit price must be whole minor units (cents)' })
      .min(-100_000_000, { error: 'The unit price must be at least -1,000,000.00' })
      .max(100_000_000, { error: 'The unit price must be at most 1,000,000.00' }),
    basis: z.string().trim().max(300).optional(),
  })
  .superRefine((line, context) => {
    if (line.kind !== 'custom' && line.unitPriceMinor < 0) context.addIssue({ code: 'custom', path: ['unitPriceMinor'], message: 'Only a custom line may have a negative price' })
    if (line.kind === 'markup' && line.unit !== '%') context.addIssue({ code: 'custom', path: ['unit'], message: 'A markup line is a percentage: its unit is %' })
  })
export type QuoteLineInputBody = z.input<typeof quoteLineInputSchema>

const linesSchema = z.array(quoteLineInputSchema).min(1, { error: 'A quote needs at least one line' }).max(100, { error: 'Use at most 100 lines' })

const customerNameSchema = z.string().trim().max(120, { error: 'Use at most 120 characters' })
const titleSchema = z.string().trim().max(120, { error: 'Use at most 120 characters' })

export const quoteSourceSchema = z.discriminatedUnion(
  'kind',
  [
    z.object({ kind: z.literal('job'), jobId: uuid }),
    z.object({ kind: z.literal('comparison'), comparisonId: uuid, stockIndex: z.number({ error: 'Pick a stock row' }).int().min(0, { error: 'Pick a stock row' }) }),
    /** Lines typed by hand, nothing computed. */
    z.object({ kind: z.literal('manual') }),
  ],
  { error: 'Source kind must be job, comparison or manual' },
)
export type QuoteSource = z.infer<typeof quoteSourceSchema>

export const createQuoteRequestSchema = z.object({
  source: quoteSourceSchema,
  title: titleSchema.optional(),
  customerName: customerNameSchema.optional(),
  customerEmail: emailSchema.optional(),
  /** Manual quotes only: the lines to start with. */
  lines: linesSchema.optional(),
})
export type CreateQuoteRequest = z.input<typeof createQuoteRequestSchema>

/** A change; `version` is the version the editor started from (stale → 409). New lines make a new version. */
export const updateQuoteRequestSchema = z
  .object({
    version: z.number({ error: 'Send the version you edited' }).int().min(1),
    title: titleSchema.optional(),
    customerName: customerNameSchema.optional(),
    customerEmail: emailSchema.or(z.literal('')).optional(),
    lines: linesSchema.optional(),
    note: z.string().trim().max(300, { error: 'Use at most 300 characters' }).optional(),
  })
  .refine((body) => body.title !== undefined || body.customerName !== undefined || body.customerEmail !== undefined || body.lines !== undefined, {
    error: 'Send at least one field to change',
  })
export type UpdateQuoteRequest = z.input<typeof updateQuoteRequestSchema>

export const sendQuoteRequestSchema = z.object({
  customerEmail: emailSchema,
  customerName: customerNameSchema.optional(),
  message: z.string().trim().max(2000, { error: 'Use at most 2000 characters' }).default(''),
})
export type SendQuoteRequest = z.input<typeof sendQuoteRequestSchema>

/** What a member may set by hand: the customer said yes or no by phone, the offer is withdrawn, paid in person. */
export const manualQuoteStatuses = ['accepted', 'declined', 'expired', 'paid'] as const
export const quoteStatusChangeRequestSchema = z.object({
  status: z.enum(manualQuoteStatuses, { error: `Status must be one of ${manualQuoteStatuses.join(', ')}` }),
  note: z.string().trim().max(300, { error: 'Use at most 300 characters' }).default(''),
})

export const quoteListQuerySchema = z.object({
  status: quoteStatusSchema.optional(),
  search: z.string().trim().max(100).optional(),
  page: z.coerce.number({ error: 'Page must be a number' }).int().min(1, { error: 'Page must be at least 1' }).default(1),
  pageSize: z.coerce.number({ error: 'Page size must be a number' }).int().min(1).max(100, { error: 'Page size must be at most 100' }).default(25),
})
export type QuoteListQuery = z.input<typeof quoteListQuerySchema>

export const quoteParamsSchema = z.object({ workspaceId: uuid, quoteId: uuid })
export const publicQuoteParamsSchema = z.object({ token: z.string().regex(/^[A-Za-z0-9_-]{20,100}$/, { error: 'Not a valid quote link' }) })

export const pricedQuoteLineSchema = z.object({
  kind: z.enum(quoteLineKinds),
  description: z.string(),
  quantity: z.number(),
  unit: z.string(),
  unitPriceMinor: z.number(),
  basis: z.string(),
  amountMinor: z.number(),
  arithmetic: z.string(),
})
export type PricedQuoteLineResponse = z.infer<typeof pricedQuoteLineSchema>

export const quoteTotalsSchema = z.object({
  subtotalMinor: z.number(),
  minimumTopUpMinor: z.number(),
  taxMinor: z.number(),
  totalMinor: z.number(),
  taxRatePercent: z.number(),
  minimumOrderMinor: z.number(),
  arithmetic: z.object({ subtotal: z.string(), minimumTopUp: z.string(), tax: z.string(), total: z.string() }),
})

export const quoteVersionSchema = quoteTotalsSchema.extend({
  version: z.number(),
  lines: z.array(pricedQuoteLineSchema),
  note: z.string(),
  createdAt: z.string(),
  createdByName: z.string().nullable(),
})
export type QuoteVersion = z.infer<typeof quoteVersionSchema>

export const quoteEventSchema = z.object({
  fromStatus: quoteStatusSchema.nullable(),
  toStatus: quoteStatusSchema,
  /** 'member' (byName says who), 'customer' (the public page), 'payment' (the provider's webhook), 'system' (expiry). */
  actor: z.enum(['member', 'customer', 'payment', 'system']),
  byName: z.string().nullable(),
  note: z.string(),
  at: z.string(),
})
export type QuoteEvent = z.infer<typeof quoteEventSchema>

export const quoteSummarySchema = z.object({
  id: z.string(),
  number: z.number(),
  title: z.string(),
  customerName: z.string(),
  customerEmail: z.string(),
  currency: z.string(),
  /** Effective status: a sent quote past its expiry reads `expired`. */
  status: quoteStatusSchema,
  currentVersion: z.number(),
  totalMinor: z.number(),
  source: z.object({ kind: z.enum(['job', 'comparison', 'manual']), label: z.string(), jobId: z.string().nullable(), comparisonId: z.string().nullable() }),
  sentAt: z.string().nullable(),
  expiresAt: z.string().nullable(),
  paidAt: z.string().nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
})
export type QuoteSummary = z.infer<typeof quoteSummarySchema>

export const quoteDetailSchema = quoteSummarySchema.extend({
  versions: z.array(quoteVersionSchema),
  events: z.array(quoteEventSchema),
  /** The provider's hosted pay page for the current version, while the quote can be paid. */
  payUrl: z.string().nullable(),
  /** A customer link is out (sent and not withdrawn by an edit). The link itself is only in the e-mail. */
  publicLinkActive: z.boolean(),
  /** Pay links are configured on this server. */
  paymentsEnabled: z.boolean(),
  /** Right after sending: the customer link, once (only its hash is stored). */
  publicUrl: z.string().optional(),
})
export type QuoteDetail = z.infer<typeof quoteDetailSchema>

export const quoteListResponseSchema = z.object({ items: z.array(quoteSummarySchema), total: z.number(), page: z.number(), pageSize: z.number() })
export type QuoteListResponse = z.infer<typeof quoteListResponseSchema>

/** What the New quote dialog offers to price: the workspace's jobs and finished comparison rows. */
export const quoteSourcesSchema = z.object({
  jobs: z.array(z.object({ id: z.string(), number: z.number(), title: z.string(), customerName: z.string(), status: z.string(), quantity: z.number(), hasLayout: z.boolean() })),
  comparisons: z.array(z.object({ id: z.string(), name: z.string(), rows: z.array(z.object({ stockIndex: z.number(), label: z.string(), complete: z.boolean() })) })),
})
export type QuoteSources = z.infer<typeof quoteSourcesSchema>

/** The customer's read-only view through the link: nothing of the workspace but its name. */
export const publicQuoteSchema = quoteTotalsSchema.extend({
  studioName: z.string(),
  number: z.number(),
  title: z.string(),
  customerName: z.string(),
  currency: z.string(),
  status: quoteStatusSchema,
  /** As the customer reads them: the markup folded into the material lines (shared/quotes/arithmetic.ts customerLines). */
  lines: z.array(pricedQuoteLineSchema.omit({ basis: true, kind: true }).extend({ unitPriceMinor: z.number().nullable() })),
  sentAt: z.string().nullable(),
  expiresAt: z.string().nullable(),
  paidAt: z.string().nullable(),
  canRespond: z.boolean(),
  canPay: z.boolean(),
})
export type PublicQuote = z.infer<typeof publicQuoteSchema>

export const publicPayResponseSchema = z.object({ url: z.string() })
