import { doublePrecision, index, integer, jsonb, pgEnum, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import type { PricedQuoteLine } from '../../../shared/quotes/arithmetic.js'
import { users, workspaces } from './accounts.js'
import { comparisons } from './comparisons.js'
import { cutJobs } from './jobs.js'

/** A workspace's pricing settings; a workspace without a row prices with `defaultPricingSettings` (all zero). */
export const pricingSettings = pgTable('pricing_settings', {
  workspaceId: uuid('workspace_id')
    .primaryKey()
    .references(() => workspaces.id, { onDelete: 'cascade' }),
  currency: text('currency').notNull(),
  machineRatePerHourMinor: integer('machine_rate_per_hour_minor').notNull(),
  labourRatePerHourMinor: integer('labour_rate_per_hour_minor').notNull(),
  setupFeeMinor: integer('setup_fee_minor').notNull(),
  weedingMinutesPerPiece: doublePrecision('weeding_minutes_per_piece').notNull(),
  materialMarkupPercent: doublePrecision('material_markup_percent').notNull(),
  minimumOrderMinor: integer('minimum_order_minor').notNull(),
  taxRatePercent: doublePrecision('tax_rate_percent').notNull(),
  quoteValidDays: integer('quote_valid_days').notNull().default(30),
  updatedBy: uuid('updated_by').references(() => users.id, { onDelete: 'set null' }),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
})

export const quoteStatus = pgEnum('quote_status', ['draft', 'sent', 'accepted', 'declined', 'expired', 'paid'])

/** What a quote was priced from, frozen at creation (the job may change later). */
export interface QuoteSourceFacts {
  kind: 'job' | 'comparison' | 'manual'
  label: string
  stockIndex?: number
}

/**
 * A customer quote. Prices live in `quote_versions` (every change of lines is a new version); the quote row holds
 * who it is for, its state, and the customer link: only the SHA-256 of the link's token is stored, so the database
 * alone cannot open a quote's public page. Sending again issues a new token (the old link stops working).
 */
export const quotes = pgTable(
  'quotes',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    workspaceId: uuid('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    /** Quote number per workspace, shown as "Quote 12". */
    number: integer('number').notNull(),
    title: text('title').notNull().default(''),
    jobId: uuid('job_id').references(() => cutJobs.id, { onDelete: 'set null' }),
    comparisonId: uuid('comparison_id').references(() => comparisons.id, { onDelete: 'set null' }),
    source: jsonb('source').$type<QuoteSourceFacts>().notNull(),
    customerName: text('customer_name').notNull().default(''),
    customerEmail: text('customer_email').notNull().default(''),
    currency: text('currency').notNull(),
    status: quoteStatus('status').notNull().default('draft'),
    currentVersion: integer('current_version').notNull().default(1),
    publicTokenHash: text('public_token_hash'),
    /** The provider's checkout session of the current version, and its hosted pay page. */
    checkoutSessionId: text('checkout_session_id'),
    payUrl: text('pay_url'),
    /** The provider's event that marked the quote paid (a repeated delivery of it changes nothing). */
    paymentEventId: text('payment_event_id'),
    sentAt: timestamp('sent_at', { withTimezone: true }),
    expiresAt: timestamp('expires_at', { withTimezone: true }),
    respondedAt: timestamp('responded_at', { withTimezone: true }),
    paidAt: timestamp('paid_at', { withTimezone: true }),
    createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    uniqueIndex('quotes_workspace_number_idx').on(table.workspaceId, table.number),
    uniqueIndex('quotes_public_token_hash_idx').on(table.publicTokenHash),
    index('quotes_workspace_status_idx').on(table.workspaceId, table.status, table.createdAt),
    index('quotes_checkout_session_idx').on(table.checkoutSessionId),
  ],
)

/** One priced state of a quote: its lines with their arithmetic and the totals, as the owner saved them. */
export const quoteVersions = pgTable(
  'quote_versions',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    workspaceId: uuid('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    quoteId: uuid('quote_id')
      .notNull()
      .references(() => quotes.id, { onDelete: 'cascade' }),
    version: integer('version').notNull(),
    lines: jsonb('lines').$type<PricedQuoteLine[]>().notNull(),
    subtotalMinor: integer('subtotal_minor').notNull(),
    minimumTopUpMinor: integer('minimum_top_up_minor').notNull(),
    taxMinor: integer('tax_minor').notNull(),
    totalMinor: integer('total_minor').notNull(),
    /** The settings the totals used, frozen so a later change of settings does not change a sent price. */
    taxRatePercent: doublePrecision('tax_rate_percent').notNull(),
    minimumOrderMinor: integer('minimum_order_minor').notNull(),
    note: text('note').notNull().default(''),
    createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [uniqueIndex('quote_versions_quote_version_idx').on(table.quoteId, table.version)],
)

/** Every status change of a quote: from → to, by a member, the customer or the payment provider. */
export const quoteEvents = pgTable(
  'quote_events',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    workspaceId: uuid('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    quoteId: uuid('quote_id')
      .notNull()
      .references(() => quotes.id, { onDelete: 'cascade' }),
    fromStatus: quoteStatus('from_status'),
    toStatus: quoteStatus('to_status').notNull(),
    actor: text('actor').$type<'member' | 'customer' | 'payment' | 'system'>().notNull(),
    byUserId: uuid('by_user_id').references(() => users.id, { onDelete: 'set null' }),
    note: text('note').notNull().default(''),
    at: timestamp('at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [index('quote_events_quote_idx').on(table.quoteId, table.at)],
)
