import earcut from 'earcut'
import type { IntPath, IntPoint, IntShape } from './intGeometry.js'

/**
 * Splits a polygon with holes into convex parts: earcut's triangulation, then Hertel–Mehlhorn merging (remove a
 * diagonal whenever both polygons it separates stay convex without it; at most four times the optimal count,
 * Hertel & Mehlhorn 1983). Parts are counter-clockwise (positive area in Clipper's sense), integer coordinates.
 * Cost: O(n log n) for the triangulation, O(n) merges with a convexity check at two vertices each.
 */
export function convexParts(shape: IntShape): IntPath[] {
  const rings = [shape.outer, ...shape.holes]
  const coordinates: number[] = []
  const holeStarts: number[] = []
  for (const [ringIndex, ring] of rings.entries()) {
    if (ringIndex > 0) holeStarts.push(coordinates.length / 2)
    for (const point of ring) coordinates.push(point.X, point.Y)
  }
  const vertexCount = coordinates.length / 2
  const triangles = earcut(coordinates, holeStarts, 2)

  const x = (index: number) => coordinates[2 * index]!
  const y = (index: number) => coordinates[2 * index + 1]!
  const cross = (a: number, b: number, c: number) => (x(b) - x(a)) * (y(c) - y(a)) - (y(b) - y(a)) * (x(c) - x(a))

  // Polygons as vertex-index cycles, counter-clockwise in the (x right, y up) sense of Clipper's positive area.
  const polygons: (number[] | undefined)[] = []
  for (let index = 0; index < triangles.length; index += 3) {
    const a = triangles[index]!
    const b = triangles[index + 1]!
    const c = triangles[index + 2]!
    const turn = cross(a, b, c)
    if (turn === 0) continue
    polygons.push(turn > 0 ? [a, b, c] : [a, c, b])
  }

  // Directed edge → owning polygon; an interior diagonal appears in both directions.
  const edgeKey = (from: number, to: number) => from * vertexCount + to
  const owner = new Map<number, number>()
  polygons.forEach((polygon, polygonIndex) => {
    for (let index = 0; index < polygon!.length; index++) owner.set(edgeKey(polygon![index]!, polygon![(index + 1) % polygon!.length]!), polygonIndex)
  })

  const convexAt = (cycle: number[], position: number) => {
    const count = cycle.length
    return cross(cycle[(position - 1 + count) % count]!, cycle[position]!, cycle[(position + 1) % count]!) >= 0
  }

  for (let polygonIndex = 0; polygonIndex < polygons.length; polygonIndex++) {
    let merged = true
    while (merged && polygons[polygonIndex]) {
      merged = false
      const polygon = polygons[polygonIndex]!
      for (let index = 0; index < polygon.length; index++) {
        const a = polygon[index]!
        const b = polygon[(index + 1) % polygon.length]!
        const neighbourIndex = owner.get(edgeKey(b, a))
        if (neighbourIndex === undefined || neighbourIndex === polygonIndex || !polygons[neighbourIndex]) continue
        const neighbour = polygons[neighbourIndex]!
        const at = neighbour.findIndex((vertex, position) => vertex === b && neighbour[(position + 1) % neighbour.length] === a)
        if (at < 0) continue
        // Walk this polygon from b round to a, then the neighbour from a round to b (without repeating a and b).
        const cycle: number[] = []
        for (let step = 0; step < polygon.length; step++) cycle.push(polygon[(index + 1 + step) % polygon.length]!)
        for (let step = 2; step < neighbour.length; step++) cycle.push(neighbour[(at + step) % neighbour.length]!)
        const positionOfA = polygon.length - 1
        if (!convexAt(cycle, 0) || !convexAt(cycle, positionOfA)) continue
        polygons[polygonIndex] = cycle
        polygons[neighbourIndex] = undefined
        for (let position = 0; position < cycle.length; position++) owner.set(edgeKey(cycle[position]!, cycle[(position + 1) % cycle.length]!), polygonIndex)
        merged = true
        break
      }
    }
  }
  return polygons.filter((polygon): polygon is number[] => polygon !== undefined).map((polygon) => polygon.map((vertex) => ({ X: x(vertex), Y: y(vertex) })))
}

