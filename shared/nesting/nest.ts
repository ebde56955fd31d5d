import ClipperLib from 'clipper-lib'
import { compressStrip } from './compress.js'
import { bestPositionOnSheet, NoFitCache, type Candidate, type FilledUpTo, type Container, type Instance, type Obstacle, type PlacedPart } from './construct.js'
import { boundingOctagon } from './convexParts.js'
import { chooseScale, orient, toIntPath } from './intGeometry.js'
import { innerFitRegion } from './noFitRegion.js'
import { createRandom } from './random.js'
import { buildVariants, type Variant } from './variants.js'
import type { NestOptions, NestProblem, NestResult, Placement, RingPoints } from './types.js'
import { verifyLayout } from './verify.js'
import { signedArea } from '../geometry/polygon.js'

const ringArea = (ring: RingPoints) => Math.abs(signedArea(ring))

export class NestInputError extends Error {}


function validate(problem: NestProblem) {
  if (problem.items.length === 0) throw new NestInputError('Add at least one item to nest')
  for (const item of problem.items) {
    if (!Number.isInteger(item.quantity) || item.quantity < 0) throw new NestInputError(`Item ${item.id}: quantity must be a whole number of 0 or more`)
    if (item.outline.length < 3) throw new NestInputError(`Item ${item.id}: the outline needs at least 3 points`)
    for (const [x, y] of [item.outline, ...(item.holes ?? [])].flat()) {
      if (!Number.isFinite(x) || !Number.isFinite(y)) throw new NestInputError(`Item ${item.id}: every coordinate must be a finite number`)
    }
    if (ringArea(item.outline) <= 0) throw new NestInputError(`Item ${item.id}: the outline has no area`)
    if (item.rotationsDeg.some((angle) => !Number.isFinite(angle))) throw new NestInputError(`Item ${item.id}: rotations must be numbers of degrees`)
  }
  const stock = problem.stock
  if (stock.kind === 'roll' && !(stock.width > 0)) throw new NestInputError('The roll width must be above 0')
  if (stock.kind === 'sheets' && !(stock.width > 0 && stock.height > 0)) throw new NestInputError('The sheet width and height must be above 0')
  if (stock.kind === 'polygon' && (stock.outline.length < 3 || ringArea(stock.outline) <= 0)) throw new NestInputError('The stock outline has no area')
  if ((problem.spacing ?? 0) < 0 || (problem.margin ?? 0) < 0) throw new NestInputError('Spacing and margin cannot be negative')
  for (const [index, zone] of (problem.excludedZones ?? []).entries()) {
    if (zone.outline.length < 3) throw new NestInputError(`Excluded zone ${index + 1}: the outline needs at least 3 points`)
    if (zone.outline.flat().some((value) => !Number.isFinite(value))) throw new NestInputError(`Excluded zone ${index + 1}: every coordinate must be a finite number`)
    if (zone.sheet !== undefined && !(Number.isInteger(zone.sheet) && zone.sheet >= 0)) throw new NestInputError(`Excluded zone ${index + 1}: the sheet must be a whole number of 0 or more`)
  }
}

interface Evaluation {
  placed: PlacedPart[]
  unplaced: Instance[]
  /** Lower is better: unplaced first, then sheets, then length. */
  cost: number
  length: number
  sheetCount: number
}

/**
 * True-shape nesting: bottom-left-fill over no-fit regions (construction), improved by a seeded local search over
 * the order and orientation of the pieces, within a time or evaluation budget. Pure and deterministic for a seed
 * and an evaluation count; callers verify the result independently (`verifyLayout`).
 */
