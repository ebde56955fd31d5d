import { and, count, desc, eq, ilike, inArray } from 'drizzle-orm'
import type { DatabaseOrTransaction } from '../../db/client.js'
import { designs, layouts, users } from '../../db/schema/index.js'

export type LayoutRow = typeof layouts.$inferSelect
export type NewLayoutRow = typeof layouts.$inferInsert
/** What a save writes besides the bookkeeping columns. */
export type LayoutContent = Pick<NewLayoutRow, 'name' | 'isTemplate' | 'stock' | 'items' | 'placements' | 'options' | 'figures'>

/** Columns of a list row: everything but the placements, which can run to thousands. */
const summaryColumns = {
  id: layouts.id,
  name: layouts.name,
  isTemplate: layouts.isTemplate,
  version: layouts.version,
  stock: layouts.stock,
  items: layouts.items,
  figures: layouts.figures,
  createdAt: layouts.createdAt,
  updatedAt: layouts.updatedAt,
  updatedByName: users.name,
}
export type LayoutSummaryRow = { [K in Exclude<keyof typeof summaryColumns, 'updatedByName'>]: LayoutRow[K] } & { updatedByName: string | null }

export async function insertLayout(db: DatabaseOrTransaction, values: NewLayoutRow): Promise<LayoutRow> {
  const [row] = await db.insert(layouts).values(values).returning()
  return row!
}

export interface LayoutListFilter {
  search?: string
  templates: 'only' | 'exclude' | 'include'
  page: number
  pageSize: number
}

function listFilter(workspaceId: string, filter: LayoutListFilter) {
  const conditions = [eq(layouts.workspaceId, workspaceId)]
  if (filter.templates === 'only') conditions.push(eq(layouts.isTemplate, true))
  if (filter.templates === 'exclude') conditions.push(eq(layouts.isTemplate, false))
  if (filter.search) conditions.push(ilike(layouts.name, `%${filter.search.replace(/[\\%_]/g, (match) => `\\${match}`)}%`))
  return and(...conditions)
}

/** Newest saves first. */
export async function listLayouts(db: DatabaseOrTransaction, workspaceId: string, filter: LayoutListFilter) {
  const where = listFilter(workspaceId, filter)
  const [rows, [total]] = await Promise.all([
    db
      .select(summaryColumns)
      .from(layouts)
      .leftJoin(users, eq(users.id, layouts.updatedBy))
      .where(where)
      .orderBy(desc(layouts.updatedAt), desc(layouts.id))
      .limit(filter.pageSize)
      .offset((filter.page - 1) * filter.pageSize),
    db.select({ value: count() }).from(layouts).where(where),
  ])
  return { rows: rows as LayoutSummaryRow[], total: total?.value ?? 0 }
}

export async function findLayout(db: DatabaseOrTransaction, workspaceId: string, layoutId: string) {
  const [row] = await db
    .select({ layout: layouts, updatedByName: users.name })
    .from(layouts)
    .leftJoin(users, eq(users.id, layouts.updatedBy))
    .where(and(eq(layouts.workspaceId, workspaceId), eq(layouts.id, layoutId)))
  return row
}

/**
 * Writes a save only if the stored version is still `version`, and moves it on by one. The check and the write are
 * one statement, so of two saves based on the same version exactly one wins.
 */
export async function updateLayoutAtVersion(
  db: DatabaseOrTransaction,
  workspaceId: string,
  layoutId: string,
  version: number,
  values: LayoutContent & { updatedBy: string },
): Promise<LayoutRow | undefined> {
  const [row] = await db
    .update(layouts)
    .set({ ...values, version: version + 1, updatedAt: new Date() })
    .where(and(eq(layouts.workspaceId, workspaceId), eq(layouts.id, layoutId), eq(layouts.version, version)))
    .returning()
  return row
}

export async function deleteLayout(db: DatabaseOrTransaction, workspaceId: string, layoutId: string) {
  const [row] = await db
    .delete(layouts)
    .where(and(eq(layouts.workspaceId, workspaceId), eq(layouts.id, layoutId)))
    .returning({ id: layouts.id })
  return row
}

/** The geometry the figures are computed from; designs of other workspaces are never found. */
export async function findDesignsForLayout(db: DatabaseOrTransaction, workspaceId: string, designIds: string[]) {
  if (designIds.length === 0) return []
  return db
    .select({ id: designs.id, keepTogether: designs.keepTogether, geometry: designs.geometry })
    .from(designs)
    .where(and(eq(designs.workspaceId, workspaceId), inArray(designs.id, designIds)))
}
