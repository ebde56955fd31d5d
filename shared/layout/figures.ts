import type { DesignGeometry } from '../schemas/designs.js'
import type { LayoutFigures, LayoutItem, LayoutOptions, LayoutPlacement, LayoutStock } from '../schemas/layouts.js'
import { boundingBox } from '../geometry/polygon.js'
import { transformRing } from '../nesting/variants.js'
import { polygonStockAreaMm2 } from './polygonStock.js'

/** What the figures need of a design: its stored geometry and whether its pieces move as one group. */
export interface DesignForLayout {
  geometry: DesignGeometry
  keepTogether: boolean
}

export interface LayoutForFigures {
  stock: LayoutStock
  items: Pick<LayoutItem, 'designId' | 'quantity'>[]
  placements: Pick<LayoutPlacement, 'designId' | 'pieceIndex' | 'sheet' | 'xMm' | 'yMm' | 'angleDeg' | 'mirrored'>[]
  options: Pick<LayoutOptions, 'marginMm'>
}

type Point = [number, number]

/** Even-odd ray test; points on the edge may land either way, which is fine for deciding where a cut line belongs. */
function insideRing(point: readonly [number, number], ring: readonly (readonly [number, number])[]): boolean {
  const [x, y] = point
  let inside = false
  for (let index = 0, previous = ring.length - 1; index < ring.length; previous = index++) {
    const [xi, yi] = ring[index]!
    const [xj, yj] = ring[previous]!
    if (yi > y !== yj > y && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) inside = !inside
  }
  return inside
}

/**
 * Which piece each cut line of a design travels with when its pieces are placed one by one: the piece whose outline
 * holds most of the line's points (a score line on a tag goes with the tag). A line inside no piece goes with piece 0,
 * so it is still cut once per copy; a design without pieces owns its lines only as a whole (-1).
 * Cost: lines × points × outline points, once per design.
 */
export function cutLineOwners(geometry: DesignGeometry): number[] {
  return geometry.cutLines.map((line) => {
    if (geometry.pieces.length === 0) return -1
    let owner = 0
    let mostInside = 0
    geometry.pieces.forEach((piece, pieceIndex) => {
      const inside = line.points.filter((point) => insideRing(point, piece.outline)).length
      if (inside > mostInside) {
        mostInside = inside
        owner = pieceIndex
      }
    })
    return owner
  })
}

/** The pieces a placement stands for: one piece, or every piece of the design (-1); out-of-range indices stand for none. */
export function placementPieceIndices(geometry: DesignGeometry, pieceIndex: number): number[] {
  if (pieceIndex === -1) return geometry.pieces.map((_, index) => index)
  return pieceIndex >= 0 && pieceIndex < geometry.pieces.length ? [pieceIndex] : []
}

/** How many of the wanted units a placement fills: a whole design kept together is one, otherwise one per piece. */
function unitsOfPlacement(design: DesignForLayout, pieceIndex: number): number {
  if (pieceIndex !== -1) return 1
  return design.keepTogether ? 1 : Math.max(1, design.geometry.pieces.length)
}

interface PreparedDesign {
  design: DesignForLayout
  owners: number[]
}

/**
 * The figures of a layout, from the stored design geometry (the server's authority on save; the editor shows the same
 * numbers live).
 *
 * - Piece area is each piece's stored true area (outline minus holes, from the curves as imported), so a layout taken
 *   from a nest run shows the nest run's utilisation; it does not change with rotation or mirroring.
 * - Sheets: utilisation = piece area / (sheets holding at least one piece × sheet area); per sheet = its piece area /
 *   sheet area, for every sheet 0..sheetCount−1. Polygon stock (a remnant): piece area / its area (outline less holes),
 *   once a piece is on it; it counts as one sheet used. Roll: utilisation = piece area / (width × used length), where the
 *   used length is the furthest x of any placed piece (or cut line) plus the margin; perSheetUtilisation has the one
 *   entry of the roll and sheetsUsed is 0.
 * - Cut length: each placed piece's stored cut length (outline and holes, true curves), plus cut lines: a placement of
 *   the whole design (-1) cuts all its lines; a single piece cuts the lines that `cutLineOwners` gives it, so a design
 *   placed piece by piece still cuts each line once per copy.
 * - Counts: wanted = Σ quantity × (1 if the design is kept together, else its piece count); placed = Σ units per
 *   placement (a whole design kept together is one, a whole design not kept together is its piece count, a single
 *   piece is one).
 *
 * Placements that cannot be resolved (unknown design, piece index out of range, a sheet outside the stock) are left
 * out; the server refuses them on save, the editor may hold them for a moment while a sheet is removed.
 * Cost: linear in the placed points.
 */
