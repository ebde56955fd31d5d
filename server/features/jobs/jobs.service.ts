import { z } from 'zod'
import { sheetRemnant, lastUsedSheet, pointsOfFlatRing, remnantAsStockOutline, polygonArea } from '../../../shared/jobs/remnant.js'
import { isOpenStatus, transitionProblem } from '../../../shared/jobs/status.js'
import { jobUsage, stockAfterJob } from '../../../shared/jobs/usage.js'
import { placedShape } from '../../../shared/layout/placedGeometry.js'
import { polygonStockAreaMm2, usableRegion } from '../../../shared/layout/polygonStock.js'
import type { LayoutStock } from '../../../shared/schemas/layouts.js'
import type { CurrentBlade } from '../../../shared/schemas/cutters.js'
import {
  createJobRequestSchema,
  jobStatusRequestSchema,
  updateJobRequestSchema,
  type Job,
  type JobBladeWear,
  type JobLinks,
  type JobListResponse,
  type JobRemnant,
  type JobStatus,
  type JobSummary,
  type JobUsage,
} from '../../../shared/schemas/jobs.js'
import type { CutPlanQuery } from '../../../shared/schemas/cutplan.js'
import type { AppContext } from '../../context.js'
import type { DatabaseOrTransaction } from '../../db/client.js'
import { AppError, conflict, invalidField, notFound } from '../../errors.js'
import { addBladeWear, currentBladesByCutter, testCutPrompt } from '../cutters/bladeWear.js'
import { getCutPlan } from '../cutplan/cutplan.service.js'
import { findDesignsForLayout, findLayout } from '../layouts/layouts.repo.js'
import { insertStock } from '../stock/stock.repo.js'
import * as repo from './jobs.repo.js'

export type CreateJobInput = z.output<typeof createJobRequestSchema>
export type UpdateJobInput = z.output<typeof updateJobRequestSchema>
export type JobStatusInput = z.output<typeof jobStatusRequestSchema>
export interface JobListInput extends Omit<repo.JobFilter, 'dueUpTo'> {
  dueSoon?: boolean
}

const apiBase = (workspaceId: string) => `/api/workspaces/${workspaceId}`

/** Today's date (UTC) plus `days`, as YYYY-MM-DD. */
export function dayFromToday(days: number, now = new Date()): string {
  const day = new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), now.getUTCDate() + days))
  return day.toISOString().slice(0, 10)
}

function dueStateOf(status: JobStatus, dueDate: string | null, dueSoonDays: number): JobSummary['dueState'] {
  if (!dueDate || !isOpenStatus(status)) return null
  if (dueDate < dayFromToday(0)) return 'overdue'
  return dueDate <= dayFromToday(dueSoonDays) ? 'due-soon' : null
}

export function toBladeWear(blade: CurrentBlade | undefined): JobBladeWear | null {
  if (!blade) return null
  return {
    bladeId: blade.id,
    bladeType: blade.bladeType,
    fittedAt: blade.fittedAt,
    wornMm: blade.wornMm,
    limitMm: blade.limitMm,
    wearRatio: blade.wearRatio,
    wearLevel: blade.wearLevel,
  }
}

function toRemnant(row: repo.JobRowWithNames['remnant']): JobRemnant | null {
  if (!row) return null
  const areaMm2 = row.kind === 'sheet' ? (row.outline && row.outline.length > 0 ? polygonArea(row.outline) : row.widthMm * (row.heightMm ?? 0)) : row.widthMm * (row.lengthMm ?? 0)
  return { id: row.id, name: row.name, kind: row.kind, areaMm2, lengthMm: row.kind === 'roll' ? row.lengthMm : null }
}

