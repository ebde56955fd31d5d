import { boolean, doublePrecision, index, integer, jsonb, numeric, pgEnum, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core'
import { users, workspaces } from './accounts.js'
import { materials } from './materials.js'

export const stockItemKind = pgEnum('stock_item_kind', ['sheet', 'roll'])

/**
 * What a studio keeps on the shelf to cut into. Sizes and margins in millimetres; `price` per sheet, or per metre of a
 * roll. Rows are archived rather than deleted once anything refers to them (a foreign key refuses the delete).
 */
export const stockItems = pgTable(
  'stock_items',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    workspaceId: uuid('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    kind: stockItemKind('kind').notNull(),
    widthMm: doublePrecision('width_mm').notNull(),
    /** Sheets only. */
    heightMm: doublePrecision('height_mm'),
    /** Rolls only: length on hand of one roll. */
    lengthMm: doublePrecision('length_mm'),
    marginTopMm: doublePrecision('margin_top_mm').notNull().default(0),
    marginRightMm: doublePrecision('margin_right_mm').notNull().default(0),
    marginBottomMm: doublePrecision('margin_bottom_mm').notNull().default(0),
    marginLeftMm: doublePrecision('margin_left_mm').notNull().default(0),
    // No action on delete: a material still on the shelf cannot be deleted, only archived.
    materialId: uuid('material_id').references(() => materials.id),
    price: numeric('price', { precision: 14, scale: 4, mode: 'number' }),
    quantityOnHand: integer('quantity_on_hand').notNull().default(0),
    supplierNote: text('supplier_note').notNull().default(''),
    /** A leftover kept from a job (sheet: the unused area as `outline`; roll: the rest of the roll). */
    isRemnant: boolean('is_remnant').notNull().default(false),
    /** The job it was left over from; no foreign key, cut_jobs already refers to stock_items. */
    remnantOfJobId: uuid('remnant_of_job_id'),
    /** Sheets only, optional: the usable area as polygon rings in mm (outer ring first, then holes), inside width × height. */
    outline: jsonb('outline').$type<Array<Array<[number, number]>>>(),
    archivedAt: timestamp('archived_at', { withTimezone: true }),
    createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [index('stock_items_workspace_idx').on(table.workspaceId, table.name), index('stock_items_material_idx').on(table.materialId)],
)
