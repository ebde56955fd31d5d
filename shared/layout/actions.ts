import type { Box } from '../geometry/polygon.js'
import { allowedAngles } from '../nesting/designItems.js'
import type { LayoutItem, LayoutOptions, LayoutPlacement, LayoutStock } from '../schemas/layouts.js'
import { copyPieceIndices, laneCount, laneSize, normaliseAngle, usableArea, type LayoutDocument } from './document.js'
import type { DesignForLayout } from './figures.js'
import { boxCentre, translateBox, type ShapeCache } from './placedGeometry.js'
import { boxInsideRegion, usableRegionOf } from './polygonStock.js'
import { createPieceIndex, type PieceIndex } from './spatialIndex.js'

/**
 * The editor's actions as pure functions: each takes a document and returns a new one that shares every placement it
 * did not change (history keeps snapshots, and the shape cache is keyed by placement object). Locked pieces are never
 * moved, turned, mirrored or deleted by an action on a selection.
 */
export interface EditorEnvironment {
  designs: ReadonlyMap<string, DesignForLayout>
  shapes: ShapeCache
  newId: () => string
}

export const MAX_SHEETS = 200

const idSet = (ids: Iterable<string>) => (ids instanceof Set ? (ids as Set<string>) : new Set(ids))

function mapPlacements(document: LayoutDocument, ids: Iterable<string>, change: (placement: LayoutPlacement) => LayoutPlacement): LayoutDocument {
  const wanted = idSet(ids)
  let changed = false
  const placements = document.placements.map((placement) => {
    if (!wanted.has(placement.id) || placement.locked) return placement
    const next = change(placement)
    if (next !== placement) changed = true
    return next
  })
  return changed ? { ...document, placements } : document
}

export const itemOf = (document: LayoutDocument, designId: string): LayoutItem | undefined => document.items.find((item) => item.designId === designId)

/** Whether a piece's angle and side are among those its item allows. */
export function orientationAllowed(item: LayoutItem | undefined, placement: Pick<LayoutPlacement, 'angleDeg' | 'mirrored'>): boolean {
  if (!item) return true
  if (item.mirror === 'never' && placement.mirrored) return false
  if (item.mirror === 'always' && !placement.mirrored) return false
  const angle = normaliseAngle(placement.angleDeg)
  return allowedAngles(item).some((allowed) => Math.abs(normaliseAngle(allowed) - angle) < 1e-6)
}

/** Moves unlocked pieces by (dx, dy) on their own sheets. */
export function movePlacements(document: LayoutDocument, ids: Iterable<string>, dxMm: number, dyMm: number): LayoutDocument {
  if (dxMm === 0 && dyMm === 0) return document
  return mapPlacements(document, ids, (placement) => ({ ...placement, xMm: placement.xMm + dxMm, yMm: placement.yMm + dyMm }))
}

/** Puts unlocked pieces at given places, on any sheet (the end of a drag, which may cross to another sheet). */
export function placePlacements(document: LayoutDocument, places: ReadonlyMap<string, { sheet: number; xMm: number; yMm: number }>): LayoutDocument {
  return mapPlacements(document, places.keys(), (placement) => {
    const place = places.get(placement.id)!
    if (place.sheet === placement.sheet && place.xMm === placement.xMm && place.yMm === placement.yMm) return placement
    return { ...placement, sheet: place.sheet, xMm: place.xMm, yMm: place.yMm }
  })
}

/** Sends unlocked pieces to another sheet at the same position. */
export function movePlacementsToSheet(document: LayoutDocument, ids: Iterable<string>, sheet: number): LayoutDocument {
  if (sheet < 0 || sheet >= laneCount(document.stock)) return document
  return mapPlacements(document, ids, (placement) => (placement.sheet === sheet ? placement : { ...placement, sheet }))
}

/** The placement with a new angle and side, moved so the centre of its box stays where it was. */
function withPose(placement: LayoutPlacement, angleDeg: number, mirrored: boolean, shapes: ShapeCache): LayoutPlacement {
  const before = shapes.orientedOf(placement)
  const after = shapes.orientedOf({ ...placement, angleDeg, mirrored })
  if (!before || !after) return placement
  const [beforeX, beforeY] = boxCentre(before.box)
  const [afterX, afterY] = boxCentre(after.box)
  return { ...placement, angleDeg, mirrored, xMm: placement.xMm + beforeX - afterX, yMm: placement.yMm + beforeY - afterY }
}

