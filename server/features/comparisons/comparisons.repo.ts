import { and, desc, eq, inArray } from 'drizzle-orm'
import type { DatabaseOrTransaction } from '../../db/client.js'
import { comparisons, designs, nestRuns, stockItems, users } from '../../db/schema/index.js'

export type ComparisonRow = typeof comparisons.$inferSelect
export type NewComparisonRow = typeof comparisons.$inferInsert
export type ComparisonWithAuthor = { comparison: ComparisonRow; createdByName: string | null }

export async function insertComparison(db: DatabaseOrTransaction, values: NewComparisonRow): Promise<ComparisonRow> {
  const [row] = await db.insert(comparisons).values(values).returning()
  return row!
}

export async function findComparison(db: DatabaseOrTransaction, workspaceId: string, comparisonId: string): Promise<ComparisonWithAuthor | undefined> {
  const [row] = await db
    .select({ comparison: comparisons, createdByName: users.name })
    .from(comparisons)
    .leftJoin(users, eq(users.id, comparisons.createdBy))
    .where(and(eq(comparisons.workspaceId, workspaceId), eq(comparisons.id, comparisonId)))
  return row
}

export async function listComparisons(db: DatabaseOrTransaction, workspaceId: string, limit = 100): Promise<ComparisonWithAuthor[]> {
  return db
    .select({ comparison: comparisons, createdByName: users.name })
    .from(comparisons)
    .leftJoin(users, eq(users.id, comparisons.createdBy))
    .where(eq(comparisons.workspaceId, workspaceId))
    .orderBy(desc(comparisons.createdAt))
    .limit(limit)
}

export async function replaceRuns(db: DatabaseOrTransaction, comparisonId: string, runIds: string[]): Promise<void> {
  await db.update(comparisons).set({ runIds, updatedAt: new Date() }).where(eq(comparisons.id, comparisonId))
}

/** The nest runs of one or many comparisons, whole (with their results) or only their states. */
export async function findRuns(db: DatabaseOrTransaction, workspaceId: string, runIds: string[]) {
  if (runIds.length === 0) return []
  return db.select().from(nestRuns).where(and(eq(nestRuns.workspaceId, workspaceId), inArray(nestRuns.id, runIds)))
}

export async function findRunStatuses(db: DatabaseOrTransaction, workspaceId: string, runIds: string[]) {
  if (runIds.length === 0) return []
  return db.select({ id: nestRuns.id, status: nestRuns.status }).from(nestRuns).where(and(eq(nestRuns.workspaceId, workspaceId), inArray(nestRuns.id, runIds)))
}

export async function findStockItems(db: DatabaseOrTransaction, workspaceId: string, stockIds: string[]) {
  if (stockIds.length === 0) return []
  return db.select().from(stockItems).where(and(eq(stockItems.workspaceId, workspaceId), inArray(stockItems.id, stockIds)))
}

export async function findDesignGeometry(db: DatabaseOrTransaction, workspaceId: string, designIds: string[]) {
  if (designIds.length === 0) return []
  return db
    .select({ id: designs.id, name: designs.name, keepTogether: designs.keepTogether, geometry: designs.geometry })
    .from(designs)
    .where(and(eq(designs.workspaceId, workspaceId), inArray(designs.id, designIds)))
}
