import { describe, expect, it } from 'vitest'
import ClipperLib from 'clipper-lib'
import { boundingOctagon, convexHullInt, convexParts, convexSum } from '../../../shared/nesting/convexParts.js'
import { createRandom } from '../../../shared/nesting/random.js'
import { nest } from '../../../shared/nesting/nest.js'
import { verifyLayout } from '../../../shared/nesting/verify.js'
import type { IntPath, IntPoint } from '../../../shared/nesting/intGeometry.js'
import type { NestProblem, RingPoints } from '../../../shared/nesting/types.js'

const area = (path: IntPath) => ClipperLib.Clipper.Area(path)
const isConvex = (path: IntPath) =>
  path.every((point, index) => {
    const next = path[(index + 1) % path.length]!
    const after = path[(index + 2) % path.length]!
    return (next.X - point.X) * (after.Y - next.Y) - (next.Y - point.Y) * (after.X - next.X) >= 0
  })
const ring = (points: [number, number][]): IntPath => points.map(([X, Y]) => ({ X, Y }))

/** A star with `tips` points: strongly non-convex, a hand-checkable area test. */
function star(tips: number, outer: number, inner: number): IntPath {
  const points: IntPath = []
  for (let index = 0; index < 2 * tips; index++) {
    const radius = index % 2 === 0 ? outer : inner
    const angle = (Math.PI * index) / tips
    points.push({ X: Math.round(radius * Math.cos(angle)), Y: Math.round(radius * Math.sin(angle)) })
  }
  return points
}

describe('convex parts (earcut + Hertel–Mehlhorn merging)', () => {
  it('splits an L into convex parts whose areas add up to the L', () => {
    // L = 20×20 square minus its 10×10 top-right quarter: area 300 by hand.
    const lShape = ring([[0, 0], [20, 0], [20, 10], [10, 10], [10, 20], [0, 20]])
    const parts = convexParts({ outer: lShape, holes: [] })
    expect(parts.every(isConvex)).toBe(true)
    expect(parts.reduce((sum, part) => sum + area(part), 0)).toBe(300)
    // A convex split of an L needs two parts; Hertel–Mehlhorn never needs more than four times the optimum.
    expect(parts.length).toBeGreaterThanOrEqual(2)
    expect(parts.length).toBeLessThanOrEqual(8)
  })

  it('covers a frame (a square with a square hole) without covering the hole', () => {
    // 30×30 minus the 10×10 hole in the middle: 800 by hand.
    const parts = convexParts({ outer: ring([[0, 0], [30, 0], [30, 30], [0, 30]]), holes: [ring([[10, 10], [10, 20], [20, 20], [20, 10]])] })
    expect(parts.every(isConvex)).toBe(true)
    expect(parts.reduce((sum, part) => sum + area(part), 0)).toBe(800)
    for (const part of parts) expect(ClipperLib.Clipper.PointInPolygon({ X: 15, Y: 15 }, part)).toBe(0)
  })

  it('keeps a star’s area and leaves a single convex piece whole', () => {
    const shape = star(7, 1000, 400)
    const parts = convexParts({ outer: shape, holes: [] })
    expect(parts.every(isConvex)).toBe(true)
    expect(parts.reduce((sum, part) => sum + area(part), 0)).toBe(area(shape))
    expect(convexParts({ outer: ring([[0, 0], [10, 0], [12, 8], [3, 11]]), holes: [] })).toHaveLength(1)
  })
})

describe('convex Minkowski sums', () => {
  it('equal the convex hull of all vertex sums on random convex polygons', () => {
    // The hull of pairwise sums is the textbook definition of the sum of two convex sets; the edge merge must agree.
    const random = createRandom(11)
    for (let trial = 0; trial < 300; trial++) {
      const polygon = (count: number) => convexHullInt(Array.from({ length: count }, (): IntPoint => ({ X: Math.round(random() * 2000 - 1000), Y: Math.round(random() * 2000 - 1000) })))
      const p = polygon(3 + Math.floor(random() * 12))
      const q = polygon(3 + Math.floor(random() * 12))
      const reference = convexHullInt(p.flatMap((a) => q.map((b) => ({ X: a.X + b.X, Y: a.Y + b.Y }))))
      expect(area(convexSum(p, q))).toBe(area(reference))
    }
  })

  it('of two axis-aligned squares is the square of summed sides', () => {
    const sum = convexSum(ring([[0, 0], [4, 0], [4, 4], [0, 4]]), ring([[-3, -3], [0, -3], [0, 0], [-3, 0]]))
    expect(area(sum)).toBe(49)
  })
})

describe('bounding octagon', () => {
  it('holds every point and is no larger than the bounding box', () => {
    const shape = star(5, 500, 200)
    const octagon = boundingOctagon(shape)
    expect(isConvex(octagon)).toBe(true)
    for (const point of shape) expect(ClipperLib.Clipper.PointInPolygon(point, octagon)).not.toBe(0)
    expect(area(octagon)).toBeLessThanOrEqual(1000 * (Math.max(...shape.map((p) => p.Y)) - Math.min(...shape.map((p) => p.Y))))
  })

  it('of a square is the square itself', () => {
    expect(area(boundingOctagon(ring([[0, 0], [10, 0], [10, 10], [0, 10]])))).toBe(100)
  })
})

describe('quick first layout', () => {
  it('is complete and passes the independent check even when the budget ends right after it', () => {
    // Stars with 48 outline points each (more than the octagon pass's threshold), 40 copies, 2 mm spacing.
    const outline: RingPoints = star(24, 20_000, 12_000).map(({ X, Y }) => [X / 1000, Y / 1000])
    const problem: NestProblem = {
      items: [{ id: 'star', outline, quantity: 40, rotationsDeg: [0, 90, 180, 270] }],
      stock: { kind: 'roll', width: 200 },
      spacing: 2,
      margin: 5,
    }
    const result = nest(problem, { timeBudgetMs: 1, seed: 3 })
    expect(result.unplaced).toHaveLength(0)
    expect(result.placements).toHaveLength(40)
    expect(verifyLayout(problem, result)).toMatchObject({ ok: true })
  })
})
