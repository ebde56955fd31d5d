import type { NestRunDto } from '../schemas/nesting.js'
import type { CreateLayoutRequest, LayoutStock } from '../schemas/layouts.js'
import { MAX_SHEETS } from './actions.js'

/**
 * A new layout from a finished nest run (the "Open as layout" of a result): the run's items, stock, spacing, margin
 * and placements. A nest run's excluded zones apply to every sheet, so each sheet gets its own copy. Null for a stock
 * of its own outline, which a layout cannot hold.
 */
export function layoutFromNestRun(run: Pick<NestRunDto, 'request' | 'result'>, name: string, newId: () => string): CreateLayoutRequest | null {
  const { request, result } = run
  if (!result || request.stock.kind === 'polygon') return null
  const sheetCount = Math.min(MAX_SHEETS, Math.max(1, result.sheetCount, ...result.placements.map((placement) => placement.sheet + 1)))
  const stock: LayoutStock =
    request.stock.kind === 'sheets'
      ? { kind: 'sheets', widthMm: request.stock.widthMm, heightMm: request.stock.heightMm, sheetCount }
      : { kind: 'roll', widthMm: request.stock.widthMm, lengthMm: Math.max(Math.ceil(result.lengthMm), request.stock.widthMm) }
  const lanes = stock.kind === 'sheets' ? sheetCount : 1
  const excludedZones = (request.excludedZones ?? []).flatMap((outline) => Array.from({ length: lanes }, (_, sheet) => ({ sheet, outline }))).slice(0, 100)
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
