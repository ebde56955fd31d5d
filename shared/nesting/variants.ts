import { offsetPaths, orient, pathArea, toIntPath, type IntPath, type IntShape } from './intGeometry.js'
import { boundingBox } from '../geometry/polygon.js'
import type { NestItem, RingPoints, Vec } from './types.js'

/** One way an item can lie on the stock: an angle and a side, with its shapes prepared for the search. */
export interface Variant {
  id: number
  itemIndex: number
  angleDeg: number
  mirrored: boolean
  /** The real outline and holes in this orientation, moved so their bounding box starts at (0, 0). */
  outline: RingPoints
  holes: RingPoints[]
  /** Translation applied after mirroring and rotating the item's own coordinates (input units). */
  shift: Vec
  /** For spacing between pieces: grown by half the spacing plus the safety allowances (integer units). */
  spacedShape: IntShape
  /** For fitting inside the stock: grown by the safety allowances only. */
  fitShape: IntShape
  fitBounds: { minX: number; minY: number; maxX: number; maxY: number }
  widthReal: number
  heightReal: number
  /** The real outline's width and height in integer units, rounded up: the inner-fit rectangle comes from these. */
  extentX: number
  extentY: number
}

export function transformRing(ring: RingPoints, angleDeg: number, mirrored: boolean): RingPoints {
  const radians = (angleDeg * Math.PI) / 180
  const cos = Math.abs(Math.cos(radians)) < 1e-15 ? 0 : Math.cos(radians)
  const sin = Math.abs(Math.sin(radians)) < 1e-15 ? 0 : Math.sin(radians)
  return ring.map(([x0, y]) => {
    const x = mirrored ? -x0 : x0
    return [x * cos - y * sin, x * sin + y * cos]
  })
}

/** Douglas–Peucker on a closed ring; every original point stays within `tolerance` of the result. */
function simplifyRing(ring: RingPoints, tolerance: number): RingPoints {
  if (tolerance <= 0 || ring.length <= 8) return ring
  const closed = [...ring, ring[0]!]
  const keep = new Uint8Array(closed.length)
  keep[0] = 1
  keep[closed.length - 1] = 1
  const stack: [number, number][] = [[0, closed.length - 1]]
  while (stack.length) {
    const [first, last] = stack.pop()!
    const [ax, ay] = closed[first]!
    const [bx, by] = closed[last]!
    const dx = bx - ax
    const dy = by - ay
    const length = Math.hypot(dx, dy)
    let farthest = -1
    let distanceMax = tolerance
    for (let index = first + 1; index < last; index++) {
      const [px, py] = closed[index]!
      const distance = length === 0 ? Math.hypot(px - ax, py - ay) : Math.abs(dy * px - dx * py + bx * ay - by * ax) / length
      if (distance > distanceMax) {
        distanceMax = distance
        farthest = index
      }
    }
    if (farthest >= 0) {
      keep[farthest] = 1
      stack.push([first, farthest], [farthest, last])
    }
  }
  const result = closed.filter((_, index) => keep[index] === 1)
  result.pop()
  return result.length >= 3 ? result : ring
}


/**
 * Grows an outline (and shrinks its holes) by `grow` integer units; holes that close up are dropped.
 * The outline is simplified first within `simplify` units, and grown by that much more, so it still covers the original.
 */
function grownShape(outline: RingPoints, holes: RingPoints[], scale: number, grow: number, simplify: number): IntShape {
  const simplifyUnits = simplify / scale
  const outer = offsetPaths([orient(toIntPath(simplifyRing(outline, simplifyUnits), scale), true)], grow + simplify)
  const largest = outer.reduce((best, path) => (Math.abs(pathArea(path)) > Math.abs(pathArea(best)) ? path : best), outer[0]!)
  const grownHoles: IntPath[] = []
  for (const hole of holes) {
    for (const path of offsetPaths([orient(toIntPath(simplifyRing(hole, simplifyUnits), scale), true)], -(grow + simplify))) {
      if (Math.abs(pathArea(path)) > 0) grownHoles.push(orient(path, false))
    }
  }
  return { outer: orient(largest, true), holes: grownHoles }
}

