import type { CachedRegion, Container, NoFitCache, Obstacle, PlacedPart } from './construct.js'
import { zoneAppliesToSheet } from './types.js'
import type { Variant } from './variants.js'

/**
 * Strip compression by overlap minimisation (Egeblad et al. 2007; Umetani et al. 2009; Gardeyn et al. 2025):
 * shorten the strip below the best feasible length, let the pieces overlap, and move overlapping pieces one at a
 * time to the position and orientation with the least weighted overlap, raising the weights of pairs that keep
 * overlapping (guided local search) until no pair overlaps; then shorten again. The overlap of a pair is the
 * penetration depth of their relative position in the no-fit region (the shortest translation that separates
 * them), so "zero for every pair" is exactly the feasibility test of the constructive phase.
 */

/** A no-fit region as flat coordinates for the hot loop; `starts[k]..starts[k+1]` are the points of path k. */
interface FlatRegion {
  minX: number
  minY: number
  maxX: number
  maxY: number
  coords: Float64Array
  starts: Int32Array
}

function flatten(region: CachedRegion): FlatRegion {
  let count = 0
  for (const path of region.paths) count += path.length
  const coords = new Float64Array(count * 2)
  const starts = new Int32Array(region.paths.length + 1)
  let offset = 0
  region.paths.forEach((path, index) => {
    starts[index] = offset
    for (const point of path) {
      coords[offset * 2] = point.X
      coords[offset * 2 + 1] = point.Y
      offset++
    }
  })
  starts[region.paths.length] = offset
  return { minX: region.minX, minY: region.minY, maxX: region.maxX, maxY: region.maxY, coords, starts }
}

/**
 * Penetration depth of a relative position in a no-fit region: its distance to the region's boundary when it lies
 * inside (non-zero winding), else 0. Points on the boundary count as free: the region is already pulled in by the
 * safety allowance, so touching there never overlaps. Cost O(edges), and O(1) outside the bounding box.
 */
function penetrationDepth(region: FlatRegion, px: number, py: number): number {
  if (px <= region.minX || px >= region.maxX || py <= region.minY || py >= region.maxY) return 0
  const { coords, starts } = region
  let winding = 0
  for (let path = 0; path + 1 < starts.length; path++) {
    const first = starts[path]!
    const last = starts[path + 1]! - 1
    let ax = coords[last * 2]!
    let ay = coords[last * 2 + 1]!
    for (let index = first; index <= last; index++) {
      const bx = coords[index * 2]!
      const by = coords[index * 2 + 1]!
      if (ay <= py) {
        if (by > py && (bx - ax) * (py - ay) - (px - ax) * (by - ay) > 0) winding++
      } else if (by <= py && (bx - ax) * (py - ay) - (px - ax) * (by - ay) < 0) winding--
      ax = bx
      ay = by
    }
  }
  if (winding === 0) return 0
  let best = Infinity
  for (let path = 0; path + 1 < starts.length; path++) {
    const first = starts[path]!
    const last = starts[path + 1]! - 1
    let ax = coords[last * 2]!
    let ay = coords[last * 2 + 1]!
    for (let index = first; index <= last; index++) {
      const bx = coords[index * 2]!
      const by = coords[index * 2 + 1]!
      const dx = bx - ax
      const dy = by - ay
      const lengthSquared = dx * dx + dy * dy
      let t = lengthSquared > 0 ? ((px - ax) * dx + (py - ay) * dy) / lengthSquared : 0
      t = t < 0 ? 0 : t > 1 ? 1 : t
      const ex = ax + t * dx - px
      const ey = ay + t * dy - py
      const distanceSquared = ex * ex + ey * ey
      if (distanceSquared < best) best = distanceSquared
      ax = bx
      ay = by
    }
  }
  return Math.sqrt(best)
}

export interface CompressionSettings {
  random: () => number
  /** Called before every shrink attempt and every separation sweep (one evaluation each); false ends the compression. */
  tick: () => boolean
  /** How much of the compression budget is spent, from 0 to 1. */
  progress: () => number
  /** Called with each shorter feasible layout found. */
  onImproved?: (parts: PlacedPart[]) => void
}

/**
 * Compresses a feasible strip layout (all parts on sheet 0 of a 'strip' container) and returns the shortest
 * feasible layout found; never longer than the input. `choicesOf` gives the allowed variants of a part.
 */
