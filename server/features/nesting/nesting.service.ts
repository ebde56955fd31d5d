import { createNestRunRequestSchema, type CreateNestRunRequest, type NestPlacementDto, type NestProgressDto, type NestResultDto, type NestRunDto } from '../../../shared/schemas/nesting.js'
import { parseItemId, problemFromDesigns, type DesignForNesting } from '../../../shared/nesting/designItems.js'
import type { NestProblem, NestResult } from '../../../shared/nesting/types.js'
import { signedArea } from '../../../shared/geometry/polygon.js'
import type { AppContext } from '../../context.js'
import { AppError, notFound } from '../../errors.js'
import { NestRunError, runNestInThreads } from './runInThreads.js'
import * as repo from './nesting.repo.js'

function toDto(row: repo.NestRunRow, createdByName: string | null): NestRunDto {
  return {
    id: row.id,
    status: row.status,
    request: createNestRunRequestSchema.parse(row.request),
    progress: row.progress ?? null,
    result: row.result ?? null,
    error: row.error ?? null,
    createdAt: row.createdAt.toISOString(),
    startedAt: row.startedAt?.toISOString() ?? null,
    finishedAt: row.finishedAt?.toISOString() ?? null,
    createdByName,
  }
}

/** Stores a queued run and hands it to the job queue. Every design must belong to the workspace. */
export async function createNestRun(context: AppContext, workspaceId: string, userId: string, request: CreateNestRunRequest): Promise<NestRunDto> {
  if (!context.jobs) throw new AppError('internal', 503, 'Background jobs are not running on this server; nest runs cannot start')
  const designIds = [...new Set(request.items.map((item) => item.designId))]
  const found = await repo.findDesignsForNesting(context.db, workspaceId, designIds)
  const known = new Set(found.map((design) => design.id))
  const fields: Record<string, string[]> = {}
  request.items.forEach((item, index) => {
    if (!known.has(item.designId)) fields[`body.items.${index}.designId`] = ['No such design in this workspace']
  })
  if (Object.keys(fields).length > 0) throw new AppError('validation_failed', 400, 'Some designs of this run are not in the workspace', fields)
  if (found.every((design) => design.geometry.pieces.length === 0)) {
    throw new AppError('validation_failed', 400, 'The chosen designs have no closed pieces to nest (only cut lines)', { 'body.items': ['No pieces to nest'] })
  }
  const row = await repo.insertNestRun(context.db, { workspaceId, createdBy: userId, request })
  await context.jobs.sendNestRun(row.id, request.timeBudgetSeconds ?? 20)
  return toDto(row, null)
}

export async function getNestRun(context: AppContext, workspaceId: string, runId: string): Promise<NestRunDto> {
  const found = await repo.findNestRun(context.db, workspaceId, runId)
  if (!found) throw notFound('Nest run')
  return toDto(found.run, found.createdByName)
}

export async function listNestRuns(context: AppContext, workspaceId: string): Promise<NestRunDto[]> {
  return (await repo.listNestRuns(context.db, workspaceId)).map((row) => toDto(row.run, row.createdByName))
}

export async function cancelNestRun(context: AppContext, workspaceId: string, runId: string): Promise<NestRunDto> {
  const row = await repo.requestCancel(context.db, workspaceId, runId)
  if (!row) throw notFound('Nest run')
  return getNestRun(context, workspaceId, runId)
}

/**
 * Figures of a layout with each piece's true area (from the design's curves, not the flattened outline the search
 * used): per sheet, piece area over the sheet's used area (a roll: up to its used length).
 */
function layoutFigures(problem: NestProblem, result: NestResult, areaOfItem: (itemId: string) => number) {
  const areaOf = (ring: [number, number][]) => Math.abs(signedArea(ring))

  const stock = problem.stock
  const perSheet = Array.from({ length: result.sheetCount }, (_, sheet) => {
    const area = result.placements.filter((placement) => placement.sheet === sheet).reduce((sum, placement) => sum + areaOfItem(placement.itemId), 0)
    let used: number
    if (stock.kind === 'roll') used = stock.width * result.length
    else if (stock.kind === 'sheets') used = stock.width * stock.height
    else used = areaOf(stock.outline) - (stock.holes ?? []).reduce((sum, hole) => sum + areaOf(hole), 0)
    return used > 0 ? area / used : 0
  })
  const pieceArea = result.placements.reduce((sum, placement) => sum + areaOfItem(placement.itemId), 0)
  return { perSheet, pieceArea, utilisation: result.usedStockArea > 0 ? pieceArea / result.usedStockArea : 0 }
}

