import { and, asc, count, eq, ilike, isNotNull, isNull, or, type SQL } from 'drizzle-orm'
import type { DatabaseOrTransaction } from '../../db/client.js'
import { materials, stockItems } from '../../db/schema/index.js'

export type StockRow = typeof stockItems.$inferSelect
export type NewStockRow = typeof stockItems.$inferInsert

const rowColumns = {
  item: stockItems,
  materialName: materials.name,
  materialCategory: materials.category,
}
export type StockRowWithMaterial = { item: StockRow; materialName: string | null; materialCategory: string | null }

export interface StockFilter {
  search?: string
  kind?: 'sheet' | 'roll'
  materialId?: string
  status: 'active' | 'archived' | 'all'
  remnants?: 'only' | 'exclude'
  page: number
  pageSize: number
}

const likePattern = (text: string) => `%${text.replace(/[\\%_]/g, (match) => `\\${match}`)}%`

function listFilter(workspaceId: string, filter: StockFilter): SQL | undefined {
  const conditions: SQL[] = [eq(stockItems.workspaceId, workspaceId)]
  if (filter.search) {
    const pattern = likePattern(filter.search)
    conditions.push(or(ilike(stockItems.name, pattern), ilike(stockItems.supplierNote, pattern), ilike(materials.name, pattern))!)
  }
  if (filter.kind) conditions.push(eq(stockItems.kind, filter.kind))
  if (filter.materialId) conditions.push(eq(stockItems.materialId, filter.materialId))
  if (filter.remnants === 'only') conditions.push(eq(stockItems.isRemnant, true))
  if (filter.remnants === 'exclude') conditions.push(eq(stockItems.isRemnant, false))
  if (filter.status === 'active') conditions.push(isNull(stockItems.archivedAt))
  if (filter.status === 'archived') conditions.push(isNotNull(stockItems.archivedAt))
  return and(...conditions)
}

export async function listStock(db: DatabaseOrTransaction, workspaceId: string, filter: StockFilter) {
  const where = listFilter(workspaceId, filter)
  const [rows, [total]] = await Promise.all([
    db
      .select(rowColumns)
      .from(stockItems)
      .leftJoin(materials, eq(materials.id, stockItems.materialId))
      .where(where)
      .orderBy(asc(stockItems.name), asc(stockItems.id))
      .limit(filter.pageSize)
      .offset((filter.page - 1) * filter.pageSize),
    db.select({ value: count() }).from(stockItems).leftJoin(materials, eq(materials.id, stockItems.materialId)).where(where),
  ])
  return { rows: rows as StockRowWithMaterial[], total: total?.value ?? 0 }
}

export async function findStock(db: DatabaseOrTransaction, workspaceId: string, stockId: string): Promise<StockRowWithMaterial | undefined> {
  const [row] = await db
    .select(rowColumns)
    .from(stockItems)
    .leftJoin(materials, eq(materials.id, stockItems.materialId))
    .where(and(eq(stockItems.workspaceId, workspaceId), eq(stockItems.id, stockId)))
  return row as StockRowWithMaterial | undefined
}

export async function insertStock(db: DatabaseOrTransaction, row: NewStockRow) {
  const [inserted] = await db.insert(stockItems).values(row).returning({ id: stockItems.id })
  return inserted!
}

export async function updateStock(db: DatabaseOrTransaction, workspaceId: string, stockId: string, changes: Partial<NewStockRow>) {
  const [row] = await db
    .update(stockItems)
    .set({ ...changes, updatedAt: new Date() })
    .where(and(eq(stockItems.workspaceId, workspaceId), eq(stockItems.id, stockId)))
    .returning({ id: stockItems.id })
  return row
}

export async function deleteStock(db: DatabaseOrTransaction, workspaceId: string, stockId: string) {
  const [row] = await db
    .delete(stockItems)
    .where(and(eq(stockItems.workspaceId, workspaceId), eq(stockItems.id, stockId)))
    .returning({ id: stockItems.id })
  return row
}

export async function materialInWorkspace(db: DatabaseOrTransaction, workspaceId: string, materialId: string): Promise<boolean> {
  const [row] = await db
    .select({ id: materials.id })
    .from(materials)
    .where(and(eq(materials.workspaceId, workspaceId), eq(materials.id, materialId)))
  return row !== undefined
}
