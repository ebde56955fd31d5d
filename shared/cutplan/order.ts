import type { CutContour, Point } from './contours.js'

/**
 * Where the blade goes into and comes out of each contour, in cut order. Closed contours: the vertex the cut starts
 * (and, without overcut, ends) at. Open contours: reversed or not.
 */
export interface CutSequence {
  order: number[]
  /** Per contour id: start vertex of a closed contour. */
  startVertex: number[]
  /** Per contour id: an open contour is cut from its last point to its first. */
  reversed: boolean[]
}

const distance = (a: readonly [number, number], b: readonly [number, number]) => Math.hypot(a[0] - b[0], a[1] - b[1])

/** Lower bound of the distance from a point to anything in a box. */
function boxDistance(point: Point, contour: CutContour): number {
  const dx = Math.max(contour.box.minX - point[0], 0, point[0] - contour.box.maxX)
  const dy = Math.max(contour.box.minY - point[1], 0, point[1] - contour.box.maxY)
  return Math.hypot(dx, dy)
}

function nearestVertex(contour: CutContour, point: Point): { vertex: number; distanceMm: number } {
  let vertex = 0
  let best = Infinity
  contour.points.forEach((candidate, index) => {
    const d = distance(candidate, point)
    if (d < best) {
      best = d
      vertex = index
    }
  })
  return { vertex, distanceMm: best }
}

/** Entry and exit points of a contour as sequenced (overcut is left out: it moves the exit by a blade's width or so). */
export function entryPoint(contour: CutContour, sequence: CutSequence): Point {
  if (contour.closed) return contour.points[sequence.startVertex[contour.id]!]!
  return sequence.reversed[contour.id] ? contour.points[contour.points.length - 1]! : contour.points[0]!
}
export function exitPoint(contour: CutContour, sequence: CutSequence): Point {
  if (contour.closed) return contour.points[sequence.startVertex[contour.id]!]!
  return sequence.reversed[contour.id] ? contour.points[0]! : contour.points[contour.points.length - 1]!
}

/** Pen-up distance of a sequence from `start` (no return to the start at the end). */
export function sequenceTravelMm(contours: readonly CutContour[], sequence: CutSequence, start: Point): number {
  let pen = start
  let total = 0
  for (const id of sequence.order) {
    total += distance(pen, entryPoint(contours[id]!, sequence))
    pen = exitPoint(contours[id]!, sequence)
  }
  return total
}

/** The order the contours were collected in (placement order), each closed contour starting at its first vertex. */
export function placementOrder(contours: readonly CutContour[], before: readonly number[][]): CutSequence {
  // Collection order already puts holes before their outline; only pieces nested in other pieces' holes need moving.
  const order = topologicalOrder(contours.map((contour) => contour.id), before)
  return { order, startVertex: contours.map(() => 0), reversed: contours.map(() => false) }
}

/** A stable topological order: each contour after everything it must follow, otherwise in the given order. */
function topologicalOrder(ids: number[], before: readonly number[][]): number[] {
  const done = new Set<number>()
  const order: number[] = []
  const visit = (id: number, depth: number) => {
    if (done.has(id) || depth > ids.length) return
    done.add(id)
    for (const first of before[id]!) visit(first, depth + 1)
    order.push(id)
  }
  // Visiting prerequisites first; `done` is set on entry, so a (malformed) cycle cannot loop.
  for (const id of ids) visit(id, 0)
  return order
}

/**
 * Nearest neighbour from the pen position over the contours whose prerequisites are cut: closed contours are entered
 * at their vertex nearest the pen, open ones at their nearer end. Ties go to the lower id, so the answer is the same on
 * every run. Cost: contours² box checks plus the vertices of contours whose box is near enough to matter.
 */
