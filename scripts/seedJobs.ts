// Seeds the demo studio's jobs through the jobs service (so done jobs take stock, add blade wear and keep remnants the
// way the API does), then moves their dates back to tell a few months of history. Idempotent: a workspace that already
// has jobs is left as it is.
import { and, asc, count, eq, inArray, isNull } from 'drizzle-orm'
import type { AppContext } from '../server/context.js'
import { cutJobEvents, cutJobs, cutters, layouts, stockItems, users } from '../server/db/schema/index.js'
import * as jobsService from '../server/features/jobs/jobs.service.js'
import { demoJobs } from '../fixtures/demo-jobs.js'

const dayMs = 24 * 60 * 60 * 1000

export async function seedJobs(context: AppContext, workspaceId: string): Promise<{ jobsAdded: number }> {
  const { db } = context
  const [existing] = await db.select({ value: count() }).from(cutJobs).where(eq(cutJobs.workspaceId, workspaceId))
  if ((existing?.value ?? 0) > 0) return { jobsAdded: 0 }

  const layoutRows = await db.select({ id: layouts.id, name: layouts.name }).from(layouts).where(eq(layouts.workspaceId, workspaceId))
  const stockRows = await db.select({ id: stockItems.id, name: stockItems.name }).from(stockItems).where(eq(stockItems.workspaceId, workspaceId))
  const people = await db.select({ id: users.id, email: users.email }).from(users).where(inArray(users.email, [...new Set(demoJobs.map((job) => job.by))]))
  // The studio's first blade cutter cuts the demo jobs; without cutters the jobs still tell their story.
  const [cutter] = await db
    .select({ id: cutters.id })
    .from(cutters)
    .where(and(eq(cutters.workspaceId, workspaceId), eq(cutters.toolKind, 'blade'), isNull(cutters.archivedAt)))
    .orderBy(asc(cutters.createdAt), asc(cutters.name))
    .limit(1)

  const now = Date.now()
  const day = (offset: number) => new Date(now + offset * dayMs).toISOString().slice(0, 10)
  let jobsAdded = 0
  // Oldest first, so job numbers follow the story.
  for (const demo of demoJobs) {
    const layoutId = layoutRows.find((row) => row.name === demo.layout)?.id
    const stockItemId = stockRows.find((row) => row.name === demo.stock)?.id
    const userId = people.find((person) => person.email === demo.by)?.id
    if (!layoutId || !stockItemId || !userId) {
      console.log(`==> demo job "${demo.title}" skipped: its layout, stock or person is missing`)
      continue
    }
    let job = await jobsService.createJob(context, workspaceId, userId, {
      title: demo.title,
      layoutId,
      comparisonId: null,
      stockItemId,
      cutterId: cutter?.id ?? null,
      quantity: demo.quantity,
      customerName: demo.customerName,
      dueDate: demo.dueInDays === null ? null : day(demo.dueInDays),
      notes: demo.notes,
    })
    const steps: ('cutting' | 'done' | 'scrapped')[] = demo.status === 'done' ? ['cutting', 'done'] : demo.status === 'cutting' ? ['cutting'] : demo.status === 'scrapped' ? ['scrapped'] : []
    for (const status of steps) {
      const last = status === steps[steps.length - 1]
      job = await jobsService.changeStatus(context, workspaceId, job.id, userId, {
        status,
        version: job.version,
        note: last ? (demo.note ?? '') : '',
        keepRemnant: status === 'done' && (demo.keepRemnant ?? false),
        allowShortStock: true,
      })
    }
    if (demo.daysAgo !== undefined) {
      // The story's dates: created two days before it was finished, each step an hour apart.
      const finishedAt = new Date(now - demo.daysAgo * dayMs)
      const createdAt = new Date(finishedAt.getTime() - 2 * dayMs)
      await db
        .update(cutJobs)
        .set({ createdAt, updatedAt: finishedAt, ...(demo.status === 'done' ? { doneAt: finishedAt } : {}) })
        .where(eq(cutJobs.id, job.id))
      const events = await db.select({ id: cutJobEvents.id, toStatus: cutJobEvents.toStatus }).from(cutJobEvents).where(eq(cutJobEvents.jobId, job.id))
      for (const event of events) {
        const at = event.toStatus === 'planned' ? createdAt : event.toStatus === 'cutting' ? new Date(finishedAt.getTime() - 60 * 60 * 1000) : finishedAt
        await db.update(cutJobEvents).set({ at }).where(eq(cutJobEvents.id, event.id))
      }
    }
    jobsAdded++
  }
  return { jobsAdded }
}
