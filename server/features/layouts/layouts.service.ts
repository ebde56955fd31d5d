import { z } from 'zod'
import { computeLayoutFigures, type DesignForLayout } from '../../../shared/layout/figures.js'
import {
  copyLayoutRequestSchema,
  createLayoutRequestSchema,
  layoutListQuerySchema,
  updateLayoutRequestSchema,
  type LayoutDetail,
  type LayoutItem,
  type LayoutListResponse,
  type LayoutOptions,
  type LayoutPlacement,
  type LayoutStock,
  type LayoutSummary,
  type LayoutVersionConflictDetails,
} from '../../../shared/schemas/layouts.js'
import type { AppContext } from '../../context.js'
import type { DatabaseOrTransaction } from '../../db/client.js'
import { AppError, notFound } from '../../errors.js'
import * as repo from './layouts.repo.js'

export type CreateLayoutInput = z.output<typeof createLayoutRequestSchema>
export type UpdateLayoutInput = z.output<typeof updateLayoutRequestSchema>
export type CopyLayoutInput = z.output<typeof copyLayoutRequestSchema>
export type LayoutListQuery = z.output<typeof layoutListQuerySchema>

interface LayoutBody {
  stock: LayoutStock
  items: LayoutItem[]
  placements: LayoutPlacement[]
  options: LayoutOptions
}

/** One answer names at most this many fields: a broken client could otherwise get thousands back. */
const maxReportedFields = 50

const uniqueDesignIds = (items: { designId: string }[]) => [...new Set(items.map((item) => item.designId))]

function toSummary(row: repo.LayoutSummaryRow): LayoutSummary {
  return {
    id: row.id,
    name: row.name,
    isTemplate: row.isTemplate,
    version: row.version,
    stock: row.stock,
    figures: row.figures,
    designIds: uniqueDesignIds(row.items),
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
    updatedByName: row.updatedByName,
  }
}

function toDetail(row: repo.LayoutRow, updatedByName: string | null): LayoutDetail {
  return { ...toSummary({ ...row, updatedByName }), items: row.items, placements: row.placements, options: row.options }
}

async function loadDesigns(db: DatabaseOrTransaction, workspaceId: string, body: Pick<LayoutBody, 'items' | 'placements'>): Promise<Map<string, DesignForLayout>> {
  const ids = uniqueDesignIds([...body.items, ...body.placements])
  const rows = await repo.findDesignsForLayout(db, workspaceId, ids)
  return new Map(rows.map((row) => [row.id, { geometry: row.geometry, keepTogether: row.keepTogether }]))
}

/**
 * The rules zod cannot see: every design is in this workspace, a placed design is among the items, piece indices fit
 * the design, sheets exist, placement ids are unique. Overlaps and pieces off the stock are allowed: a layout may be
 * saved half-done, and the editor shows them.
 */
function checkAgainstDesigns(body: LayoutBody, designs: Map<string, DesignForLayout>): void {
  const fields: Record<string, string[]> = {}
  const add = (field: string, message: string) => {
    if (Object.keys(fields).length < maxReportedFields) (fields[field] ??= []).push(message)
  }
  const laneCount = body.stock.kind === 'sheets' ? body.stock.sheetCount : 1
  const sheetMessage =
    body.stock.kind === 'sheets'
      ? `This layout has ${laneCount} sheet${laneCount === 1 ? '' : 's'}: use a sheet index from 0 to ${laneCount - 1}`
      : body.stock.kind === 'roll'
        ? 'A roll is one piece of stock: use sheet 0'
        : 'A stock of its own outline is one piece of stock: use sheet 0'

  body.items.forEach((item, index) => {
    if (!designs.has(item.designId)) add(`body.items.${index}.designId`, 'No such design in this workspace')
  })
  const itemDesigns = new Set(body.items.map((item) => item.designId))
  const placementIds = new Set<string>()
  body.placements.forEach((placement, index) => {
    const design = designs.get(placement.designId)
    if (!design) add(`body.placements.${index}.designId`, 'No such design in this workspace')
    else if (!itemDesigns.has(placement.designId)) add(`body.placements.${index}.designId`, 'Add this design to the items before placing it')
    else {
      const pieceCount = design.geometry.pieces.length
      if (placement.pieceIndex >= pieceCount) {
        add(
          `body.placements.${index}.pieceIndex`,
          pieceCount === 0 ? 'This design has no pieces: place it whole (-1)' : `This design has ${pieceCount} piece${pieceCount === 1 ? '' : 's'}: use 0 to ${pieceCount - 1}, or -1 for the whole design`,
        )
      }
    }
    if (placement.sheet >= laneCount) add(`body.placements.${index}.sheet`, sheetMessage)
    if (placementIds.has(placement.id)) add(`body.placements.${index}.id`, 'Each placed piece needs its own id')
    placementIds.add(placement.id)
  })
  body.options.excludedZones.forEach((zone, index) => {
    if (zone.sheet >= laneCount) add(`body.options.excludedZones.${index}.sheet`, sheetMessage)
  })

  const names = Object.keys(fields)
  if (names.length > 0) {
    const shown = names.length > 3 ? `${names.slice(0, 3).join(', ')} and ${names.length - 3} more` : names.join(', ')
    throw new AppError('validation_failed', 400, `Check ${shown}: ${fields[names[0]!]![0]}`, fields)
  }
}

