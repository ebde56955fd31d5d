import type { Box } from '../geometry/polygon.js'

/**
 * Flat rings for the editor's hot loops: [x0, y0, x1, y1, …] in millimetres, closed implicitly (the first point is
 * not repeated). Flat typed arrays keep the per-frame checks of a drag free of small allocations.
 */
export type FlatRing = Float64Array

/** Distances below this count as touching: far below anything a blade or a screen can show. */
export const TOUCH_MM = 1e-6

export function flatRing(points: readonly (readonly [number, number])[]): FlatRing {
  const flat = new Float64Array(points.length * 2)
  for (let index = 0; index < points.length; index++) {
    flat[2 * index] = points[index]![0]
    flat[2 * index + 1] = points[index]![1]
  }
  return flat
}

export function flatRingBox(ring: FlatRing): Box {
  let minX = Infinity
  let minY = Infinity
  let maxX = -Infinity
  let maxY = -Infinity
  for (let index = 0; index < ring.length; index += 2) {
    const x = ring[index]!
    const y = ring[index + 1]!
    if (x < minX) minX = x
    if (x > maxX) maxX = x
    if (y < minY) minY = y
    if (y > maxY) maxY = y
  }
  return { minX, minY, maxX, maxY }
}

export function translateFlatRing(ring: FlatRing, dx: number, dy: number): FlatRing {
  const moved = new Float64Array(ring.length)
  for (let index = 0; index < ring.length; index += 2) {
    moved[index] = ring[index]! + dx
    moved[index + 1] = ring[index + 1]! + dy
  }
  return moved
}

export const boxesTouch = (a: Box, b: Box, grow = 0): boolean =>
  a.minX <= b.maxX + grow && b.minX <= a.maxX + grow && a.minY <= b.maxY + grow && b.minY <= a.maxY + grow

/** The gap between two boxes along the axis where they are furthest apart; ≤ 0 when they meet. A lower bound of the distance between anything inside them. */
export function boxGap(a: Box, b: Box): number {
  return Math.max(b.minX - a.maxX, a.minX - b.maxX, b.minY - a.maxY, a.minY - b.maxY)
}

/** Even-odd ray test. A point on an edge may land either way: callers that care test `distanceToRingBelow` first. */
export function pointInFlatRing(x: number, y: number, ring: FlatRing): boolean {
  let inside = false
  const count = ring.length
  for (let index = 0, previous = count - 2; index < count; previous = index, index += 2) {
    const xi = ring[index]!
    const yi = ring[index + 1]!
    const xj = ring[previous]!
    const yj = ring[previous + 1]!
    if (yi > y !== yj > y && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) inside = !inside
  }
  return inside
}

function pointSegmentDistanceSquared(px: number, py: number, ax: number, ay: number, bx: number, by: number): number {
  const dx = bx - ax
  const dy = by - ay
  const lengthSquared = dx * dx + dy * dy
  let t = lengthSquared > 0 ? ((px - ax) * dx + (py - ay) * dy) / lengthSquared : 0
  if (t < 0) t = 0
  else if (t > 1) t = 1
  const cx = ax + t * dx - px
  const cy = ay + t * dy - py
  return cx * cx + cy * cy
}

/** True when the point lies within `distance` of the ring's boundary. Cost: one pass over the ring. */
export function pointNearRing(x: number, y: number, ring: FlatRing, distance: number): boolean {
  const limit = distance * distance
  const count = ring.length
  for (let index = 0, previous = count - 2; index < count; previous = index, index += 2) {
    if (pointSegmentDistanceSquared(x, y, ring[previous]!, ring[previous + 1]!, ring[index]!, ring[index + 1]!) <= limit) return true
  }
  return false
}

/**
 * Signed distance of (px, py) from the line through a→b, in millimetres (positive to the left when y points up).
 * A zero-length segment gives 0.
 */
function sideOf(ax: number, ay: number, bx: number, by: number, px: number, py: number): number {
  const dx = bx - ax
  const dy = by - ay
  const length = Math.hypot(dx, dy)
  if (length === 0) return 0
  return (dx * (py - ay) - dy * (px - ax)) / length
}

/** Segments cross at one point inside both, not at an end and not along a shared line (touching is not crossing). */
function segmentsCrossProperly(ax: number, ay: number, bx: number, by: number, cx: number, cy: number, dx: number, dy: number): boolean {
  const d1 = sideOf(cx, cy, dx, dy, ax, ay)
  const d2 = sideOf(cx, cy, dx, dy, bx, by)
  if (!((d1 > TOUCH_MM && d2 < -TOUCH_MM) || (d1 < -TOUCH_MM && d2 > TOUCH_MM))) return false
  const d3 = sideOf(ax, ay, bx, by, cx, cy)
  const d4 = sideOf(ax, ay, bx, by, dx, dy)
  return (d3 > TOUCH_MM && d4 < -TOUCH_MM) || (d3 < -TOUCH_MM && d4 > TOUCH_MM)
}

