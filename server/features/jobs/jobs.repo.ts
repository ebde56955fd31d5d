import { and, asc, count, desc, eq, gte, ilike, inArray, isNotNull, lte, or, sql, type SQL } from 'drizzle-orm'
import { alias } from 'drizzle-orm/pg-core'
import type { DatabaseOrTransaction } from '../../db/client.js'
import { comparisons, cutJobEvents, cutJobs, cutters, layouts, materialRecipes, materials, stockItems, studioSettings, users } from '../../db/schema/index.js'

export type JobRow = typeof cutJobs.$inferSelect
export type NewJobRow = typeof cutJobs.$inferInsert

const remnants = alias(stockItems, 'remnant_items')

const rowColumns = {
  job: cutJobs,
  layoutName: layouts.name,
  materialName: materials.name,
  stock: { id: stockItems.id, name: stockItems.name, kind: stockItems.kind, isRemnant: stockItems.isRemnant, quantityOnHand: stockItems.quantityOnHand, lengthMm: stockItems.lengthMm },
  cutter: { id: cutters.id, name: cutters.name, toolKind: cutters.toolKind },
  remnant: { id: remnants.id, name: remnants.name, kind: remnants.kind, widthMm: remnants.widthMm, heightMm: remnants.heightMm, lengthMm: remnants.lengthMm, outline: remnants.outline },
}

export interface JobRowWithNames {
  job: JobRow
  layoutName: string | null
  materialName: string | null
  stock: { id: string; name: string; kind: 'sheet' | 'roll'; isRemnant: boolean; quantityOnHand: number; lengthMm: number | null } | null
  cutter: { id: string; name: string; toolKind: 'blade' | 'pen' | 'laser' } | null
  remnant: { id: string; name: string; kind: 'sheet' | 'roll'; widthMm: number; heightMm: number | null; lengthMm: number | null; outline: Array<Array<[number, number]>> | null } | null
}

function selectJobs(db: DatabaseOrTransaction) {
  return db
    .select(rowColumns)
    .from(cutJobs)
    .leftJoin(layouts, eq(layouts.id, cutJobs.layoutId))
    .leftJoin(materials, eq(materials.id, cutJobs.materialId))
    .leftJoin(stockItems, eq(stockItems.id, cutJobs.stockItemId))
    .leftJoin(cutters, eq(cutters.id, cutJobs.cutterId))
    .leftJoin(remnants, eq(remnants.id, cutJobs.remnantStockItemId))
}

export interface JobFilter {
  search?: string
  status?: 'planned' | 'cutting' | 'done' | 'scrapped' | 'open'
  materialId?: string
  cutterId?: string
  dueBefore?: string
  dueAfter?: string
  /** Open jobs with a due date up to this day (overdue ones included). */
  dueUpTo?: string
  page: number
  pageSize: number
}

const likePattern = (text: string) => `%${text.replace(/[\\%_]/g, (match) => `\\${match}`)}%`

function listFilter(workspaceId: string, filter: JobFilter): SQL | undefined {
  const conditions: SQL[] = [eq(cutJobs.workspaceId, workspaceId)]
  if (filter.search) {
    const pattern = likePattern(filter.search)
    const asNumber = /^\d{1,9}$/.test(filter.search.replace(/^job\s*/i, '')) ? Number(filter.search.replace(/^job\s*/i, '')) : null
    conditions.push(
      or(ilike(cutJobs.title, pattern), ilike(cutJobs.customerName, pattern), ilike(cutJobs.notes, pattern), ...(asNumber === null ? [] : [eq(cutJobs.number, asNumber)]))!,
    )
  }
  if (filter.status === 'open' || filter.dueUpTo) conditions.push(inArray(cutJobs.status, ['planned', 'cutting']))
  else if (filter.status) conditions.push(eq(cutJobs.status, filter.status))
  if (filter.materialId) conditions.push(eq(cutJobs.materialId, filter.materialId))
  if (filter.cutterId) conditions.push(eq(cutJobs.cutterId, filter.cutterId))
  if (filter.dueBefore) conditions.push(lte(cutJobs.dueDate, filter.dueBefore))
  if (filter.dueAfter) conditions.push(gte(cutJobs.dueDate, filter.dueAfter))
  if (filter.dueUpTo) conditions.push(isNotNull(cutJobs.dueDate), lte(cutJobs.dueDate, filter.dueUpTo))
  return and(...conditions)
}

/** Due-soon lists read by due date; other lists newest job first. */
export async function listJobs(db: DatabaseOrTransaction, workspaceId: string, filter: JobFilter) {
  const where = listFilter(workspaceId, filter)
  const order = filter.dueUpTo ? [asc(cutJobs.dueDate), asc(cutJobs.number)] : [desc(cutJobs.number)]
  const [rows, [total]] = await Promise.all([
    selectJobs(db)
      .where(where)
      .orderBy(...order)
      .limit(filter.pageSize)
      .offset((filter.page - 1) * filter.pageSize),
    db.select({ value: count() }).from(cutJobs).where(where),
  ])
  return { rows: rows as JobRowWithNames[], total: total?.value ?? 0 }
}

export async function findJob(db: DatabaseOrTransaction, workspaceId: string, jobId: string): Promise<JobRowWithNames | undefined> {
  const [row] = await selectJobs(db).where(and(eq(cutJobs.workspaceId, workspaceId), eq(cutJobs.id, jobId)))
  return row as JobRowWithNames | undefined
}

