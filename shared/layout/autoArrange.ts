import ClipperLib from 'clipper-lib'
import { convexHull } from '../nesting/designItems.js'
import { fromIntPath, offsetPaths, orient, pathArea, toIntPath, unionPaths, type IntPath } from '../nesting/intGeometry.js'
import type { CreateNestRunRequest, NestResultDto } from '../schemas/nesting.js'
import type { LayoutPlacement, LayoutStock } from '../schemas/layouts.js'
import { MAX_SHEETS, rollLengthFor } from './actions.js'
import { copyPieceIndices, laneSize, type LayoutDocument } from './document.js'
import type { DesignForLayout } from './figures.js'
import type { ShapeCache } from './placedGeometry.js'

/** The nest-run request allows this many excluded zones (shared/schemas/nesting.ts). */
export const NEST_ZONE_LIMIT = 50

/** Integer units per millimetre for growing outlines with Clipper: a micrometre grid. */
const ZONE_SCALE = 1000
/** Grown outlines are thinned within this distance, and grown by it first, so they still cover the true offset. */
const ZONE_SIMPLIFY_MM = 0.1

type Ring = [number, number][]

const key = (designId: string, pieceIndex: number) => `${designId}:${pieceIndex}`

/** Locked pieces per design piece (`designId:pieceIndex`). */
function lockedCounts(document: LayoutDocument): Map<string, number> {
  const counts = new Map<string, number>()
  for (const placement of document.placements) {
    if (!placement.locked) continue
    const id = key(placement.designId, placement.pieceIndex)
    counts.set(id, (counts.get(id) ?? 0) + 1)
  }
  return counts
}

/** A zone for a nest run: on one sheet, or on every sheet when `sheet` is left out. */
export interface SheetZone {
  sheet?: number
  outline: Ring
}

/** The engine's sheet of a layout sheet: sheets keep their index; a roll or a polygon stock is one lane, sheet 0. */
const runSheetOf = (document: LayoutDocument, sheet: number) => (document.stock.kind === 'sheets' ? sheet : 0)

/**
 * The areas locked pieces keep clear, each on its piece's sheet: every locked outline grown by the spacing (so
 * arranged pieces keep the spacing from them whatever the search does with zones), merged where they meet on the
 * same sheet, holes left out (a zone has none). Sorted by sheet, so the request is the same for the same layout.
 */
export function lockedZones(document: LayoutDocument, shapes: ShapeCache): SheetZone[] {
  const grownBySheet = new Map<number, IntPath[]>()
  const grow = (document.options.spacingMm + ZONE_SIMPLIFY_MM) * ZONE_SCALE
  for (const placement of document.placements) {
    if (!placement.locked) continue
    const shape = shapes.shapeOf(placement)
    if (!shape) continue
    const sheet = runSheetOf(document, placement.sheet)
    const grown = grownBySheet.get(sheet) ?? []
    for (const polygon of shape.polygons) {
      const ring: Ring = []
      for (let index = 0; index < polygon.outer.length; index += 2) ring.push([polygon.outer[index]!, polygon.outer[index + 1]!])
      grown.push(...offsetPaths([orient(toIntPath(ring, ZONE_SCALE), true)], grow))
    }
    grownBySheet.set(sheet, grown)
  }
  const zones: SheetZone[] = []
  for (const sheet of [...grownBySheet.keys()].sort((left, right) => left - right)) {
    const merged = unionPaths(grownBySheet.get(sheet)!).filter((path) => pathArea(path) > 0)
    for (const path of ClipperLib.Clipper.CleanPolygons(merged, ZONE_SIMPLIFY_MM * ZONE_SCALE)) {
      if (path.length >= 3) zones.push({ sheet, outline: fromIntPath(path, ZONE_SCALE) })
    }
  }
  return zones
}

/**
 * Fewer zones, never less area kept clear: the two zones of the same sheet whose boxes' centres lie closest become
 * their convex hull, until `limit` remain. Only when no two zones share a sheet do two of different sheets merge,
 * into a hull kept clear on every sheet (more than needed, never less).
 */
export function capZones(zones: SheetZone[], limit: number): SheetZone[] {
  const list: SheetZone[] = zones.map((zone) => ({ ...(zone.sheet !== undefined ? { sheet: zone.sheet } : {}), outline: zone.outline.map(([x, y]) => [x, y] as [number, number]) }))
  const centre = (zone: SheetZone) => {
    const xs = zone.outline.map(([x]) => x)
    const ys = zone.outline.map(([, y]) => y)
    return [(Math.min(...xs) + Math.max(...xs)) / 2, (Math.min(...ys) + Math.max(...ys)) / 2] as const
  }
  while (list.length > Math.max(1, limit)) {
    let best: [number, number] = [0, 1]
    let bestDistance = Infinity
    let bestSameSheet = false
    const centres = list.map(centre)
    for (let i = 0; i < list.length; i++) {
      for (let j = i + 1; j < list.length; j++) {
        const sameSheet = list[i]!.sheet === list[j]!.sheet
        if (bestSameSheet && !sameSheet) continue
        const distance = Math.hypot(centres[i]![0] - centres[j]![0], centres[i]![1] - centres[j]![1])
        if ((sameSheet && !bestSameSheet) || distance < bestDistance) {
          bestDistance = distance
          best = [i, j]
          bestSameSheet = sameSheet
        }
      }
    }
    const [first, second] = [list[best[0]]!, list[best[1]]!]
    const hull = convexHull([...first.outline, ...second.outline])
    list.splice(best[1], 1)
    list.splice(best[0], 1, bestSameSheet && first.sheet !== undefined ? { sheet: first.sheet, outline: hull } : { outline: hull })
  }
  return list
}

