import type { DesignGeometry } from '../schemas/designs.js'
import type { LayoutPlacement, LayoutStock } from '../schemas/layouts.js'
import { boundingBox, perimeter, signedArea, type Box } from '../geometry/polygon.js'
import { transformRing } from '../nesting/variants.js'
import { cutLineOwners, placementPieceIndices } from '../layout/figures.js'

export type Point = [number, number]

export type ContourRole = 'hole' | 'outline' | 'cut-line' | 'weeding-border' | 'weeding-line'

/** One thing the blade cuts in one go, in sheet millimetres (origin top-left, y down). */
export interface CutContour {
  /** Index in the sheet's contour list (the order they were collected: placement order). */
  id: number
  closed: boolean
  /** Closed: the ring without its first point repeated. Open: the polyline from one end to the other. */
  points: Point[]
  /** True length along the design's curves ÷ length of these flattened points; multiplies every cut length. */
  lengthFactor: number
  role: ContourRole
  /** Which placed piece the contour belongs to ("placementId/pieceIndex"), or "weeding" for weeding aids. */
  groupKey: string
  /** Label for people: the design's name and piece number. */
  groupLabel: string
  box: Box
}

export interface DesignForCutPlan {
  name: string
  geometry: DesignGeometry
}

export type PlacementForCutPlan = Pick<LayoutPlacement, 'id' | 'designId' | 'pieceIndex' | 'sheet' | 'xMm' | 'yMm' | 'angleDeg' | 'mirrored'>

export interface LayoutForCutPlan {
  name?: string
  stock: LayoutStock
  placements: PlacementForCutPlan[]
  options: { marginMm: number }
}

const moved = (ring: readonly (readonly [number, number])[], placement: PlacementForCutPlan): Point[] =>
  transformRing(ring as Point[], placement.angleDeg, placement.mirrored).map(([x, y]) => [x + placement.xMm, y + placement.yMm])

export function polylineLength(points: readonly (readonly [number, number])[], closed: boolean): number {
  return perimeter(points, closed) + (closed && points.length === 2 ? Math.hypot(points[0]![0] - points[1]![0], points[0]![1] - points[1]![1]) : 0)
}

/**
 * The contours one sheet (or the roll, sheet 0) cuts, in placement order: per placed piece its holes, its outline and
 * the cut lines that travel with it (same ownership rule as the layout figures). Each piece's stored true cut length is
 * spread over its rings in proportion to their flattened lengths, so cut lengths follow the real curves.
 * Placements of unknown designs or other sheets are left out. Cost: linear in the placed points.
 */
export function sheetContours(layout: LayoutForCutPlan, designs: ReadonlyMap<string, DesignForCutPlan>, sheet: number): CutContour[] {
  const contours: CutContour[] = []
  const owners = new Map<string, number[]>()
  const add = (contour: Omit<CutContour, 'id' | 'box'>) => {
    if (contour.points.length < (contour.closed ? 3 : 2)) return
    contours.push({ ...contour, id: contours.length, box: boundingBox(contour.points) })
  }
  for (const placement of layout.placements) {
    if (placement.sheet !== sheet) continue
    const design = designs.get(placement.designId)
    if (!design) continue
    const { geometry } = design
    let designOwners = owners.get(placement.designId)
    if (!designOwners) {
      designOwners = cutLineOwners(geometry)
      owners.set(placement.designId, designOwners)
    }
    for (const pieceIndex of placementPieceIndices(geometry, placement.pieceIndex)) {
      const piece = geometry.pieces[pieceIndex]!
      const flattened = polylineLength(piece.outline, true) + piece.holes.reduce((sum, hole) => sum + polylineLength(hole, true), 0)
      const lengthFactor = flattened > 0 && piece.cutLengthMm > 0 ? piece.cutLengthMm / flattened : 1
      const groupKey = `${placement.id}/${pieceIndex}`
      const groupLabel = geometry.pieces.length > 1 ? `${design.name} · piece ${pieceIndex + 1}` : design.name
      for (const hole of piece.holes) add({ closed: true, points: moved(hole, placement), lengthFactor, role: 'hole', groupKey, groupLabel })
      add({ closed: true, points: moved(piece.outline, placement), lengthFactor, role: 'outline', groupKey, groupLabel })
    }
    geometry.cutLines.forEach((line, lineIndex) => {
      const owner = designOwners[lineIndex]!
      if (placement.pieceIndex !== -1 && owner !== placement.pieceIndex) return
      const flattened = polylineLength(line.points, false)
      const lengthFactor = flattened > 0 && line.lengthMm > 0 ? line.lengthMm / flattened : 1
      const pieceIndex = owner < 0 ? 0 : owner
      add({
        closed: false,
        points: moved(line.points, placement),
        lengthFactor,
        role: 'cut-line',
        groupKey: `${placement.id}/${pieceIndex}`,
        groupLabel: geometry.pieces.length > 1 ? `${design.name} · piece ${pieceIndex + 1}` : design.name,
      })
    })
  }
  return contours
}

