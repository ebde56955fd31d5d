import { and, desc, eq, gte, isNull, sql } from 'drizzle-orm'
import type { Dashboard } from '../../../shared/schemas/jobs.js'
import type { AppContext } from '../../context.js'
import { cutJobs, cutters, materials, testCuts, users } from '../../db/schema/index.js'
import { currentBladesByCutter } from '../cutters/bladeWear.js'
import { careDueOf, lastCareByCutter } from '../cutters/cutters.service.js'
import * as jobsRepo from '../jobs/jobs.repo.js'
import { dayFromToday, summariesOf } from '../jobs/jobs.service.js'

const dayMs = 24 * 60 * 60 * 1000
const monthsShown = 6

/** The first day (UTC) of each of the last `count` months, oldest first, as YYYY-MM. */
export function lastMonths(count: number, now = new Date()): string[] {
  return Array.from({ length: count }, (_, index) => {
    const day = new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth() - (count - 1 - index), 1))
    return day.toISOString().slice(0, 7)
  })
}

/**
 * The workspace home: open jobs due within the studio's due-soon days (and overdue ones), every fitted blade with its
 * wear (most worn first), the latest test cuts, care that is due within the same window, and material used and wasted
 * per month from done jobs.
 */
export async function getDashboard(context: AppContext, workspaceId: string): Promise<Dashboard> {
  const { db } = context
  const dueSoonDays = await jobsRepo.dueSoonDaysOf(db, workspaceId)
  const now = new Date()

  const dueRows = await jobsRepo.listJobs(db, workspaceId, { dueUpTo: dayFromToday(dueSoonDays), page: 1, pageSize: 10 })
  const dueJobs = await summariesOf(db, workspaceId, dueRows.rows, dueSoonDays)

  const activeCutters = await db
    .select({ id: cutters.id, name: cutters.name, toolKind: cutters.toolKind, careReminders: cutters.careReminders, createdAt: cutters.createdAt })
    .from(cutters)
    .where(and(eq(cutters.workspaceId, workspaceId), isNull(cutters.archivedAt)))
  const bladeCutters = activeCutters.filter((cutter) => cutter.toolKind === 'blade')
  const current = bladeCutters.length === 0 ? new Map() : await currentBladesByCutter(db, workspaceId, bladeCutters.map((cutter) => cutter.id))
  const blades = bladeCutters
    .flatMap((cutter) => {
      const blade = current.get(cutter.id)
      if (!blade) return []
      return [
        {
          cutter: { id: cutter.id, name: cutter.name },
          bladeId: blade.id,
          bladeType: blade.bladeType,
          fittedAt: blade.fittedAt,
          wornMm: blade.wornMm,
          limitMm: blade.limitMm,
          wearRatio: blade.wearRatio,
          wearLevel: blade.wearLevel,
        },
      ]
    })
    .sort((a, b) => b.wearRatio - a.wearRatio)

  const testCutRows = await db
    .select({ id: testCuts.id, materialId: materials.id, materialName: materials.name, outcome: testCuts.outcome, cutterName: cutters.name, byName: users.name, at: testCuts.createdAt })
    .from(testCuts)
    .innerJoin(materials, eq(materials.id, testCuts.materialId))
    .leftJoin(cutters, eq(cutters.id, testCuts.cutterId))
    .leftJoin(users, eq(users.id, testCuts.createdBy))
    .where(eq(testCuts.workspaceId, workspaceId))
    .orderBy(desc(testCuts.createdAt))
    .limit(5)

  // Care reminders, as the cutters page computes them; never done counts from the cutter's creation.
  const withReminders = activeCutters.filter((cutter) => cutter.careReminders.length > 0)
  const lastByCutter = await lastCareByCutter(db, withReminders.map((cutter) => cutter.id))
  const horizon = now.getTime() + dueSoonDays * dayMs
  const careReminders = withReminders
    .flatMap((cutter) =>
      careDueOf(cutter.careReminders, lastByCutter.get(cutter.id) ?? new Map(), cutter.createdAt, now).map((due) => ({ cutter: { id: cutter.id, name: cutter.name }, ...due })),
    )
    .filter((reminder) => new Date(reminder.dueAt).getTime() <= horizon)
    .sort((a, b) => a.dueAt.localeCompare(b.dueAt))

  const months = lastMonths(monthsShown, now)
  const monthRows = await db
    .select({
      month: sql<string>`to_char(${cutJobs.doneAt} at time zone 'UTC', 'YYYY-MM')`,
      usedMm2: sql<number>`coalesce(sum((${cutJobs.usage}->>'stockAreaMm2')::double precision), 0)::double precision`,
      wastedMm2: sql<number>`coalesce(sum((${cutJobs.usage}->>'wasteAreaMm2')::double precision), 0)::double precision`,
      jobs: sql<number>`count(*)::int`,
    })
    .from(cutJobs)
    .where(and(eq(cutJobs.workspaceId, workspaceId), eq(cutJobs.status, 'done'), gte(cutJobs.doneAt, new Date(`${months[0]}-01T00:00:00Z`))))
    .groupBy(sql`1`)
  const byMonth = new Map(monthRows.map((row) => [row.month, row]))
  const materialByMonth = months.map((month) => {
    const row = byMonth.get(month)
    return { month, usedM2: Number(row?.usedMm2 ?? 0) / 1e6, wastedM2: Number(row?.wastedMm2 ?? 0) / 1e6, jobs: Number(row?.jobs ?? 0) }
  })

  return {
    dueSoonDays,
    dueJobs,
    blades,
    recentTestCuts: testCutRows.map((row) => ({
      id: row.id,
      material: { id: row.materialId, name: row.materialName },
      outcome: row.outcome,
      cutterName: row.cutterName,
      byName: row.byName,
      at: row.at.toISOString(),
    })),
    careReminders,
    materialByMonth,
  }
}