/** The job row locked for a status change, so two people marking it done at once cannot both take stock. */
export async function lockJob(db: DatabaseOrTransaction, workspaceId: string, jobId: string): Promise<JobRow | undefined> {
  const [row] = await db
    .select()
    .from(cutJobs)
    .where(and(eq(cutJobs.workspaceId, workspaceId), eq(cutJobs.id, jobId)))
    .for('update')
  return row
}

/** Next job number of the workspace; call inside the inserting transaction (the advisory lock serialises numbering). */
export async function nextJobNumber(db: DatabaseOrTransaction, workspaceId: string): Promise<number> {
  await db.execute(sql`select pg_advisory_xact_lock(hashtext(${`cut_jobs:${workspaceId}`}))`)
  const [row] = await db
    .select({ value: sql<number>`coalesce(max(${cutJobs.number}), 0)::int` })
    .from(cutJobs)
    .where(eq(cutJobs.workspaceId, workspaceId))
  return (row?.value ?? 0) + 1
}

export async function insertJob(db: DatabaseOrTransaction, row: NewJobRow): Promise<JobRow> {
  const [inserted] = await db.insert(cutJobs).values(row).returning()
  return inserted!
}

export async function updateJob(db: DatabaseOrTransaction, workspaceId: string, jobId: string, changes: Partial<NewJobRow>) {
  const [row] = await db
    .update(cutJobs)
    .set({ ...changes, updatedAt: new Date() })
    .where(and(eq(cutJobs.workspaceId, workspaceId), eq(cutJobs.id, jobId)))
    .returning({ id: cutJobs.id })
  return row
}

export async function deleteJob(db: DatabaseOrTransaction, workspaceId: string, jobId: string) {
  const [row] = await db
    .delete(cutJobs)
    .where(and(eq(cutJobs.workspaceId, workspaceId), eq(cutJobs.id, jobId)))
    .returning({ id: cutJobs.id })
  return row
}

export async function insertEvent(db: DatabaseOrTransaction, row: typeof cutJobEvents.$inferInsert) {
  await db.insert(cutJobEvents).values(row)
}

export async function eventsOf(db: DatabaseOrTransaction, jobId: string) {
  return db
    .select({ fromStatus: cutJobEvents.fromStatus, toStatus: cutJobEvents.toStatus, note: cutJobEvents.note, at: cutJobEvents.at, byName: users.name })
    .from(cutJobEvents)
    .leftJoin(users, eq(users.id, cutJobEvents.byUserId))
    .where(eq(cutJobEvents.jobId, jobId))
    .orderBy(asc(cutJobEvents.at), asc(cutJobEvents.id))
}

export async function dueSoonDaysOf(db: DatabaseOrTransaction, workspaceId: string): Promise<number> {
  const [row] = await db.select({ dueSoonDays: studioSettings.dueSoonDays }).from(studioSettings).where(eq(studioSettings.workspaceId, workspaceId))
  return row?.dueSoonDays ?? 7
}

/** Passes of the material's cut recipe for a tool kind (blade or laser); null without a recipe. */
export async function recipePasses(db: DatabaseOrTransaction, workspaceId: string, materialId: string, toolKind: 'blade' | 'laser'): Promise<number | null> {
  const [row] = await db
    .select({ passes: materialRecipes.passes })
    .from(materialRecipes)
    .where(and(eq(materialRecipes.workspaceId, workspaceId), eq(materialRecipes.materialId, materialId), eq(materialRecipes.toolKind, toolKind)))
  return row?.passes ?? null
}

export async function lockStockItem(db: DatabaseOrTransaction, workspaceId: string, stockItemId: string) {
  const [row] = await db
    .select()
    .from(stockItems)
    .where(and(eq(stockItems.workspaceId, workspaceId), eq(stockItems.id, stockItemId)))
    .for('update')
  return row
}

export async function findStockItem(db: DatabaseOrTransaction, workspaceId: string, stockItemId: string) {
  const [row] = await db
    .select()
    .from(stockItems)
    .where(and(eq(stockItems.workspaceId, workspaceId), eq(stockItems.id, stockItemId)))
  return row
}

export async function findCutterRow(db: DatabaseOrTransaction, workspaceId: string, cutterId: string) {
  const [row] = await db
    .select()
    .from(cutters)
    .where(and(eq(cutters.workspaceId, workspaceId), eq(cutters.id, cutterId)))
  return row
}

export async function materialExists(db: DatabaseOrTransaction, workspaceId: string, materialId: string): Promise<boolean> {
  const [row] = await db
    .select({ id: materials.id })
    .from(materials)
    .where(and(eq(materials.workspaceId, workspaceId), eq(materials.id, materialId)))
  return row !== undefined
}

export async function comparisonExists(db: DatabaseOrTransaction, workspaceId: string, comparisonId: string): Promise<boolean> {
  const [row] = await db
    .select({ id: comparisons.id })
    .from(comparisons)
    .where(and(eq(comparisons.workspaceId, workspaceId), eq(comparisons.id, comparisonId)))
  return row !== undefined
}

export async function setStockOnHand(db: DatabaseOrTransaction, stockItemId: string, onHand: { quantityOnHand: number; lengthMm: number | null }) {
  await db
    .update(stockItems)
    .set({ ...onHand, updatedAt: new Date() })
    .where(eq(stockItems.id, stockItemId))
}