/** Even-odd ray test (a point exactly on the edge may land either way; callers sample several points). */
export function pointInRing(x: number, y: number, ring: readonly Point[]): boolean {
  let inside = false
  for (let index = 0, previous = ring.length - 1; index < ring.length; previous = index++) {
    const [xi, yi] = ring[index]!
    const [xj, yj] = ring[previous]!
    if (yi > y !== yj > y && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) inside = !inside
  }
  return inside
}

const boxWithin = (inner: Box, outer: Box, slack: number) =>
  inner.minX >= outer.minX - slack && inner.maxX <= outer.maxX + slack && inner.minY >= outer.minY - slack && inner.maxY <= outer.maxY + slack

/**
 * For each contour, the contours that must be cut before it: everything lying inside it when it is closed (holes and
 * their islands, pieces nested in holes, score lines, everything within a weeding border). Cutting those first keeps a
 * part from shifting once it is free (common practice). "Inside" = the box fits and most of up to seven sampled points
 * fall inside the ring, so contours that touch the ring still count. Cost: pairs whose boxes nest × sampled points.
 */
export function insideFirstConstraints(contours: readonly CutContour[]): number[][] {
  const before: number[][] = contours.map(() => [])
  const areas = contours.map((contour) => (contour.closed ? Math.abs(signedArea(contour.points)) : 0))
  const closed = contours.filter((contour) => contour.closed)
  for (const outer of closed) {
    for (const inner of contours) {
      if (inner === outer || !boxWithin(inner.box, outer.box, 1e-6)) continue
      if (inner.closed && areas[inner.id]! >= areas[outer.id]!) continue
      const count = inner.points.length
      const samples = Math.min(7, count)
      let inside = 0
      for (let sample = 0; sample < samples; sample++) {
        const [x, y] = inner.points[Math.floor((sample * count) / samples)]!
        if (pointInRing(x, y, outer.points)) inside++
      }
      if (inside * 2 > samples) before[outer.id]!.push(inner.id)
    }
  }
  return before
}

/** Sheet size in millimetres: a sheet of the stock (a polygon stock's box), or the roll from 0 to its used length (furthest contour + margin). */
export function sheetSize(layout: LayoutForCutPlan, contours: readonly CutContour[]): { widthMm: number; heightMm: number } {
  if (layout.stock.kind !== 'roll') return { widthMm: layout.stock.widthMm, heightMm: layout.stock.heightMm }
  const furthest = contours.reduce((max, contour) => Math.max(max, contour.box.maxX), 0)
  return { widthMm: contours.length > 0 ? furthest + layout.options.marginMm : layout.stock.lengthMm, heightMm: layout.stock.widthMm }
}

export const sheetCountOf = (stock: LayoutStock) => (stock.kind === 'sheets' ? stock.sheetCount : 1)