export function nearestNeighbourSequence(contours: readonly CutContour[], before: readonly number[][], start: Point): CutSequence {
  const count = contours.length
  const waiting = before.map((list) => list.length)
  const after: number[][] = contours.map(() => [])
  before.forEach((list, id) => list.forEach((first) => after[first]!.push(id)))
  const available = new Set<number>(contours.filter((contour) => waiting[contour.id] === 0).map((contour) => contour.id))
  const sequence: CutSequence = { order: [], startVertex: contours.map(() => 0), reversed: contours.map(() => false) }
  let pen = start
  while (sequence.order.length < count) {
    let bestId = -1
    let bestDistance = Infinity
    let bestVertex = 0
    let bestReversed = false
    for (const id of available) {
      const contour = contours[id]!
      const bound = boxDistance(pen, contour)
      if (bound > bestDistance || (bound === bestDistance && id > bestId)) continue
      if (contour.closed) {
        const { vertex, distanceMm } = nearestVertex(contour, pen)
        if (distanceMm < bestDistance || (distanceMm === bestDistance && id < bestId)) {
          bestId = id
          bestDistance = distanceMm
          bestVertex = vertex
        }
      } else {
        const toFirst = distance(pen, contour.points[0]!)
        const toLast = distance(pen, contour.points[contour.points.length - 1]!)
        const d = Math.min(toFirst, toLast)
        if (d < bestDistance || (d === bestDistance && id < bestId)) {
          bestId = id
          bestDistance = d
          bestReversed = toLast < toFirst
        }
      }
    }
    if (bestId < 0) {
      // Only a cycle in the constraints (overlapping, malformed contours) can leave nothing available: take the lowest left.
      bestId = contours.find((contour) => !sequence.order.includes(contour.id))!.id
    }
    available.delete(bestId)
    sequence.order.push(bestId)
    if (contours[bestId]!.closed) sequence.startVertex[bestId] = bestVertex
    else sequence.reversed[bestId] = bestReversed
    pen = exitPoint(contours[bestId]!, sequence)
    for (const next of after[bestId]!) {
      waiting[next]! -= 1
      if (waiting[next] === 0 && !sequence.order.includes(next)) available.add(next)
    }
    if (available.size === 0 && sequence.order.length < count) {
      for (const contour of contours) if (!sequence.order.includes(contour.id) && waiting[contour.id]! <= 0) available.add(contour.id)
    }
  }
  return sequence
}

/** Improvement moves evaluated at most, so a sheet of thousands of contours answers in bounded time (deterministic). */
const maxEvaluations = 5_000_000

/**
 * 2-opt (reverse a stretch of the order) and Or-opt (move one to three consecutive contours elsewhere, either way
 * round) on the entry and exit points fixed by the sequence, accepting only moves that shorten the travel and keep
 * every contour after its prerequisites. Reversing a stretch reverses its open contours; closed ones enter and leave
 * at the same vertex, so they need no change. Returns a new sequence; the input is not changed.
 * Cost: up to `maxEvaluations` move evaluations of a few distances each.
 */
