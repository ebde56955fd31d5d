import ClipperLib from 'clipper-lib'
import { boundsOf, translatePath, type IntPath, type IntShape } from './intGeometry.js'
import { noFitRegion } from './noFitRegion.js'
import { zoneAppliesToSheet } from './types.js'
import type { Variant } from './variants.js'

/** One copy of one item in the placement order. */
export interface Instance {
  itemIndex: number
  copy: number
}

export interface PlacedPart {
  instance: Instance
  variant: Variant
  sheet: number
  /** Position of the variant's reference point, integer units. */
  x: number
  y: number
}

/** A fixed obstacle (an excluded zone) on one sheet, or on every sheet without `sheet`, as a variant-like shape at the origin. */
export interface Obstacle {
  key: string
  sheet?: number
  shape: { outer: IntPath; holes: IntPath[] }
}

export interface Container {
  kind: 'strip' | 'sheet' | 'region'
  /** Usable rectangle (after the margin) in integer units; for a strip, maxX is open-ended. */
  minX: number
  minY: number
  maxX: number
  maxY: number
  maxSheets: number
  /** For 'region': the inner-fit region of each variant, from the caller. */
  regionFor?: (variant: Variant) => IntPath[]
}

export interface CachedRegion {
  paths: IntPath[]
  minX: number
  minY: number
  maxX: number
  maxY: number
}

/**
 * No-fit regions cached per (placed variant, moving variant): each pair is computed once per job.
 * The key packs both variant ids into one number.
 */
export class NoFitCache {
  private readonly regions = new Map<number, CachedRegion>()
  private readonly obstacleRegions = new Map<string, CachedRegion>()
  private readonly boxes = new WeakMap<IntShape, { minX: number; minY: number; maxX: number; maxY: number }>()
  constructor(private readonly shrink: number) {}

  get(fixed: Variant, moving: Variant): CachedRegion {
    const key = fixed.id * 1_000_003 + moving.id
    let region = this.regions.get(key)
    if (!region) {
      const paths = noFitRegion(fixed.spacedShape, moving.spacedShape, this.shrink)
      region = { paths, ...boundsOf(paths) }
      this.regions.set(key, region)
    }
    return region
  }

  /**
   * A box that holds the no-fit region, without computing it: the bounding box of A ⊕ (−B) is the sum of the two
   * boxes. Lets the search skip far-away pieces before their region is ever built.
   */
  boundsOf(fixed: IntShape, moving: IntShape): { minX: number; minY: number; maxX: number; maxY: number } {
    const a = this.boxOf(fixed)
    const b = this.boxOf(moving)
    return { minX: a.minX - b.maxX, minY: a.minY - b.maxY, maxX: a.maxX - b.minX, maxY: a.maxY - b.minY }
  }

  private boxOf(shape: IntShape) {
    let box = this.boxes.get(shape)
    if (!box) {
      box = boundsOf([shape.outer])
      this.boxes.set(shape, box)
    }
    return box
  }

  forObstacle(obstacle: Obstacle, moving: Variant): CachedRegion {
    const key = `${obstacle.key}:${moving.id}`
    let region = this.obstacleRegions.get(key)
    if (!region) {
      const paths = noFitRegion(obstacle.shape, moving.spacedShape, this.shrink)
      region = { paths, ...boundsOf(paths) }
      this.obstacleRegions.set(key, region)
    }
    return region
  }

  get size(): number {
    return this.regions.size
  }
}

export interface Candidate {
  variant: Variant
  sheet: number
  x: number
  y: number
  score: number
}

/**
 * What one construction has learnt so far: per (sheet, variant), the x below which no free position is left.
 * Valid only while pieces are added, never removed (free space only shrinks), so a construction makes a new one.
 */
export type FilledUpTo = Map<number, number>

/**
 * Bottom-left-fill with gravity: the free positions of a variant are its inner-fit region minus the no-fit
 * regions of everything on the sheet; among their vertices, the one that keeps the layout shortest wins
 * (right edge first, then height). Returns undefined when the variant fits nowhere on this sheet.
 *
 * On rectangles the search walks windows along x from the left, each a boolean difference with only the no-fit
 * regions that reach into it (a region's box is known before the region is built), and stops once no later window
 * can beat the best point found: the cost per piece then depends on its neighbours, not on the whole layout.
 */
