import polygonClipping, { type MultiPolygon, type Polygon, type Ring } from 'polygon-clipping'
import { signedArea } from '../geometry/polygon.js'
import { chooseScale, fromIntPath, offsetPaths, orient, toIntPath } from '../nesting/intGeometry.js'

type Point = [number, number]

export interface SheetRemnantInput {
  widthMm: number
  heightMm: number
  /** The layout's margin on every side: the usable area starts inside it. */
  marginMm: number
  /** Pieces are grown by this before they are taken away, so the remnant keeps the layout's gap to every cut. */
  spacingMm: number
  /** Outer outlines of the pieces on the sheet, in sheet millimetres (holes fall out with their piece). */
  pieceOutlines: readonly (readonly (readonly [number, number])[])[]
  /**
   * Stock of its own outline (a remnant laid out again): the region pieces could use, outer ring first then holes per
   * polygon, already inside the margin. It takes the place of the rectangle inside the margin.
   */
  usableRegion?: readonly (readonly (readonly [number, number])[])[][]
}

export interface SheetRemnant {
  /** Outer ring first, then holes, in sheet coordinates. */
  rings: Point[][]
  areaMm2: number
  box: { minX: number; minY: number; maxX: number; maxY: number }
}

const ringArea = (ring: readonly (readonly [number, number])[]) => Math.abs(signedArea(ring))

/** Area of one polygon-clipping polygon: outer less its holes. */
export function polygonArea(polygon: Polygon | Point[][]): number {
  const [outer, ...holes] = polygon
  if (!outer) return 0
  return ringArea(outer as Point[]) - holes.reduce((sum, hole) => sum + ringArea(hole as Point[]), 0)
}

/** polygon-clipping closes rings by repeating the first point; stored outlines do not. */
function openRing(ring: Ring): Point[] {
  const points = ring.map(([x, y]) => [x, y] as Point)
  const first = points[0]
  const last = points[points.length - 1]
  if (points.length > 1 && first && last && first[0] === last[0] && first[1] === last[1]) points.pop()
  return points
}

/** Outlines grown by `deltaMm` with mitred corners (never smaller than the true offset), through Clipper's integer offset. */
function grow(outlines: readonly (readonly (readonly [number, number])[])[], deltaMm: number, extentMm: number): Point[][] {
  const rings = outlines.filter((ring) => ring.length >= 3)
  if (deltaMm <= 0) return rings.map((ring) => ring.map(([x, y]) => [x, y] as Point))
  const scale = chooseScale(extentMm + 2 * deltaMm)
  const grown = offsetPaths(
    rings.map((ring) => orient(toIntPath(ring, scale), true)),
    deltaMm * scale,
  )
  return grown.map((path) => fromIntPath(path, scale))
}

/**
 * The leftover of one sheet worth keeping: the usable rectangle (inside the margin) less the placed pieces grown by the
 * layout's spacing, and of what remains the largest connected region (several small islands between pieces are not
 * stock anyone can use; the biggest one usually is). Null when nothing is left.
 * Exact for straight-edged input without spacing (polygon-clipping works in floating point); with spacing the grown
 * outlines go through an integer offset at a scale that keeps well under a micrometre.
 */
export function sheetRemnant(input: SheetRemnantInput): SheetRemnant | null {
  const { widthMm, heightMm, marginMm } = input
  const left = marginMm
  const top = marginMm
  const right = widthMm - marginMm
  const bottom = heightMm - marginMm
  if (right <= left || bottom <= top) return null
  const usable: MultiPolygon = input.usableRegion
    ? input.usableRegion.map((polygon) => polygon.map((ring) => ring.map(([x, y]) => [x, y] as [number, number])))
    : [
        [
          [
            [left, top],
            [right, top],
            [right, bottom],
            [left, bottom],
            [left, top],
          ],
        ],
      ]
  const grown = grow(input.pieceOutlines, input.spacingMm, Math.max(widthMm, heightMm))
  const clips: Polygon[] = grown.map((ring) => [ring.map(([x, y]) => [x, y] as [number, number])])
  const rest: MultiPolygon = clips.length === 0 ? usable : polygonClipping.difference(usable, ...clips)
  let best: Polygon | null = null
  let bestArea = 0
  for (const polygon of rest) {
    const area = polygonArea(polygon)
    if (area > bestArea) {
      best = polygon
      bestArea = area
    }
  }
  if (!best || bestArea <= 0) return null
  const rings = best.map(openRing)
  const outer = rings[0]!
  const xs = outer.map(([x]) => x)
  const ys = outer.map(([, y]) => y)
  return { rings, areaMm2: bestArea, box: { minX: Math.min(...xs), minY: Math.min(...ys), maxX: Math.max(...xs), maxY: Math.max(...ys) } }
}

/** The remnant moved so its box starts at (0, 0): how a stock item stores its outline inside width × height. */
export function remnantAsStockOutline(remnant: SheetRemnant): { widthMm: number; heightMm: number; outline: Point[][] } {
  const { minX, minY, maxX, maxY } = remnant.box
  return {
    widthMm: maxX - minX,
    heightMm: maxY - minY,
    outline: remnant.rings.map((ring) => ring.map(([x, y]) => [x - minX, y - minY] as Point)),
  }
}

export interface PlacedOutlineSource {
  designId: string
  pieceIndex: number
  sheet: number
  xMm: number
  yMm: number
  angleDeg: number
  mirrored: boolean
}

/** The last sheet that holds a piece (the one a job leaves part-used), or null when nothing is placed. */
export function lastUsedSheet(placements: readonly Pick<PlacedOutlineSource, 'sheet'>[]): number | null {
  return placements.reduce<number | null>((last, placement) => (last === null || placement.sheet > last ? placement.sheet : last), null)
}

/** Flat ring [x0, y0, x1, y1, …] to points. */
export function pointsOfFlatRing(ring: ArrayLike<number>): Point[] {
  const points: Point[] = []
  for (let index = 0; index + 1 < ring.length; index += 2) points.push([ring[index]!, ring[index + 1]!])
  return points
}
