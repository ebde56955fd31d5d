import { randomUUID } from 'node:crypto'
import type { z } from 'zod'
import {
  createComparisonRequestSchema,
  type ComparisonDetail,
  type ComparisonFigures,
  type ComparisonRow as ComparisonRowDto,
  type ComparisonStock,
  type ComparisonSummary,
} from '../../../shared/schemas/comparisons.js'
import { createNestRunRequestSchema, nestRunItemSchema, type NestRunItem, type NestStockInput } from '../../../shared/schemas/nesting.js'
import { bestPerColumn, comparisonFigures, comparisonStatusOf } from '../../../shared/comparisons/costs.js'
import { computeLayoutFigures, type DesignForLayout } from '../../../shared/layout/figures.js'
import { layoutFromNestRun } from '../../../shared/layout/fromNestRun.js'
import { planLayout, type DesignForCutPlan } from '../../../shared/cutplan/index.js'
import type { ComparisonOptionsColumn } from '../../db/schema/comparisons.js'
import type { NestRunRow } from '../nesting/nesting.repo.js'
import type { AppContext } from '../../context.js'
import { AppError, conflict, notFound } from '../../errors.js'
import * as nestingService from '../nesting/nesting.service.js'
import * as repo from './comparisons.repo.js'

type ValidRequest = z.output<typeof createComparisonRequestSchema>

/**
 * Each requested stock as the comparison will nest and price it. Shelf items are looked up in the workspace (an
 * unknown id is a 400 naming its place in the list); a shelf item's widest margin is kept when wider than the
 * comparison's. All priced stocks must share one currency.
 */
async function resolveStocks(context: AppContext, workspaceId: string, request: ValidRequest): Promise<ComparisonStock[]> {
  const shelfIds = request.stocks.flatMap((stock) => (stock.kind === 'stock-item' ? [stock.stockItemId] : []))
  const shelf = new Map((await repo.findStockItems(context.db, workspaceId, [...new Set(shelfIds)])).map((item) => [item.id, item]))
  const fields: Record<string, string[]> = {}
  const resolved: ComparisonStock[] = []
  request.stocks.forEach((stock, index) => {
    if (stock.kind === 'stock-item') {
      const item = shelf.get(stock.stockItemId)
      if (!item) {
        fields[`body.stocks.${index}.stockItemId`] = ['No such stock item in this workspace']
        return
      }
      const widestMargin = Math.max(item.marginTopMm, item.marginRightMm, item.marginBottomMm, item.marginLeftMm)
      resolved.push({
        label: item.name,
        kind: item.kind === 'sheet' ? 'sheets' : 'roll',
        widthMm: item.widthMm,
        heightMm: item.kind === 'sheet' ? item.heightMm : null,
        marginMm: Math.max(request.marginMm, widestMargin),
        price: item.price,
        priceUnit: item.kind === 'sheet' ? 'sheet' : 'metre',
        currency: null,
        stockItemId: item.id,
      })
    } else {
      resolved.push({
        label: stock.label,
        kind: stock.kind,
        widthMm: stock.widthMm,
        heightMm: stock.kind === 'sheets' ? stock.heightMm : null,
        marginMm: request.marginMm,
        price: stock.kind === 'sheets' ? stock.pricePerSheet : stock.pricePerMetre,
        priceUnit: stock.kind === 'sheets' ? 'sheet' : 'metre',
        currency: stock.currency ?? null,
        stockItemId: null,
      })
    }
  })
  const currencies = [...new Set(resolved.flatMap((stock) => (stock.currency ? [stock.currency] : [])))]
  if (currencies.length > 1) {
    request.stocks.forEach((stock, index) => {
      if (stock.kind !== 'stock-item' && stock.currency && stock.currency.toUpperCase() !== currencies[0]) {
        fields[`body.stocks.${index}.currency`] = [`Price every stock of a comparison in one currency (${currencies[0]})`]
      }
    })
  }
  for (const stock of resolved) {
    const widthLeft = stock.widthMm - 2 * stock.marginMm
    const heightLeft = stock.heightMm === null ? 1 : stock.heightMm - 2 * stock.marginMm
    if (widthLeft <= 0 || heightLeft <= 0) {
      const index = resolved.indexOf(stock)
      fields[`body.stocks.${index}`] = [`${stock.label}: the margin of ${stock.marginMm} mm leaves nothing to cut on`]
    }
  }
  if (Object.keys(fields).length > 0) {
    throw new AppError('validation_failed', 400, `Check ${Object.keys(fields).join(', ')}: ${Object.values(fields)[0]![0]}`, fields)
  }
  // One currency for all: a shelf item's price is taken to be in the same currency as the inline ones.
  return resolved.map((stock) => ({ ...stock, currency: currencies[0] ?? null }))
}

