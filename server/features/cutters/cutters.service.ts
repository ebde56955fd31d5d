import type { z } from 'zod'
import { bladeTypes, bladeWearStatus, defaultBladeWearLimitsM, wearLimitM } from '../../../shared/cutters/wear.js'
import {
  createCutterRequestSchema,
  type Blade,
  type BladeListResponse,
  type CareDue,
  type CareEvent,
  type CareEventListResponse,
  type CareReminder,
  type Cutter,
  type CutterListResponse,
  type CurrentBlade,
  type DeleteCutterResponse,
  type StudioSettings,
  type careEventListQuerySchema,
  type createCareEventRequestSchema,
  type fitBladeRequestSchema,
  type updateCutterRequestSchema,
  type updateStudioSettingsRequestSchema,
} from '../../../shared/schemas/cutters.js'
import type { Role } from '../../../shared/schemas/workspaces.js'
import type { AppContext } from '../../context.js'
import type { DatabaseOrTransaction } from '../../db/client.js'
import { AppError, conflict, forbidden, invalidField, notFound } from '../../errors.js'
import { zodFieldMessages } from '../../middleware/parseRequest.js'
import { addBladeWear, currentBladesByCutter, wearLimitsOf } from './bladeWear.js'
import * as repo from './cutters.repo.js'

const dayMs = 24 * 60 * 60 * 1000
/** A date sent from a browser may run a little ahead of the server's clock; more than this is "in the future". */
const clockSkewMs = 5 * 60 * 1000

/** When each reminder's care is due: interval days after it was last done (or after the cutter was added). */
export function careDueOf(reminders: CareReminder[], lastDone: Map<string, Date>, cutterCreatedAt: Date, now = new Date()): CareDue[] {
  return reminders.map((reminder) => {
    const last = lastDone.get(reminder.kind) ?? null
    const due = new Date((last ?? cutterCreatedAt).getTime() + reminder.intervalDays * dayMs)
    return { kind: reminder.kind, intervalDays: reminder.intervalDays, lastDoneAt: last?.toISOString() ?? null, dueAt: due.toISOString(), overdue: due.getTime() < now.getTime() }
  })
}

function toCutter(row: repo.CutterRow, currentBlade: CurrentBlade | null, lastDone: Map<string, Date>): Cutter {
  return {
    id: row.id,
    name: row.name,
    toolKind: row.toolKind,
    cuttingWidthMm: row.cuttingWidthMm,
    maxLengthMm: row.maxLengthMm,
    cutSpeedMmS: row.cutSpeedMmS,
    travelSpeedMmS: row.travelSpeedMmS,
    accelerationMmS2: row.accelerationMmS2,
    liftLowerS: row.liftLowerS,
    cornerAngleDeg: row.cornerAngleDeg,
    forceMin: row.forceMin,
    forceMax: row.forceMax,
    origin: row.origin as Cutter['origin'],
    swapAxes: row.swapAxes,
    careReminders: row.careReminders,
    notes: row.notes,
    archived: row.archivedAt !== null,
    currentBlade,
    careDue: careDueOf(row.careReminders, lastDone, row.createdAt),
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  }
}

/** When each kind of care was last done, per cutter (cutter id → kind → date). */
export async function lastCareByCutter(db: DatabaseOrTransaction, cutterIds: string[]): Promise<Map<string, Map<string, Date>>> {
  const lastByCutter = new Map<string, Map<string, Date>>()
  for (const entry of await repo.lastCareOf(db, cutterIds)) {
    if (!entry.lastDoneAt) continue
    const map = lastByCutter.get(entry.cutterId) ?? new Map<string, Date>()
    map.set(entry.kind, new Date(entry.lastDoneAt))
    lastByCutter.set(entry.cutterId, map)
  }
  return lastByCutter
}

async function toCutters(db: DatabaseOrTransaction, workspaceId: string, rows: repo.CutterRow[]): Promise<Cutter[]> {
  const ids = rows.map((row) => row.id)
  const [current, lastByCutter] = await Promise.all([currentBladesByCutter(db, workspaceId, ids), lastCareByCutter(db, ids)])
  return rows.map((row) => toCutter(row, current.get(row.id) ?? null, lastByCutter.get(row.id) ?? new Map()))
}

export async function listCutters(context: AppContext, workspaceId: string, filter: repo.CutterFilter): Promise<CutterListResponse> {
  const { rows, total } = await repo.listCutters(context.db, workspaceId, filter)
  return { items: await toCutters(context.db, workspaceId, rows), total, page: filter.page, pageSize: filter.pageSize }
}