function toSummary(row: repo.JobRowWithNames, dueSoonDays: number, blades: Map<string, CurrentBlade>): JobSummary {
  const { job } = row
  return {
    id: job.id,
    number: job.number,
    title: job.title,
    status: job.status,
    layout: job.layoutId && row.layoutName !== null ? { id: job.layoutId, name: row.layoutName } : null,
    comparisonId: job.comparisonId,
    material: job.materialId && row.materialName !== null ? { id: job.materialId, name: row.materialName } : null,
    stock: row.stock ? { id: row.stock.id, name: row.stock.name, kind: row.stock.kind, isRemnant: row.stock.isRemnant } : null,
    cutter: row.cutter ? { id: row.cutter.id, name: row.cutter.name, toolKind: row.cutter.toolKind } : null,
    quantity: job.quantity,
    customerName: job.customerName,
    dueDate: job.dueDate,
    dueState: dueStateOf(job.status, job.dueDate, dueSoonDays),
    notes: job.notes,
    usage: job.usage ?? null,
    usedBladeId: job.bladeId,
    bladeWear: row.cutter?.toolKind === 'blade' ? toBladeWear(blades.get(row.cutter.id)) : null,
    remnant: toRemnant(row.remnant),
    version: job.version,
    createdAt: job.createdAt.toISOString(),
    updatedAt: job.updatedAt.toISOString(),
    doneAt: job.doneAt?.toISOString() ?? null,
  }
}

async function bladesFor(db: DatabaseOrTransaction, workspaceId: string, rows: repo.JobRowWithNames[]): Promise<Map<string, CurrentBlade>> {
  const ids = [...new Set(rows.flatMap((row) => (row.cutter?.toolKind === 'blade' ? [row.cutter.id] : [])))]
  return ids.length === 0 ? new Map() : currentBladesByCutter(db, workspaceId, ids)
}

export async function summariesOf(db: DatabaseOrTransaction, workspaceId: string, rows: repo.JobRowWithNames[], dueSoonDays: number): Promise<JobSummary[]> {
  const blades = await bladesFor(db, workspaceId, rows)
  return rows.map((row) => toSummary(row, dueSoonDays, blades))
}

export async function listJobs(context: AppContext, workspaceId: string, query: JobListInput): Promise<JobListResponse> {
  const dueSoonDays = await repo.dueSoonDaysOf(context.db, workspaceId)
  const { dueSoon, ...filter } = query
  const { rows, total } = await repo.listJobs(context.db, workspaceId, { ...filter, ...(dueSoon ? { dueUpTo: dayFromToday(dueSoonDays) } : {}) })
  return { items: await summariesOf(context.db, workspaceId, rows, dueSoonDays), total, page: query.page, pageSize: query.pageSize, dueSoonDays }
}

// ---------------------------------------------------------------------------------------------------------------
// Usage: what one run of the saved layout uses, from its stored figures and the cut plan.

/** Passes come from the material's cut recipe for the cutter's tool (pens draw once); 1 without a recipe. */
export async function passesFor(db: DatabaseOrTransaction, workspaceId: string, materialId: string | null, toolKind: 'blade' | 'pen' | 'laser' | null): Promise<number> {
  if (!materialId || toolKind === 'pen') return 1
  return (await repo.recipePasses(db, workspaceId, materialId, toolKind === 'laser' ? 'laser' : 'blade')) ?? 1
}

interface PlannedUsage {
  usage: JobUsage
  passes: number
  sheetCount: number
}

async function plannedUsageOf(context: AppContext, workspaceId: string, job: repo.JobRow, toolKind: 'blade' | 'pen' | 'laser' | null): Promise<PlannedUsage | null> {
  if (!job.layoutId) return null
  const found = await findLayout(context.db, workspaceId, job.layoutId)
  if (!found) return null
  const passes = await passesFor(context.db, workspaceId, job.materialId, toolKind)
  const query: CutPlanQuery = { passes, ...(job.cutterId ? { cutterId: job.cutterId } : {}) } as CutPlanQuery
  const plan = await getCutPlan(context, workspaceId, job.layoutId, query)
  const { layout } = found
  return {
    usage: jobUsage({ figures: layout.figures, stockKind: usageKindOf(layout.stock), cutPlanCutLengthMm: plan.totals.cutLengthMm, passes, quantity: job.quantity }),
    passes,
    sheetCount: plan.sheets.length,
  }
}

