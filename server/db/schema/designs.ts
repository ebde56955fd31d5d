import { boolean, doublePrecision, index, integer, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core'
import type { DesignGeometry, DesignPreview, ReadWarningDto } from '../../../shared/schemas/designs.js'
import { users, workspaces } from './accounts.js'

/** An uploaded artwork, normalised: geometry in millimetres as the importer produced it, plus the sanitised original. */
export const designs = pgTable(
  'designs',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    workspaceId: uuid('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    tags: text('tags').array().notNull().default([]),
    originalFilename: text('original_filename').notNull(),
    /** The upload without scripts, event handlers or external references; offered for download only. */
    sanitizedSvg: text('sanitized_svg').notNull(),
    widthMm: doublePrecision('width_mm').notNull(),
    heightMm: doublePrecision('height_mm').notNull(),
    bboxMinX: doublePrecision('bbox_min_x').notNull(),
    bboxMinY: doublePrecision('bbox_min_y').notNull(),
    bboxMaxX: doublePrecision('bbox_max_x').notNull(),
    bboxMaxY: doublePrecision('bbox_max_y').notNull(),
    areaMm2: doublePrecision('area_mm2').notNull(),
    cutLengthMm: doublePrecision('cut_length_mm').notNull(),
    pieceCount: integer('piece_count').notNull(),
    holeCount: integer('hole_count').notNull(),
    cutLineCount: integer('cut_line_count').notNull(),
    keepTogether: boolean('keep_together').notNull().default(true),
    toleranceMm: doublePrecision('tolerance_mm').notNull(),
    geometry: jsonb('geometry').$type<DesignGeometry>().notNull(),
    preview: jsonb('preview').$type<DesignPreview>().notNull(),
    warnings: jsonb('warnings').$type<ReadWarningDto[]>().notNull(),
    createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [index('designs_workspace_idx').on(table.workspaceId, table.createdAt)],
)