export async function requireCutter(db: DatabaseOrTransaction, workspaceId: string, cutterId: string, lock = false): Promise<repo.CutterRow> {
  const row = await repo.findCutter(db, workspaceId, cutterId, lock)
  if (!row) throw notFound('Cutter')
  return row
}

export async function getCutter(context: AppContext, workspaceId: string, cutterId: string): Promise<Cutter> {
  const row = await requireCutter(context.db, workspaceId, cutterId)
  return (await toCutters(context.db, workspaceId, [row]))[0]!
}

type ValidCutter = z.output<typeof createCutterRequestSchema>

function columnsOf(cutter: ValidCutter): Omit<repo.NewCutterRow, 'workspaceId'> {
  // Pens and lasers have no cutting force: a range left over from a blade profile would mislead.
  const force = cutter.toolKind === 'blade' ? { forceMin: cutter.forceMin, forceMax: cutter.forceMax } : { forceMin: null, forceMax: null }
  return {
    name: cutter.name,
    toolKind: cutter.toolKind,
    cuttingWidthMm: cutter.cuttingWidthMm,
    maxLengthMm: cutter.maxLengthMm,
    cutSpeedMmS: cutter.cutSpeedMmS,
    travelSpeedMmS: cutter.travelSpeedMmS,
    accelerationMmS2: cutter.accelerationMmS2,
    liftLowerS: cutter.liftLowerS,
    cornerAngleDeg: cutter.cornerAngleDeg,
    ...force,
    origin: cutter.origin,
    swapAxes: cutter.swapAxes,
    careReminders: cutter.careReminders,
    notes: cutter.notes,
  }
}

export async function createCutter(context: AppContext, workspaceId: string, userId: string, body: ValidCutter): Promise<Cutter> {
  const row = await repo.insertCutter(context.db, { ...columnsOf(body), workspaceId, createdBy: userId })
  return getCutter(context, workspaceId, row.id)
}

/** The stored cutter with the change laid over it, checked as a whole: a new lowest force must stay under the highest. */
export async function updateCutter(context: AppContext, workspaceId: string, cutterId: string, changes: z.output<typeof updateCutterRequestSchema>): Promise<Cutter> {
  const current = await requireCutter(context.db, workspaceId, cutterId)
  const { archived, ...rest } = changes
  const defined = Object.fromEntries(Object.entries(rest).filter(([, value]) => value !== undefined))
  const checked = createCutterRequestSchema.safeParse({ ...columnsOf(current as unknown as ValidCutter), ...defined })
  if (!checked.success) {
    const fields = zodFieldMessages(checked.error, 'body')
    const [first] = Object.keys(fields)
    throw new AppError('validation_failed', 400, `Check ${Object.keys(fields).join(', ')}: ${fields[first!]![0]}`, fields)
  }
  const archivedAt = archived === undefined ? {} : { archivedAt: archived ? (current.archivedAt ?? new Date()) : null }
  await repo.updateCutter(context.db, workspaceId, cutterId, { ...columnsOf(checked.data), ...archivedAt })
  return getCutter(context, workspaceId, cutterId)
}

/**
 * Deletes a cutter nothing refers to. A cutter with jobs, blades, care events or test cuts keeps its history: it is
 * archived instead (it leaves pickers but stays readable), and the answer says which happened.
 */
export async function deleteCutter(context: AppContext, workspaceId: string, cutterId: string): Promise<DeleteCutterResponse> {
  return context.db.transaction(async (tx) => {
    const current = await requireCutter(tx, workspaceId, cutterId, true)
    const references = await repo.cutterReferences(tx, cutterId)
    if (Object.values(references).some((value) => value > 0)) {
      if (!current.archivedAt) await repo.updateCutter(tx, workspaceId, cutterId, { archivedAt: new Date() })
      return { result: 'archived' as const, cutter: (await toCutters(tx, workspaceId, [(await repo.findCutter(tx, workspaceId, cutterId))!]))[0]! }
    }
    await repo.deleteCutter(tx, workspaceId, cutterId)
    return { result: 'deleted' as const, cutter: null }
  })
}

// Blades