export type ArrangeRequestResult = { request: CreateNestRunRequest; lockedCount: number } | { request: null; reason: string }

/** The stock a nest run arranges on: sheets without a count, a roll without an end, a polygon stock as it is. */
export function nestStockOfLayoutStock(stock: LayoutStock): CreateNestRunRequest['stock'] {
  if (stock.kind === 'sheets') return { kind: 'sheets', widthMm: stock.widthMm, heightMm: stock.heightMm, maxSheets: MAX_SHEETS }
  if (stock.kind === 'polygon') return { kind: 'polygon', outline: stock.outline, ...(stock.holes && stock.holes.length > 0 ? { holes: stock.holes } : {}) }
  return { kind: 'roll', widthMm: stock.widthMm }
}

/**
 * The nest-run request that arranges a layout's unlocked pieces: its items less the copies locked pieces already
 * hold, its stock (a roll without an end, sheets without a count), spacing and margin. The layout's excluded zones
 * and the locked pieces (grown by the spacing) become the run's excluded zones, each naming its own sheet, so a piece
 * locked on one sheet keeps only that sheet's area clear. The run's sheets are the layout's sheets, index for index,
 * so its placements map straight back (arrangementFromNestResult); a roll or a polygon stock is sheet 0.
 */
export function nestRequestFromLayout(document: LayoutDocument, environment: { designs: ReadonlyMap<string, DesignForLayout>; shapes: ShapeCache }, timeBudgetSeconds: number): ArrangeRequestResult {
  const locked = lockedCounts(document)
  const items: CreateNestRunRequest['items'] = []
  for (const item of document.items) {
    const design = environment.designs.get(item.designId)
    if (!design) continue
    const pieceIndices = copyPieceIndices(design)
    if (pieceIndices.length === 0) continue
    // Whole copies held by locked pieces; pieces of partly locked copies are nested again and the surplus dropped.
    const lockedCopies = Math.min(...pieceIndices.map((pieceIndex) => locked.get(key(item.designId, pieceIndex)) ?? 0))
    const quantity = item.quantity - lockedCopies
    if (quantity <= 0) continue
    items.push({
      designId: item.designId,
      quantity,
      rotation: item.rotation,
      ...(item.rotation === 'any-step' && item.rotationStepDeg !== undefined ? { rotationStepDeg: item.rotationStepDeg } : {}),
      mirror: item.mirror,
      grainLock: item.grainLock,
    })
  }
  if (document.items.length === 0) return { request: null, reason: 'Add a design first: there is nothing to arrange.' }
  if (items.length === 0) return { request: null, reason: 'Every piece is locked: unlock the pieces that may move.' }

  const ownZones: SheetZone[] = document.options.excludedZones.map((zone) => ({ sheet: runSheetOf(document, zone.sheet), outline: zone.outline }))
  const zones = capZones([...ownZones, ...lockedZones(document, environment.shapes)], NEST_ZONE_LIMIT).map((zone) => (zone.sheet === undefined ? zone.outline : { sheet: zone.sheet, outline: zone.outline }))
  const { stock } = document
  return {
    request: {
      items,
      stock: nestStockOfLayoutStock(stock),
      spacingMm: document.options.spacingMm,
      marginMm: document.options.marginMm,
      excludedZones: zones,
      timeBudgetSeconds,
    },
    lockedCount: document.placements.filter((placement) => placement.locked).length,
  }
}

/**
 * A nest result as layout placements (1:1: design, piece, sheet, angle, side, position), less the pieces locked ones
 * already stand for, and the stock sized to hold them and the locked pieces.
 */
export function arrangementFromNestResult(document: LayoutDocument, result: NestResultDto, environment: { shapes: ShapeCache; newId: () => string }): { placements: LayoutPlacement[]; stock: LayoutStock } {
  const room = new Map<string, number>()
  const locked = lockedCounts(document)
  for (const item of document.items) {
    for (const placement of result.placements) {
      if (placement.designId !== item.designId) continue
      const id = key(placement.designId, placement.pieceIndex)
      if (!room.has(id)) room.set(id, item.quantity - (locked.get(id) ?? 0))
    }
  }
  const placements: LayoutPlacement[] = []
  for (const placement of result.placements) {
    const id = key(placement.designId, placement.pieceIndex)
    const left = room.get(id) ?? 0
    if (left <= 0) continue
    room.set(id, left - 1)
    placements.push({
      id: environment.newId(),
      designId: placement.designId,
      pieceIndex: placement.pieceIndex,
      sheet: placement.sheet,
      xMm: placement.xMm,
      yMm: placement.yMm,
      angleDeg: placement.angleDeg,
      mirrored: placement.mirrored,
      locked: false,
    })
  }
  const kept = document.placements.filter((placement) => placement.locked)
  const { stock } = document
  // A polygon stock keeps its outline: the run placed what fits on it and reports the rest as not placed.
  if (stock.kind === 'polygon') return { placements, stock }
  if (stock.kind === 'sheets') {
    const needed = [...kept, ...placements].reduce((most, placement) => Math.max(most, placement.sheet + 1), 1)
    return { placements, stock: { ...stock, sheetCount: Math.min(MAX_SHEETS, needed) } }
  }
  const lengthMm = Math.max(Math.ceil(result.lengthMm), rollLengthFor({ ...document, placements: [...kept, ...placements] }, environment.shapes), laneSize(stock).heightMm)
  return { placements, stock: { ...stock, lengthMm } }
}
