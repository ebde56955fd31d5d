import { boolean, index, integer, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core'
import type { LayoutFigures, LayoutItem, LayoutOptions, LayoutPlacement, LayoutStock } from '../../../shared/schemas/layouts.js'
import { users, workspaces } from './accounts.js'

/**
 * A layout arranged by hand (or taken from a nest run): stock, items, placements and options as the editor saved them,
 * and the figures the server computed from the stored design geometry at that save. `version` grows by one on every
 * save, so a save based on an older version is refused instead of overwriting someone else's work.
 */
export const layouts = pgTable(
  'layouts',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    workspaceId: uuid('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    isTemplate: boolean('is_template').notNull().default(false),
    version: integer('version').notNull().default(1),
    stock: jsonb('stock').$type<LayoutStock>().notNull(),
    items: jsonb('items').$type<LayoutItem[]>().notNull(),
    placements: jsonb('placements').$type<LayoutPlacement[]>().notNull(),
    options: jsonb('options').$type<LayoutOptions>().notNull(),
    figures: jsonb('figures').$type<LayoutFigures>().notNull(),
    createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
    updatedBy: uuid('updated_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [index('layouts_workspace_idx').on(table.workspaceId, table.isTemplate, table.updatedAt)],
)
