import { and, asc, count, desc, eq, inArray, isNotNull, isNull, max, sql, type SQL } from 'drizzle-orm'
import { alias } from 'drizzle-orm/pg-core'
import type { DatabaseOrTransaction } from '../../db/client.js'
import { blades, bladeWear, careEvents, cutJobs, cutters, materials, studioSettings, testCuts, users } from '../../db/schema/index.js'

export type CutterRow = typeof cutters.$inferSelect
export type NewCutterRow = typeof cutters.$inferInsert
export type BladeRow = typeof blades.$inferSelect
export type NewBladeRow = typeof blades.$inferInsert
export type CareEventRow = typeof careEvents.$inferSelect

export interface CutterFilter {
  status: 'active' | 'archived' | 'all'
  toolKind?: 'blade' | 'pen' | 'laser'
  page: number
  pageSize: number
}

export async function listCutters(db: DatabaseOrTransaction, workspaceId: string, filter: CutterFilter) {
  const conditions: SQL[] = [eq(cutters.workspaceId, workspaceId)]
  if (filter.status === 'active') conditions.push(isNull(cutters.archivedAt))
  if (filter.status === 'archived') conditions.push(isNotNull(cutters.archivedAt))
  if (filter.toolKind) conditions.push(eq(cutters.toolKind, filter.toolKind))
  const where = and(...conditions)
  const [rows, [total]] = await Promise.all([
    db
      .select()
      .from(cutters)
      .where(where)
      .orderBy(asc(cutters.name), asc(cutters.id))
      .limit(filter.pageSize)
      .offset((filter.page - 1) * filter.pageSize),
    db.select({ value: count() }).from(cutters).where(where),
  ])
  return { rows, total: total?.value ?? 0 }
}

export async function findCutter(db: DatabaseOrTransaction, workspaceId: string, cutterId: string, lock = false): Promise<CutterRow | undefined> {
  const query = db
    .select()
    .from(cutters)
    .where(and(eq(cutters.workspaceId, workspaceId), eq(cutters.id, cutterId)))
  const [row] = lock ? await query.for('update') : await query
  return row
}

export async function insertCutter(db: DatabaseOrTransaction, row: NewCutterRow): Promise<CutterRow> {
  const [inserted] = await db.insert(cutters).values(row).returning()
  return inserted!
}

export async function updateCutter(db: DatabaseOrTransaction, workspaceId: string, cutterId: string, changes: Partial<NewCutterRow>) {
  const [row] = await db
    .update(cutters)
    .set({ ...changes, updatedAt: new Date() })
    .where(and(eq(cutters.workspaceId, workspaceId), eq(cutters.id, cutterId)))
    .returning()
  return row
}

export async function deleteCutter(db: DatabaseOrTransaction, workspaceId: string, cutterId: string) {
  const [row] = await db
    .delete(cutters)
    .where(and(eq(cutters.workspaceId, workspaceId), eq(cutters.id, cutterId)))
    .returning({ id: cutters.id })
  return row
}

/** What refers to a cutter: with any of these the cutter is archived rather than deleted, so no record is lost. */
export async function cutterReferences(db: DatabaseOrTransaction, cutterId: string) {
  const [[jobCount], [bladeCount], [careCount], [testCutCount]] = await Promise.all([
    db.select({ value: count() }).from(cutJobs).where(eq(cutJobs.cutterId, cutterId)),
    db.select({ value: count() }).from(blades).where(eq(blades.cutterId, cutterId)),
    db.select({ value: count() }).from(careEvents).where(eq(careEvents.cutterId, cutterId)),
    db.select({ value: count() }).from(testCuts).where(eq(testCuts.cutterId, cutterId)),
  ])
  return { jobs: jobCount?.value ?? 0, blades: bladeCount?.value ?? 0, careEvents: careCount?.value ?? 0, testCuts: testCutCount?.value ?? 0 }
}

const fitter = alias(users, 'blade_fitter')
const retirer = alias(users, 'blade_retirer')
const bladeColumns = { blade: blades, fittedByName: fitter.name, retiredByName: retirer.name }
export type BladeWithNames = { blade: BladeRow; fittedByName: string | null; retiredByName: string | null }

function bladesWithNames(db: DatabaseOrTransaction, where: SQL | undefined) {
  return db.select(bladeColumns).from(blades).leftJoin(fitter, eq(fitter.id, blades.fittedBy)).leftJoin(retirer, eq(retirer.id, blades.retiredBy)).where(where)
}

/** The fitted (not retired) blade of each cutter; the service keeps at most one per cutter. */
export async function currentBladesOf(db: DatabaseOrTransaction, workspaceId: string, cutterIds: string[]): Promise<BladeWithNames[]> {
  if (cutterIds.length === 0) return []
  return bladesWithNames(db, and(eq(blades.workspaceId, workspaceId), inArray(blades.cutterId, cutterIds), isNull(blades.retiredAt))).orderBy(desc(blades.fittedAt))
}