/** The next angle of the item's allowed ones after (direction 1) or before (−1) the current one, or null if none other. */
export function nextAllowedAngle(item: LayoutItem | undefined, angleDeg: number, direction: 1 | -1): number | null {
  const angles = [...new Set(allowedAngles(item ?? { rotation: 'quarter-turns' }).map(normaliseAngle))].sort((a, b) => a - b)
  const current = normaliseAngle(angleDeg)
  const others = angles.filter((angle) => Math.abs(angle - current) > 1e-6)
  if (others.length === 0) return null
  if (direction === 1) return angles.find((angle) => angle > current + 1e-6) ?? angles[0]!
  return [...angles].reverse().find((angle) => angle < current - 1e-6) ?? angles[angles.length - 1]!
}

/**
 * Turns each unlocked piece on the spot to its item's next allowed angle. `skipped` counts pieces whose item allows no
 * other angle (the editor says so).
 */
export function rotatePlacements(document: LayoutDocument, ids: Iterable<string>, environment: Pick<EditorEnvironment, 'shapes'>, direction: 1 | -1 = 1): { document: LayoutDocument; skipped: number } {
  let skipped = 0
  const next = mapPlacements(document, ids, (placement) => {
    const angle = nextAllowedAngle(itemOf(document, placement.designId), placement.angleDeg, direction)
    if (angle === null) {
      skipped += 1
      return placement
    }
    return withPose(placement, angle, placement.mirrored, environment.shapes)
  })
  return { document: next, skipped }
}

/**
 * Mirrors each unlocked piece left to right on the spot where its item allows either side. Mirroring after a turn
 * by θ is the same drawing as a turn by −θ of the mirrored design, so the angle becomes −θ when that is allowed.
 */
export function mirrorPlacements(document: LayoutDocument, ids: Iterable<string>, environment: Pick<EditorEnvironment, 'shapes'>): { document: LayoutDocument; skipped: number } {
  let skipped = 0
  const next = mapPlacements(document, ids, (placement) => {
    const item = itemOf(document, placement.designId)
    if (item && item.mirror !== 'allowed') {
      skipped += 1
      return placement
    }
    const opposite = normaliseAngle(-placement.angleDeg)
    const angle = orientationAllowed(item && { ...item, mirror: 'allowed' }, { angleDeg: opposite, mirrored: false }) ? opposite : placement.angleDeg
    return withPose(placement, angle, !placement.mirrored, environment.shapes)
  })
  return { document: next, skipped }
}

/** Copies of the given pieces (locked ones too, the copies unlocked), moved by (dx, dy); the copies are drawn on top. */
export function duplicatePlacements(document: LayoutDocument, ids: Iterable<string>, environment: Pick<EditorEnvironment, 'newId'>, dxMm: number, dyMm: number): { document: LayoutDocument; newIds: string[] } {
  const wanted = idSet(ids)
  const copies = document.placements
    .filter((placement) => wanted.has(placement.id))
    .map((placement) => ({ ...placement, id: environment.newId(), xMm: placement.xMm + dxMm, yMm: placement.yMm + dyMm, locked: false }))
  if (copies.length === 0) return { document, newIds: [] }
  return { document: { ...document, placements: [...document.placements, ...copies] }, newIds: copies.map((copy) => copy.id) }
}

/** Deletes unlocked pieces; `skipped` counts the locked ones left. */
export function deletePlacements(document: LayoutDocument, ids: Iterable<string>): { document: LayoutDocument; skipped: number } {
  const wanted = idSet(ids)
  let skipped = 0
  const placements = document.placements.filter((placement) => {
    if (!wanted.has(placement.id)) return true
    if (placement.locked) skipped += 1
    return placement.locked
  })
  return { document: placements.length === document.placements.length ? document : { ...document, placements }, skipped }
}

export function setPlacementsLocked(document: LayoutDocument, ids: Iterable<string>, locked: boolean): LayoutDocument {
  const wanted = idSet(ids)
  let changed = false
  const placements = document.placements.map((placement) => {
    if (!wanted.has(placement.id) || placement.locked === locked) return placement
    changed = true
    return { ...placement, locked }
  })
  return changed ? { ...document, placements } : document
}