function linksOf(workspaceId: string, job: repo.JobRow, passes: number, sheetCount: number): JobLinks | null {
  if (!job.layoutId) return null
  const layoutPath = `${apiBase(workspaceId)}/layouts/${job.layoutId}`
  const shared = `passes=${passes}${job.cutterId ? `&cutterId=${job.cutterId}` : ''}`
  return {
    cutPlan: `${layoutPath}/cut-plan?${shared}`,
    jobSheetPdf: `${layoutPath}/export?format=pdf&${shared}${job.materialId ? `&materialId=${job.materialId}` : ''}`,
    sheets: Array.from({ length: sheetCount }, (_, sheet) => ({
      sheet,
      svg: `${layoutPath}/export?format=svg&sheet=${sheet}&${shared}`,
      hpgl: `${layoutPath}/export?format=hpgl&sheet=${sheet}&${shared}`,
    })),
  }
}

export async function getJob(context: AppContext, workspaceId: string, jobId: string): Promise<Job> {
  const row = await repo.findJob(context.db, workspaceId, jobId)
  if (!row) throw notFound('Job')
  const { job } = row
  const dueSoonDays = await repo.dueSoonDaysOf(context.db, workspaceId)
  const [summary] = await summariesOf(context.db, workspaceId, [row], dueSoonDays)
  const toolKind = row.cutter?.toolKind ?? null
  const [planned, events, prompt] = await Promise.all([
    plannedUsageOf(context, workspaceId, job, toolKind).catch((error: unknown) => {
      // A layout whose designs are gone cannot be planned; the job still shows.
      if (error instanceof AppError && error.status < 500) return null
      throw error
    }),
    repo.eventsOf(context.db, job.id),
    job.cutterId && job.materialId && isOpenStatus(job.status) ? testCutPrompt(context.db, { workspaceId, cutterId: job.cutterId, materialId: job.materialId }) : Promise.resolve(null),
  ])
  return {
    ...summary!,
    plannedUsage: job.usage ?? planned?.usage ?? null,
    stockOnHand: row.stock ? { quantityOnHand: row.stock.quantityOnHand, lengthMm: row.stock.kind === 'roll' ? row.stock.lengthMm : null } : null,
    testCutPrompt: prompt,
    events: events.map((event) => ({ fromStatus: event.fromStatus, toStatus: event.toStatus, byName: event.byName, at: event.at.toISOString(), note: event.note })),
    links: linksOf(workspaceId, job, job.usage?.passes ?? planned?.passes ?? 1, planned?.sheetCount ?? 1),
  }
}

// ---------------------------------------------------------------------------------------------------------------
// Create and edit

const layoutKindWord = { sheets: 'sheets', roll: 'a roll' } as const

/** A polygon stock (a remnant laid out again) is one sheet of its own outline: it is used, counted and checked as sheets. */
const usageKindOf = (stock: LayoutStock): 'sheets' | 'roll' => (stock.kind === 'roll' ? 'roll' : 'sheets')

