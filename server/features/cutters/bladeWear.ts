import { and, desc, eq, gte, isNull, or, sql } from 'drizzle-orm'
import { bladeWearStatus, defaultBladeWearLimitsM, wearLimitM } from '../../../shared/cutters/wear.js'
import type { CurrentBlade, TestCutPromptDto } from '../../../shared/schemas/cutters.js'
import type { DatabaseOrTransaction } from '../../db/client.js'
import { blades, bladeWear, cutters, testCuts } from '../../db/schema/index.js'
import { invalidField, notFound } from '../../errors.js'
import * as repo from './cutters.repo.js'

/**
 * Blade wear for the cutters feature and for jobs: which blade is fitted, how far it has cut against the studio's
 * limit, adding a done job's cut length to it once, and whether a material needs a test cut on a fresh blade.
 */

/** The workspace's wear limits (metres per blade type) laid over the starting points. */
export async function wearLimitsOf(db: DatabaseOrTransaction, workspaceId: string): Promise<Record<string, number>> {
  const row = await repo.settingsRow(db, workspaceId)
  return { ...defaultBladeWearLimitsM, ...(row?.bladeWearLimitsM ?? {}) }
}

/** Total cut length (mm) per blade. */
export async function wornMmOf(db: DatabaseOrTransaction, bladeIds: string[]): Promise<Map<string, number>> {
  const totals = new Map<string, number>(bladeIds.map((id) => [id, 0]))
  for (const row of await repo.wearByBladeAndMaterial(db, bladeIds)) totals.set(row.bladeId, (totals.get(row.bladeId) ?? 0) + row.cutLengthMm)
  return totals
}

export function toCurrentBlade(row: repo.BladeWithNames, wornMm: number, limitsM: Record<string, number>): CurrentBlade {
  const status = bladeWearStatus(wornMm, wearLimitM(row.blade.bladeType, limitsM))
  return {
    id: row.blade.id,
    bladeType: row.blade.bladeType,
    angleDeg: row.blade.angleDeg,
    label: row.blade.label,
    fittedAt: row.blade.fittedAt.toISOString(),
    fittedByName: row.fittedByName,
    wornMm: status.wornMm,
    limitMm: status.limitMm,
    wearRatio: status.ratio,
    wearLevel: status.level,
  }
}

/** The current blade of each cutter (cutter id → blade with wear); cutters without a fitted blade are absent. */
export async function currentBladesByCutter(db: DatabaseOrTransaction, workspaceId: string, cutterIds: string[]): Promise<Map<string, CurrentBlade>> {
  const rows = await repo.currentBladesOf(db, workspaceId, cutterIds)
  // Newest first: should two ever be open at once, the later fit is the one in the machine.
  const byCutter = new Map<string, repo.BladeWithNames>()
  for (const row of rows) if (!byCutter.has(row.blade.cutterId)) byCutter.set(row.blade.cutterId, row)
  const [worn, limitsM] = await Promise.all([wornMmOf(db, [...byCutter.values()].map((row) => row.blade.id)), wearLimitsOf(db, workspaceId)])
  return new Map([...byCutter].map(([cutterId, row]) => [cutterId, toCurrentBlade(row, worn.get(row.blade.id) ?? 0, limitsM)]))
}

/** The blade fitted on a cutter now, with its wear; null when none is recorded. */
export async function currentBladeOf(db: DatabaseOrTransaction, workspaceId: string, cutterId: string): Promise<CurrentBlade | null> {
  return (await currentBladesByCutter(db, workspaceId, [cutterId])).get(cutterId) ?? null
}

export interface AddBladeWear {
  workspaceId: string
  bladeId: string
  /** The done job; null for wear entered by hand (e.g. carried over from before the blade was recorded). */
  jobId: string | null
  materialId: string | null
  /** Cut length × passes (× quantity) of the job, mm. */
  cutLengthMm: number
  userId: string | null
}

/**
 * Adds a job's cut length to a blade. A job counts once per blade (unique blade + job): calling it again for the
 * same job, e.g. when a job is marked done a second time, adds nothing and answers `added: false`.
 */
export async function addBladeWear(tx: DatabaseOrTransaction, wear: AddBladeWear): Promise<{ added: boolean }> {
  if (!Number.isFinite(wear.cutLengthMm) || wear.cutLengthMm < 0) throw invalidField('cutLengthMm', 'Cut length must be a number of at least 0 mm')
  const [blade] = await tx
    .select({ id: blades.id })
    .from(blades)
    .where(and(eq(blades.workspaceId, wear.workspaceId), eq(blades.id, wear.bladeId)))
  if (!blade) throw notFound('Blade')
  const inserted = await tx
    .insert(bladeWear)
    .values({ workspaceId: wear.workspaceId, bladeId: wear.bladeId, jobId: wear.jobId, materialId: wear.materialId, cutLengthMm: wear.cutLengthMm, createdBy: wear.userId })
    .onConflictDoNothing()
    .returning({ id: bladeWear.id })
  return { added: inserted.length > 0 }
}

/**
 * Whether a job of `materialId` on a cutter should start with a test cut: yes when a blade is fitted and that
 * material has neither a test cut logged with that blade (or on that cutter since the fit) nor any wear on it yet.
 * Settings drift after a blade swap, so the first job of each material checks the recipe on a test piece.
 */
export async function testCutPrompt(db: DatabaseOrTransaction, query: { workspaceId: string; cutterId: string; materialId: string }): Promise<TestCutPromptDto> {
  const [cutter] = await db
    .select({ toolKind: cutters.toolKind })
    .from(cutters)
    .where(and(eq(cutters.workspaceId, query.workspaceId), eq(cutters.id, query.cutterId)))
  if (!cutter) throw notFound('Cutter')
  const [blade] = await db
    .select({ id: blades.id, fittedAt: blades.fittedAt })
    .from(blades)
    .where(and(eq(blades.workspaceId, query.workspaceId), eq(blades.cutterId, query.cutterId), isNull(blades.retiredAt)))
    .orderBy(desc(blades.fittedAt))
    .limit(1)
  if (!blade) {
    const reason = cutter.toolKind === 'blade' ? 'No blade is recorded on this cutter' : `A ${cutter.toolKind} has no blade to swap`
    return { needed: false, bladeId: null, fittedAt: null, reason }
  }
  const base = { bladeId: blade.id, fittedAt: blade.fittedAt.toISOString() }
  const [testCut] = await db
    .select({ id: testCuts.id })
    .from(testCuts)
    .where(
      and(
        eq(testCuts.workspaceId, query.workspaceId),
        eq(testCuts.materialId, query.materialId),
        or(eq(testCuts.bladeId, blade.id), and(eq(testCuts.cutterId, query.cutterId), gte(testCuts.createdAt, blade.fittedAt))),
      ),
    )
    .limit(1)
  if (testCut) return { needed: false, ...base, reason: 'A test cut of this material was logged with the current blade' }
  const [worn] = await db
    .select({ one: sql<number>`1` })
    .from(bladeWear)
    .where(and(eq(bladeWear.bladeId, blade.id), eq(bladeWear.materialId, query.materialId)))
    .limit(1)
  if (worn) return { needed: false, ...base, reason: 'The current blade has already cut this material in a done job' }
  const day = blade.fittedAt.toISOString().slice(0, 10)
  return { needed: true, ...base, reason: `A new blade was fitted on ${day}: log a test cut of this material before the first job` }
}