async function toBlades(db: DatabaseOrTransaction, workspaceId: string, rows: repo.BladeWithNames[]): Promise<Blade[]> {
  const ids = rows.map((row) => row.blade.id)
  const [wearRows, limitsM] = await Promise.all([repo.wearByBladeAndMaterial(db, ids), wearLimitsOf(db, workspaceId)])
  return rows.map((row) => {
    const byMaterial = wearRows
      .filter((wear) => wear.bladeId === row.blade.id)
      .map((wear) => ({
        materialId: wear.materialId,
        materialName: wear.materialId === null ? 'Carried over or unknown material' : (wear.materialName ?? 'Deleted material'),
        cutLengthMm: wear.cutLengthMm,
      }))
      .sort((a, b) => b.cutLengthMm - a.cutLengthMm)
    const status = bladeWearStatus(
      byMaterial.reduce((sum, wear) => sum + wear.cutLengthMm, 0),
      wearLimitM(row.blade.bladeType, limitsM),
    )
    return {
      id: row.blade.id,
      cutterId: row.blade.cutterId,
      bladeType: row.blade.bladeType,
      angleDeg: row.blade.angleDeg,
      label: row.blade.label,
      fittedAt: row.blade.fittedAt.toISOString(),
      fittedByName: row.fittedByName,
      retiredAt: row.blade.retiredAt?.toISOString() ?? null,
      retiredByName: row.retiredByName,
      retireReason: row.blade.retireReason,
      current: row.blade.retiredAt === null,
      wornMm: status.wornMm,
      limitMm: status.limitMm,
      wearRatio: status.ratio,
      wearLevel: status.level,
      wearByMaterial: byMaterial,
    }
  })
}

export async function listBlades(context: AppContext, workspaceId: string, cutterId: string, page: { page: number; pageSize: number }): Promise<BladeListResponse> {
  await requireCutter(context.db, workspaceId, cutterId)
  const { rows, total } = await repo.listBlades(context.db, workspaceId, cutterId, page)
  return { items: await toBlades(context.db, workspaceId, rows), total, page: page.page, pageSize: page.pageSize }
}

export async function getBlade(context: AppContext, workspaceId: string, cutterId: string, bladeId: string): Promise<Blade> {
  const row = await repo.findBlade(context.db, workspaceId, bladeId)
  if (!row || row.blade.cutterId !== cutterId) throw notFound('Blade')
  return (await toBlades(context.db, workspaceId, [row]))[0]!
}

function checkNotFuture(date: Date, field: string, what: string): void {
  if (date.getTime() > Date.now() + clockSkewMs) throw invalidField(field, `${what} cannot be in the future`)
}

/**
 * Fits a blade: the cutter's current blade is retired, the new one recorded, wear carried over by a used blade
 * entered, and a blade swap written to the care log, all in one transaction (the cutter row is locked so two fits
 * at once cannot leave two blades in one holder).
 */
export async function fitBlade(context: AppContext, workspaceId: string, cutterId: string, userId: string, body: z.output<typeof fitBladeRequestSchema>): Promise<Blade> {
  const bladeId = await context.db.transaction(async (tx) => {
    const cutter = await requireCutter(tx, workspaceId, cutterId, true)
    if (cutter.toolKind !== 'blade') throw conflict(`${cutter.name} is a ${cutter.toolKind} cutter: only blade cutters take blades`)
    if (cutter.archivedAt) throw conflict(`${cutter.name} is archived: restore it before fitting a blade`)
    const limitsM = await wearLimitsOf(tx, workspaceId)
    const known = [...new Set([...bladeTypes, ...Object.keys(limitsM)])]
    if (!known.includes(body.bladeType)) throw invalidField('body.bladeType', `Blade type must be one of ${known.join(', ')}`)
    const fittedAt = body.fittedAt ? new Date(body.fittedAt) : new Date()
    checkNotFuture(fittedAt, 'body.fittedAt', 'The fitted date')
    const openBlades = await repo.currentBladesOf(tx, workspaceId, [cutterId])
    const previous = openBlades[0]
    for (const open of openBlades) {
      if (fittedAt.getTime() < open.blade.fittedAt.getTime()) {
        throw invalidField('body.fittedAt', `The fitted date must not be before the current blade's (${open.blade.fittedAt.toISOString().slice(0, 10)})`)
      }
      await repo.retireBlade(tx, open.blade.id, { retiredAt: fittedAt, retiredBy: userId, retireReason: body.previousRetireReason || 'Replaced by a new blade' })
    }
    const blade = await repo.insertBlade(tx, { workspaceId, cutterId, bladeType: body.bladeType, angleDeg: body.angleDeg, label: body.label, fittedAt, fittedBy: userId })
    if (body.carriedOverWearM > 0) {
      await addBladeWear(tx, { workspaceId, bladeId: blade.id, jobId: null, materialId: null, cutLengthMm: body.carriedOverWearM * 1000, userId })
    }
    const label = body.label ? ` "${body.label}"` : ''
    const swapNote = `Fitted a ${body.bladeType} ${body.angleDeg}° blade${label}${previous ? `; the previous ${previous.blade.bladeType} blade was retired` : ''}.`
    await repo.insertCareEvent(tx, { workspaceId, cutterId, kind: 'blade_swap', note: body.note ? `${swapNote} ${body.note}` : swapNote, doneAt: fittedAt, doneBy: userId })
    await repo.updateCutter(tx, workspaceId, cutterId, {})
    return blade.id
  })
  return getBlade(context, workspaceId, cutterId, bladeId)
}

