import { boolean, doublePrecision, index, integer, jsonb, pgEnum, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import { users, workspaces } from './accounts.js'
import { materials } from './materials.js'

export const cutterToolKind = pgEnum('cutter_tool_kind', ['blade', 'pen', 'laser'])
export const careEventKind = pgEnum('care_event_kind', ['blade_swap', 'blade_cleaned', 'housing_cleaned', 'roller_checked', 'spring_checked', 'other'])

/** A reminder to repeat one kind of care every so many days (per cutter). */
export interface CareReminderSetting {
  kind: 'blade_swap' | 'blade_cleaned' | 'housing_cleaned' | 'roller_checked' | 'spring_checked' | 'other'
  intervalDays: number
}

/**
 * A machine of the studio and how it moves: the profile the cut plan times and the HP-GL export follows.
 * Speeds in mm/s, acceleration in mm/s², lift/lower in seconds, force in the machine's own units.
 */
export const cutters = pgTable(
  'cutters',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    workspaceId: uuid('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    toolKind: cutterToolKind('tool_kind').notNull(),
    cuttingWidthMm: doublePrecision('cutting_width_mm').notNull(),
    maxLengthMm: doublePrecision('max_length_mm').notNull(),
    cutSpeedMmS: doublePrecision('cut_speed_mm_s').notNull(),
    travelSpeedMmS: doublePrecision('travel_speed_mm_s').notNull(),
    accelerationMmS2: doublePrecision('acceleration_mm_s2').notNull(),
    liftLowerS: doublePrecision('lift_lower_s').notNull(),
    cornerAngleDeg: doublePrecision('corner_angle_deg').notNull().default(30),
    /** Blade cutters only; null for pens and lasers. */
    forceMin: integer('force_min'),
    forceMax: integer('force_max'),
    /** HP-GL origin corner and axes (see shared/cutplan/profile.ts). */
    origin: text('origin').notNull().default('bottom-left'),
    swapAxes: boolean('swap_axes').notNull().default(false),
    careReminders: jsonb('care_reminders').$type<CareReminderSetting[]>().notNull().default([]),
    notes: text('notes').notNull().default(''),
    archivedAt: timestamp('archived_at', { withTimezone: true }),
    createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [index('cutters_workspace_idx').on(table.workspaceId, table.name)],
)

/**
 * A blade fitted to a cutter: from `fittedAt` until `retiredAt`. At most one blade per cutter is fitted at a time
 * (the service retires the old one in the same transaction as a new fit). Wear is the sum of its `blade_wear` rows.
 */
export const blades = pgTable(
  'blades',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    workspaceId: uuid('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    cutterId: uuid('cutter_id')
      .notNull()
      .references(() => cutters.id, { onDelete: 'cascade' }),
    /** A blade type of the workspace's wear-limit table, e.g. "standard", "deep-cut", "fabric". */
    bladeType: text('blade_type').notNull(),
    angleDeg: doublePrecision('angle_deg').notNull(),
    label: text('label').notNull().default(''),
    fittedAt: timestamp('fitted_at', { withTimezone: true }).notNull().defaultNow(),
    fittedBy: uuid('fitted_by').references(() => users.id, { onDelete: 'set null' }),
    retiredAt: timestamp('retired_at', { withTimezone: true }),
    retiredBy: uuid('retired_by').references(() => users.id, { onDelete: 'set null' }),
    retireReason: text('retire_reason').notNull().default(''),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [index('blades_cutter_idx').on(table.cutterId, table.fittedAt)],
)

/**
 * Cut length a blade has done: one row per done job (cut length × passes, with the job's material), or a manual
 * entry (job null) such as wear carried over from before the blade was recorded.
 */
export const bladeWear = pgTable(
  'blade_wear',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    workspaceId: uuid('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    bladeId: uuid('blade_id')
      .notNull()
      .references(() => blades.id, { onDelete: 'cascade' }),
    /** No foreign key here: cut_jobs refers to blades, and a deleted job keeps the wear it caused. */
    jobId: uuid('job_id'),
    materialId: uuid('material_id').references(() => materials.id, { onDelete: 'set null' }),
    cutLengthMm: doublePrecision('cut_length_mm').notNull(),
    createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [index('blade_wear_blade_idx').on(table.bladeId), uniqueIndex('blade_wear_blade_job_idx').on(table.bladeId, table.jobId)],
)

/** Maintenance done on a cutter: who, when, what. */
export const careEvents = pgTable(
  'care_events',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    workspaceId: uuid('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    cutterId: uuid('cutter_id')
      .notNull()
      .references(() => cutters.id, { onDelete: 'cascade' }),
    kind: careEventKind('kind').notNull(),
    note: text('note').notNull().default(''),
    doneAt: timestamp('done_at', { withTimezone: true }).notNull().defaultNow(),
    doneBy: uuid('done_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [index('care_events_cutter_idx').on(table.cutterId, table.doneAt)],
)

/** Studio settings of issue-9 features; a workspace without a row uses the defaults in shared/cutters. */
export const studioSettings = pgTable('studio_settings', {
  workspaceId: uuid('workspace_id')
    .primaryKey()
    .references(() => workspaces.id, { onDelete: 'cascade' }),
  /** Wear limit in metres of cut per blade type. */
  bladeWearLimitsM: jsonb('blade_wear_limits_m').$type<Record<string, number>>().notNull().default({}),
  /** Days ahead a job counts as due soon. */
  dueSoonDays: integer('due_soon_days').notNull().default(7),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
})
