import { and, desc, eq, inArray, sql } from 'drizzle-orm'
import type { DatabaseOrTransaction } from '../../db/client.js'
import { designs, nestRuns, users } from '../../db/schema/index.js'
import type { CreateNestRunRequest, NestProgressDto, NestResultDto } from '../../../shared/schemas/nesting.js'

export type NestRunRow = typeof nestRuns.$inferSelect

export async function insertNestRun(db: DatabaseOrTransaction, values: { workspaceId: string; createdBy: string; request: CreateNestRunRequest }) {
  const [row] = await db.insert(nestRuns).values(values).returning()
  return row!
}

export async function findNestRun(db: DatabaseOrTransaction, workspaceId: string, runId: string) {
  const [row] = await db
    .select({ run: nestRuns, createdByName: users.name })
    .from(nestRuns)
    .leftJoin(users, eq(users.id, nestRuns.createdBy))
    .where(and(eq(nestRuns.workspaceId, workspaceId), eq(nestRuns.id, runId)))
  return row
}

export async function findNestRunById(db: DatabaseOrTransaction, runId: string) {
  const [row] = await db.select().from(nestRuns).where(eq(nestRuns.id, runId))
  return row
}

export async function listNestRuns(db: DatabaseOrTransaction, workspaceId: string, limit = 20) {
  return db
    .select({ run: nestRuns, createdByName: users.name })
    .from(nestRuns)
    .leftJoin(users, eq(users.id, nestRuns.createdBy))
    .where(eq(nestRuns.workspaceId, workspaceId))
    .orderBy(desc(nestRuns.createdAt))
    .limit(limit)
}

/** Moves a run to running unless it is already finished or cancelled; returns the row when it may start. */
export async function markRunning(db: DatabaseOrTransaction, runId: string) {
  const [row] = await db
    .update(nestRuns)
    .set({ status: 'running', startedAt: sql`coalesce(${nestRuns.startedAt}, now())` })
    .where(and(eq(nestRuns.id, runId), inArray(nestRuns.status, ['queued', 'running']), eq(nestRuns.cancelRequested, false)))
    .returning()
  return row
}

export async function saveProgress(db: DatabaseOrTransaction, runId: string, progress: NestProgressDto) {
  const [row] = await db.update(nestRuns).set({ progress }).where(eq(nestRuns.id, runId)).returning({ cancelRequested: nestRuns.cancelRequested })
  return row?.cancelRequested ?? false
}

export async function finishRun(
  db: DatabaseOrTransaction,
  runId: string,
  values: { status: 'succeeded' | 'failed' | 'cancelled'; result?: NestResultDto | null; error?: string | null },
) {
  await db
    .update(nestRuns)
    .set({ status: values.status, result: values.result ?? null, error: values.error ?? null, finishedAt: new Date() })
    .where(eq(nestRuns.id, runId))
}

/** Cancels a queued run at once; a running one is asked to stop and keeps its best layout so far. */
export async function requestCancel(db: DatabaseOrTransaction, workspaceId: string, runId: string) {
  return db.transaction(async (tx) => {
    const [row] = await tx.select().from(nestRuns).where(and(eq(nestRuns.workspaceId, workspaceId), eq(nestRuns.id, runId))).for('update')
    if (!row) return undefined
    if (row.status === 'queued') {
      await tx.update(nestRuns).set({ status: 'cancelled', cancelRequested: true, finishedAt: new Date() }).where(eq(nestRuns.id, runId))
    } else if (row.status === 'running') {
      await tx.update(nestRuns).set({ cancelRequested: true }).where(eq(nestRuns.id, runId))
    }
    return row
  })
}

export async function findDesignsForNesting(db: DatabaseOrTransaction, workspaceId: string, designIds: string[]) {
  return db
    .select({ id: designs.id, keepTogether: designs.keepTogether, geometry: designs.geometry })
    .from(designs)
    .where(and(eq(designs.workspaceId, workspaceId), inArray(designs.id, designIds)))
}