/** The stored content of a save: the checked body plus figures computed here, never the client's. */
async function prepareContent(db: DatabaseOrTransaction, workspaceId: string, body: LayoutBody & { name: string; isTemplate: boolean }): Promise<repo.LayoutContent> {
  const designs = await loadDesigns(db, workspaceId, body)
  checkAgainstDesigns(body, designs)
  return {
    name: body.name,
    isTemplate: body.isTemplate,
    stock: body.stock,
    items: body.items,
    placements: body.placements,
    options: body.options,
    figures: computeLayoutFigures(body, designs),
  }
}

async function readBack(db: DatabaseOrTransaction, workspaceId: string, layoutId: string): Promise<LayoutDetail> {
  const found = await repo.findLayout(db, workspaceId, layoutId)
  if (!found) throw notFound('Layout')
  return toDetail(found.layout, found.updatedByName)
}

export async function createLayout(context: AppContext, workspaceId: string, userId: string, body: CreateLayoutInput): Promise<LayoutDetail> {
  const content = await prepareContent(context.db, workspaceId, body)
  const row = await repo.insertLayout(context.db, { ...content, workspaceId, createdBy: userId, updatedBy: userId })
  return readBack(context.db, workspaceId, row.id)
}

export async function listLayouts(context: AppContext, workspaceId: string, query: LayoutListQuery): Promise<LayoutListResponse> {
  const { rows, total } = await repo.listLayouts(context.db, workspaceId, query)
  return { items: rows.map(toSummary), total, page: query.page, pageSize: query.pageSize }
}

export async function getLayout(context: AppContext, workspaceId: string, layoutId: string): Promise<LayoutDetail> {
  return readBack(context.db, workspaceId, layoutId)
}

/**
 * Saves over the version the editor started from. A save based on an older version is refused with 409
 * `layout_version_conflict` (details: the version now stored, when and by whom) and changes nothing.
 */
export async function updateLayout(context: AppContext, workspaceId: string, layoutId: string, userId: string, body: UpdateLayoutInput): Promise<LayoutDetail> {
  const existing = await repo.findLayout(context.db, workspaceId, layoutId)
  if (!existing) throw notFound('Layout')
  // Checked before the content, so a stale editor hears "reload" rather than complaints about a layout it never saw.
  if (existing.layout.version !== body.version) throw versionConflict(existing, body.version)
  const content = await prepareContent(context.db, workspaceId, { ...body, isTemplate: body.isTemplate ?? existing.layout.isTemplate })
  const updated = await repo.updateLayoutAtVersion(context.db, workspaceId, layoutId, body.version, { ...content, updatedBy: userId })
  if (!updated) {
    // Someone saved between the read above and this write.
    const current = await repo.findLayout(context.db, workspaceId, layoutId)
    if (!current) throw notFound('Layout')
    throw versionConflict(current, body.version)
  }
  return readBack(context.db, workspaceId, layoutId)
}

function versionConflict(current: { layout: repo.LayoutRow; updatedByName: string | null }, editedVersion: number): AppError {
  const details: LayoutVersionConflictDetails = {
    currentVersion: current.layout.version,
    updatedAt: current.layout.updatedAt.toISOString(),
    updatedByName: current.updatedByName,
  }
  const who = current.updatedByName ? ` by ${current.updatedByName}` : ''
  return new AppError(
    'layout_version_conflict',
    409,
    `This layout was saved${who} after you opened it (now version ${current.layout.version}, yours was ${editedVersion}). Reload it and apply your change again.`,
    undefined,
    details,
  )
}

export async function deleteLayout(context: AppContext, workspaceId: string, layoutId: string): Promise<void> {
  const deleted = await repo.deleteLayout(context.db, workspaceId, layoutId)
  if (!deleted) throw notFound('Layout')
}

/** A copy within the same kind is "… (copy)"; a template turned into a layout (or the other way) keeps its name. */
function nameOfCopy(source: repo.LayoutRow, isTemplate: boolean): string {
  if (source.isTemplate !== isTemplate) return source.name
  const suffix = ' (copy)'
  return `${source.name.slice(0, 120 - suffix.length)}${suffix}`
}

/**
 * Duplicates a layout, starts a layout from a template, or saves a layout as a template: a new row at version 1 with
 * figures computed afresh. Designs deleted since the source was saved are left out of the copy (items and their
 * placements), so a template outliving a design still gives a layout that can be saved.
 */
export async function copyLayout(context: AppContext, workspaceId: string, layoutId: string, userId: string, request: CopyLayoutInput): Promise<LayoutDetail> {
  const found = await repo.findLayout(context.db, workspaceId, layoutId)
  if (!found) throw notFound('Layout')
  const source = found.layout
  const designs = await loadDesigns(context.db, workspaceId, source)
  const body: LayoutBody & { name: string; isTemplate: boolean } = {
    name: request.name ?? nameOfCopy(source, request.isTemplate),
    isTemplate: request.isTemplate,
    stock: source.stock,
    items: source.items.filter((item) => designs.has(item.designId)),
    placements: source.placements.filter((placement) => designs.has(placement.designId)),
    options: source.options,
  }
  const content = await prepareContent(context.db, workspaceId, body)
  const row = await repo.insertLayout(context.db, { ...content, workspaceId, createdBy: userId, updatedBy: userId })
  return readBack(context.db, workspaceId, row.id)
}
