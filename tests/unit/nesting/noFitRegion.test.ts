import { describe, expect, it } from 'vitest'
import ClipperLib from 'clipper-lib'
import { noFitRegion, innerFitRegion } from '../../../shared/nesting/noFitRegion.js'
import type { IntPath, IntShape } from '../../../shared/nesting/intGeometry.js'

const rect = (x0: number, y0: number, x1: number, y1: number): IntPath => [
  { X: x0, Y: y0 },
  { X: x1, Y: y0 },
  { X: x1, Y: y1 },
  { X: x0, Y: y1 },
]
const shape = (outer: IntPath, holes: IntPath[] = []): IntShape => ({ outer, holes: holes.map((hole) => [...hole].reverse()) })

/** B placed at (x, y) overlaps A: strictly inside the region (non-zero winding). On a boundary the shapes only touch. */
function forbiddenAt(paths: IntPath[], x: number, y: number): boolean {
  const where = paths.map((path) => ClipperLib.Clipper.PointInPolygon({ X: x, Y: y }, path))
  if (where.includes(-1)) return false
  return paths.reduce((winding, path, index) => winding + (where[index] === 1 ? (ClipperLib.Clipper.Area(path) > 0 ? 1 : -1) : 0), 0) > 0
}
const totalArea = (paths: IntPath[]) => paths.reduce((sum, path) => sum + ClipperLib.Clipper.Area(path), 0)

describe('no-fit regions (hand-checked, Bennell & Oliveira 2008 definitions)', () => {
  it('of two rectangles is the rectangle of overlapping reference positions', () => {
    // A = [0,10]×[0,5], B = [0,4]×[0,3]: B overlaps A exactly when x ∈ (−4, 10) and y ∈ (−3, 5).
    const region = noFitRegion(shape(rect(0, 0, 10, 5)), shape(rect(0, 0, 4, 3)), 0)
    expect(region).toHaveLength(1)
    expect(totalArea(region)).toBe(14 * 8)
    const xs = region[0]!.map((point) => point.X)
    const ys = region[0]!.map((point) => point.Y)
    expect([Math.min(...xs), Math.max(...xs), Math.min(...ys), Math.max(...ys)]).toEqual([-4, 10, -3, 5])
  })

  it('lets a bar that exactly fits slide into the slot of a U, with the one-unit allowance', () => {
    // U: 90×90 with a 30-wide slot from (30,30) up to the top; the bar is 30×60, exactly the slot's width.
    // Exact fits are a zero-width line of positions, which a boolean step would drop: the region is pulled in by one
    // unit (the engine grows every shape by as much), leaving a two-unit strip of touching positions.
    const u = shape([
      { X: 0, Y: 0 },
      { X: 90, Y: 0 },
      { X: 90, Y: 90 },
      { X: 60, Y: 90 },
      { X: 60, Y: 30 },
      { X: 30, Y: 30 },
      { X: 30, Y: 90 },
      { X: 0, Y: 90 },
    ])
    const bar = shape(rect(0, 0, 30, 60))
    const region = noFitRegion(u, bar, 1)
    // Inside the slot (x = 30, any height from 30 up) the bar touches the walls without overlapping.
    expect(forbiddenAt(region, 30, 45)).toBe(false)
    expect(forbiddenAt(region, 30, 120)).toBe(false)
    // Two units to either side it cuts into a wall; below the slot floor it cuts into the base.
    expect(forbiddenAt(region, 28, 45)).toBe(true)
    expect(forbiddenAt(region, 32, 45)).toBe(true)
    expect(forbiddenAt(region, 30, 27)).toBe(true)
  })

  it('keeps the positions inside a hole free when the piece fits in it', () => {
    // A: 100×100 with a 60×60 hole at (20,20); B: a 40×40 square fits for reference positions [20,40]×[20,40].
    const frame = shape(rect(0, 0, 100, 100), [rect(20, 20, 80, 80)])
    const square = shape(rect(0, 0, 40, 40))
    const region = noFitRegion(frame, square, 0)
    expect(forbiddenAt(region, 30, 30)).toBe(false)
    expect(forbiddenAt(region, 20, 40)).toBe(false)
    expect(forbiddenAt(region, 45, 30)).toBe(true)
    expect(forbiddenAt(region, 10, 10)).toBe(true)
    // Free area inside: (40−20)² = 400 square units; the region is the full sum minus that hole.
    expect(totalArea(region)).toBe(140 * 140 - 20 * 20)
  })

  it('fills a pocket too small for the piece', () => {
    const frame = shape(rect(0, 0, 100, 100), [rect(20, 20, 50, 50)])
    const region = noFitRegion(frame, shape(rect(0, 0, 40, 40)), 0)
    expect(forbiddenAt(region, 25, 25)).toBe(true)
    expect(totalArea(region)).toBe(140 * 140)
  })

  it('gives the inner-fit region of a piece in a remnant outline', () => {
    // Remnant: an L-shaped offcut; a 20×20 square fits in the 100×30 leg and the 30×100 leg.
    const remnant = shape([
      { X: 0, Y: 0 },
      { X: 100, Y: 0 },
      { X: 100, Y: 30 },
      { X: 30, Y: 30 },
      { X: 30, Y: 100 },
      { X: 0, Y: 100 },
    ])
    const region = innerFitRegion(remnant, shape(rect(0, 0, 20, 20)), 0)
    // Reference positions: x ∈ [0,80], y ∈ [0,10] ∪ x ∈ [0,10], y ∈ [0,80] → 80·10 + 10·80 − 10·10.
    expect(totalArea(region)).toBe(800 + 800 - 100)
  })
})