/**
 * Minkowski sum of two convex polygons (counter-clockwise, any start vertex) by merging their edges in angle order:
 * O(n + m). Collinear vertices may remain, which Clipper accepts.
 */
export function convexSum(p: IntPath, q: IntPath): IntPath {
  const start = (path: IntPath) => {
    let lowest = 0
    for (let index = 1; index < path.length; index++) {
      const point = path[index]!
      const best = path[lowest]!
      if (point.Y < best.Y || (point.Y === best.Y && point.X < best.X)) lowest = index
    }
    return lowest
  }
  const pStart = start(p)
  const qStart = start(q)
  const n = p.length
  const m = q.length
  const sum: IntPath = []
  let i = 0
  let j = 0
  while (i < n || j < m) {
    const pi = p[(pStart + i) % n]!
    const qj = q[(qStart + j) % m]!
    sum.push({ X: pi.X + qj.X, Y: pi.Y + qj.Y })
    const pNext = p[(pStart + i + 1) % n]!
    const qNext = q[(qStart + j + 1) % m]!
    const turn = i >= n ? -1 : j >= m ? 1 : (pNext.X - pi.X) * (qNext.Y - qj.Y) - (pNext.Y - pi.Y) * (qNext.X - qj.X)
    if (turn >= 0 && i < n) i++
    if (turn <= 0 && j < m) j++
  }
  return sum
}

/** Andrew's monotone chain on integer points; counter-clockwise, collinear points dropped. */
export function convexHullInt(points: IntPoint[]): IntPath {
  points.sort((left, right) => left.X - right.X || left.Y - right.Y)
  if (points.length < 3) return points
  const turn = (o: IntPoint, a: IntPoint, b: IntPoint) => (a.X - o.X) * (b.Y - o.Y) - (a.Y - o.Y) * (b.X - o.X)
  const hull: IntPoint[] = []
  for (const point of points) {
    while (hull.length >= 2 && turn(hull[hull.length - 2]!, hull[hull.length - 1]!, point) <= 0) hull.pop()
    hull.push(point)
  }
  const lowerSize = hull.length + 1
  for (let index = points.length - 2; index >= 0; index--) {
    const point = points[index]!
    while (hull.length >= lowerSize && turn(hull[hull.length - 2]!, hull[hull.length - 1]!, point) <= 0) hull.pop()
    hull.push(point)
  }
  hull.pop()
  return hull
}

/**
 * The smallest octagon with sides at 0°, 45°, 90° and 135° that holds the points: eight support lines, so it is
 * computed in one pass and always contains the shape (a disc's octagon is 5 % larger than the disc, its square 27 %).
 * Counter-clockwise; repeated corners are dropped.
 */
export function boundingOctagon(points: IntPoint[]): IntPath {
  let minX = Infinity
  let maxX = -Infinity
  let minY = Infinity
  let maxY = -Infinity
  let minSum = Infinity
  let maxSum = -Infinity
  let minDifference = Infinity
  let maxDifference = -Infinity
  for (const { X, Y } of points) {
    minX = Math.min(minX, X)
    maxX = Math.max(maxX, X)
    minY = Math.min(minY, Y)
    maxY = Math.max(maxY, Y)
    minSum = Math.min(minSum, X + Y)
    maxSum = Math.max(maxSum, X + Y)
    minDifference = Math.min(minDifference, X - Y)
    maxDifference = Math.max(maxDifference, X - Y)
  }
  const corners: IntPath = [
    { X: minSum - minY, Y: minY },
    { X: maxDifference + minY, Y: minY },
    { X: maxX, Y: maxX - maxDifference },
    { X: maxX, Y: maxSum - maxX },
    { X: maxSum - maxY, Y: maxY },
    { X: minDifference + maxY, Y: maxY },
    { X: minX, Y: minX - minDifference },
    { X: minX, Y: minSum - minX },
  ]
  return corners.filter((corner, index) => {
    const next = corners[(index + 1) % corners.length]!
    return corner.X !== next.X || corner.Y !== next.Y
  })
}
