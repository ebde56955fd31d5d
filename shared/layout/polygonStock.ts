import polygonClipping, { type MultiPolygon, type Polygon } from 'polygon-clipping'
import type { Box } from '../geometry/polygon.js'
import { signedArea } from '../geometry/polygon.js'
import { chooseScale, fromIntPath, offsetPaths, orient, pathArea, toIntPath } from '../nesting/intGeometry.js'
import type { LayoutStock, PolygonLayoutStock } from '../schemas/layouts.js'
import type { PlacedPolygon } from './placedGeometry.js'
import type { FlatRing } from './rings.js'

/**
 * Stock of its own outline (a remnant) in a layout: its area, the region pieces may use (the outline less the margin),
 * and the exact containment tests the editor needs for it.
 */

type Point = [number, number]

/** One usable polygon: outer ring first, then holes (polygon-clipping's shape, rings not closed). */
export type RegionPolygon = Point[][]

const ringArea = (ring: readonly (readonly [number, number])[]) => Math.abs(signedArea(ring))

/** Area of a polygon stock: the outline less its holes. */
export function polygonStockAreaMm2(stock: Pick<PolygonLayoutStock, 'outline' | 'holes'>): number {
  return ringArea(stock.outline) - (stock.holes ?? []).reduce((sum, hole) => sum + ringArea(hole), 0)
}

const regionCache = new WeakMap<PolygonLayoutStock, Map<number, RegionPolygon[]>>()

/**
 * Where pieces may lie on a polygon stock: its outline and holes moved inwards by the margin, with mitred corners
 * through Clipper's integer offset, as the nesting engine insets a polygon stock (so the editor and an auto-arrange
 * agree). A narrow neck may split the region into several polygons. Cached per stock object and margin, since the
 * editor asks on every check.
 */
export function usableRegion(stock: PolygonLayoutStock, marginMm: number): RegionPolygon[] {
  let byMargin = regionCache.get(stock)
  if (!byMargin) regionCache.set(stock, (byMargin = new Map()))
  const known = byMargin.get(marginMm)
  if (known) return known
  let region: RegionPolygon[]
  if (marginMm <= 0) {
    region = [[stock.outline.map(([x, y]) => [x, y] as Point), ...(stock.holes ?? []).map((hole) => hole.map(([x, y]) => [x, y] as Point))]]
  } else {
    const scale = chooseScale(Math.max(stock.widthMm, stock.heightMm))
    const paths = offsetPaths([orient(toIntPath(stock.outline, scale), true), ...(stock.holes ?? []).map((hole) => orient(toIntPath(hole, scale), false))], -marginMm * scale)
    // Clipper answers with outer rings (positive area) and holes (negative); each hole goes to the outer that holds it.
    const outers = paths.filter((path) => pathArea(path) > 0).map((path) => fromIntPath(path, scale))
    const holes = paths.filter((path) => pathArea(path) < 0).map((path) => fromIntPath(path, scale))
    region = outers.map((outer) => [outer])
    for (const hole of holes) {
      const [x, y] = hole[0]!
      const owner = region.find((polygon) => pointInRing(x, y, polygon[0]!)) ?? region[0]
      owner?.push(hole)
    }
  }
  byMargin.set(marginMm, region)
  return region
}

/** The region for any stock: null for sheets and rolls (their usable area is the box `usableArea` gives). */
export function usableRegionOf(stock: LayoutStock, marginMm: number): RegionPolygon[] | null {
  return stock.kind === 'polygon' ? usableRegion(stock, marginMm) : null
}

function pointInRing(x: number, y: number, ring: readonly (readonly [number, number])[]): boolean {
  let inside = false
  for (let index = 0, previous = ring.length - 1; index < ring.length; previous = index++) {
    const [xi, yi] = ring[index]!
    const [xj, yj] = ring[previous]!
    if (yi > y !== yj > y && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) inside = !inside
  }
  return inside
}