export async function retireBlade(context: AppContext, workspaceId: string, cutterId: string, bladeId: string, userId: string, reason: string): Promise<Blade> {
  await context.db.transaction(async (tx) => {
    await requireCutter(tx, workspaceId, cutterId, true)
    const found = await repo.findBlade(tx, workspaceId, bladeId)
    if (!found || found.blade.cutterId !== cutterId) throw notFound('Blade')
    if (found.blade.retiredAt) throw conflict(`This blade was already retired on ${found.blade.retiredAt.toISOString().slice(0, 10)}`)
    await repo.retireBlade(tx, bladeId, { retiredAt: new Date(), retiredBy: userId, retireReason: reason })
  })
  return getBlade(context, workspaceId, cutterId, bladeId)
}

// Care log

function toCareEvent(row: repo.CareEventWithName): CareEvent {
  return {
    id: row.event.id,
    cutterId: row.event.cutterId,
    kind: row.event.kind,
    note: row.event.note,
    doneAt: row.event.doneAt.toISOString(),
    doneByName: row.doneByName,
    doneById: row.event.doneBy,
  }
}

export async function listCareEvents(context: AppContext, workspaceId: string, cutterId: string, filter: z.output<typeof careEventListQuerySchema>): Promise<CareEventListResponse> {
  await requireCutter(context.db, workspaceId, cutterId)
  const { rows, total } = await repo.listCareEvents(context.db, workspaceId, cutterId, filter)
  return { items: rows.map(toCareEvent), total, page: filter.page, pageSize: filter.pageSize }
}

export async function createCareEvent(context: AppContext, workspaceId: string, cutterId: string, userId: string, body: z.output<typeof createCareEventRequestSchema>): Promise<CareEvent> {
  await requireCutter(context.db, workspaceId, cutterId)
  const doneAt = body.doneAt ? new Date(body.doneAt) : new Date()
  checkNotFuture(doneAt, 'body.doneAt', 'The done date')
  const { id } = await repo.insertCareEvent(context.db, { workspaceId, cutterId, kind: body.kind, note: body.note, doneAt, doneBy: userId })
  return toCareEvent((await repo.findCareEvent(context.db, workspaceId, cutterId, id))!)
}

/** Members delete their own entries; owners may delete any (e.g. one logged on the wrong cutter by someone else). */
export async function deleteCareEvent(context: AppContext, workspaceId: string, cutterId: string, careEventId: string, user: { id: string; role: Role }): Promise<void> {
  const found = await repo.findCareEvent(context.db, workspaceId, cutterId, careEventId)
  if (!found) throw notFound('Care event')
  if (user.role !== 'owner' && found.event.doneBy !== user.id) throw forbidden('Only the person who logged this care event, or an owner, can delete it')
  await repo.deleteCareEvent(context.db, careEventId)
}

// Studio settings

export async function getStudioSettings(context: AppContext, workspaceId: string): Promise<StudioSettings> {
  const row = await repo.settingsRow(context.db, workspaceId)
  return {
    bladeWearLimitsM: { ...defaultBladeWearLimitsM, ...(row?.bladeWearLimitsM ?? {}) },
    dueSoonDays: row?.dueSoonDays ?? 7,
    startingPointLimitsM: { ...defaultBladeWearLimitsM },
    updatedAt: row?.updatedAt.toISOString() ?? null,
  }
}

/** Wear limits sent replace the workspace's table (a type left out goes back to its starting point). */
export async function updateStudioSettings(context: AppContext, workspaceId: string, body: z.output<typeof updateStudioSettingsRequestSchema>): Promise<StudioSettings> {
  const current = await repo.settingsRow(context.db, workspaceId)
  await repo.upsertSettings(context.db, workspaceId, {
    bladeWearLimitsM: body.bladeWearLimitsM ?? current?.bladeWearLimitsM ?? {},
    dueSoonDays: body.dueSoonDays ?? current?.dueSoonDays ?? 7,
  })
  return getStudioSettings(context, workspaceId)
}