function nestStockOf(stock: ComparisonStock): NestStockInput {
  return stock.kind === 'sheets' ? { kind: 'sheets', widthMm: stock.widthMm, heightMm: stock.heightMm! } : { kind: 'roll', widthMm: stock.widthMm }
}

/** One nest run per stock through the ordinary nest-run path, so they share the queue and its workers. */
async function startRuns(context: AppContext, workspaceId: string, userId: string, items: NestRunItem[], stocks: ComparisonStock[], options: ComparisonOptionsColumn): Promise<string[]> {
  const runIds: string[] = []
  for (const stock of stocks) {
    const run = await nestingService.createNestRun(context, workspaceId, userId, {
      items,
      stock: nestStockOf(stock),
      spacingMm: options.spacingMm,
      marginMm: stock.marginMm,
      timeBudgetSeconds: options.timeBudgetSeconds,
      ...(options.seed !== undefined ? { seed: options.seed } : {}),
    })
    runIds.push(run.id)
  }
  return runIds
}

function defaultName(stocks: ComparisonStock[]): string {
  const name = `${stocks.length} stocks: ${stocks.map((stock) => stock.label).join(', ')}`
  return name.length > 120 ? `${name.slice(0, 119)}…` : name
}

export async function createComparison(context: AppContext, workspaceId: string, userId: string, request: ValidRequest): Promise<ComparisonDetail> {
  const stocks = await resolveStocks(context, workspaceId, request)
  const options: ComparisonOptionsColumn = {
    spacingMm: request.spacingMm,
    marginMm: request.marginMm,
    timeBudgetSeconds: request.timeBudgetSeconds,
    ...(request.seed !== undefined ? { seed: request.seed } : {}),
  }
  const items = request.items
  const runIds = await startRuns(context, workspaceId, userId, items, stocks, options)
  const row = await repo.insertComparison(context.db, { workspaceId, name: request.name || defaultName(stocks), items, stocks, options, runIds, createdBy: userId })
  return getComparison(context, workspaceId, row.id)
}

function summaryOf(found: repo.ComparisonWithAuthor, runStatuses: string[]): ComparisonSummary {
  const { comparison } = found
  return {
    id: comparison.id,
    name: comparison.name,
    status: comparisonStatusOf(runStatuses),
    stockLabels: comparison.stocks.map((stock) => stock.label),
    itemCount: comparison.items.length,
    pieceQuantity: comparison.items.reduce((sum, item) => sum + item.quantity, 0),
    createdAt: comparison.createdAt.toISOString(),
    updatedAt: comparison.updatedAt.toISOString(),
    createdByName: found.createdByName,
  }
}

type DesignsForFigures = Map<string, DesignForLayout & DesignForCutPlan>

/** Figures of finished runs never change: kept so that polling a comparison does not re-plan its cuts each time. */
const finishedFigures = new Map<string, ComparisonFigures | null>()
const finishedFiguresLimit = 500

/**
 * The figures of one run's layout, measured the way the layout editor measures the same layout; the cut time is the
 * cut plan's total (cutting, travel, lifts) on the default cutter profile, or null should planning fail.
 */
function figuresOf(context: AppContext, stock: ComparisonStock, run: NestRunRow, designs: DesignsForFigures): ComparisonFigures | null {
  const finished = run.status !== 'queued' && run.status !== 'running'
  const cacheKey = run.id
  if (finished && finishedFigures.has(cacheKey)) return finishedFigures.get(cacheKey)!
  if (!run.result) return null
  const layout = layoutFromNestRun({ request: createNestRunRequestSchema.parse(run.request), result: run.result }, 'comparison', randomUUID)
  if (!layout) return null
  const placements = layout.placements.map((placement) => ({ ...placement, mirrored: placement.mirrored ?? false }))
  const marginMm = layout.options.marginMm ?? stock.marginMm
  const measured = computeLayoutFigures({ stock: layout.stock, items: layout.items, placements, options: { marginMm } }, designs)
  let cutTimeSeconds: number | null = null
  try {
    cutTimeSeconds = planLayout({ stock: layout.stock, placements, options: { marginMm } }, designs).totals.totalTimeS
  } catch (error) {
    context.logger.warn({ err: error, runId: run.id }, 'could not plan the cuts of a comparison row')
  }
  const figures = comparisonFigures(stock, {
    sheetsUsed: measured.sheetsUsed,
    usedLengthMm: measured.usedLengthMm,
    pieceAreaMm2: measured.pieceAreaMm2,
    placedCount: measured.placedCount,
    wantedCount: measured.wantedCount,
    cutLengthMm: measured.cutLengthMm,
    cutTimeSeconds,
  })
  if (finished) {
    if (finishedFigures.size >= finishedFiguresLimit) finishedFigures.delete(finishedFigures.keys().next().value!)
    finishedFigures.set(cacheKey, figures)
  }
  return figures
}

