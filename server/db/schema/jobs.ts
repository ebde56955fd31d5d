import { date, index, integer, jsonb, pgEnum, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import { users, workspaces } from './accounts.js'
import { comparisons } from './comparisons.js'
import { blades, cutters } from './cutters.js'
import { layouts } from './layouts.js'
import { materials } from './materials.js'
import { stockItems } from './stock.js'

export const cutJobStatus = pgEnum('cut_job_status', ['planned', 'cutting', 'done', 'scrapped'])

/** What a job used, computed by the server from the saved layout and cut plan when the job is marked done. */
export interface CutJobUsage {
  sheetsUsed: number
  rollLengthUsedMm: number
  /** Stock area used (sheets × sheet area, or roll width × length used), all runs of the job. */
  stockAreaMm2: number
  pieceAreaMm2: number
  wasteAreaMm2: number
  /** Cut length × passes × quantity. */
  cutLengthMm: number
  passes: number
}

/**
 * A job the studio cuts: a layout (or a comparison row made into a layout) on a stock with a cutter, `quantity`
 * times. Named cut_jobs so it is never confused with pg-boss's background jobs.
 */
export const cutJobs = pgTable(
  'cut_jobs',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    workspaceId: uuid('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    /** Job number per workspace, shown as "Job 12". */
    number: integer('number').notNull(),
    title: text('title').notNull(),
    layoutId: uuid('layout_id').references(() => layouts.id, { onDelete: 'set null' }),
    comparisonId: uuid('comparison_id').references(() => comparisons.id, { onDelete: 'set null' }),
    materialId: uuid('material_id').references(() => materials.id),
    stockItemId: uuid('stock_item_id').references(() => stockItems.id),
    cutterId: uuid('cutter_id').references(() => cutters.id),
    quantity: integer('quantity').notNull().default(1),
    customerName: text('customer_name').notNull().default(''),
    dueDate: date('due_date', { mode: 'string' }),
    notes: text('notes').notNull().default(''),
    status: cutJobStatus('status').notNull().default('planned'),
    /** The blade on the cutter when the job was marked done (wear was added to it). */
    bladeId: uuid('blade_id').references(() => blades.id, { onDelete: 'set null' }),
    usage: jsonb('usage').$type<CutJobUsage>(),
    /** The remnant kept from this job, if any. */
    remnantStockItemId: uuid('remnant_stock_item_id').references(() => stockItems.id, { onDelete: 'set null' }),
    version: integer('version').notNull().default(1),
    createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
    doneAt: timestamp('done_at', { withTimezone: true }),
  },
  (table) => [
    uniqueIndex('cut_jobs_workspace_number_idx').on(table.workspaceId, table.number),
    index('cut_jobs_workspace_status_idx').on(table.workspaceId, table.status, table.dueDate),
  ],
)

/** Every status change of a job: from → to, who and when. The first row (from null) is the job's creation. */
export const cutJobEvents = pgTable(
  'cut_job_events',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    workspaceId: uuid('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    jobId: uuid('job_id')
      .notNull()
      .references(() => cutJobs.id, { onDelete: 'cascade' }),
    fromStatus: cutJobStatus('from_status'),
    toStatus: cutJobStatus('to_status').notNull(),
    note: text('note').notNull().default(''),
    byUserId: uuid('by_user_id').references(() => users.id, { onDelete: 'set null' }),
    at: timestamp('at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [index('cut_job_events_job_idx').on(table.jobId, table.at)],
)

