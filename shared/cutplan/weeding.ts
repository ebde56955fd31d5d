import type { Box } from '../geometry/polygon.js'
import type { CutContour, Point } from './contours.js'

type NewContour = Omit<CutContour, 'id' | 'box'>

const grow = (box: Box, by: number): Box => ({ minX: box.minX - by, minY: box.minY - by, maxX: box.maxX + by, maxY: box.maxY + by })
const overlap = (a: Box, b: Box) => a.minX < b.maxX && b.minX < a.maxX && a.minY < b.maxY && b.minY < a.maxY

/**
 * Weeding aids for vinyl: a rectangle `gapMm` around each group of pieces (a placed design, or pieces whose borders
 * would overlap, merged until none do), kept on the sheet, and optionally one weeding line from each border straight
 * to the nearest stock edge that no other border stands in the way of, so the waste lifts off in pieces (common
 * practice). Cost: groups² per merge round.
 */
export function weedingContours(contours: readonly CutContour[], sheet: { widthMm: number; heightMm: number }, gapMm: number, withLines: boolean): NewContour[] {
  const byGroup = new Map<string, Box>()
  for (const contour of contours) {
    // A placement's pieces share the placement id before the "/".
    const key = contour.groupKey.split('/')[0]!
    const known = byGroup.get(key)
    byGroup.set(key, known ? { minX: Math.min(known.minX, contour.box.minX), minY: Math.min(known.minY, contour.box.minY), maxX: Math.max(known.maxX, contour.box.maxX), maxY: Math.max(known.maxY, contour.box.maxY) } : { ...contour.box })
  }
  let borders = [...byGroup.values()].map((box) => grow(box, gapMm))
  for (let merged = true; merged; ) {
    merged = false
    outer: for (let a = 0; a < borders.length; a++) {
      for (let b = a + 1; b < borders.length; b++) {
        if (!overlap(borders[a]!, borders[b]!)) continue
        const A = borders[a]!
        const B = borders[b]!
        borders[a] = { minX: Math.min(A.minX, B.minX), minY: Math.min(A.minY, B.minY), maxX: Math.max(A.maxX, B.maxX), maxY: Math.max(A.maxY, B.maxY) }
        borders.splice(b, 1)
        merged = true
        break outer
      }
    }
  }
  borders = borders.map((box) => ({ minX: Math.max(0, box.minX), minY: Math.max(0, box.minY), maxX: Math.min(sheet.widthMm, box.maxX), maxY: Math.min(sheet.heightMm, box.maxY) }))
  borders.sort((a, b) => a.minY - b.minY || a.minX - b.minX)

  const added: NewContour[] = []
  for (const box of borders) {
    const ring: Point[] = [
      [box.minX, box.minY],
      [box.maxX, box.minY],
      [box.maxX, box.maxY],
      [box.minX, box.maxY],
    ]
    added.push({ closed: true, points: ring, lengthFactor: 1, role: 'weeding-border', groupKey: 'weeding', groupLabel: 'Weeding border' })
  }
  if (!withLines) return added
  borders.forEach((box, index) => {
    const midX = (box.minX + box.maxX) / 2
    const midY = (box.minY + box.maxY) / 2
    const candidates: [Point, Point][] = [
      [[box.minX, midY], [0, midY]],
      [[box.maxX, midY], [sheet.widthMm, midY]],
      [[midX, box.minY], [midX, 0]],
      [[midX, box.maxY], [midX, sheet.heightMm]],
    ]
    let best: [Point, Point] | undefined
    let bestLength = Infinity
    for (const [from, to] of candidates) {
      const length = Math.hypot(to[0] - from[0], to[1] - from[1])
      // A border on the stock edge needs no line on that side (its waste already reaches the edge).
      if (length < 0.01) return
      const lineBox: Box = { minX: Math.min(from[0], to[0]), minY: Math.min(from[1], to[1]), maxX: Math.max(from[0], to[0]), maxY: Math.max(from[1], to[1]) }
      const blocked = borders.some((other, otherIndex) => otherIndex !== index && lineBox.minX <= other.maxX && other.minX <= lineBox.maxX && lineBox.minY <= other.maxY && other.minY <= lineBox.maxY)
      if (!blocked && length < bestLength) {
        best = [from, to]
        bestLength = length
      }
    }
    if (best) added.push({ closed: false, points: best, lengthFactor: 1, role: 'weeding-line', groupKey: 'weeding', groupLabel: 'Weeding line' })
  })
  return added
}