function segmentsDistanceSquared(ax: number, ay: number, bx: number, by: number, cx: number, cy: number, dx: number, dy: number): number {
  if (segmentsCrossProperly(ax, ay, bx, by, cx, cy, dx, dy)) return 0
  return Math.min(
    pointSegmentDistanceSquared(ax, ay, cx, cy, dx, dy),
    pointSegmentDistanceSquared(bx, by, cx, cy, dx, dy),
    pointSegmentDistanceSquared(cx, cy, ax, ay, bx, by),
    pointSegmentDistanceSquared(dx, dy, ax, ay, bx, by),
  )
}

/**
 * Start offsets of the edges of `ring` whose box meets `region` (grown by `grow`): the only edges that can cross or
 * come near anything inside the region. Cost: one pass over the ring.
 */
function edgesNear(ring: FlatRing, region: Box, grow: number): number[] {
  const edges: number[] = []
  const count = ring.length
  const minX = region.minX - grow
  const minY = region.minY - grow
  const maxX = region.maxX + grow
  const maxY = region.maxY + grow
  for (let index = 0, previous = count - 2; index < count; previous = index, index += 2) {
    const ax = ring[previous]!
    const ay = ring[previous + 1]!
    const bx = ring[index]!
    const by = ring[index + 1]!
    if ((ax < minX && bx < minX) || (ax > maxX && bx > maxX) || (ay < minY && by < minY) || (ay > maxY && by > maxY)) continue
    edges.push(previous, index)
  }
  return edges
}

/**
 * Walks the pairs of edges of a and b that may come within `grow` of each other, calling `visit` until it returns
 * true. Edges are first narrowed to the other ring's box, then pairs by their own boxes; worst case n × m.
 */
function someEdgePair(a: FlatRing, aBox: Box, b: FlatRing, bBox: Box, grow: number, visit: (ax: number, ay: number, bx: number, by: number, cx: number, cy: number, dx: number, dy: number) => boolean): boolean {
  const aEdges = edgesNear(a, bBox, grow)
  if (aEdges.length === 0) return false
  const bEdges = edgesNear(b, aBox, grow)
  for (let i = 0; i < aEdges.length; i += 2) {
    const ax = a[aEdges[i]!]!
    const ay = a[aEdges[i]! + 1]!
    const bx = a[aEdges[i + 1]!]!
    const by = a[aEdges[i + 1]! + 1]!
    const minX = (ax < bx ? ax : bx) - grow
    const maxX = (ax > bx ? ax : bx) + grow
    const minY = (ay < by ? ay : by) - grow
    const maxY = (ay > by ? ay : by) + grow
    for (let j = 0; j < bEdges.length; j += 2) {
      const cx = b[bEdges[j]!]!
      const cy = b[bEdges[j]! + 1]!
      const dx = b[bEdges[j + 1]!]!
      const dy = b[bEdges[j + 1]! + 1]!
      if ((cx < minX && dx < minX) || (cx > maxX && dx > maxX) || (cy < minY && dy < minY) || (cy > maxY && dy > maxY)) continue
      if (visit(ax, ay, bx, by, cx, cy, dx, dy)) return true
    }
  }
  return false
}

/** Some edge of a crosses some edge of b at a point inside both edges (touching does not count). */
export function ringsCross(a: FlatRing, aBox: Box, b: FlatRing, bBox: Box): boolean {
  return someEdgePair(a, aBox, b, bBox, 0, segmentsCrossProperly)
}

/** The boundaries of a and b come closer than `distance` somewhere (crossing counts as distance 0). */
export function ringsCloserThan(a: FlatRing, aBox: Box, b: FlatRing, bBox: Box, distance: number): boolean {
  if (distance <= 0) return false
  const limit = distance * distance
  return someEdgePair(a, aBox, b, bBox, distance, (ax, ay, bx, by, cx, cy, dx, dy) => segmentsDistanceSquared(ax, ay, bx, by, cx, cy, dx, dy) < limit)
}

/** Where a point lies relative to a polygon with holes: in its material, outside it, or on a boundary (within TOUCH_MM). */
export type PointPlace = 'inside' | 'outside' | 'boundary'

/**
 * Where (x, y) lies relative to the polygon. With `outsideIsEnough`, a point the ray test puts outside is called
 * outside without asking whether it touches a boundary (callers that already saw a point clearly outside need no more).
 */
