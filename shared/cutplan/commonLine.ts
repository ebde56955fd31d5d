import { boundingBox } from '../geometry/polygon.js'
import type { CutContour, Point } from './contours.js'

/** Edges closer than this to each other's line count as lying on it; spacing of zero in a layout gives exact contact. */
const onLineMm = 0.01
/** Shared stretches shorter than this are not worth a lift. */
const minimumSharedMm = 0.5

/**
 * Common-line cutting: where a straight edge of one piece's outline lies on an edge of an earlier piece's outline (zero
 * spacing), the later outline leaves that stretch out, since the blade already cut it. The later outline becomes the
 * open stretches that remain. Prerequisites carry over to the stretches (the holes of a piece still come first), and a
 * contour that had to wait for the outline now waits for all its stretches.
 * Cost: pairs of outlines whose boxes touch × their edges.
 */
export function applyCommonLine(contours: readonly CutContour[], before: readonly number[][]): { contours: CutContour[]; before: number[][]; savedMm: number } {
  const outlines = contours.filter((contour) => contour.role === 'outline')
  const removed = new Map<number, [number, number][][]>()
  let savedMm = 0
  for (let bIndex = 0; bIndex < outlines.length; bIndex++) {
    const b = outlines[bIndex]!
    for (let aIndex = 0; aIndex < bIndex; aIndex++) {
      const a = outlines[aIndex]!
      if (a.box.minX > b.box.maxX + onLineMm || b.box.minX > a.box.maxX + onLineMm || a.box.minY > b.box.maxY + onLineMm || b.box.minY > a.box.maxY + onLineMm) continue
      const n = b.points.length
      for (let edge = 0; edge < n; edge++) {
        const [cx, cy] = b.points[edge]!
        const [dx, dy] = b.points[(edge + 1) % n]!
        const edgeLength = Math.hypot(dx - cx, dy - cy)
        if (edgeLength < minimumSharedMm) continue
        const m = a.points.length
        for (let other = 0; other < m; other++) {
          const [ax, ay] = a.points[other]!
          const [bx, by] = a.points[(other + 1) % m]!
          const length = Math.hypot(bx - ax, by - ay)
          if (length < minimumSharedMm) continue
          // Both ends of b's edge must lie on the line of a's edge.
          const ux = (bx - ax) / length
          const uy = (by - ay) / length
          if (Math.abs(ux * (cy - ay) - uy * (cx - ax)) > onLineMm || Math.abs(ux * (dy - ay) - uy * (dx - ax)) > onLineMm) continue
          const tc = ux * (cx - ax) + uy * (cy - ay)
          const td = ux * (dx - ax) + uy * (dy - ay)
          const from = Math.max(0, Math.min(tc, td))
          const to = Math.min(length, Math.max(tc, td))
          if (to - from < minimumSharedMm) continue
          // The shared stretch as fractions of b's edge.
          const s0 = (from - tc) / (td - tc)
          const s1 = (to - tc) / (td - tc)
          const list = removed.get(b.id) ?? b.points.map(() => [] as [number, number][])
          list[edge]!.push([Math.max(0, Math.min(s0, s1)), Math.min(1, Math.max(s0, s1))])
          removed.set(b.id, list)
        }
      }
    }
  }
  if (removed.size === 0) return { contours: [...contours], before: before.map((list) => [...list]), savedMm: 0 }

  const result: CutContour[] = []
  const replacement = new Map<number, number[]>()
  for (const contour of contours) {
    const intervals = removed.get(contour.id)
    if (!intervals) {
      replacement.set(contour.id, [result.length])
      result.push({ ...contour, id: result.length })
      continue
    }
    const { stretches, removedMm } = keptStretches(contour.points, intervals)
    savedMm += removedMm * contour.lengthFactor
    const ids: number[] = []
    for (const points of stretches) {
      ids.push(result.length)
      result.push({ ...contour, id: result.length, closed: false, points, box: boundingBox(points) })
    }
    replacement.set(contour.id, ids)
  }
  const newBefore: number[][] = result.map(() => [])
  contours.forEach((contour) => {
    const firsts = before[contour.id]!.flatMap((first) => replacement.get(first)!)
    for (const id of replacement.get(contour.id)!) newBefore[id]!.push(...firsts)
  })
  return { contours: result, before: newBefore, savedMm }
}

/** The parts of a closed ring left after removing stretches of its edges, as open polylines in ring order. */
function keptStretches(ring: readonly Point[], removedPerEdge: [number, number][][]): { stretches: Point[][]; removedMm: number } {
  const n = ring.length
  type Piece = { edge: number; from: number; to: number }
  const kept: Piece[] = []
  let removedMm = 0
  for (let edge = 0; edge < n; edge++) {
    const [ax, ay] = ring[edge]!
    const [bx, by] = ring[(edge + 1) % n]!
    const length = Math.hypot(bx - ax, by - ay)
    const intervals = [...removedPerEdge[edge]!].sort((left, right) => left[0] - right[0])
    let cursor = 0
    for (const [from, to] of intervals) {
      if (to <= cursor) continue
      if (from > cursor) kept.push({ edge, from: cursor, to: from })
      removedMm += (to - Math.max(from, cursor)) * length
      cursor = to
    }
    if (cursor < 1) kept.push({ edge, from: cursor, to: 1 })
  }
  const at = (edge: number, t: number): Point => {
    const [ax, ay] = ring[edge]!
    const [bx, by] = ring[(edge + 1) % n]!
    return [ax + (bx - ax) * t, ay + (by - ay) * t]
  }
  // Join pieces that continue each other; start after a gap so the stretch across the ring's first vertex stays whole.
  const joins = (left: Piece, right: Piece) => left.to === 1 && right.from === 0 && (left.edge + 1) % n === right.edge
  let first = kept.findIndex((piece, index) => !joins(kept[(index - 1 + kept.length) % kept.length]!, piece))
  if (first < 0) first = 0
  const stretches: Point[][] = []
  let current: Point[] = []
  for (let step = 0; step < kept.length; step++) {
    const piece = kept[(first + step) % kept.length]!
    const previous = kept[(first + step - 1 + kept.length) % kept.length]!
    if (step > 0 && joins(previous, piece)) current.push(at(piece.edge, piece.to))
    else {
      if (current.length >= 2) stretches.push(current)
      current = [at(piece.edge, piece.from), at(piece.edge, piece.to)]
    }
  }
  if (current.length >= 2) stretches.push(current)
  return { stretches: stretches.filter((points) => points.some((point, index) => index > 0 && Math.hypot(point[0] - points[index - 1]![0], point[1] - points[index - 1]![1]) > 1e-6)), removedMm }
}