/** One more sheet after the last (sheet stock only, at most MAX_SHEETS). */
export function addSheet(document: LayoutDocument): LayoutDocument {
  const { stock } = document
  if (stock.kind !== 'sheets' || stock.sheetCount >= MAX_SHEETS) return document
  return { ...document, stock: { ...stock, sheetCount: stock.sheetCount + 1 } }
}

/**
 * Takes a sheet away with everything on it (locked pieces too: the sheet is gone); later sheets move up one. The last
 * sheet cannot be removed.
 */
export function removeSheet(document: LayoutDocument, sheet: number): LayoutDocument {
  const { stock } = document
  if (stock.kind !== 'sheets' || stock.sheetCount <= 1 || sheet < 0 || sheet >= stock.sheetCount) return document
  const shift = <T extends { sheet: number }>(entry: T): T => (entry.sheet > sheet ? { ...entry, sheet: entry.sheet - 1 } : entry)
  return {
    ...document,
    stock: { ...stock, sheetCount: stock.sheetCount - 1 },
    placements: document.placements.filter((placement) => placement.sheet !== sheet).map(shift),
    options: { ...document.options, excludedZones: document.options.excludedZones.filter((zone) => zone.sheet !== sheet).map(shift) },
  }
}

function indexOfDocument(document: LayoutDocument, shapes: ShapeCache): PieceIndex {
  const entries = []
  for (const placement of document.placements) {
    const box = shapes.boxAt(placement, placement.xMm, placement.yMm)
    if (box) entries.push({ id: placement.id, sheet: placement.sheet, ...box })
  }
  return createPieceIndex(entries)
}

/**
 * The first free spot for a box of the given size: lanes in order; on a sheet row by row from the top, on a roll
 * across its width first and then along its length. A spot is free when the box, grown by the spacing, meets no
 * other piece's box and no excluded zone's box (boxes, not outlines: quick, and never too close). The scan jumps
 * past each box it meets, so it costs about rows × pieces in a row.
 */
function findFreeSpot(document: LayoutDocument, index: PieceIndex, size: { width: number; height: number }, stepMm = 1): { sheet: number; minX: number; minY: number } | null {
  const usable = usableArea(document.stock, document.options)
  const spacing = document.options.spacingMm
  const alongX = document.stock.kind !== 'roll'
  // A polygon stock's box holds notches and holes: a spot free of pieces must also lie inside its outline.
  const region = usableRegionOf(document.stock, document.options.marginMm)
  const zoneBoxes = document.options.excludedZones.map((zone) => {
    let minX = Infinity
    let minY = Infinity
    let maxX = -Infinity
    let maxY = -Infinity
    for (const [x, y] of zone.outline) {
      minX = Math.min(minX, x)
      minY = Math.min(minY, y)
      maxX = Math.max(maxX, x)
      maxY = Math.max(maxY, y)
    }
    return { sheet: zone.sheet, box: { minX, minY, maxX, maxY } }
  })
  for (let sheet = 0; sheet < laneCount(document.stock); sheet++) {
    // Rows run along x on a sheet and along y (across the roll) on a roll; `outer` steps between rows.
    const outerStart = alongX ? usable.minY : usable.minX
    const outerEnd = (alongX ? usable.maxY - size.height : usable.maxX - size.width) + 1e-9
    const innerStart = alongX ? usable.minX : usable.minY
    const innerEnd = (alongX ? usable.maxX - size.width : usable.maxY - size.height) + 1e-9
    for (let outer = outerStart; outer <= outerEnd; outer += stepMm) {
      let inner = innerStart
      while (inner <= innerEnd) {
        const box: Box = alongX
          ? { minX: inner, minY: outer, maxX: inner + size.width, maxY: outer + size.height }
          : { minX: outer, minY: inner, maxX: outer + size.width, maxY: inner + size.height }
        const blockers: Box[] = index.search(sheet, box, spacing - 1e-9)
        for (const zone of zoneBoxes) {
          if (zone.sheet === sheet && zone.box.minX < box.maxX && box.minX < zone.box.maxX && zone.box.minY < box.maxY && box.minY < zone.box.maxY) blockers.push(zone.box)
        }
        if (blockers.length === 0 && (!region || boxInsideRegion(box, region))) return { sheet, minX: box.minX, minY: box.minY }
        if (blockers.length === 0) {
          inner += stepMm
          continue
        }
        const past = Math.max(...blockers.map((blocker) => (alongX ? blocker.maxX : blocker.maxY))) + spacing
        inner = Math.max(past, inner + stepMm)
      }
    }
  }
  return null
}