export function nest(problem: NestProblem, options: NestOptions = {}): NestResult {
  validate(problem)
  const started = Date.now()
  const budgetMs = options.timeBudgetMs ?? (options.maxEvaluations ? Infinity : 10_000)
  // A complete first layout is worth a late answer: the construction may run past the budget, up to this hard limit,
  // after which the pieces still waiting are reported as not placed in time.
  let constructionDeadlineMs = budgetMs === Infinity ? Infinity : Math.max(3 * budgetMs, budgetMs + 15_000)
  const seed = options.seed ?? 1
  const random = createRandom(seed)
  const margin = problem.margin ?? 0
  const spacing = problem.spacing ?? 0
  const stock = problem.stock

  const totalWidth = problem.items.reduce((sum, item) => {
    const xs = item.outline.map(([x]) => x)
    const ys = item.outline.map(([, y]) => y)
    return sum + Math.max(Math.max(...xs) - Math.min(...xs), Math.max(...ys) - Math.min(...ys)) * Math.max(item.quantity, 1)
  }, 0)
  const stockExtent =
    stock.kind === 'roll'
      ? Math.max(stock.width, Math.min(stock.maxLength ?? Infinity, totalWidth + 2 * margin))
      : stock.kind === 'sheets'
        ? Math.max(stock.width, stock.height)
        : Math.max(...stock.outline.flat().map(Math.abs))
  const scale = chooseScale(stockExtent * 1.5 + spacing)
  // No-fit regions are pulled in by `safety` units so touching positions stay free; the shapes grow by twice that,
  // because a mitred integer offset can lose up to about half a unit to rounding at sharp corners.
  const safety = 1
  const variants = buildVariants(problem.items, {
    scale,
    halfSpacing: Math.round((spacing / 2) * scale),
    safety: 2 * safety,
    simplify: Math.round((problem.simplifyTolerance ?? 0) * scale),
  })
  const cache = new NoFitCache(safety)

  const marginInt = Math.round(margin * scale)
  let container: Container
  if (stock.kind === 'roll') {
    container = { kind: 'strip', minX: marginInt, minY: marginInt, maxX: Math.round((stock.maxLength ?? Infinity) * scale) - marginInt, maxY: Math.round(stock.width * scale) - marginInt, maxSheets: 1 }
  } else if (stock.kind === 'sheets') {
    container = { kind: 'sheet', minX: marginInt, minY: marginInt, maxX: Math.round(stock.width * scale) - marginInt, maxY: Math.round(stock.height * scale) - marginInt, maxSheets: stock.maxSheets ?? 10_000 }
  } else {
    const outer = orient(toIntPath(stock.outline, scale), true)
    const holes = (stock.holes ?? []).map((hole) => orient(toIntPath(hole, scale), false))
    const offset = new ClipperLib.ClipperOffset(2, 0.25)
    offset.AddPaths([outer, ...holes], ClipperLib.JoinType.jtMiter, ClipperLib.EndType.etClosedPolygon)
    const insetPaths: { X: number; Y: number }[][] = []
    offset.Execute(insetPaths, -marginInt)
    const region = { outer: insetPaths.find((path) => ClipperLib.Clipper.Area(path) > 0) ?? [], holes: insetPaths.filter((path) => ClipperLib.Clipper.Area(path) < 0) }
    const regions = new Map<number, ReturnType<typeof innerFitRegion>>()
    container = {
      kind: 'region',
      minX: 0,
      minY: 0,
      maxX: 0,
      maxY: 0,
      maxSheets: 1,
      regionFor: (variant) => {
        let fit = regions.get(variant.id)
        if (!fit) {
          fit = region.outer.length ? innerFitRegion(region, variant.fitShape, safety) : []
          regions.set(variant.id, fit)
        }
        return fit
      },
    }
  }
  // A zone acts only on its own sheet (every sheet when it names none). A roll or a stock outline is sheet 0, so a
  // zone naming another sheet never acts there and is left out. The key keeps the zone's index in the request: the
  // no-fit regions are cached per key and moving variant.
  const obstacles: Obstacle[] = (problem.excludedZones ?? []).flatMap((zone, index) =>
    container.kind !== 'sheet' && zone.sheet !== undefined && zone.sheet !== 0 ? [] : [{ key: `zone${index}`, ...(zone.sheet !== undefined ? { sheet: zone.sheet } : {}), shape: { outer: orient(toIntPath(zone.outline, scale), true), holes: [] } }],
  )
  // Empty sheets past the last one a zone names are all alike; up to it, a new sheet may be blocked by its own zones,
  // so the construction tries the empty sheets in turn until one past the last named sheet.
  const lastZoneSheet = obstacles.reduce((last, obstacle) => Math.max(last, obstacle.sheet ?? -1), -1)

  // Largest first is the classic good start (Burke et al. 2006); ties keep the input order.
  const itemArea = problem.items.map((item) => ringArea(item.outline) - (item.holes ?? []).reduce((sum, hole) => sum + ringArea(hole), 0))
  const instances: Instance[] = []
  problem.items.forEach((item, itemIndex) => {
    for (let copy = 0; copy < item.quantity; copy++) instances.push({ itemIndex, copy })
  })
  const initialOrder = instances.map((_, index) => index).sort((left, right) => itemArea[instances[right]!.itemIndex]! - itemArea[instances[left]!.itemIndex]! || left - right)
  const pieceArea = instances.reduce((sum, instance) => sum + itemArea[instance.itemIndex]!, 0)

  /** Which variants of an instance to try: all when there are few, else the preferred one and its quarter turns. */
  const variantChoices = (instance: Instance, preferred: number, table: Variant[][] = variants): Variant[] => {
    const all = table[instance.itemIndex]!
    if (all.length <= 8) return all
    const quarter = Math.max(1, Math.round(all.length / 4))
    const picked = [0, quarter, 2 * quarter, 3 * quarter].map((step) => all[(preferred + step) % all.length]!)
    return [...new Set(picked)]
  }

  const rightEdgeOf = (part: PlacedPart) => part.x + part.variant.fitBounds.maxX

  /** Places instances from `fromStep` on, keeping the earlier placements of `previous`. */
  const construct = (order: number[], preferences: number[], previous: Evaluation | undefined, fromStep: number, table: Variant[][] = variants): Evaluation => {
    const placed: PlacedPart[] = previous ? previous.placed.slice(0, countPlacedBefore(previous, order, fromStep)) : []
    const unplaced: Instance[] = previous ? previous.unplaced.filter((instance) => order.indexOf(instances.indexOf(instance)) < fromStep) : []
    let sheetCount = placed.reduce((max, part) => Math.max(max, part.sheet + 1), 0)
    let stripLength = placed.reduce((max, part) => Math.max(max, rightEdgeOf(part)), container.minX)
    const filledUpTo: FilledUpTo = new Map()
    for (let step = fromStep; step < order.length; step++) {
      const instanceIndex = order[step]!
      const instance = instances[instanceIndex]!
      // Out of time (or asked to stop) before every piece found a place: the rest are reported, never left hanging.
      if (Date.now() - started > constructionDeadlineMs || options.shouldStop?.()) {
        for (let rest = step; rest < order.length; rest++) unplaced.push(instances[order[rest]!]!)
        break
      }
      let chosen: Candidate | undefined
      const sheetsToTry = container.kind === 'sheet' ? Math.min(Math.max(sheetCount, lastZoneSheet + 1) + 1, container.maxSheets) : 1
      for (let sheet = 0; sheet < sheetsToTry && !chosen; sheet++) {
        for (const variant of variantChoices(instance, preferences[instanceIndex]!, table)) {
          const candidate = bestPositionOnSheet(variant, sheet, placed, obstacles, container, cache, stripLength + variant.fitBounds.maxX + 2, undefined, filledUpTo, chosen?.score)
          if (candidate && (!chosen || candidate.score < chosen.score)) chosen = candidate
        }
      }
      if (!chosen) {
        unplaced.push(instance)
        continue
      }
      const part: PlacedPart = { instance, variant: chosen.variant, sheet: chosen.sheet, x: chosen.x, y: chosen.y }
      placed.push(part)
      sheetCount = Math.max(sheetCount, chosen.sheet + 1)
      stripLength = Math.max(stripLength, rightEdgeOf(part))
    }
    return evaluationOf(placed, unplaced)
  }

  /** Length and cost of a layout: unplaced first, then sheets, then the used length of the last sheet. */
  function evaluationOf(placed: PlacedPart[], unplaced: Instance[]): Evaluation {
    const sheetCount = placed.reduce((max, part) => Math.max(max, part.sheet + 1), 0)
    const lastSheet = sheetCount - 1
    // The real outline's bounding box starts at the reference point, so its right edge is x + width.
    const length = placed.filter((part) => part.sheet === lastSheet).reduce((max, part) => Math.max(max, part.x + part.variant.widthReal * scale), 0)
    const cost = unplaced.length * 1e15 + (container.kind === 'sheet' ? lastSheet * 1e12 : 0) + length
    return { placed, unplaced, cost, length, sheetCount }
  }

  /** How many of `previous.placed` were placed by steps before `fromStep` (their order is unchanged). */
  function countPlacedBefore(previous: Evaluation, order: number[], fromStep: number): number {
    const before = new Set(order.slice(0, fromStep))
    let count = 0
    for (const part of previous.placed) {
      if (!before.has(instances.indexOf(part.instance))) break
      count++
    }
    return count
  }

  /**
   * Settling pass: take each piece, rightmost first, out of the layout and put it back at its best position among
   * all the others (any allowed orientation). A piece only moves when that shortens or lowers it, so the layout
   * never gets worse; repeated until nothing moves.
   */
  const compact = (evaluation: Evaluation): Evaluation => {
    let placed = [...evaluation.placed]
    for (let round = 0; round < 8; round++) {
      let moved = false
      const byRightEdge = [...placed].sort((left, right) => rightEdgeOf(right) - rightEdgeOf(left))
      for (const part of byRightEdge) {
        if (options.shouldStop?.() || Date.now() - started > budgetMs) break
        const others = placed.filter((other) => other !== part)
        const currentScore = part.x + part.variant.fitBounds.maxX + 0.05 * (part.y + part.variant.fitBounds.maxY)
        let bestCandidate: Candidate | undefined
        for (const variant of variantChoices(part.instance, 0)) {
          const candidate = bestPositionOnSheet(variant, part.sheet, others, obstacles, container, cache, others.reduce((max, other) => Math.max(max, rightEdgeOf(other)), container.minX) + variant.fitBounds.maxX + 2)
          if (candidate && (!bestCandidate || candidate.score < bestCandidate.score)) bestCandidate = candidate
        }
        if (bestCandidate && bestCandidate.score < currentScore - 1) {
          const replacement: PlacedPart = { instance: part.instance, variant: bestCandidate.variant, sheet: part.sheet, x: bestCandidate.x, y: bestCandidate.y }
          placed = placed.map((other) => (other === part ? replacement : other))
          moved = true
        }
      }
      if (!moved) break
    }
    const lastSheet = placed.reduce((max, part) => Math.max(max, part.sheet), 0)
    const length = placed.filter((part) => part.sheet === lastSheet).reduce((max, part) => Math.max(max, part.x + part.variant.widthReal * scale), 0)
    const cost = evaluation.unplaced.length * 1e15 + (container.kind === 'sheet' ? lastSheet * 1e12 : 0) + length
    return cost <= evaluation.cost ? { ...evaluation, placed, length, cost } : evaluation
  }

  const utilisationOf = (evaluation: Evaluation) => {
    const used = usedStockArea(evaluation)
    return used > 0 ? placedArea(evaluation) / used : 0
  }
  const placedArea = (evaluation: Evaluation) => evaluation.placed.reduce((sum, part) => sum + itemArea[part.instance.itemIndex]!, 0)
  const usedStockArea = (evaluation: Evaluation) => {
    if (stock.kind === 'roll') return stock.width * (evaluation.length / scale + margin)
    if (stock.kind === 'sheets') return stock.width * stock.height * Math.max(0, evaluation.sheetCount - 1) + stock.height * (evaluation.length / scale + margin)
    return ringArea(stock.outline) - (stock.holes ?? []).reduce((sum, hole) => sum + ringArea(hole), 0)
  }
  let evaluations = 0
  let order = [...initialOrder]
  let preferences = instances.map(() => 0)
  // A quick first layout on the convex hulls of the pieces: a hull's no-fit region is one convex sum, so even
  // hundreds of detailed pieces are laid out in about a second, and the hulls hold the real shapes, so the layout is
  // feasible as it stands. The true-shape construction that follows replaces it when it does better (it nearly
  // always does), and may then keep to the budget: a complete layout is already in hand.
  let hullEvaluation: Evaluation | undefined
  let firstFeasibleMs: number | undefined
  if (variants.some((list) => list.some((variant) => variant.spacedShape.outer.length > 8 || variant.spacedShape.holes.length > 0))) {
    const idOffset = variants.flat().length
    // A half turn gives nearly the same octagon, so the quick pass tries each orientation modulo 180° once.
    const hullVariants = variants.map((list) =>
      list
        .filter((variant, index) => list.findIndex((other) => other.mirrored === variant.mirrored && other.angleDeg % 180 === variant.angleDeg % 180) === index)
        .map((variant) => ({ ...variant, id: idOffset + variant.id, spacedShape: { outer: boundingOctagon(variant.spacedShape.outer), holes: [] } })),
    )
    hullEvaluation = construct(order, preferences, undefined, 0, hullVariants)
    evaluations++
    if (hullEvaluation.unplaced.length === 0) {
      firstFeasibleMs = Date.now() - started
      constructionDeadlineMs = Math.min(constructionDeadlineMs, budgetMs)
      options.onProgress?.({ evaluations, elapsedMs: firstFeasibleMs, bestUtilisation: utilisationOf(hullEvaluation), placedCount: hullEvaluation.placed.length, bestLength: hullEvaluation.length / scale + (container.kind === 'sheet' ? 0 : margin), bestSheets: hullEvaluation.sheetCount })
    }
  }
  let current = construct(order, preferences, undefined, 0)
  evaluations++
  if (hullEvaluation && hullEvaluation.cost < current.cost) current = hullEvaluation
  firstFeasibleMs ??= Date.now() - started
  let best = { evaluation: current, order: [...order], preferences: [...preferences] }

  const timeBudgetMs = options.timeBudgetMs ?? (options.maxEvaluations ? Infinity : 10_000)
  const maxEvaluations = options.maxEvaluations ?? Infinity
  const report = () =>
    options.onProgress?.({
      evaluations,
      elapsedMs: Date.now() - started,
      bestUtilisation: utilisationOf(best.evaluation),
      bestLength: best.evaluation.length / scale + (container.kind === 'sheet' ? 0 : margin),
      bestSheets: best.evaluation.sheetCount,
      placedCount: best.evaluation.placed.length,
    })
  report()

  // Local search: swap two pieces in the order or turn one, rebuild from the first changed step, keep what is
  // not worse (sideways moves cross plateaus), and now and then accept a slightly worse layout (annealing).
  let lastReport = Date.now()
  const n = order.length
  // On a roll, the order search gets 5 % of the budget and compression (overlap minimisation) the rest: measured on
  // the ESICUP set, compression closes far more of the gap to the best-known layouts than further reordering.
  const compresses = container.kind === 'strip' && n > 1
  const constructionShare = compresses ? 0.05 : 1
  const constructionEvaluations = maxEvaluations === Infinity ? Infinity : Math.max(1, Math.floor(maxEvaluations * constructionShare))
  const constructionMs = timeBudgetMs * constructionShare
  while (n > 1 && evaluations < constructionEvaluations && Date.now() - started < constructionMs && !options.shouldStop?.()) {
    const nextOrder = [...order]
    const nextPreferences = [...preferences]
    let fromStep: number
    const move = random()
    if (move < 0.7 || variants.every((list) => list.length === 1)) {
      const first = Math.floor(random() * n)
      const distance = 1 + Math.floor(random() * Math.min(n - 1, Math.max(2, Math.floor(n / 4))))
      const second = (first + distance) % n
      ;[nextOrder[first], nextOrder[second]] = [nextOrder[second]!, nextOrder[first]!]
      fromStep = Math.min(first, second)
      if (nextOrder[first] === order[first] && nextOrder[second] === order[second]) continue
    } else {
      const step = Math.floor(random() * n)
      const instanceIndex = nextOrder[step]!
      nextPreferences[instanceIndex] = (nextPreferences[instanceIndex]! + 1 + Math.floor(random() * 3)) % Math.max(1, variants[instances[instanceIndex]!.itemIndex]!.length)
      fromStep = step
      if (variants[instances[instanceIndex]!.itemIndex]!.length <= 8) {
        // All variants are tried anyway: move the piece earlier instead, which changes the layout.
        const target = Math.floor(random() * (step + 1))
        nextOrder.splice(step, 1)
        nextOrder.splice(target, 0, instanceIndex)
        fromStep = target
      }
    }
    const candidate = construct(nextOrder, nextPreferences, current, fromStep)
    evaluations++
    const elapsed = (Date.now() - started) / Math.max(1, timeBudgetMs === Infinity ? 60_000 : timeBudgetMs)
    const temperature = 0.002 * (1 - Math.min(1, elapsed)) * current.cost
    if (candidate.cost <= current.cost || (temperature > 0 && candidate.cost < 1e12 && random() < Math.exp(-(candidate.cost - current.cost) / temperature))) {
      current = candidate
      order = nextOrder
      preferences = nextPreferences
      if (candidate.cost < best.evaluation.cost) best = { evaluation: candidate, order: [...nextOrder], preferences: [...nextPreferences] }
    }
    if (Date.now() - lastReport > 250) {
      lastReport = Date.now()
      report()
    }
  }
  report()

  const beforeCompression = best.evaluation
  if (compresses) {
    const compressionStarted = Date.now()
    const compressionEvaluations = evaluations
    const compressed = compressStrip(
      best.evaluation.placed,
      (part) => variantChoices(part.instance, Math.max(0, variants[part.instance.itemIndex]!.indexOf(part.variant))),
      variants.flat(),
      obstacles,
      container,
      cache,
      {
        random,
        tick: () => {
          if (evaluations >= maxEvaluations || Date.now() - started >= timeBudgetMs || options.shouldStop?.()) return false
          evaluations++
          if (Date.now() - lastReport > 250) {
            lastReport = Date.now()
            report()
          }
          return true
        },
        progress: () => {
          const byTime = timeBudgetMs === Infinity ? 0 : (Date.now() - compressionStarted) / Math.max(1, timeBudgetMs - (compressionStarted - started))
          const byCount = maxEvaluations === Infinity ? 0 : (evaluations - compressionEvaluations) / Math.max(1, maxEvaluations - compressionEvaluations)
          return Math.max(byTime, byCount)
        },
        onImproved: (parts) => {
          const evaluation = evaluationOf(parts, best.evaluation.unplaced)
          if (evaluation.cost < best.evaluation.cost) best = { ...best, evaluation }
        },
      },
    )
    const evaluation = evaluationOf(compressed, best.evaluation.unplaced)
    if (evaluation.cost < best.evaluation.cost) best = { ...best, evaluation }
    report()
  }

  // After a compression the settling pass rarely finds anything and costs seconds on a hundred pieces.
  const final = compresses ? best.evaluation : compact(best.evaluation)
  const fitsByItem = new Map<number, boolean>()
  /**
   * Whether the instance would fit on an empty stock: if so, only time (or the stop) kept it out. For sheets that is
   * a sheet no zone names (only the zones of every sheet act there); a roll or a stock outline is sheet 0.
   */
  const emptySheet = container.kind === 'sheet' ? lastZoneSheet + 1 : 0
  const fitsEmptyStock = (instance: Instance) => {
    let fits = fitsByItem.get(instance.itemIndex)
    if (fits === undefined) {
      fits = variants[instance.itemIndex]!.some((variant) => bestPositionOnSheet(variant, emptySheet, [], obstacles, container, cache, container.minX + variant.fitBounds.maxX + 2) !== undefined)
      fitsByItem.set(instance.itemIndex, fits)
    }
    return fits
  }
  const resultOf = (final: Evaluation): NestResult => {
  const placements: Placement[] = final.placed.map((part) => {
    const item = problem.items[part.instance.itemIndex]!
    const x = part.x / scale
    const y = part.y / scale
    return {
      itemId: item.id,
      copy: part.instance.copy,
      sheet: part.sheet,
      angleDeg: part.variant.angleDeg,
      mirrored: part.variant.mirrored,
      x: part.variant.shift[0] + x,
      y: part.variant.shift[1] + y,
      outline: part.variant.outline.map(([px, py]) => [px + x, py + y]),
      holes: part.variant.holes.map((hole) => hole.map(([px, py]) => [px + x, py + y])),
    }
  })
  const realLength = placements.filter((placement) => placement.sheet === final.sheetCount - 1).reduce((max, placement) => Math.max(max, ...placement.outline.map(([px]) => px)), 0) + margin
  const used = stock.kind === 'roll' ? stock.width * realLength : stock.kind === 'sheets' ? stock.width * stock.height * Math.max(0, final.sheetCount - 1) + stock.height * realLength : usedStockArea(final)
  const placedPieceArea = placedArea(final)
  return {
    mode: stock.kind === 'polygon' ? 'polygon' : stock.kind,
    placements,
    unplaced: final.unplaced.map((instance) => ({ itemId: problem.items[instance.itemIndex]!.id, copy: instance.copy, reason: fitsEmptyStock(instance) ? 'Not placed within the time budget: give the run more time' : container.kind === 'sheet' && final.sheetCount >= container.maxSheets ? 'No sheet left for it' : 'It does not fit on the stock' })),
    length: realLength,
    sheetCount: final.sheetCount,
    utilisation: used > 0 ? placedPieceArea / used : 0,
    pieceArea,
    usedStockArea: used,
    evaluations,
    elapsedMs: Date.now() - started,
    firstFeasibleMs,
    seed,
  }
  }
  let result = resultOf(final)
  // The compression measures overlap on the search outlines; should it ever end on a layout the exact check
  // refuses, the layout it started from (feasible by construction) is returned instead.
  if (final !== beforeCompression && compresses && !verifyLayout(problem, result).ok) result = resultOf(beforeCompression)
  return result
}
