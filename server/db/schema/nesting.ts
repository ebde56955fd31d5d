import { index, jsonb, pgEnum, pgTable, text, timestamp, uuid, boolean } from 'drizzle-orm/pg-core'
import type { CreateNestRunRequest, NestProgressDto, NestResultDto } from '../../../shared/schemas/nesting.js'
import { users, workspaces } from './accounts.js'

export const nestRunStatus = pgEnum('nest_run_status', ['queued', 'running', 'succeeded', 'failed', 'cancelled'])

/** A background search that arranges pieces on stock; the result is stored only after the independent check passed. */
export const nestRuns = pgTable(
  'nest_runs',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    workspaceId: uuid('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    status: nestRunStatus('status').notNull().default('queued'),
    request: jsonb('request').$type<CreateNestRunRequest>().notNull(),
    progress: jsonb('progress').$type<NestProgressDto>(),
    result: jsonb('result').$type<NestResultDto>(),
    error: text('error'),
    cancelRequested: boolean('cancel_requested').notNull().default(false),
    createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    startedAt: timestamp('started_at', { withTimezone: true }),
    finishedAt: timestamp('finished_at', { withTimezone: true }),
  },
  (table) => [index('nest_runs_workspace_idx').on(table.workspaceId, table.createdAt)],
)
