import { and, count, desc, eq, sql, type SQL } from 'drizzle-orm'
import { alias } from 'drizzle-orm/pg-core'
import type { DatabaseOrTransaction } from '../../db/client.js'
import { blades, cutters, testCutPhotos, testCuts, users } from '../../db/schema/index.js'

export type TestCutRow = typeof testCuts.$inferSelect
export type NewTestCutRow = typeof testCuts.$inferInsert

const author = alias(users, 'test_cut_author')
const applier = alias(users, 'test_cut_applier')

const listColumns = {
  testCut: testCuts,
  createdByName: author.name,
  appliedByName: applier.name,
  hasPhoto: sql<boolean>`exists (select 1 from ${testCutPhotos} where ${testCutPhotos.testCutId} = ${testCuts.id})`,
  cutterName: cutters.name,
  bladeType: blades.bladeType,
  bladeAngleDeg: blades.angleDeg,
}
export type TestCutWithNames = {
  testCut: TestCutRow
  createdByName: string | null
  appliedByName: string | null
  hasPhoto: boolean
  cutterName: string | null
  bladeType: string | null
  bladeAngleDeg: number | null
}

function withNames(where: SQL | undefined) {
  return (db: DatabaseOrTransaction) =>
    db
      .select(listColumns)
      .from(testCuts)
      .leftJoin(author, eq(author.id, testCuts.createdBy))
      .leftJoin(applier, eq(applier.id, testCuts.suggestionAppliedBy))
      .leftJoin(cutters, and(eq(cutters.id, testCuts.cutterId), eq(cutters.workspaceId, testCuts.workspaceId)))
      .leftJoin(blades, and(eq(blades.id, testCuts.bladeId), eq(blades.workspaceId, testCuts.workspaceId)))
      .where(where)
}

export async function listTestCuts(
  db: DatabaseOrTransaction,
  workspaceId: string,
  materialId: string,
  filter: { toolKind?: 'blade' | 'laser'; page: number; pageSize: number },
): Promise<{ rows: TestCutWithNames[]; total: number }> {
  const conditions: SQL[] = [eq(testCuts.workspaceId, workspaceId), eq(testCuts.materialId, materialId)]
  if (filter.toolKind) conditions.push(eq(testCuts.toolKind, filter.toolKind))
  const where = and(...conditions)
  const [rows, [total]] = await Promise.all([
    withNames(where)(db)
      .orderBy(desc(testCuts.createdAt), desc(testCuts.id))
      .limit(filter.pageSize)
      .offset((filter.page - 1) * filter.pageSize),
    db.select({ value: count() }).from(testCuts).where(where),
  ])
  return { rows, total: total?.value ?? 0 }
}

export async function findTestCut(db: DatabaseOrTransaction, workspaceId: string, materialId: string, testCutId: string): Promise<TestCutWithNames | undefined> {
  const [row] = await withNames(and(eq(testCuts.workspaceId, workspaceId), eq(testCuts.materialId, materialId), eq(testCuts.id, testCutId)))(db)
  return row
}

/** Locks the test cut for the rest of the transaction: a suggestion is applied once, even on a double click. */
export async function lockTestCut(db: DatabaseOrTransaction, workspaceId: string, materialId: string, testCutId: string): Promise<TestCutRow | undefined> {
  const [row] = await db
    .select()
    .from(testCuts)
    .where(and(eq(testCuts.workspaceId, workspaceId), eq(testCuts.materialId, materialId), eq(testCuts.id, testCutId)))
    .for('update')
  return row
}

export async function insertTestCut(db: DatabaseOrTransaction, row: NewTestCutRow) {
  const [inserted] = await db.insert(testCuts).values(row).returning({ id: testCuts.id })
  return inserted!
}

export async function markSuggestionApplied(db: DatabaseOrTransaction, testCutId: string, userId: string, at: Date) {
  await db.update(testCuts).set({ suggestionAppliedAt: at, suggestionAppliedBy: userId }).where(eq(testCuts.id, testCutId))
}

export async function deleteTestCut(db: DatabaseOrTransaction, workspaceId: string, materialId: string, testCutId: string) {
  const [row] = await db
    .delete(testCuts)
    .where(and(eq(testCuts.workspaceId, workspaceId), eq(testCuts.materialId, materialId), eq(testCuts.id, testCutId)))
    .returning({ id: testCuts.id })
  return row
}

export async function insertPhoto(db: DatabaseOrTransaction, row: typeof testCutPhotos.$inferInsert) {
  await db.insert(testCutPhotos).values(row)
}

export async function findPhoto(db: DatabaseOrTransaction, workspaceId: string, materialId: string, testCutId: string) {
  const [row] = await db
    .select({ contentType: testCutPhotos.contentType, data: testCutPhotos.data, createdAt: testCutPhotos.createdAt })
    .from(testCutPhotos)
    .innerJoin(testCuts, eq(testCuts.id, testCutPhotos.testCutId))
    .where(and(eq(testCutPhotos.workspaceId, workspaceId), eq(testCuts.materialId, materialId), eq(testCutPhotos.testCutId, testCutId)))
  return row
}
