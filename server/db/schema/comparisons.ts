import { index, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core'
import type { ComparisonStock } from '../../../shared/schemas/comparisons.js'
import type { NestRunItem } from '../../../shared/schemas/nesting.js'
import { users, workspaces } from './accounts.js'

/** What a comparison was asked for besides items and stocks; kept so a re-run repeats it exactly. */
export interface ComparisonOptionsColumn {
  spacingMm: number
  marginMm: number
  timeBudgetSeconds: number
  seed?: number
}

/**
 * A stock comparison: its inputs (items, a snapshot of each stock's size and price, options) and the nest run of each
 * stock, `run_ids[i]` for `stocks[i]`. Its state is derived from those runs; a re-run points it at new runs.
 */
export const comparisons = pgTable(
  'comparisons',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    workspaceId: uuid('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    items: jsonb('items').$type<NestRunItem[]>().notNull(),
    stocks: jsonb('stocks').$type<ComparisonStock[]>().notNull(),
    options: jsonb('options').$type<ComparisonOptionsColumn>().notNull(),
    runIds: uuid('run_ids').array().notNull(),
    createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [index('comparisons_workspace_idx').on(table.workspaceId, table.createdAt)],
)