/** The references of a job must be in this workspace and fit together: a sheet layout on sheet stock, a roll on a roll. */
async function checkReferences(
  db: DatabaseOrTransaction,
  workspaceId: string,
  refs: { layoutId?: string | null; stockItemId?: string; materialId?: string | null; cutterId?: string | null; comparisonId?: string | null },
  layoutKind: 'sheets' | 'roll' | null,
): Promise<{ stockMaterialId: string | null }> {
  const fields: Record<string, string[]> = {}
  let stockMaterialId: string | null = null
  if (refs.stockItemId) {
    const stock = await repo.findStockItem(db, workspaceId, refs.stockItemId)
    if (!stock) fields['body.stockItemId'] = ['No such stock item in this workspace']
    else if (stock.archivedAt) fields['body.stockItemId'] = ['This stock item is archived: pick one on the shelf']
    else if (layoutKind && (layoutKind === 'sheets') !== (stock.kind === 'sheet')) {
      fields['body.stockItemId'] = [`The layout is on ${layoutKindWord[layoutKind]}: pick ${layoutKind === 'sheets' ? 'a sheet' : 'a roll'} stock item`]
    } else stockMaterialId = stock.materialId
  }
  if (refs.materialId && !(await repo.materialExists(db, workspaceId, refs.materialId))) fields['body.materialId'] = ['No such material in this workspace']
  if (refs.cutterId) {
    const cutter = await repo.findCutterRow(db, workspaceId, refs.cutterId)
    if (!cutter) fields['body.cutterId'] = ['No such cutter in this workspace']
    else if (cutter.archivedAt) fields['body.cutterId'] = ['This cutter is archived: pick one in use']
  }
  const names = Object.keys(fields)
  if (names.length > 0) throw new AppError('validation_failed', 400, `Check ${names.join(', ')}: ${fields[names[0]!]![0]}`, fields)
  return { stockMaterialId }
}

export async function createJob(context: AppContext, workspaceId: string, userId: string, body: CreateJobInput): Promise<Job> {
  const found = await findLayout(context.db, workspaceId, body.layoutId)
  if (!found) throw invalidField('body.layoutId', 'No such layout in this workspace')
  if (body.comparisonId && !(await repo.comparisonExists(context.db, workspaceId, body.comparisonId))) {
    throw invalidField('body.comparisonId', 'No such comparison in this workspace')
  }
  const { stockMaterialId } = await checkReferences(context.db, workspaceId, body, usageKindOf(found.layout.stock))
  const id = await context.db.transaction(async (tx) => {
    const number = await repo.nextJobNumber(tx, workspaceId)
    const job = await repo.insertJob(tx, {
      workspaceId,
      number,
      title: body.title ?? found.layout.name,
      layoutId: body.layoutId,
      comparisonId: body.comparisonId,
      materialId: body.materialId === undefined ? stockMaterialId : body.materialId,
      stockItemId: body.stockItemId,
      cutterId: body.cutterId,
      quantity: body.quantity,
      customerName: body.customerName,
      dueDate: body.dueDate,
      notes: body.notes,
      createdBy: userId,
    })
    await repo.insertEvent(tx, { workspaceId, jobId: job.id, fromStatus: null, toStatus: 'planned', byUserId: userId })
    return job.id
  })
  return getJob(context, workspaceId, id)
}

const staleVersion = (current: number) =>
  new AppError('conflict', 409, `This job was changed by someone else (now version ${current}): reload it and try again`, undefined, { reason: 'stale_version', currentVersion: current })

export async function updateJob(context: AppContext, workspaceId: string, jobId: string, body: UpdateJobInput): Promise<Job> {
  await context.db.transaction(async (tx) => {
    const job = await repo.lockJob(tx, workspaceId, jobId)
    if (!job) throw notFound('Job')
    if (job.version !== body.version) throw staleVersion(job.version)
    if (!isOpenStatus(job.status)) throw conflict(`This job is ${job.status}: its details are kept as they were`)
    let layoutKind: 'sheets' | 'roll' | null = null
    if (body.stockItemId && job.layoutId) {
      const layout = (await findLayout(tx, workspaceId, job.layoutId))?.layout
      layoutKind = layout ? usageKindOf(layout.stock) : null
    }
    await checkReferences(tx, workspaceId, body, layoutKind)
    const { version, ...changes } = body
    const defined = Object.fromEntries(Object.entries(changes).filter(([, value]) => value !== undefined))
    await repo.updateJob(tx, workspaceId, jobId, { ...defined, version: version + 1 })
  })
  return getJob(context, workspaceId, jobId)
}