const pointsOfFlat = (ring: FlatRing): Point[] => {
  const points: Point[] = []
  for (let index = 0; index + 1 < ring.length; index += 2) points.push([ring[index]!, ring[index + 1]!])
  return points
}

const multiArea = (polygons: MultiPolygon) => polygons.reduce((sum, polygon) => sum + ringArea(polygon[0]!) - polygon.slice(1).reduce((holes, hole) => holes + ringArea(hole), 0), 0)

/**
 * Area of a piece lying outside the region below which it still counts as inside: boundaries that coincide leave
 * floating-point slivers of far less than this (0.01 mm × 0.01 mm).
 */
const OUTSIDE_AREA_SLACK_MM2 = 1e-4

/** Whether some of the placed polygons lies outside the region (beyond the outline, in a hole, or in the margin). Exact, by polygon clipping. */
export function polygonsOutsideRegion(polygons: readonly PlacedPolygon[], region: readonly RegionPolygon[]): boolean {
  if (region.length === 0) return polygons.length > 0
  const clip = region as unknown as MultiPolygon
  for (const polygon of polygons) {
    const subject: Polygon = [pointsOfFlat(polygon.outer), ...polygon.holes.map(pointsOfFlat)]
    if (multiArea(polygonClipping.difference(subject, clip)) > OUTSIDE_AREA_SLACK_MM2) return true
  }
  return false
}

/** Whether a segment runs through the open inside of a box (touching its edges is fine). Liang–Barsky clipping. */
function segmentEntersBox(ax: number, ay: number, bx: number, by: number, box: Box, slack: number): boolean {
  const minX = box.minX + slack
  const minY = box.minY + slack
  const maxX = box.maxX - slack
  const maxY = box.maxY - slack
  if (minX >= maxX || minY >= maxY) return false
  let t0 = 0
  let t1 = 1
  const dx = bx - ax
  const dy = by - ay
  const edges: [number, number][] = [
    [-dx, ax - minX],
    [dx, maxX - ax],
    [-dy, ay - minY],
    [dy, maxY - ay],
  ]
  for (const [p, q] of edges) {
    if (p === 0) {
      if (q <= 0) return false
    } else {
      const t = q / p
      if (p < 0) {
        if (t > t1) return false
        if (t > t0) t0 = t
      } else {
        if (t < t0) return false
        if (t < t1) t1 = t
      }
    }
  }
  return t1 > t0
}

/**
 * Whether a rectangle lies wholly inside the region: no ring of the region runs through its inside, and its centre is
 * in the region's material (a connected inside that no boundary enters is all in or all out). Cost: the region's points.
 */
export function boxInsideRegion(box: Box, region: readonly RegionPolygon[]): boolean {
  const slack = 1e-7
  const centreX = (box.minX + box.maxX) / 2
  const centreY = (box.minY + box.maxY) / 2
  for (const polygon of region) {
    for (const ring of polygon) {
      for (let index = 0, previous = ring.length - 1; index < ring.length; previous = index++) {
        const [ax, ay] = ring[previous]!
        const [bx, by] = ring[index]!
        if (segmentEntersBox(ax, ay, bx, by, box, slack)) return false
      }
    }
  }
  return region.some((polygon) => pointInRing(centreX, centreY, polygon[0]!) && !polygon.slice(1).some((hole) => pointInRing(centreX, centreY, hole)))
}

/** The box around the region (the polygon's drawn box less nothing: where the free-spot scan starts and ends). */
export function regionBox(region: readonly RegionPolygon[]): Box | null {
  let minX = Infinity
  let minY = Infinity
  let maxX = -Infinity
  let maxY = -Infinity
  for (const polygon of region) {
    for (const [x, y] of polygon[0] ?? []) {
      minX = Math.min(minX, x)
      minY = Math.min(minY, y)
      maxX = Math.max(maxX, x)
      maxY = Math.max(maxY, y)
    }
  }
  return minX <= maxX ? { minX, minY, maxX, maxY } : null
}
