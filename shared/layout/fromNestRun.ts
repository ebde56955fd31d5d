import type { NestRunDto } from '../schemas/nesting.js'
import type { CreateLayoutRequest, LayoutStock } from '../schemas/layouts.js'
import { boundingBox } from '../geometry/polygon.js'
import { nestZonesOf } from '../nesting/designItems.js'
import { MAX_SHEETS } from './actions.js'

/**
 * A new layout from a finished nest run (the "Open as layout" of a result): the run's items, stock, spacing, margin
 * and placements. A run's zone of every sheet is copied onto each sheet; a zone of one sheet stays on that sheet. A
 * stock of its own outline (a remnant) becomes a polygon stock drawn in the box from (0, 0) to its furthest point;
 * null when its outline reaches below 0, which a layout cannot draw.
 */
export function layoutFromNestRun(run: Pick<NestRunDto, 'request' | 'result'>, name: string, newId: () => string): CreateLayoutRequest | null {
  const { request, result } = run
  if (!result) return null
  const sheetCount = Math.min(MAX_SHEETS, Math.max(1, result.sheetCount, ...result.placements.map((placement) => placement.sheet + 1)))
  let stock: LayoutStock
  if (request.stock.kind === 'polygon') {
    const box = boundingBox(request.stock.outline)
    if (box.minX < 0 || box.minY < 0) return null
    stock = { kind: 'polygon', widthMm: box.maxX, heightMm: box.maxY, outline: request.stock.outline, holes: request.stock.holes ?? [], stockItemId: null }
  } else if (request.stock.kind === 'sheets') {
    stock = { kind: 'sheets', widthMm: request.stock.widthMm, heightMm: request.stock.heightMm, sheetCount }
  } else {
    stock = { kind: 'roll', widthMm: request.stock.widthMm, lengthMm: Math.max(Math.ceil(result.lengthMm), request.stock.widthMm) }
  }
  const lanes = stock.kind === 'sheets' ? sheetCount : 1
  // A layout keeps zones per sheet: a zone of every sheet is copied onto each, a zone of one sheet goes to that sheet.
  const excludedZones = nestZonesOf(request.excludedZones)
    .flatMap(({ sheet, outline }) => (sheet === undefined ? Array.from({ length: lanes }, (_, lane) => ({ sheet: lane, outline })) : sheet < lanes ? [{ sheet, outline }] : []))
    .slice(0, 100)
  return {
    name,
    isTemplate: false,
    stock,
    items: request.items.map((item) => ({
      designId: item.designId,
      quantity: item.quantity,
      rotation: item.rotation ?? 'quarter-turns',
      ...(item.rotation === 'any-step' && item.rotationStepDeg !== undefined ? { rotationStepDeg: item.rotationStepDeg } : {}),
      mirror: item.mirror ?? 'never',
      grainLock: item.grainLock ?? false,
    })),
    placements: result.placements.map((placement) => ({
      id: newId(),
      designId: placement.designId,
      pieceIndex: placement.pieceIndex,
      sheet: placement.sheet,
      xMm: placement.xMm,
      yMm: placement.yMm,
      angleDeg: placement.angleDeg,
      mirrored: placement.mirrored,
      locked: false,
    })),
    options: { spacingMm: request.spacingMm ?? 2, marginMm: request.marginMm ?? 5, excludedZones, snapToGrid: false, gridMm: 5 },
  }
}