export function placeOfPoint(x: number, y: number, outer: FlatRing, outerBox: Box, holes: readonly FlatRing[], holeBoxes: readonly Box[], outsideIsEnough = false): PointPlace {
  if (x < outerBox.minX - TOUCH_MM || x > outerBox.maxX + TOUCH_MM || y < outerBox.minY - TOUCH_MM || y > outerBox.maxY + TOUCH_MM) return 'outside'
  let inside = pointInFlatRing(x, y, outer)
  if (inside || !outsideIsEnough) {
    if (pointNearRing(x, y, outer, TOUCH_MM)) return 'boundary'
  }
  if (!inside) return 'outside'
  for (let index = 0; index < holes.length; index++) {
    const box = holeBoxes[index]!
    if (x < box.minX - TOUCH_MM || x > box.maxX + TOUCH_MM || y < box.minY - TOUCH_MM || y > box.maxY + TOUCH_MM) continue
    if (pointNearRing(x, y, holes[index]!, TOUCH_MM)) return 'boundary'
    if (pointInFlatRing(x, y, holes[index]!)) {
      inside = false
      break
    }
  }
  return inside ? 'inside' : 'outside'
}

let scratch = new Float64Array(256)

/** The polygon's vertices (outline and holes) inside `box` grown by TOUCH_MM, copied into a shared scratch array. */
function verticesWithin(box: Box, outer: FlatRing, outerBox: Box, holes: readonly FlatRing[], holeBoxes: readonly Box[]): number {
  const minX = box.minX - TOUCH_MM
  const maxX = box.maxX + TOUCH_MM
  const minY = box.minY - TOUCH_MM
  const maxY = box.maxY + TOUCH_MM
  let length = 0
  for (let ringIndex = -1; ringIndex < holes.length; ringIndex++) {
    const ring = ringIndex < 0 ? outer : holes[ringIndex]!
    const ringBox = ringIndex < 0 ? outerBox : holeBoxes[ringIndex]!
    if (ringBox.maxX < minX || ringBox.minX > maxX || ringBox.maxY < minY || ringBox.minY > maxY) continue
    for (let vertex = 0; vertex < ring.length; vertex += 2) {
      const px = ring[vertex]!
      const py = ring[vertex + 1]!
      if (px < minX || px > maxX || py < minY || py > maxY) continue
      if (length + 2 > scratch.length) {
        const grown = new Float64Array(scratch.length * 2)
        grown.set(scratch)
        scratch = grown
      }
      scratch[length++] = px
      scratch[length++] = py
    }
  }
  return length
}

/**
 * Where a ring's boundary runs relative to a polygon with holes: 'inside' as soon as some stretch of it lies in the
 * polygon's material; else 'boundary' when all of it lies on the polygon's boundaries; else 'outside'. Each edge is cut
 * where the polygon's vertices touch it, and the middle of every stretch is tested, so boundaries that share a line or
 * meet at vertices (labels placed edge to edge) are judged right. Cost: edges near the polygon × its points.
 */
export function boundaryPlace(ring: FlatRing, ringBox: Box, outer: FlatRing, outerBox: Box, holes: readonly FlatRing[], holeBoxes: readonly Box[]): PointPlace {
  // Only the polygon's vertices inside the ring's box can touch one of its edges.
  const vertexCount = verticesWithin(ringBox, outer, outerBox, holes, holeBoxes)
  const vertices = scratch
  let sawOutside = false
  const cuts: number[] = [0, 1]
  const count = ring.length
  for (let index = 0, previous = count - 2; index < count; previous = index, index += 2) {
    const ax = ring[previous]!
    const ay = ring[previous + 1]!
    const bx = ring[index]!
    const by = ring[index + 1]!
    const minX = (ax < bx ? ax : bx) - TOUCH_MM
    const maxX = (ax > bx ? ax : bx) + TOUCH_MM
    const minY = (ay < by ? ay : by) - TOUCH_MM
    const maxY = (ay > by ? ay : by) + TOUCH_MM
    if (maxX < outerBox.minX || minX > outerBox.maxX || maxY < outerBox.minY || minY > outerBox.maxY) {
      sawOutside = true
      continue
    }
    const dx = bx - ax
    const dy = by - ay
    const lengthSquared = dx * dx + dy * dy
    cuts.length = 2
    if (lengthSquared > 0) {
      for (let vertex = 0; vertex < vertexCount; vertex += 2) {
        const px = vertices[vertex]!
        const py = vertices[vertex + 1]!
        if (px < minX || px > maxX || py < minY || py > maxY) continue
        const t = ((px - ax) * dx + (py - ay) * dy) / lengthSquared
        if (t <= 0 || t >= 1) continue
        const cx = ax + t * dx - px
        const cy = ay + t * dy - py
        if (cx * cx + cy * cy <= TOUCH_MM * TOUCH_MM) cuts.push(t)
      }
    }
    if (cuts.length > 2) cuts.sort((left, right) => left - right)
    for (let cut = 1; cut < cuts.length; cut++) {
      const t = (cuts[cut - 1]! + cuts[cut]!) / 2
      const place = placeOfPoint(ax + t * dx, ay + t * dy, outer, outerBox, holes, holeBoxes, sawOutside)
      if (place === 'inside') return 'inside'
      if (place === 'outside') sawOutside = true
    }
  }
  return sawOutside ? 'outside' : 'boundary'
}