export async function getComparison(context: AppContext, workspaceId: string, comparisonId: string): Promise<ComparisonDetail> {
  const found = await repo.findComparison(context.db, workspaceId, comparisonId)
  if (!found) throw notFound('Comparison')
  const { comparison } = found
  const runs = new Map((await repo.findRuns(context.db, workspaceId, comparison.runIds)).map((run) => [run.id, run]))
  const designRows = await repo.findDesignGeometry(context.db, workspaceId, [...new Set(comparison.items.map((item) => item.designId))])
  const designs: DesignsForFigures = new Map(designRows.map((design) => [design.id, { name: design.name, geometry: design.geometry, keepTogether: design.keepTogether }]))

  const rows: Omit<ComparisonRowDto, 'best'>[] = comparison.stocks.map((stock, index) => {
    const runId = comparison.runIds[index]!
    const run = runs.get(runId)
    if (!run) return { stock, runId, runStatus: 'failed', progress: null, figures: null, error: 'This nest run no longer exists; re-run the comparison' }
    return { stock, runId, runStatus: run.status, progress: run.progress ?? null, figures: figuresOf(context, stock, run, designs), error: run.error ?? null }
  })
  const best = bestPerColumn(rows.map((row) => row.figures))
  return {
    ...summaryOf(found, rows.map((row) => row.runStatus)),
    items: comparison.items.map((item) => nestRunItemSchema.parse(item)),
    options: comparison.options,
    rows: rows.map((row, index) => ({ ...row, best: best[index]! })),
  }
}

export async function listComparisons(context: AppContext, workspaceId: string): Promise<ComparisonSummary[]> {
  const found = await repo.listComparisons(context.db, workspaceId)
  const statuses = new Map((await repo.findRunStatuses(context.db, workspaceId, found.flatMap((entry) => entry.comparison.runIds))).map((run) => [run.id, run.status as string]))
  return found.map((entry) => summaryOf(entry, entry.comparison.runIds.map((runId) => statuses.get(runId) ?? 'failed')))
}

/** Cancels every run of the comparison: queued ones at once, running ones stop and keep their best layout so far. */
export async function cancelComparison(context: AppContext, workspaceId: string, comparisonId: string): Promise<ComparisonDetail> {
  const found = await repo.findComparison(context.db, workspaceId, comparisonId)
  if (!found) throw notFound('Comparison')
  for (const runId of found.comparison.runIds) {
    await nestingService.cancelNestRun(context, workspaceId, runId).catch((error: unknown) => {
      if (!(error instanceof AppError && error.status === 404)) throw error
    })
  }
  return getComparison(context, workspaceId, comparisonId)
}

/** Runs the stored inputs again (the stock snapshot, not today's shelf) on new nest runs; refused while it still runs. */
export async function rerunComparison(context: AppContext, workspaceId: string, userId: string, comparisonId: string): Promise<ComparisonDetail> {
  const found = await repo.findComparison(context.db, workspaceId, comparisonId)
  if (!found) throw notFound('Comparison')
  const { comparison } = found
  const statuses = await repo.findRunStatuses(context.db, workspaceId, comparison.runIds)
  if (statuses.some((run) => run.status === 'queued' || run.status === 'running')) throw conflict('This comparison is still running; cancel it or wait for it to finish before running it again')
  const runIds = await startRuns(context, workspaceId, userId, comparison.items, comparison.stocks, comparison.options)
  await repo.replaceRuns(context.db, comparisonId, runIds)
  return getComparison(context, workspaceId, comparisonId)
}