export async function listBlades(db: DatabaseOrTransaction, workspaceId: string, cutterId: string, page: { page: number; pageSize: number }) {
  const where = and(eq(blades.workspaceId, workspaceId), eq(blades.cutterId, cutterId))
  const [rows, [total]] = await Promise.all([
    bladesWithNames(db, where)
      .orderBy(desc(blades.fittedAt), desc(blades.createdAt))
      .limit(page.pageSize)
      .offset((page.page - 1) * page.pageSize),
    db.select({ value: count() }).from(blades).where(where),
  ])
  return { rows, total: total?.value ?? 0 }
}

export async function findBlade(db: DatabaseOrTransaction, workspaceId: string, bladeId: string): Promise<BladeWithNames | undefined> {
  const [row] = await bladesWithNames(db, and(eq(blades.workspaceId, workspaceId), eq(blades.id, bladeId)))
  return row
}

export async function insertBlade(db: DatabaseOrTransaction, row: NewBladeRow): Promise<BladeRow> {
  const [inserted] = await db.insert(blades).values(row).returning()
  return inserted!
}

export async function retireBlade(db: DatabaseOrTransaction, bladeId: string, change: { retiredAt: Date; retiredBy: string | null; retireReason: string }) {
  const [row] = await db
    .update(blades)
    .set(change)
    .where(and(eq(blades.id, bladeId), isNull(blades.retiredAt)))
    .returning({ id: blades.id })
  return row
}

/** Cut length per blade and material (material null for wear carried over by hand). */
export async function wearByBladeAndMaterial(db: DatabaseOrTransaction, bladeIds: string[]) {
  if (bladeIds.length === 0) return []
  return db
    .select({
      bladeId: bladeWear.bladeId,
      materialId: bladeWear.materialId,
      materialName: materials.name,
      cutLengthMm: sql<number>`sum(${bladeWear.cutLengthMm})`.mapWith(Number),
    })
    .from(bladeWear)
    .leftJoin(materials, eq(materials.id, bladeWear.materialId))
    .where(inArray(bladeWear.bladeId, bladeIds))
    .groupBy(bladeWear.bladeId, bladeWear.materialId, materials.name)
}

export async function settingsRow(db: DatabaseOrTransaction, workspaceId: string) {
  const [row] = await db.select().from(studioSettings).where(eq(studioSettings.workspaceId, workspaceId))
  return row
}

export async function upsertSettings(db: DatabaseOrTransaction, workspaceId: string, values: { bladeWearLimitsM: Record<string, number>; dueSoonDays: number }) {
  await db
    .insert(studioSettings)
    .values({ workspaceId, ...values, updatedAt: new Date() })
    .onConflictDoUpdate({ target: studioSettings.workspaceId, set: { ...values, updatedAt: new Date() } })
}

/** When each kind of care was last done on each cutter. */
export async function lastCareOf(db: DatabaseOrTransaction, cutterIds: string[]) {
  if (cutterIds.length === 0) return []
  return db
    .select({ cutterId: careEvents.cutterId, kind: careEvents.kind, lastDoneAt: max(careEvents.doneAt) })
    .from(careEvents)
    .where(inArray(careEvents.cutterId, cutterIds))
    .groupBy(careEvents.cutterId, careEvents.kind)
}

const careAuthor = alias(users, 'care_author')
export type CareEventWithName = { event: CareEventRow; doneByName: string | null }

export async function listCareEvents(db: DatabaseOrTransaction, workspaceId: string, cutterId: string, filter: { kind?: CareEventRow['kind']; page: number; pageSize: number }) {
  const conditions: SQL[] = [eq(careEvents.workspaceId, workspaceId), eq(careEvents.cutterId, cutterId)]
  if (filter.kind) conditions.push(eq(careEvents.kind, filter.kind))
  const where = and(...conditions)
  const [rows, [total]] = await Promise.all([
    db
      .select({ event: careEvents, doneByName: careAuthor.name })
      .from(careEvents)
      .leftJoin(careAuthor, eq(careAuthor.id, careEvents.doneBy))
      .where(where)
      .orderBy(desc(careEvents.doneAt), desc(careEvents.createdAt))
      .limit(filter.pageSize)
      .offset((filter.page - 1) * filter.pageSize),
    db.select({ value: count() }).from(careEvents).where(where),
  ])
  return { rows: rows as CareEventWithName[], total: total?.value ?? 0 }
}

export async function findCareEvent(db: DatabaseOrTransaction, workspaceId: string, cutterId: string, careEventId: string): Promise<CareEventWithName | undefined> {
  const [row] = await db
    .select({ event: careEvents, doneByName: careAuthor.name })
    .from(careEvents)
    .leftJoin(careAuthor, eq(careAuthor.id, careEvents.doneBy))
    .where(and(eq(careEvents.workspaceId, workspaceId), eq(careEvents.cutterId, cutterId), eq(careEvents.id, careEventId)))
  return row as CareEventWithName | undefined
}

export async function insertCareEvent(db: DatabaseOrTransaction, row: typeof careEvents.$inferInsert) {
  const [inserted] = await db.insert(careEvents).values(row).returning({ id: careEvents.id })
  return inserted!
}

export async function deleteCareEvent(db: DatabaseOrTransaction, careEventId: string) {
  const [row] = await db.delete(careEvents).where(eq(careEvents.id, careEventId)).returning({ id: careEvents.id })
  return row
}