export interface VariantSettings {
  scale: number
  /** Half the spacing, in integer units. */
  halfSpacing: number
  /** Safety allowance every shape grows by (integer units) so touching positions never overlap. */
  safety: number
  /** Simplification tolerance in integer units. */
  simplify: number
}

/**
 * Drops the holes no piece of the job could ever sit in (its bounding box fits no variant's): they cannot change
 * where anything goes, and each hole multiplies the cost of every no-fit region of its piece.
 */
function dropUselessHoles(all: Variant[][]): void {
  const sizes = all.flat().map((variant) => {
    const box = boxOfPath(variant.spacedShape.outer)
    return [box.maxX - box.minX, box.maxY - box.minY] as const
  })
  for (const variant of all.flat()) {
    variant.spacedShape.holes = variant.spacedShape.holes.filter((hole) => {
      const box = boxOfPath(hole)
      const width = box.maxX - box.minX
      const height = box.maxY - box.minY
      return sizes.some(([pieceWidth, pieceHeight]) => pieceWidth <= width && pieceHeight <= height)
    })
  }
}

function boxOfPath(path: IntPath) {
  let minX = Infinity
  let minY = Infinity
  let maxX = -Infinity
  let maxY = -Infinity
  for (const point of path) {
    if (point.X < minX) minX = point.X
    if (point.Y < minY) minY = point.Y
    if (point.X > maxX) maxX = point.X
    if (point.Y > maxY) maxY = point.Y
  }
  return { minX, minY, maxX, maxY }
}

/** Every allowed orientation of every item, prepared once per job. */
export function buildVariants(items: NestItem[], settings: VariantSettings): Variant[][] {
  const all = buildAllVariants(items, settings)
  dropUselessHoles(all)
  return all
}

function buildAllVariants(items: NestItem[], settings: VariantSettings): Variant[][] {
  let nextId = 0
  return items.map((item, itemIndex) => {
    const mirrors = item.mirror === 'always' ? [true] : item.mirror === 'allowed' ? [false, true] : [false]
    const angles = [...new Set(item.rotationsDeg.map((angle) => ((angle % 360) + 360) % 360))]
    const variants: Variant[] = []
    for (const mirrored of mirrors) {
      for (const angleDeg of angles.length ? angles : [0]) {
        const turned = transformRing(item.outline, angleDeg, mirrored)
        const bounds = boundingBox(turned)
        const shift: Vec = [-bounds.minX, -bounds.minY]
        const move = (ring: RingPoints): RingPoints => ring.map(([x, y]) => [x + shift[0], y + shift[1]])
        const outline = move(turned)
        const holes = (item.holes ?? []).map((hole) => move(transformRing(hole, angleDeg, mirrored)))
        const spacedShape = grownShape(outline, holes, settings.scale, settings.halfSpacing + settings.safety, settings.simplify)
        const fitShape = grownShape(outline, [], settings.scale, settings.safety, settings.simplify)
        let minX = Infinity
        let minY = Infinity
        let maxX = -Infinity
        let maxY = -Infinity
        for (const point of fitShape.outer) {
          minX = Math.min(minX, point.X)
          minY = Math.min(minY, point.Y)
          maxX = Math.max(maxX, point.X)
          maxY = Math.max(maxY, point.Y)
        }
        variants.push({
          id: nextId++,
          itemIndex,
          angleDeg,
          mirrored,
          outline,
          holes,
          shift,
          spacedShape,
          fitShape,
          fitBounds: { minX, minY, maxX, maxY },
          widthReal: bounds.maxX - bounds.minX,
          heightReal: bounds.maxY - bounds.minY,
          extentX: Math.ceil((bounds.maxX - bounds.minX) * settings.scale - 1e-6),
          extentY: Math.ceil((bounds.maxY - bounds.minY) * settings.scale - 1e-6),
        })
      }
    }
    return variants
  })
}
