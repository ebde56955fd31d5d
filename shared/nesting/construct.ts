import ClipperLib from 'clipper-lib'
import { boundsOf, translatePath, type IntPath } from './intGeometry.js'
import { noFitRegion } from './noFitRegion.js'
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

/** A fixed obstacle on every sheet (an excluded zone), as a variant-like shape at the origin. */
export interface Obstacle {
  key: string
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
 * Bottom-left-fill with gravity: the free positions of a variant are its inner-fit region minus the no-fit
 * regions of everything on the sheet; among their vertices, the one that keeps the layout shortest wins
 * (right edge first, then height). Returns undefined when the variant fits nowhere on this sheet.
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
): Candidate | undefined {
  const bounds = variant.fitBounds
  let fitPaths: IntPath[]
  let windowMinX: number
  let windowMaxX: number
  let windowMinY: number
  let windowMaxY: number
  let clampRange: { minX: number; minY: number; maxX: number; maxY: number } | undefined
  if (container.kind === 'region') {
    fitPaths = container.regionFor!(variant)
    if (fitPaths.length === 0) return undefined
    const box = boundsOf(fitPaths)
    windowMinX = box.minX
    windowMaxX = box.maxX
    windowMinY = box.minY
    windowMaxY = box.maxY
  } else {
    // The real range of the reference point comes from the real outline's extent (its bounding box starts at the
    // reference point), not from the grown fit shape: a mitred offset can stay flush with the outline at sharp
    // corners. The window is one unit larger on each side so that a piece exactly as tall as the roll still has a
    // strip of free area (a zero-area window would vanish in the boolean step); chosen points are clamped back.
    const realMaxY = container.maxY - variant.extentY
    const realMaxX = container.maxX - variant.extentX
    if (realMaxY < container.minY || realMaxX < container.minX) return undefined
    clampRange = { minX: container.minX, minY: container.minY, maxX: realMaxX, maxY: realMaxY }
    windowMinX = container.minX - 1
    windowMinY = container.minY - 1
    windowMaxY = realMaxY + 1
    // On a strip, no position further right than "just after everything placed" is ever the best one.
    windowMaxX = container.kind === 'strip' ? Math.min(Math.max(windowMinX + 2, stripLength - bounds.minX + 1), realMaxX + 1) : realMaxX + 1
    fitPaths = [
      [
        { X: windowMinX, Y: windowMinY },
        { X: windowMaxX, Y: windowMinY },
        { X: windowMaxX, Y: windowMaxY },
        { X: windowMinX, Y: windowMaxY },
      ],
    ]
  }

  const clipper = new ClipperLib.Clipper()
  clipper.AddPaths(fitPaths, ClipperLib.PolyType.ptSubject, true)
  const addRegion = (region: CachedRegion, dx: number, dy: number) => {
    if (region.maxX + dx < windowMinX || region.minX + dx > windowMaxX || region.maxY + dy < windowMinY || region.minY + dy > windowMaxY) return
    for (const path of region.paths) clipper.AddPath(translatePath(path, dx, dy), ClipperLib.PolyType.ptClip, true)
  }
  for (const part of placed) if (part.sheet === sheet) addRegion(cache.get(part.variant, variant), part.x, part.y)
  for (const obstacle of obstacles) addRegion(cache.forObstacle(obstacle, variant), 0, 0)
  const free: IntPath[] = []
  clipper.Execute(ClipperLib.ClipType.ctDifference, free, ClipperLib.PolyFillType.pftNonZero, ClipperLib.PolyFillType.pftNonZero)
  if (free.length === 0) return undefined

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