export function improveSequence(contours: readonly CutContour[], before: readonly number[][], start: Point, input: CutSequence): CutSequence {
  const count = input.order.length
  const order = [...input.order]
  const reversed = [...input.reversed]
  const size = contours.length
  // Entry (ex, ey) and exit (fx, fy) per contour id; flipping an open contour swaps them.
  const ex = new Float64Array(size)
  const ey = new Float64Array(size)
  const fx = new Float64Array(size)
  const fy = new Float64Array(size)
  const current: CutSequence = { order, startVertex: input.startVertex, reversed }
  for (const contour of contours) {
    const inPoint = entryPoint(contour, current)
    const outPoint = exitPoint(contour, current)
    ex[contour.id] = inPoint[0]
    ey[contour.id] = inPoint[1]
    fx[contour.id] = outPoint[0]
    fy[contour.id] = outPoint[1]
  }
  const flip = (id: number) => {
    if (contours[id]!.closed) return
    reversed[id] = !reversed[id]
    const x = ex[id]!
    const y = ey[id]!
    ex[id] = fx[id]!
    ey[id] = fy[id]!
    fx[id] = x
    fy[id] = y
  }
  const position = new Int32Array(size)
  const reindex = (from: number, to: number) => {
    for (let index = from; index <= to; index++) position[order[index]!] = index
  }
  reindex(0, count - 1)
  const gap = (x1: number, y1: number, x2: number, y2: number) => Math.hypot(x1 - x2, y1 - y2)
  const epsilon = 1e-9
  let evaluations = 0

  /** No prerequisite pair lies inside order[from..to] (reversing would put the later one first). */
  const reversible = (from: number, to: number) => {
    for (let index = from; index <= to; index++) {
      for (const first of before[order[index]!]!) if (position[first]! >= from) return false
    }
    return true
  }

  const twoOpt = (): boolean => {
    let improved = false
    for (let i = 0; i < count - 1; i++) {
      const previousId = i === 0 ? -1 : order[i - 1]!
      const px = previousId < 0 ? start[0] : fx[previousId]!
      const py = previousId < 0 ? start[1] : fy[previousId]!
      for (let j = i + 1; j < count; j++) {
        if (++evaluations > maxEvaluations) return improved
        const first = order[i]!
        const last = order[j]!
        let delta = gap(px, py, fx[last]!, fy[last]!) - gap(px, py, ex[first]!, ey[first]!)
        if (j < count - 1) {
          const next = order[j + 1]!
          delta += gap(ex[first]!, ey[first]!, ex[next]!, ey[next]!) - gap(fx[last]!, fy[last]!, ex[next]!, ey[next]!)
        }
        if (delta < -epsilon && reversible(i, j)) {
          const stretch = order.slice(i, j + 1).reverse()
          for (let index = 0; index < stretch.length; index++) {
            order[i + index] = stretch[index]!
            flip(stretch[index]!)
          }
          reindex(i, j)
          improved = true
        }
      }
    }
    return improved
  }

  const movable = (i: number, end: number, p: number, flipped: boolean) => {
    if (flipped && !reversible(i, end)) return false
    if (p > end) {
      for (let index = end + 1; index <= p; index++) for (const first of before[order[index]!]!) if (position[first]! >= i && position[first]! <= end) return false
    } else {
      for (let index = i; index <= end; index++) for (const first of before[order[index]!]!) if (position[first]! > p && position[first]! < i) return false
    }
    return true
  }

  const applyMove = (i: number, end: number, p: number, flipped: boolean) => {
    const segment = order.splice(i, end - i + 1)
    if (flipped) {
      segment.reverse()
      segment.forEach(flip)
    }
    const insertAt = p > end ? p - segment.length + 1 : p + 1
    order.splice(insertAt, 0, ...segment)
    reindex(0, count - 1)
  }

  const orOpt = (): boolean => {
    let improved = false
    for (let length = 1; length <= 3; length++) {
      for (let i = 0; i + length <= count; i++) {
        const end = i + length - 1
        const head = order[i]!
        const tail = order[end]!
        const previousId = i === 0 ? -1 : order[i - 1]!
        const px = previousId < 0 ? start[0] : fx[previousId]!
        const py = previousId < 0 ? start[1] : fy[previousId]!
        const nextId = end < count - 1 ? order[end + 1]! : -1
        const removeGain = gap(px, py, ex[head]!, ey[head]!) + (nextId >= 0 ? gap(fx[tail]!, fy[tail]!, ex[nextId]!, ey[nextId]!) - gap(px, py, ex[nextId]!, ey[nextId]!) : 0)
        let moved = false
        for (let p = -1; p < count && !moved; p++) {
          if (p >= i - 1 && p <= end) continue
          if (++evaluations > maxEvaluations) return improved
          const beforeId = p === -1 ? -1 : order[p]!
          const bx = beforeId < 0 ? start[0] : fx[beforeId]!
          const by = beforeId < 0 ? start[1] : fy[beforeId]!
          const afterId = p + 1 < count && p + 1 !== i ? order[p + 1]! : -1
          for (const flipped of [false, true]) {
            // Flipped, the stretch enters where its last contour used to leave and leaves where its first used to enter.
            const inX = flipped ? fx[tail]! : ex[head]!
            const inY = flipped ? fy[tail]! : ey[head]!
            const outX = flipped ? ex[head]! : fx[tail]!
            const outY = flipped ? ey[head]! : fy[tail]!
            const insertCost = gap(bx, by, inX, inY) + (afterId >= 0 ? gap(outX, outY, ex[afterId]!, ey[afterId]!) - gap(bx, by, ex[afterId]!, ey[afterId]!) : 0)
            if (insertCost - removeGain < -epsilon && movable(i, end, p, flipped)) {
              applyMove(i, end, p, flipped)
              improved = true
              moved = true
              break
            }
          }
        }
      }
    }
    return improved
  }

  for (let round = 0; round < 50 && evaluations <= maxEvaluations; round++) {
    const reversedSome = twoOpt()
    const movedSome = orOpt()
    if (!reversedSome && !movedSome) break
  }
  return { order, startVertex: [...input.startVertex], reversed }
}

/** Each closed contour starts at its vertex nearest the pen as it arrives, walking the order once. */
export function chooseStartVertices(contours: readonly CutContour[], sequence: CutSequence, start: Point): CutSequence {
  const chosen: CutSequence = { order: sequence.order, startVertex: [...sequence.startVertex], reversed: sequence.reversed }
  let pen = start
  for (const id of sequence.order) {
    const contour = contours[id]!
    if (contour.closed) chosen.startVertex[id] = nearestVertex(contour, pen).vertex
    pen = exitPoint(contour, chosen)
  }
  return chosen
}

/**
 * The cut order: nearest neighbour, then 2-opt/Or-opt, then start vertices chosen afresh (twice round); the shortest
 * of these by travel is kept, so the result is never longer than nearest neighbour alone.
 */
export function optimisedSequence(contours: readonly CutContour[], before: readonly number[][], start: Point): CutSequence {
  let best = nearestNeighbourSequence(contours, before, start)
  let bestTravel = sequenceTravelMm(contours, best, start)
  let current = best
  for (let round = 0; round < 2; round++) {
    current = chooseStartVertices(contours, improveSequence(contours, before, start, current), start)
    const travel = sequenceTravelMm(contours, current, start)
    if (travel < bestTravel - 1e-9) {
      best = current
      bestTravel = travel
    } else break
  }
  return best
}