export function toResultDto(problem: NestProblem, result: NestResult, areaOfItem: (itemId: string) => number): NestResultDto {
  const placements: NestPlacementDto[] = result.placements.map((placement) => {
    const { designId, pieceIndex } = parseItemId(placement.itemId)
    return { designId, pieceIndex, copy: placement.copy, sheet: placement.sheet, angleDeg: placement.angleDeg, mirrored: placement.mirrored, xMm: placement.x, yMm: placement.y, outline: placement.outline, holes: placement.holes }
  })
  const figures = layoutFigures(problem, result, areaOfItem)
  return {
    mode: result.mode,
    placements,
    unplaced: result.unplaced.map((entry) => ({ ...parseItemId(entry.itemId), copy: entry.copy, reason: entry.reason })),
    lengthMm: result.length,
    sheetCount: result.sheetCount,
    utilisation: figures.utilisation,
    perSheetUtilisation: figures.perSheet,
    pieceAreaMm2: figures.pieceArea,
    usedStockAreaMm2: result.usedStockArea,
    evaluations: result.evaluations,
    elapsedMs: result.elapsedMs,
    firstFeasibleMs: result.firstFeasibleMs,
    seed: result.seed,
    verified: true,
  }
}

/** The true area of a nested item: one piece, or all pieces of a design kept together. */
function itemAreas(designs: Map<string, DesignForNesting>) {
  return (itemId: string) => {
    const { designId, pieceIndex } = parseItemId(itemId)
    const pieces = designs.get(designId)?.geometry.pieces ?? []
    if (pieceIndex < 0) return pieces.reduce((sum, piece) => sum + piece.areaMm2, 0)
    return pieces[pieceIndex]?.areaMm2 ?? 0
  }
}

/**
 * The job: runs the search in worker threads, saves progress twice a second, stops early when asked, and stores
 * the verified best layout. An engine crash is thrown so the queue retries the run; bad input fails it for good.
 */
export async function processNestRun(context: AppContext, runId: string): Promise<void> {
  const run = await repo.markRunning(context.db, runId)
  if (!run) return
  const request = createNestRunRequestSchema.parse(run.request)
  const designRows = await repo.findDesignsForNesting(context.db, run.workspaceId, [...new Set(request.items.map((item) => item.designId))])
  const designs = new Map<string, DesignForNesting>(designRows.map((design) => [design.id, design]))
  if (designs.size === 0) {
    await repo.finishRun(context.db, runId, { status: 'failed', error: 'The designs of this run were deleted' })
    return
  }
  const problem = problemFromDesigns({ ...request, items: request.items.filter((item) => designs.has(item.designId)) }, designs)
  const abort = new AbortController()
  let latest: NestProgressDto | undefined
  let saving = false
  const saver = setInterval(() => {
    if (!latest || saving) return
    saving = true
    repo
      .saveProgress(context.db, runId, latest)
      .then((cancelRequested) => {
        if (cancelRequested) abort.abort()
      })
      .catch((error: unknown) => context.logger.warn({ err: error, runId }, 'could not save nest progress'))
      .finally(() => {
        saving = false
      })
  }, 500)
  try {
    const { result } = await runNestInThreads(problem, {
      seed: request.seed ?? 1,
      timeBudgetMs: (request.timeBudgetSeconds ?? 20) * 1000,
      signal: abort.signal,
      onProgress: (progress) => {
        latest = {
          evaluations: progress.evaluations,
          elapsedMs: progress.elapsedMs,
          bestUtilisation: progress.bestUtilisation,
          placedCount: progress.placedCount,
          bestLengthMm: progress.bestLength,
          bestSheets: progress.bestSheets,
        }
      },
    })
    clearInterval(saver)
    const dto = toResultDto(problem, result, itemAreas(designs))
    await repo.saveProgress(context.db, runId, { evaluations: result.evaluations, elapsedMs: result.elapsedMs, bestUtilisation: dto.utilisation, placedCount: result.placements.length, bestLengthMm: result.length, bestSheets: result.sheetCount })
    await repo.finishRun(context.db, runId, { status: abort.signal.aborted ? 'cancelled' : 'succeeded', result: dto })
  } catch (error) {
    clearInterval(saver)
    if (error instanceof NestRunError && error.kind !== 'engine') {
      if (error.kind === 'verification') context.logger.error({ runId, error: error.message }, 'a nest result failed verification')
      await repo.finishRun(context.db, runId, { status: 'failed', error: error.message })
      return
    }
    throw error
  }
}
