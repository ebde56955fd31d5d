import { boolean, customType, doublePrecision, index, integer, jsonb, pgEnum, pgTable, primaryKey, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import type { RecipeValues } from '../../../shared/schemas/materials.js'
import { users, workspaces } from './accounts.js'

export const recipeToolKind = pgEnum('recipe_tool_kind', ['blade', 'laser'])
export const testCutOutcome = pgEnum('test_cut_outcome', ['clean', 'not_through', 'torn', 'too_deep'])
export const recipeChangeSource = pgEnum('recipe_change_source', ['created', 'tuned', 'suggestion', 'reset'])

const bytea = customType<{ data: Buffer; driverData: Buffer }>({ dataType: () => 'bytea' })

/**
 * A material of one workspace. Catalogue entries are copied into each workspace the first time it opens its
 * materials (`catalogue_key` set, unique per workspace), so tuning, favourites and test cuts all point at one
 * row id whatever the material's origin; the key finds the catalogue's starting point again for a reset.
 */
export const materials = pgTable(
  'materials',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    workspaceId: uuid('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    catalogueKey: text('catalogue_key'),
    name: text('name').notNull(),
    category: text('category').notNull(),
    description: text('description').notNull().default(''),
    thicknessMm: doublePrecision('thickness_mm'),
    basisWeightLb: doublePrecision('basis_weight_lb'),
    basisWeightKind: text('basis_weight_kind'),
    grammageGsm: doublePrecision('grammage_gsm'),
    laserSafe: boolean('laser_safe').notNull().default(false),
    archivedAt: timestamp('archived_at', { withTimezone: true }),
    createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [uniqueIndex('materials_catalogue_key_idx').on(table.workspaceId, table.catalogueKey), index('materials_workspace_name_idx').on(table.workspaceId, table.name)],
)

/** How a material is cut with one tool kind; one row per material and tool kind. Fields of the other kind stay null. */
export const materialRecipes = pgTable(
  'material_recipes',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    workspaceId: uuid('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    materialId: uuid('material_id')
      .notNull()
      .references(() => materials.id, { onDelete: 'cascade' }),
    toolKind: recipeToolKind('tool_kind').notNull(),
    bladeType: text('blade_type'),
    bladeAngleDeg: doublePrecision('blade_angle_deg'),
    force: integer('force'),
    passes: integer('passes').notNull().default(1),
    speedMmS: doublePrecision('speed_mm_s').notNull(),
    powerPercent: doublePrecision('power_percent'),
    /** Raised on every change; a test cut remembers the version it was cut with, so a stale suggestion is never applied. */
    version: integer('version').notNull().default(1),
    updatedBy: uuid('updated_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [uniqueIndex('material_recipes_material_tool_idx').on(table.materialId, table.toolKind)],
)

/** One changed recipe field: who, when, from → to and why. Written in the same transaction as the change. */
export const recipeChanges = pgTable(
  'recipe_changes',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    workspaceId: uuid('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    materialId: uuid('material_id')
      .notNull()
      .references(() => materials.id, { onDelete: 'cascade' }),
    toolKind: recipeToolKind('tool_kind').notNull(),
    field: text('field').notNull(),
    fromValue: jsonb('from_value').$type<number | string | null>(),
    toValue: jsonb('to_value').$type<number | string | null>(),
    reason: text('reason').notNull(),
    source: recipeChangeSource('source').notNull(),
    testCutId: uuid('test_cut_id').references(() => testCuts.id, { onDelete: 'set null' }),
    changedBy: uuid('changed_by').references(() => users.id, { onDelete: 'set null' }),
    changedAt: timestamp('changed_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [index('recipe_changes_material_idx').on(table.materialId, table.changedAt)],
)

/**
 * A trial cut and its outcome, with the recipe as it was cut. Cutters and blades get their own tables later;
 * until then their ids are plain nullable columns without a foreign key.
 */
export const testCuts = pgTable(
  'test_cuts',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    workspaceId: uuid('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    // No action on delete: a material with test cuts keeps its record and can only be archived.
    materialId: uuid('material_id')
      .notNull()
      .references(() => materials.id),
    toolKind: recipeToolKind('tool_kind').notNull(),
    recipe: jsonb('recipe').$type<RecipeValues>().notNull(),
    /** The recipe's version when the cut was logged (see material_recipes.version). */
    recipeVersion: integer('recipe_version').notNull(),
    cutterId: uuid('cutter_id'),
    bladeId: uuid('blade_id'),
    cutterMaxForce: integer('cutter_max_force'),
    outcome: testCutOutcome('outcome').notNull(),
    note: text('note').notNull().default(''),
    suggestionAppliedAt: timestamp('suggestion_applied_at', { withTimezone: true }),
    suggestionAppliedBy: uuid('suggestion_applied_by').references(() => users.id, { onDelete: 'set null' }),
    createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [index('test_cuts_material_idx').on(table.materialId, table.createdAt)],
)

/**
 * The photo of a test cut, kept in PostgreSQL beside its record: served only through the API to members, backed up
 * and shared by every web process with the rest of the data, and never listed with the test cuts themselves.
 */
export const testCutPhotos = pgTable('test_cut_photos', {
  testCutId: uuid('test_cut_id')
    .primaryKey()
    .references(() => testCuts.id, { onDelete: 'cascade' }),
  workspaceId: uuid('workspace_id')
    .notNull()
    .references(() => workspaces.id, { onDelete: 'cascade' }),
  contentType: text('content_type').notNull(),
  byteSize: integer('byte_size').notNull(),
  data: bytea('data').notNull(),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
})

/** A person's starred materials, shown first in every material picker. */
export const materialFavourites = pgTable(
  'material_favourites',
  {
    userId: uuid('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    materialId: uuid('material_id')
      .notNull()
      .references(() => materials.id, { onDelete: 'cascade' }),
    workspaceId: uuid('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [primaryKey({ columns: [table.userId, table.materialId] }), index('material_favourites_workspace_idx').on(table.workspaceId, table.userId)],
)

/** Per-workspace tuning settings; a workspace without a row uses the defaults. */
export const materialSettings = pgTable('material_settings', {
  workspaceId: uuid('workspace_id')
    .primaryKey()
    .references(() => workspaces.id, { onDelete: 'cascade' }),
  forceStep: integer('force_step').notNull().default(15),
  forceMin: integer('force_min').notNull().default(1),
  forceMax: integer('force_max').notNull().default(400),
  powerStepPercent: doublePrecision('power_step_percent').notNull().default(5),
  /** The catalogue version last copied into this workspace (see shared/materials/catalogue.ts). */
  catalogueVersion: integer('catalogue_version').notNull().default(0),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
})