/**
 * Places `copies` new copies of a design where there is room (see findFreeSpot), at angle 0 and on the side its item
 * asks for. When nothing is free, sheets get a new sheet (up to MAX_SHEETS) and a roll grows at its end; a piece too
 * large for the stock still goes on, at the margin, where the editor flags it.
 */
function placeCopies(document: LayoutDocument, designId: string, copies: number, environment: EditorEnvironment): LayoutDocument {
  const design = environment.designs.get(designId)
  if (!design || copies <= 0) return document
  const item = itemOf(document, designId)
  const mirrored = item?.mirror === 'always'
  let next = { ...document, placements: [...document.placements] }
  const index = indexOfDocument(next, environment.shapes)
  const usable = usableArea(next.stock, next.options)
  for (let copy = 0; copy < copies; copy++) {
    for (const pieceIndex of copyPieceIndices(design)) {
      const pose = { designId, pieceIndex, angleDeg: 0, mirrored }
      const oriented = environment.shapes.orientedOf(pose)
      if (!oriented) continue
      const size = { width: oriented.box.maxX - oriented.box.minX, height: oriented.box.maxY - oriented.box.minY }
      let spot = findFreeSpot(next, index, size)
      if (!spot) {
        const stock = next.stock
        if (stock.kind === 'sheets' && stock.sheetCount < MAX_SHEETS) {
          next = { ...next, stock: { ...stock, sheetCount: stock.sheetCount + 1 } }
          spot = { sheet: stock.sheetCount, minX: usable.minX, minY: usable.minY }
        } else if (stock.kind === 'roll') {
          let furthest = usable.minX - next.options.spacingMm
          for (const placement of next.placements) furthest = Math.max(furthest, index.get(placement.id)?.maxX ?? furthest)
          const minX = furthest + next.options.spacingMm
          next = { ...next, stock: { ...stock, lengthMm: Math.max(stock.lengthMm, Math.ceil(minX + size.width + next.options.marginMm)) } }
          spot = { sheet: 0, minX, minY: usable.minY }
        } else {
          spot = { sheet: laneCount(stock) - 1, minX: usable.minX, minY: usable.minY }
        }
      }
      const placement: LayoutPlacement = { id: environment.newId(), ...pose, sheet: spot.sheet, xMm: spot.minX - oriented.box.minX, yMm: spot.minY - oriented.box.minY, locked: false }
      next.placements.push(placement)
      index.upsert(placement.id, placement.sheet, translateBox(oriented.box, placement.xMm, placement.yMm))
    }
  }
  return next
}

/** Adds a design to the items (once) and places its copies where there is room. */
export function addItem(document: LayoutDocument, item: LayoutItem, environment: EditorEnvironment): LayoutDocument {
  if (itemOf(document, item.designId)) return document
  return placeCopies({ ...document, items: [...document.items, item] }, item.designId, item.quantity, environment)
}

/** Takes a design out of the layout with all its pieces, locked ones included. */
export function removeItem(document: LayoutDocument, designId: string): LayoutDocument {
  if (!itemOf(document, designId)) return document
  return { ...document, items: document.items.filter((item) => item.designId !== designId), placements: document.placements.filter((placement) => placement.designId !== designId) }
}

/** Changes an item's rules (rotation, mirror, grain); pieces stay where they are and the editor flags any that now break them. */
export function updateItem(document: LayoutDocument, designId: string, patch: Partial<Omit<LayoutItem, 'designId' | 'quantity'>>): LayoutDocument {
  const item = itemOf(document, designId)
  if (!item) return document
  const next: LayoutItem = { ...item, ...patch }
  if (next.rotation !== 'any-step') delete next.rotationStepDeg
  return { ...document, items: document.items.map((entry) => (entry === item ? next : entry)) }
}

/**
 * Sets how many copies of a design are wanted. More: the new copies are placed where there is room. Fewer: the
 * newest pieces of the design go first, unlocked before locked, one of each of its pieces per copy.
 */