export function compressStrip(
  start: PlacedPart[],
  choicesOf: (part: PlacedPart) => Variant[],
  allVariants: Variant[],
  obstacles: Obstacle[],
  container: Container,
  cache: NoFitCache,
  settings: CompressionSettings,
): PlacedPart[] {
  const count = start.length
  if (count < 2) return start
  const random = settings.random
  const variantCount = allVariants.reduce((max, variant) => Math.max(max, variant.id + 1), 0)
  const regionTable: (FlatRegion | undefined)[] = new Array(variantCount * variantCount)
  const regionOf = (fixed: Variant, moving: Variant): FlatRegion => {
    const key = fixed.id * variantCount + moving.id
    let region = regionTable[key]
    if (!region) regionTable[key] = region = flatten(cache.get(fixed, moving))
    return region
  }
  const obstacleTable = new Map<string, FlatRegion>()
  const obstacleRegionOf = (obstacle: Obstacle, moving: Variant): FlatRegion => {
    const key = `${obstacle.key}:${moving.id}`
    let region = obstacleTable.get(key)
    if (!region) obstacleTable.set(key, (region = flatten(cache.forObstacle(obstacle, moving))))
    return region
  }
  // Bounding boxes of the spaced shapes: two parts can only overlap when these meet.
  const spacedBounds = new Map<number, { minX: number; minY: number; maxX: number; maxY: number }>()
  const spacedBoundsOf = (variant: Variant) => {
    let box = spacedBounds.get(variant.id)
    if (!box) {
      let minX = Infinity
      let minY = Infinity
      let maxX = -Infinity
      let maxY = -Infinity
      for (const point of variant.spacedShape.outer) {
        if (point.X < minX) minX = point.X
        if (point.Y < minY) minY = point.Y
        if (point.X > maxX) maxX = point.X
        if (point.Y > maxY) maxY = point.Y
      }
      spacedBounds.set(variant.id, (box = { minX, minY, maxX, maxY }))
    }
    return box
  }
  const obstacleBounds = obstacles.map((obstacle) => {
    let minX = Infinity
    let minY = Infinity
    let maxX = -Infinity
    let maxY = -Infinity
    for (const point of obstacle.shape.outer) {
      minX = Math.min(minX, point.X)
      minY = Math.min(minY, point.Y)
      maxX = Math.max(maxX, point.X)
      maxY = Math.max(maxY, point.Y)
    }
    return { minX, minY, maxX, maxY }
  })

  const choices = start.map(choicesOf)
  const variants: Variant[] = start.map((part) => part.variant)
  const xs = new Float64Array(count)
  const ys = new Float64Array(count)
  const boxMinX = new Float64Array(count)
  const boxMinY = new Float64Array(count)
  const boxMaxX = new Float64Array(count)
  const boxMaxY = new Float64Array(count)
  const weights = new Float64Array(count * count).fill(1)
  const depths = new Float64Array(count * count)
  const obstacleCount = obstacles.length
  // An obstacle acts only on the parts of its own sheet (every sheet when it names none); parts keep their sheet.
  const obstacleActs = new Uint8Array(count * obstacleCount)
  start.forEach((part, index) => obstacles.forEach((obstacle, k) => (obstacleActs[index * obstacleCount + k] = zoneAppliesToSheet(obstacle, part.sheet) ? 1 : 0)))
  const obstacleWeights = new Float64Array(count * obstacleCount).fill(1)
  const obstacleDepths = new Float64Array(count * obstacleCount)

  const setPart = (index: number, variant: Variant, x: number, y: number) => {
    variants[index] = variant
    xs[index] = x
    ys[index] = y
    const box = spacedBoundsOf(variant)
    boxMinX[index] = x + box.minX
    boxMinY[index] = y + box.minY
    boxMaxX[index] = x + box.maxX
    boxMaxY[index] = y + box.maxY
  }
  start.forEach((part, index) => setPart(index, part.variant, part.x, part.y))

  // The inner-fit rectangle of a variant for strip length `length`, from the real outline's extent as in the construction.
  let length = 0
  const fitLength = () => {
    let max = container.minX
    for (let index = 0; index < count; index++) max = Math.max(max, xs[index]! + variants[index]!.extentX)
    return max
  }
  const rangeX = (variant: Variant): [number, number] => [container.minX, length - variant.extentX]
  const rangeY = (variant: Variant): [number, number] => [container.minY, container.maxY - variant.extentY]

  // Every overlap costs at least this much, so that clearing a shallow overlap pays off clearly.
  const epsilon = 0.001 * (container.maxY - container.minY)
  /** Weighted overlap of part `index` if it were `variant` at (x, y); stops summing once it reaches `limit`. O(n) box tests. */
  const weightedOverlap = (index: number, variant: Variant, x: number, y: number, limit: number): number => {
    const box = spacedBoundsOf(variant)
    const minX = x + box.minX
    const minY = y + box.minY
    const maxX = x + box.maxX
    const maxY = y + box.maxY
    let total = 0
    const row = index * count
    for (let other = 0; other < count; other++) {
      if (other === index || boxMinX[other]! >= maxX || boxMaxX[other]! <= minX || boxMinY[other]! >= maxY || boxMaxY[other]! <= minY) continue
      const depth = penetrationDepth(regionOf(variants[other]!, variant), x - xs[other]!, y - ys[other]!)
      if (depth > 0) {
        total += weights[row + other]! * (depth + epsilon)
        if (total >= limit) return total
      }
    }
    for (let k = 0; k < obstacleCount; k++) {
      if (!obstacleActs[index * obstacleCount + k]) continue
      const obstacleBox = obstacleBounds[k]!
      if (obstacleBox.minX >= maxX || obstacleBox.maxX <= minX || obstacleBox.minY >= maxY || obstacleBox.maxY <= minY) continue
      const depth = penetrationDepth(obstacleRegionOf(obstacles[k]!, variant), x, y)
      if (depth > 0) {
        total += obstacleWeights[index * obstacleCount + k]! * (depth + epsilon)
        if (total >= limit) return total
      }
    }
    return total
  }

  /** Recomputes the unweighted depths of part `index` against all others. O(n) box tests. */
  const refreshDepths = (index: number) => {
    const variant = variants[index]!
    const x = xs[index]!
    const y = ys[index]!
    for (let other = 0; other < count; other++) {
      if (other === index) continue
      let depth = 0
      if (!(boxMinX[other]! >= boxMaxX[index]! || boxMaxX[other]! <= boxMinX[index]! || boxMinY[other]! >= boxMaxY[index]! || boxMaxY[other]! <= boxMinY[index]!)) {
        depth = penetrationDepth(regionOf(variants[other]!, variant), x - xs[other]!, y - ys[other]!)
      }
      depths[index * count + other] = depth
      depths[other * count + index] = depth
    }
    for (let k = 0; k < obstacleCount; k++) obstacleDepths[index * obstacleCount + k] = obstacleActs[index * obstacleCount + k] ? penetrationDepth(obstacleRegionOf(obstacles[k]!, variant), x, y) : 0
  }
  const refreshAll = () => {
    for (let index = 0; index < count; index++) refreshDepths(index)
  }
  const totalOverlap = () => {
    let total = 0
    for (let index = 0; index < count; index++) {
      for (let other = index + 1; other < count; other++) total += depths[index * count + other]!
      for (let k = 0; k < obstacleCount; k++) total += obstacleDepths[index * obstacleCount + k]!
    }
    return total
  }
  const partOverlaps = (index: number) => {
    for (let other = 0; other < count; other++) if (depths[index * count + other]! > 0) return true
    for (let k = 0; k < obstacleCount; k++) if (obstacleDepths[index * obstacleCount + k]! > 0) return true
    return false
  }

  const clamp = (value: number, [low, high]: [number, number]) => Math.round(value < low ? low : value > high ? Math.max(low, high) : value)
  const globalSamples = 40
  const localSamples = 30

  /**
   * Moves part `index` to the best of random positions of every allowed variant, of random positions near where it
   * is, and of its current position, then refines the best by a coordinate descent with a shrinking step.
   * Cost: about (globalSamples × variants + localSamples + descent steps) weighted-overlap evaluations.
   */
  const movePart = (index: number) => {
    let bestVariant = variants[index]!
    let bestX = xs[index]!
    let bestY = ys[index]!
    let bestCost = weightedOverlap(index, bestVariant, bestX, bestY, Infinity)
    if (bestCost === 0) return
    const consider = (variant: Variant, x: number, y: number) => {
      const cost = weightedOverlap(index, variant, x, y, bestCost)
      if (cost < bestCost) {
        bestCost = cost
        bestVariant = variant
        bestX = x
        bestY = y
      }
    }
    for (const variant of choices[index]!) {
      const spanX = rangeX(variant)
      const spanY = rangeY(variant)
      for (let sample = 0; sample < globalSamples && bestCost > 0; sample++) {
        consider(variant, clamp(spanX[0] + random() * (spanX[1] - spanX[0]), spanX), clamp(spanY[0] + random() * (spanY[1] - spanY[0]), spanY))
      }
    }
    {
      const variant = variants[index]!
      const box = spacedBoundsOf(variant)
      const reachX = (box.maxX - box.minX) * 0.5
      const reachY = (box.maxY - box.minY) * 0.5
      const spanX = rangeX(variant)
      const spanY = rangeY(variant)
      for (let sample = 0; sample < localSamples && bestCost > 0; sample++) {
        consider(variant, clamp(xs[index]! + (random() * 2 - 1) * reachX, spanX), clamp(ys[index]! + (random() * 2 - 1) * reachY, spanY))
      }
    }
    if (bestCost > 0) {
      const box = spacedBoundsOf(bestVariant)
      const spanX = rangeX(bestVariant)
      const spanY = rangeY(bestVariant)
      let step = Math.max(box.maxX - box.minX, box.maxY - box.minY) * 0.1
      while (step >= 1 && bestCost > 0) {
        const before = bestCost
        const x = bestX
        const y = bestY
        consider(bestVariant, clamp(x + step, spanX), y)
        consider(bestVariant, clamp(x - step, spanX), y)
        consider(bestVariant, x, clamp(y + step, spanY))
        consider(bestVariant, x, clamp(y - step, spanY))
        // Diagonals free a part wedged in a corner, where every axis move deepens one of two overlaps.
        consider(bestVariant, clamp(x + step, spanX), clamp(y + step, spanY))
        consider(bestVariant, clamp(x - step, spanX), clamp(y + step, spanY))
        consider(bestVariant, clamp(x + step, spanX), clamp(y - step, spanY))
        consider(bestVariant, clamp(x - step, spanX), clamp(y - step, spanY))
        if (!(bestCost < before)) step *= 0.5
      }
    }
    setPart(index, bestVariant, bestX, bestY)
    refreshDepths(index)
  }

  /** Guided local search weights: pairs that still overlap get heavier, in proportion to how deep they are. */
  const updateWeights = () => {
    let deepest = 0
    for (let index = 0; index < depths.length; index++) if (depths[index]! > deepest) deepest = depths[index]!
    for (let index = 0; index < obstacleDepths.length; index++) if (obstacleDepths[index]! > deepest) deepest = obstacleDepths[index]!
    if (deepest === 0) return
    for (let index = 0; index < depths.length; index++) {
      const depth = depths[index]!
      weights[index] = depth > 0 ? weights[index]! * (1.2 + (0.8 * depth) / deepest) : Math.max(1, weights[index]! * 0.95)
    }
    for (let index = 0; index < obstacleDepths.length; index++) {
      const depth = obstacleDepths[index]!
      obstacleWeights[index] = depth > 0 ? obstacleWeights[index]! * (1.2 + (0.8 * depth) / deepest) : Math.max(1, obstacleWeights[index]! * 0.95)
    }
  }

  interface Snapshot {
    variants: Variant[]
    xs: Float64Array
    ys: Float64Array
  }
  const snapshot = (): Snapshot => ({ variants: [...variants], xs: xs.slice(), ys: ys.slice() })
  const restore = (state: Snapshot) => {
    for (let index = 0; index < count; index++) setPart(index, state.variants[index]!, state.xs[index]!, state.ys[index]!)
    refreshAll()
  }
  const order = Array.from({ length: count }, (_, index) => index)
  const shuffle = () => {
    for (let index = count - 1; index > 0; index--) {
      const other = Math.floor(random() * (index + 1))
      ;[order[index], order[other]] = [order[other]!, order[index]!]
    }
  }

  /**
   * Separates the overlapping parts at the current strip length: sweeps of moves with weight updates, and after
   * `patience` sweeps without a new least overlap, back to the least-overlap state (a strike). True when feasible.
   */
  const separate = (strikes: number, patience: number): boolean | undefined => {
    weights.fill(1)
    obstacleWeights.fill(1)
    let total = totalOverlap()
    if (total === 0) return true
    let leastTotal = total
    let least = snapshot()
    for (let strike = 0; strike < strikes; strike++) {
      let stale = 0
      while (stale < patience) {
        if (!settings.tick()) return undefined
        shuffle()
        for (const index of order) if (partOverlaps(index)) movePart(index)
        total = totalOverlap()
        if (total === 0) return true
        if (total < leastTotal * 0.999) {
          leastTotal = total
          least = snapshot()
          stale = 0
        } else stale++
        updateWeights()
      }
      restore(least)
    }
    return false
  }

  /** Shortens the strip to `target`: parts right of a random cut move left by the difference, then all are clamped in. */
  const shrinkTo = (target: number) => {
    const shift = length - target
    const cut = container.minX + random() * (length - container.minX)
    length = target
    for (let index = 0; index < count; index++) {
      const variant = variants[index]!
      const centre = xs[index]! + (variant.fitBounds.minX + variant.fitBounds.maxX) / 2
      const x = centre > cut ? xs[index]! - shift : xs[index]!
      setPart(index, variant, clamp(x, rangeX(variant)), clamp(ys[index]!, rangeY(variant)))
    }
    refreshAll()
  }

  /**
   * Disrupts an infeasible state so a retry does not end in the same local minimum: two large parts of different
   * items swap places (centre to centre), as in Gardeyn et al. (2025).
   */
  const disrupt = () => {
    const large = order.filter((index) => areas[index]! >= medianArea)
    const first = large[Math.floor(random() * large.length)]!
    const others = order.filter((index) => start[index]!.instance.itemIndex !== start[first]!.instance.itemIndex)
    if (others.length === 0) return
    const second = others[Math.floor(random() * others.length)]!
    const centreX = (index: number) => xs[index]! + variants[index]!.extentX / 2
    const centreY = (index: number) => ys[index]! + variants[index]!.extentY / 2
    const [ax, ay, bx, by] = [centreX(first), centreY(first), centreX(second), centreY(second)]
    const a = variants[first]!
    const b = variants[second]!
    setPart(first, a, clamp(bx - a.extentX / 2, rangeX(a)), clamp(by - a.extentY / 2, rangeY(a)))
    setPart(second, b, clamp(ax - b.extentX / 2, rangeX(b)), clamp(ay - b.extentY / 2, rangeY(b)))
    refreshAll()
  }
  const areas = start.map((part) => {
    let twice = 0
    const ring = part.variant.outline
    for (let index = 0, previous = ring.length - 1; index < ring.length; previous = index++) twice += (ring[previous]![0] - ring[index]![0]) * (ring[previous]![1] + ring[index]![1])
    return Math.abs(twice / 2)
  })
  const medianArea = [...areas].sort((left, right) => left - right)[Math.floor(count / 2)]!

  refreshAll()
  length = fitLength()
  let bestLength = length
  let best = snapshot()
  // Exploration: fixed steps of `explorationRatio`, and after a failure keep working on the least-overlap states
  // at the same target (a pool), disrupted; compression: from the best layout with a step that shrinks on failure.
  const explorationShare = 0.6
  const explorationRatio = 0.01
  const minimumRatio = 0.0002
  const decay = 0.7
  let ratio = 0.005
  const pool: { state: Snapshot; overlap: number }[] = []
  const poolSize = 8
  const strikes = 3
  const patience = Math.max(20, Math.min(100, 2 * count))
  // No layout is shorter than its longest part in its shortest allowed orientation.
  const shortestPossible = container.minX + Math.max(...choices.map((list) => Math.min(...list.map((variant) => variant.extentX))))
  for (;;) {
    const exploring = settings.progress() < explorationShare
    const target = Math.floor(bestLength * (1 - (exploring ? explorationRatio : ratio)))
    // Every attempt counts as an evaluation, so the loop ends even when attempts need no separation sweep.
    if (target < shortestPossible || !settings.tick()) break
    if (exploring && pool.length > 0) {
      const pick = pool[Math.floor(random() * random() * pool.length)]!
      restore(pick.state)
      length = target
      disrupt()
    } else {
      restore(best)
      length = bestLength
      shrinkTo(target)
    }
    const outcome = separate(strikes, patience)
    if (outcome === undefined) break
    if (outcome && fitLength() <= target) {
      bestLength = fitLength()
      best = snapshot()
      pool.length = 0
      settings.onImproved?.(toParts(best))
    } else if (outcome) {
      break
    } else if (exploring) {
      pool.push({ state: snapshot(), overlap: totalOverlap() })
      pool.sort((left, right) => left.overlap - right.overlap)
      if (pool.length > poolSize) pool.pop()
    } else {
      ratio = Math.max(minimumRatio, ratio * decay)
    }
  }
  return toParts(best)

  function toParts(state: Snapshot): PlacedPart[] {
    return start.map((part, index) => ({ instance: part.instance, sheet: part.sheet, variant: state.variants[index]!, x: state.xs[index]!, y: state.ys[index]! }))
  }
}
