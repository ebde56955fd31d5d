import { and, arrayContains, count, desc, eq, ilike, or, sql } from 'drizzle-orm'
import type { DatabaseOrTransaction } from '../../db/client.js'
import { designs, users } from '../../db/schema/index.js'

export type DesignRow = typeof designs.$inferSelect
export type NewDesignRow = typeof designs.$inferInsert

/** Columns of a list row: everything but the full geometry and the original file. */
const summaryColumns = {
  id: designs.id,
  workspaceId: designs.workspaceId,
  name: designs.name,
  tags: designs.tags,
  originalFilename: designs.originalFilename,
  widthMm: designs.widthMm,
  heightMm: designs.heightMm,
  bboxMinX: designs.bboxMinX,
  bboxMinY: designs.bboxMinY,
  bboxMaxX: designs.bboxMaxX,
  bboxMaxY: designs.bboxMaxY,
  areaMm2: designs.areaMm2,
  cutLengthMm: designs.cutLengthMm,
  pieceCount: designs.pieceCount,
  holeCount: designs.holeCount,
  cutLineCount: designs.cutLineCount,
  keepTogether: designs.keepTogether,
  toleranceMm: designs.toleranceMm,
  preview: designs.preview,
  warnings: designs.warnings,
  createdAt: designs.createdAt,
  updatedAt: designs.updatedAt,
}
export type DesignSummaryRow = { [K in keyof typeof summaryColumns]: DesignRow[K] }

export async function insertDesigns(db: DatabaseOrTransaction, rows: NewDesignRow[]) {
  if (rows.length === 0) return []
  return db.insert(designs).values(rows).returning(summaryColumns)
}

function listFilter(workspaceId: string, filter: { search?: string; tag?: string }) {
  const conditions = [eq(designs.workspaceId, workspaceId)]
  if (filter.search) {
    const pattern = `%${filter.search.replace(/[\\%_]/g, (match) => `\\${match}`)}%`
    conditions.push(or(ilike(designs.name, pattern), sql`exists (select 1 from unnest(${designs.tags}) as tag where tag ilike ${pattern})`)!)
  }
  if (filter.tag) conditions.push(arrayContains(designs.tags, [filter.tag]))
  return and(...conditions)
}

export async function listDesigns(db: DatabaseOrTransaction, workspaceId: string, filter: { search?: string; tag?: string; page: number; pageSize: number }) {
  const where = listFilter(workspaceId, filter)
  const [rows, [total]] = await Promise.all([
    db
      .select(summaryColumns)
      .from(designs)
      .where(where)
      .orderBy(desc(designs.createdAt), desc(designs.id))
      .limit(filter.pageSize)
      .offset((filter.page - 1) * filter.pageSize),
    db.select({ value: count() }).from(designs).where(where),
  ])
  return { rows, total: total?.value ?? 0 }
}

export async function listWorkspaceTags(db: DatabaseOrTransaction, workspaceId: string): Promise<string[]> {
  const result = await db.execute<{ tag: string }>(sql`select distinct unnest(${designs.tags}) as tag from ${designs} where ${designs.workspaceId} = ${workspaceId} order by tag`)
  return result.rows.map((row) => row.tag)
}

export async function findDesign(db: DatabaseOrTransaction, workspaceId: string, designId: string) {
  const [row] = await db
    .select({ design: designs, createdByName: users.name })
    .from(designs)
    .leftJoin(users, eq(users.id, designs.createdBy))
    .where(and(eq(designs.workspaceId, workspaceId), eq(designs.id, designId)))
  return row
}

export async function updateDesign(db: DatabaseOrTransaction, workspaceId: string, designId: string, changes: Partial<Pick<DesignRow, 'name' | 'tags' | 'keepTogether'>>) {
  const [row] = await db
    .update(designs)
    .set({ ...changes, updatedAt: new Date() })
    .where(and(eq(designs.workspaceId, workspaceId), eq(designs.id, designId)))
    .returning({ id: designs.id })
  return row
}

export async function deleteDesign(db: DatabaseOrTransaction, workspaceId: string, designId: string) {
  const [row] = await db
    .delete(designs)
    .where(and(eq(designs.workspaceId, workspaceId), eq(designs.id, designId)))
    .returning({ id: designs.id })
  return row
}