export function bestPositionOnSheet(
  variant: Variant,
  sheet: number,
  placed: PlacedPart[],
  obstacles: Obstacle[],
  container: Container,
  cache: NoFitCache,
  stripLength: number,
  verticalWeight = 0.05,
  filledUpTo?: FilledUpTo,
  /** Only a position scoring below this is of interest (another variant already reached it): saves windows. */
  toBeat = Infinity,
): Candidate | undefined {
  const bounds = variant.fitBounds
  if (container.kind === 'region') {
    const fitPaths = container.regionFor!(variant)
    if (fitPaths.length === 0) return undefined
    const box = boundsOf(fitPaths)
    const found = bestInWindow(variant, sheet, placed, obstacles, cache, fitPaths, box, undefined, verticalWeight)
    return found === 'empty' ? undefined : found
  }
  // The real range of the reference point comes from the real outline's extent (its bounding box starts at the
  // reference point), not from the grown fit shape: a mitred offset can stay flush with the outline at sharp
  // corners. The window is one unit larger on each side so that a piece exactly as tall as the roll still has a
  // strip of free area (a zero-area window would vanish in the boolean step); chosen points are clamped back.
  const realMaxY = container.maxY - variant.extentY
  const realMaxX = container.maxX - variant.extentX
  if (realMaxY < container.minY || realMaxX < container.minX) return undefined
  const clampRange = { minX: container.minX, minY: container.minY, maxX: realMaxX, maxY: realMaxY }
  const minY = container.minY - 1
  const maxY = realMaxY + 1
  // On a strip, no position further right than "just after everything placed" is ever the best one.
  const endX = container.kind === 'strip' ? Math.min(Math.max(container.minX + 1, stripLength - bounds.minX + 1), realMaxX + 1) : realMaxX + 1
  const memoKey = sheet * 1_000_003 + variant.id
  const windowWidth = Math.max(2 * (bounds.maxX - bounds.minX), 16)
  let windowStart = Math.max(container.minX - 1, filledUpTo?.get(memoKey) ?? -Infinity)
  let best: Candidate | undefined
  while (windowStart < endX) {
    // No point at or beyond this window can score better than this.
    if (windowStart + bounds.maxX + verticalWeight * (container.minY + bounds.maxY) - 2 >= Math.min(best?.score ?? Infinity, toBeat)) break
    const windowEnd = Math.min(windowStart + windowWidth, endX)
    const box = { minX: windowStart, minY, maxX: windowEnd, maxY }
    const window: IntPath = [
      { X: box.minX, Y: box.minY },
      { X: box.maxX, Y: box.minY },
      { X: box.maxX, Y: box.maxY },
      { X: box.minX, Y: box.maxY },
    ]
    const found = bestInWindow(variant, sheet, placed, obstacles, cache, [window], box, clampRange, verticalWeight)
    if (found === 'empty') {
      if (!best && filledUpTo) filledUpTo.set(memoKey, windowEnd - 1)
    } else if (found && (!best || found.score < best.score)) {
      best = found
    }
    if (windowEnd >= endX) break
    // Windows overlap by one unit so that no position between them is missed.
    windowStart = windowEnd - 1
  }
  return best
}

/** The best vertex of the free area inside one window; 'empty' when the window holds no free area at all. */
function bestInWindow(
  variant: Variant,
  sheet: number,
  placed: PlacedPart[],
  obstacles: Obstacle[],
  cache: NoFitCache,
  fitPaths: IntPath[],
  window: { minX: number; minY: number; maxX: number; maxY: number },
  clampRange: { minX: number; minY: number; maxX: number; maxY: number } | undefined,
  verticalWeight: number,
): Candidate | 'empty' | undefined {
  const bounds = variant.fitBounds
  const clipper = new ClipperLib.Clipper()
  clipper.AddPaths(fitPaths, ClipperLib.PolyType.ptSubject, true)
  const outside = (box: { minX: number; minY: number; maxX: number; maxY: number }, dx: number, dy: number) =>
    box.maxX + dx <= window.minX || box.minX + dx >= window.maxX || box.maxY + dy <= window.minY || box.minY + dy >= window.maxY
  for (const part of placed) {
    if (part.sheet !== sheet) continue
    if (outside(cache.boundsOf(part.variant.spacedShape, variant.spacedShape), part.x, part.y)) continue
    const region = cache.get(part.variant, variant)
    if (outside(region, part.x, part.y)) continue
    for (const path of region.paths) clipper.AddPath(translatePath(path, part.x, part.y), ClipperLib.PolyType.ptClip, true)
  }
  for (const obstacle of obstacles) {
    if (!zoneAppliesToSheet(obstacle, sheet)) continue
    const region = cache.forObstacle(obstacle, variant)
    if (outside(region, 0, 0)) continue
    for (const path of region.paths) clipper.AddPath(path, ClipperLib.PolyType.ptClip, true)
  }
  const free: IntPath[] = []
  clipper.Execute(ClipperLib.ClipType.ctDifference, free, ClipperLib.PolyFillType.pftNonZero, ClipperLib.PolyFillType.pftNonZero)
  if (free.length === 0) return 'empty'

  let best: Candidate | undefined
  for (const path of free) {
    for (const point of path) {
      let x = point.X
      let y = point.Y
      if (clampRange) {
        // At most one unit: the shapes carry more allowance than that (see nest.ts), so this never makes an overlap.
        x = Math.min(Math.max(x, clampRange.minX), clampRange.maxX)
        y = Math.min(Math.max(y, clampRange.minY), clampRange.maxY)
      }
      // Mostly "as far left as possible", with a light pull downwards so columns fill bottom-up.
      const score = x + bounds.maxX + verticalWeight * (y + bounds.maxY)
      if (!best || score < best.score) best = { variant, sheet, x, y, score }
    }
  }
  return best
}