/** Planned and scrapped jobs may be deleted; a done job is the record of stock taken and blade wear added. */
export async function deleteJob(context: AppContext, workspaceId: string, jobId: string): Promise<void> {
  const row = await repo.findJob(context.db, workspaceId, jobId)
  if (!row) throw notFound('Job')
  if (row.job.status === 'done') throw conflict('A done job keeps the record of the stock it used and the blade wear it added: it cannot be deleted')
  if (row.job.status === 'cutting') throw conflict('This job is being cut: put it back to planned or scrap it first')
  await repo.deleteJob(context.db, workspaceId, jobId)
}

// ---------------------------------------------------------------------------------------------------------------
// Status

const remnantName = (number: number, stockName: string) => `Remnant of Job ${number} — ${stockName}`.slice(0, 120)

/**
 * The leftover of the last sheet of the job's layout, in the layout's stock size, grown pieces taken away. On a polygon
 * stock (a remnant laid out again) the leftover is taken from its outline less the margin, so a remnant of a remnant
 * never claims material that was not there.
 */
async function sheetRemnantOf(db: DatabaseOrTransaction, workspaceId: string, layout: NonNullable<Awaited<ReturnType<typeof findLayout>>>['layout']) {
  if (layout.stock.kind === 'roll') return null
  const sheet = lastUsedSheet(layout.placements)
  if (sheet === null) return null
  const placements = layout.placements.filter((placement) => placement.sheet === sheet)
  const designRows = await findDesignsForLayout(db, workspaceId, [...new Set(placements.map((placement) => placement.designId))])
  const designs = new Map(designRows.map((row) => [row.id, { geometry: row.geometry, keepTogether: row.keepTogether }]))
  const pieceOutlines = placements.flatMap((placement) => {
    const design = designs.get(placement.designId)
    if (!design) return []
    return placedShape(design, { ...placement, mirrored: placement.mirrored ?? false }).polygons.map((polygon) => pointsOfFlatRing(polygon.outer))
  })
  const region = layout.stock.kind === 'polygon' ? usableRegion(layout.stock, layout.options.marginMm) : undefined
  return sheetRemnant({ widthMm: layout.stock.widthMm, heightMm: layout.stock.heightMm, marginMm: layout.options.marginMm, spacingMm: layout.options.spacingMm, pieceOutlines, usableRegion: region })
}

/**
 * Moves a job on. Marking it done, in one transaction: works out what it used from the saved layout and cut plan, takes
 * the stock down (refusing with 409 when less is on hand, unless `allowShortStock`), adds the cut length to the blade
 * fitted on a blade cutter, and keeps the leftover as a remnant stock item when asked.
 */
