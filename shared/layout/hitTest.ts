import type { Box } from '../geometry/polygon.js'
import { relatePolygons } from './conflicts.js'
import { polygonFromRings, type PlacedShape } from './placedGeometry.js'
import { pointInFlatRing } from './rings.js'
import type { PieceIndex } from './spatialIndex.js'

/** True when (x, y) is on the material of the shape: inside an outline and not inside one of its holes. */
export function pointInShape(shape: PlacedShape, x: number, y: number): boolean {
  if (x < shape.box.minX || x > shape.box.maxX || y < shape.box.minY || y > shape.box.maxY) return false
  for (const polygon of shape.polygons) {
    const { box } = polygon
    if (x < box.minX || x > box.maxX || y < box.minY || y > box.maxY) continue
    if (!pointInFlatRing(x, y, polygon.outer)) continue
    if (polygon.holes.some((hole, index) => {
      const holeBox = polygon.holeBoxes[index]!
      return x >= holeBox.minX && x <= holeBox.maxX && y >= holeBox.minY && y <= holeBox.maxY && pointInFlatRing(x, y, hole)
    })) continue
    return true
  }
  return false
}

/**
 * The piece under a point of a sheet, the topmost one (highest `order`) where pieces overlap, or null. A click inside
 * a hole misses the piece with the hole, and may hit a small piece nested in it. Cost: an index lookup and point
 * tests of the few pieces whose box holds the point.
 */
export function pieceAt(index: PieceIndex, shapeOf: (id: string) => PlacedShape | undefined, sheet: number, x: number, y: number, order: (id: string) => number): string | null {
  let best: string | null = null
  let bestOrder = -Infinity
  for (const candidate of index.search(sheet, { minX: x, minY: y, maxX: x, maxY: y })) {
    const shape = shapeOf(candidate.id)
    if (!shape || !pointInShape(shape, x, y)) continue
    const rank = order(candidate.id)
    if (rank > bestOrder) {
      best = candidate.id
      bestOrder = rank
    }
  }
  return best
}

/**
 * Pieces of a sheet that a selection rectangle touches: some of their material lies inside it (a rectangle drawn
 * wholly inside a piece's hole selects nothing of that piece).
 */
export function piecesInBox(index: PieceIndex, shapeOf: (id: string) => PlacedShape | undefined, sheet: number, box: Box): string[] {
  const width = box.maxX - box.minX
  const height = box.maxY - box.minY
  if (!(width > 0) || !(height > 0)) return []
  const rectangle = polygonFromRings([
    [box.minX, box.minY],
    [box.maxX, box.minY],
    [box.maxX, box.maxY],
    [box.minX, box.maxY],
  ])
  const found: string[] = []
  for (const candidate of index.search(sheet, box)) {
    const shape = shapeOf(candidate.id)
    if (!shape) continue
    const inside = shape.box.minX >= box.minX && shape.box.maxX <= box.maxX && shape.box.minY >= box.minY && shape.box.maxY <= box.maxY
    if (inside || shape.polygons.some((polygon) => relatePolygons(polygon, rectangle, 0) === 'overlap')) found.push(candidate.id)
  }
  return found
}