export function computeLayoutFigures(layout: LayoutForFigures, designs: Map<string, DesignForLayout>): LayoutFigures {
  const prepared = new Map<string, PreparedDesign>()
  const prepare = (designId: string): PreparedDesign | undefined => {
    const known = prepared.get(designId)
    if (known) return known
    const design = designs.get(designId)
    if (!design) return undefined
    const entry = { design, owners: cutLineOwners(design.geometry) }
    prepared.set(designId, entry)
    return entry
  }

  const { stock } = layout
  const laneCount = stock.kind === 'sheets' ? stock.sheetCount : 1
  const areaPerLane = new Array<number>(laneCount).fill(0)
  const occupied = new Array<boolean>(laneCount).fill(false)
  let pieceAreaMm2 = 0
  let cutLengthMm = 0
  let placedCount = 0
  let furthestXMm = 0

  for (const placement of layout.placements) {
    const entry = prepare(placement.designId)
    if (!entry) continue
    if (!Number.isInteger(placement.sheet) || placement.sheet < 0 || placement.sheet >= laneCount) continue
    const { geometry } = entry.design
    const pieceIndices = placementPieceIndices(geometry, placement.pieceIndex)
    const lineIndices = entry.owners.flatMap((owner, lineIndex) => (placement.pieceIndex === -1 || owner === placement.pieceIndex ? [lineIndex] : []))
    if (pieceIndices.length === 0 && lineIndices.length === 0) continue

    let area = 0
    for (const pieceIndex of pieceIndices) {
      const piece = geometry.pieces[pieceIndex]!
      area += piece.areaMm2
      cutLengthMm += piece.cutLengthMm
    }
    for (const lineIndex of lineIndices) cutLengthMm += geometry.cutLines[lineIndex]!.lengthMm
    areaPerLane[placement.sheet]! += area
    occupied[placement.sheet] = true
    pieceAreaMm2 += area
    placedCount += unitsOfPlacement(entry.design, placement.pieceIndex)

    if (stock.kind === 'roll') {
      // Holes lie inside their outline, so outlines and cut lines give the extent.
      const rings: Point[][] = [...pieceIndices.map((index) => geometry.pieces[index]!.outline), ...lineIndices.map((index) => geometry.cutLines[index]!.points)]
      for (const ring of rings) {
        if (ring.length === 0) continue
        const box = boundingBox(transformRing(ring, placement.angleDeg, placement.mirrored))
        furthestXMm = Math.max(furthestXMm, box.maxX + placement.xMm)
      }
    }
  }

  let wantedCount = 0
  for (const item of layout.items) {
    const design = designs.get(item.designId)
    if (!design) continue
    wantedCount += item.quantity * (design.keepTogether ? 1 : Math.max(1, design.geometry.pieces.length))
  }

  let usedStockAreaMm2: number
  let perSheetUtilisation: number[]
  let sheetsUsed = 0
  let usedLengthMm = 0
  if (stock.kind === 'sheets') {
    const sheetAreaMm2 = stock.widthMm * stock.heightMm
    sheetsUsed = occupied.filter(Boolean).length
    usedStockAreaMm2 = sheetsUsed * sheetAreaMm2
    perSheetUtilisation = areaPerLane.map((area) => area / sheetAreaMm2)
  } else if (stock.kind === 'polygon') {
    // A remnant is one piece of stock: once anything is cut from it, all of it (outline less holes) is used, as a sheet is.
    const stockAreaMm2 = polygonStockAreaMm2(stock)
    sheetsUsed = occupied[0] ? 1 : 0
    usedStockAreaMm2 = sheetsUsed * stockAreaMm2
    perSheetUtilisation = [stockAreaMm2 > 0 ? areaPerLane[0]! / stockAreaMm2 : 0]
  } else {
    usedLengthMm = placedCount > 0 ? Math.max(0, furthestXMm) + layout.options.marginMm : 0
    usedStockAreaMm2 = stock.widthMm * usedLengthMm
    perSheetUtilisation = [usedStockAreaMm2 > 0 ? pieceAreaMm2 / usedStockAreaMm2 : 0]
  }

  return {
    utilisation: usedStockAreaMm2 > 0 ? pieceAreaMm2 / usedStockAreaMm2 : 0,
    perSheetUtilisation,
    pieceAreaMm2,
    usedStockAreaMm2,
    wasteAreaMm2: Math.max(0, usedStockAreaMm2 - pieceAreaMm2),
    cutLengthMm,
    sheetsUsed,
    usedLengthMm,
    placedCount,
    wantedCount,
  }
}