export async function changeStatus(context: AppContext, workspaceId: string, jobId: string, userId: string, body: JobStatusInput): Promise<Job> {
  const before = await repo.findJob(context.db, workspaceId, jobId)
  if (!before) throw notFound('Job')
  const problem = transitionProblem(before.job.status, body.status)
  if (problem) throw new AppError('conflict', 409, problem, undefined, { reason: 'illegal_transition', from: before.job.status, to: body.status })

  // Planned outside the transaction: planning a big layout takes a moment and reads nothing the transaction changes.
  let planned: PlannedUsage | null = null
  if (body.status === 'done') {
    if (!before.job.layoutId) throw conflict('The layout of this job was deleted: there is nothing to measure what it used')
    if (!before.job.stockItemId) throw conflict('Pick the stock item this job is cut from before marking it done')
    planned = await plannedUsageOf(context, workspaceId, before.job, before.cutter?.toolKind ?? null)
    if (!planned) throw conflict('The layout of this job was deleted: there is nothing to measure what it used')
  }

  await context.db.transaction(async (tx) => {
    const job = await repo.lockJob(tx, workspaceId, jobId)
    if (!job) throw notFound('Job')
    if (job.version !== body.version) throw staleVersion(job.version)
    const lockedProblem = transitionProblem(job.status, body.status)
    if (lockedProblem) throw new AppError('conflict', 409, lockedProblem, undefined, { reason: 'illegal_transition', from: job.status, to: body.status })

    const changes: Partial<repo.NewJobRow> = { status: body.status, version: job.version + 1 }
    if (body.status === 'done' && planned) {
      const { usage } = planned
      const stock = await repo.lockStockItem(tx, workspaceId, job.stockItemId!)
      if (!stock) throw conflict('The stock item of this job is gone: pick another before marking it done')
      const after = stockAfterJob({ kind: stock.kind, quantityOnHand: stock.quantityOnHand, lengthMm: stock.lengthMm }, usage, body.keepRemnant)
      if (after.short && !body.allowShortStock) {
        throw new AppError('conflict', 409, `${after.shortMessage}. Update the stock count, or confirm to take it down to nothing`, undefined, {
          reason: 'short_stock',
          quantityOnHand: stock.quantityOnHand,
          lengthMm: stock.lengthMm,
          sheetsUsed: usage.sheetsUsed,
          rollLengthUsedMm: usage.rollLengthUsedMm,
        })
      }
      await repo.setStockOnHand(tx, stock.id, { quantityOnHand: after.quantityOnHand, lengthMm: after.lengthMm })

      if (job.cutterId) {
        const cutter = await repo.findCutterRow(tx, workspaceId, job.cutterId)
        if (cutter?.toolKind === 'blade') {
          const blade = (await currentBladesByCutter(tx, workspaceId, [cutter.id])).get(cutter.id)
          if (blade) {
            await addBladeWear(tx, { workspaceId, bladeId: blade.id, jobId: job.id, materialId: job.materialId, cutLengthMm: usage.cutLengthMm, userId })
            changes.bladeId = blade.id
          }
        }
      }

      if (body.keepRemnant) {
        let remnant: repo.NewJobRow['remnantStockItemId'] = null
        const base = {
          workspaceId,
          name: remnantName(job.number, stock.name),
          materialId: stock.materialId,
          supplierNote: `Left over from Job ${job.number}`,
          isRemnant: true,
          remnantOfJobId: job.id,
          createdBy: userId,
        }
        if (stock.kind === 'roll' && after.remnantLengthMm !== null) {
          remnant = (
            await insertStock(tx, {
              ...base,
              kind: 'roll',
              widthMm: stock.widthMm,
              lengthMm: after.remnantLengthMm,
              marginTopMm: stock.marginTopMm,
              marginRightMm: stock.marginRightMm,
              marginBottomMm: stock.marginBottomMm,
              marginLeftMm: stock.marginLeftMm,
              // Roll prices are per metre: the rest of the roll costs the same per metre.
              price: stock.price,
              quantityOnHand: 1,
            })
          ).id
        } else if (stock.kind === 'sheet') {
          const layout = (await findLayout(tx, workspaceId, job.layoutId!))?.layout
          const leftover = layout ? await sheetRemnantOf(tx, workspaceId, layout) : null
          if (leftover && layout && layout.stock.kind !== 'roll') {
            const shape = remnantAsStockOutline(leftover)
            const sheetAreaMm2 = layout.stock.kind === 'polygon' ? polygonStockAreaMm2(layout.stock) : layout.stock.widthMm * layout.stock.heightMm
            remnant = (
              await insertStock(tx, {
                ...base,
                kind: 'sheet',
                widthMm: shape.widthMm,
                heightMm: shape.heightMm,
                outline: shape.outline,
                // The layout's margin is already outside the outline.
                price: stock.price === null ? null : Math.round(((stock.price * leftover.areaMm2) / sheetAreaMm2) * 10_000) / 10_000,
                // Every run of the job leaves the same leftover on its last sheet.
                quantityOnHand: job.quantity,
              })
            ).id
          }
        }
        changes.remnantStockItemId = remnant
      }
      changes.usage = usage
      changes.doneAt = new Date()
    }
    await repo.updateJob(tx, workspaceId, jobId, changes)
    await repo.insertEvent(tx, { workspaceId, jobId, fromStatus: job.status, toStatus: body.status, note: body.note, byUserId: userId })
  })
  return getJob(context, workspaceId, jobId)
}