export function setItemQuantity(document: LayoutDocument, designId: string, quantity: number, environment: EditorEnvironment): LayoutDocument {
  const item = itemOf(document, designId)
  if (!item || quantity === item.quantity || quantity < 1) return document
  const resized = { ...document, items: document.items.map((entry) => (entry === item ? { ...entry, quantity } : entry)) }
  if (quantity > item.quantity) return placeCopies(resized, designId, quantity - item.quantity, environment)
  const design = environment.designs.get(designId)
  const pieceIndices = design ? copyPieceIndices(design) : [...new Set(document.placements.filter((placement) => placement.designId === designId).map((placement) => placement.pieceIndex))]
  const drop = new Set<string>()
  for (let copy = 0; copy < item.quantity - quantity; copy++) {
    for (const pieceIndex of pieceIndices) {
      const candidates = document.placements.filter((placement) => placement.designId === designId && placement.pieceIndex === pieceIndex && !drop.has(placement.id))
      const victim = [...candidates].reverse().find((placement) => !placement.locked) ?? candidates[candidates.length - 1]
      if (victim) drop.add(victim.id)
    }
  }
  return { ...resized, placements: document.placements.filter((placement) => !drop.has(placement.id)) }
}

/**
 * A new stock. Between kinds, pieces keep their order: sheets laid end to end become one roll (a piece on sheet k
 * moves k sheet widths along it), and a roll's or a polygon stock's pieces all land on the first sheet; onto a polygon
 * stock (one lane) every piece lands on it, where the editor flags those outside its outline. Sheet count is kept from
 * the old sheets, and grows to hold every piece's sheet.
 */
export function setStock(document: LayoutDocument, stock: LayoutStock): LayoutDocument {
  const old = document.stock
  let placements = document.placements
  let next = stock
  if (old.kind === 'sheets' && next.kind === 'roll') {
    placements = placements.map((placement) => (placement.sheet === 0 ? placement : { ...placement, sheet: 0, xMm: placement.xMm + placement.sheet * old.widthMm }))
    next = { ...next, lengthMm: Math.max(next.lengthMm, old.widthMm * old.sheetCount) }
  } else if (old.kind !== next.kind && next.kind !== 'roll') {
    // Onto sheets from a roll or a polygon, or onto a polygon (one lane): everything lands on the first.
    placements = placements.map((placement) => (placement.sheet === 0 ? placement : { ...placement, sheet: 0 }))
  }
  if (next.kind === 'sheets') {
    const needed = placements.reduce((most, placement) => Math.max(most, placement.sheet + 1), 1)
    if (next.sheetCount < needed) next = { ...next, sheetCount: Math.min(MAX_SHEETS, needed) }
  }
  const zones = next.kind !== 'sheets' ? document.options.excludedZones.filter((zone) => zone.sheet === 0) : document.options.excludedZones
  return { ...document, stock: next, placements, options: zones === document.options.excludedZones ? document.options : { ...document.options, excludedZones: zones } }
}

export function setOptions(document: LayoutDocument, patch: Partial<LayoutOptions>): LayoutDocument {
  const changed = (Object.keys(patch) as (keyof LayoutOptions)[]).some((key) => patch[key] !== document.options[key])
  return changed ? { ...document, options: { ...document.options, ...patch } } : document
}

export function renameLayout(document: LayoutDocument, name: string): LayoutDocument {
  return name === document.name ? document : { ...document, name }
}

/**
 * The result of an auto-arrange: the unlocked pieces are replaced by the arranged ones, locked pieces stay, and the
 * stock takes the size the arrangement needs.
 */
export function applyArrangement(document: LayoutDocument, arranged: LayoutPlacement[], stock: LayoutStock): LayoutDocument {
  return { ...document, stock, placements: [...document.placements.filter((placement) => placement.locked), ...arranged] }
}

/** The drawn length a roll needs to show every piece and its margin (never shorter than the stock's width). */
export function rollLengthFor(document: LayoutDocument, shapes: ShapeCache): number {
  let furthest = 0
  for (const placement of document.placements) furthest = Math.max(furthest, shapes.boxAt(placement, placement.xMm, placement.yMm)?.maxX ?? 0)
  return Math.max(laneSize(document.stock).heightMm, Math.ceil(furthest + document.options.marginMm))
}
