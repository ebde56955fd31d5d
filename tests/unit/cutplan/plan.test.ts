import { describe, expect, it } from 'vitest'
import {
  defaultCutPlanOptions,
  insideFirstConstraints,
  moveTimeS,
  nearestNeighbourSequence,
  optimisedSequence,
  planLayout,
  planSheet,
  profileWith,
  sequenceTravelMm,
  sheetContours,
  type CutPlanOptions,
} from '../../../shared/cutplan/index.js'
import { design, placed, seeded, sheetLayout, square } from './fixtures.js'

const options = (overrides: Partial<CutPlanOptions> = {}): CutPlanOptions => ({ ...defaultCutPlanOptions, ...overrides })
// Round numbers for hand calculation; a test profile, not any machine's values.
const profile = profileWith({ cutSpeedMmS: 100, travelSpeedMmS: 300, accelerationMmS2: 1000, liftLowerS: 0.15, origin: 'top-left' })

describe('trapezoidal move time', () => {
  // Elementary kinematics (../shared/REFERENCES.md, "Kinematics"): d ≥ v²/a → t = d/v + v/a, else t = 2√(d/a).
  it('reaches top speed on a long move: 100 mm at 100 mm/s, 1000 mm/s² takes 100/100 + 100/1000 = 1.1 s', () => {
    expect(moveTimeS(100, 100, 1000)).toBeCloseTo(1.1, 12)
  })
  it('never reaches top speed on a short move (triangular): 5 mm takes 2√(5/1000) s', () => {
    expect(moveTimeS(5, 100, 1000)).toBeCloseTo(2 * Math.sqrt(5 / 1000), 12)
  })
  it('gives the same time from both formulas at d = v²/a (10 mm → 0.2 s)', () => {
    expect(moveTimeS(10, 100, 1000)).toBeCloseTo(0.2, 12)
    expect(2 * Math.sqrt(10 / 1000)).toBeCloseTo(0.2, 12)
  })
  it('takes no time for no move', () => {
    expect(moveTimeS(0, 100, 1000)).toBe(0)
  })
})

describe('cut plan of one sheet', () => {
  it('cuts a 100 × 100 mm square with a cut length of 400 mm (perimeter 4 × 100, elementary geometry)', () => {
    const designs = new Map([['square', design('Square', square(0, 0, 100))]])
    const plan = planSheet(sheetLayout([placed('a', 'square', 10, 10)]), designs, 0, profile, options())
    expect(plan.figures.cutLengthMm).toBeCloseTo(400, 9)
    expect(plan.figures.contourCount).toBe(1)
    expect(plan.figures.lifts).toBe(1)
    expect(plan.figures.pieceCount).toBe(1)
  })

  it('cuts the hole of a square before the square itself', () => {
    const designs = new Map([['frame', design('Frame', square(0, 0, 100), [square(40, 40, 20).reverse()])]])
    const plan = planSheet(sheetLayout([placed('a', 'frame', 0, 0)]), designs, 0, profile, options())
    expect(plan.cuts.map((cut) => cut.role)).toEqual(['hole', 'outline'])
    // 400 mm outline + 80 mm hole (elementary geometry).
    expect(plan.figures.cutLengthMm).toBeCloseTo(480, 9)
  })

  it('cuts a piece lying in the hole of another piece before that hole and that outline', () => {
    const designs = new Map([
      ['frame', design('Frame', square(0, 0, 100), [square(20, 20, 60).reverse()])],
      ['chip', design('Chip', square(0, 0, 10))],
    ])
    // The frame is placed first, so placement order alone would cut it first.
    const plan = planSheet(sheetLayout([placed('f', 'frame', 0, 0), placed('c', 'chip', 45, 45)]), designs, 0, profile, options())
    const order = plan.cuts.map((cut) => `${cut.groupKey}:${cut.role}`)
    expect(order).toEqual(['c/0:outline', 'f/0:hole', 'f/0:outline'])
  })

  it('works out travel, lifts and time of a three-contour sheet by hand', () => {
    // Two 10 mm squares at (10, 10) and (50, 10), and a 40 mm cut line of a third design from (100, 10) to (100, 50).
    const designs = new Map([
      ['square', design('Square', square(0, 0, 10))],
      ['line', design('Score', square(0, 0, 1), [], [[[0, 0], [0, 40]]])],
    ])
    const layout = sheetLayout([placed('b', 'square', 50, 10), placed('a', 'square', 10, 10), placed('l', 'line', 100, 10, { pieceIndex: -1 })])
    // Keep only the cut line of the third design: drop its 1 mm piece by placing only what we need.
    designs.get('line')!.geometry.pieces = []
    const plan = planSheet(layout, designs, 0, profile, options())
    // Pen starts at the origin corner (0, 0); nearest vertex of square a is (10, 10); square a ends where it started;
    // square b's nearest vertex is (50, 10), 40 mm away; the line's nearer end (100, 10) is 50 mm from (50, 10).
    const moves = [Math.hypot(10, 10), 40, 50]
    expect(plan.cuts.map((cut) => cut.groupKey)).toEqual(['a/0', 'b/0', 'l/0'])
    expect(plan.figures.travelLengthMm).toBeCloseTo(moves[0]! + moves[1]! + moves[2]!, 9)
    expect(plan.figures.lifts).toBe(3)
    expect(plan.figures.cutLengthMm).toBeCloseTo(40 + 40 + 40, 9)
    // Each square: four 10 mm sides, each a move that stops at a right-angle corner: d = v²/a = 10 → 10/100 + 100/1000.
    const side = 10 / 100 + 100 / 1000
    const line = 40 / 100 + 100 / 1000
    const travel = (d: number) => (d >= 300 ** 2 / 1000 ? d / 300 + 300 / 1000 : 2 * Math.sqrt(d / 1000))
    expect(plan.figures.cutTimeS).toBeCloseTo(8 * side + line, 9)
    expect(plan.figures.travelTimeS).toBeCloseTo(moves.reduce((sum, d) => sum + travel(d), 0), 9)
    expect(plan.figures.liftTimeS).toBeCloseTo(3 * 0.15, 9)
    expect(plan.figures.totalTimeS).toBeCloseTo(8 * side + line + moves.reduce((sum, d) => sum + travel(d), 0) + 0.45, 9)
  })

  it('times a flattened curve as one move, not one per chord', () => {
    const circle = Array.from({ length: 360 }, (_, index) => [50 + 40 * Math.cos((index * Math.PI) / 180), 50 + 40 * Math.sin((index * Math.PI) / 180)] as [number, number])
    const designs = new Map([['disc', design('Disc', circle)]])
    const plan = planSheet(sheetLayout([placed('d', 'disc', 0, 0)]), designs, 0, profile, options())
    expect(plan.figures.cutTimeS).toBeCloseTo(moveTimeS(plan.figures.cutLengthMm, 100, 1000), 6)
  })

  it('repeats every contour for each pass and adds the overcut past the start', () => {
    const designs = new Map([['square', design('Square', square(0, 0, 100))]])
    const plan = planSheet(sheetLayout([placed('a', 'square', 0, 0)]), designs, 0, profile, options({ passes: 2, overcutMm: 3 }))
    expect(plan.figures.cutLengthMm).toBeCloseTo(800, 9)
    expect(plan.figures.overcutLengthMm).toBeCloseTo(3, 9)
    const cut = plan.cuts[0]!
    expect(cut.path[0]).toEqual([0, 0])
    expect(cut.path[cut.path.length - 1]).toEqual([3, 0])
    expect(cut.path).toHaveLength(1 + 4 + 4 + 1)
  })

  it('cuts a shared straight edge once with common-line cutting and reports the length saved', () => {
    const designs = new Map([['square', design('Square', square(0, 0, 100))]])
    const layout = sheetLayout([placed('a', 'square', 0, 0), placed('b', 'square', 100, 0)])
    const without = planSheet(layout, designs, 0, profile, options())
    const shared = planSheet(layout, designs, 0, profile, options({ commonLine: true }))
    expect(without.figures.cutLengthMm).toBeCloseTo(800, 9)
    expect(shared.figures.commonLineSavedMm).toBeCloseTo(100, 9)
    expect(shared.figures.cutLengthMm).toBeCloseTo(700, 9)
  })

  it('adds a weeding border around each group and a weeding line to the nearest free stock edge, counted in the figures', () => {
    const designs = new Map([['square', design('Square', square(0, 0, 20))]])
    const layout = sheetLayout([placed('a', 'square', 40, 40)], 200, 200)
    const plan = planSheet(layout, designs, 0, profile, options({ weedingGapMm: 5, weedingLines: true }))
    // Border 30 × 30 mm (20 + 2 × 5) → 120 mm; line from the border's left side (x = 35) to the edge x = 0 → 35 mm.
    expect(plan.figures.weedingLengthMm).toBeCloseTo(120 + 35, 9)
    expect(plan.figures.cutLengthMm).toBeCloseTo(80 + 120 + 35, 9)
    expect(plan.cuts.findIndex((cut) => cut.role === 'outline')).toBeLessThan(plan.cuts.findIndex((cut) => cut.role === 'weeding-border'))
  })

  it('gives the same plan for the same input', () => {
    const { layout, designs } = generatedSheet(60, 3)
    expect(JSON.stringify(planSheet(layout, designs, 0, profile, options()))).toBe(JSON.stringify(planSheet(layout, designs, 0, profile, options())))
  })
})

/** A sheet of `count` squares of 8 to 20 mm in a jumbled placement order, some with a hole. */
function generatedSheet(count: number, seed: number) {
  const random = seeded(seed)
  const designs = new Map([
    ['small', design('Small', square(0, 0, 8))],
    ['ring', design('Ring', square(0, 0, 20), [square(6, 6, 8).reverse()])],
  ])
  const placements = Array.from({ length: count }, (_, index) => {
    const column = index % 20
    const row = Math.floor(index / 20)
    return { index, x: 10 + column * 30, y: 10 + row * 30, key: random() }
  })
    .sort((a, b) => a.key - b.key)
    .map(({ index, x, y }) => placed(`p${index}`, index % 3 === 0 ? 'ring' : 'small', x, y))
  return { layout: sheetLayout(placements, 650, 650), designs }
}

describe('cut order', () => {
  it('is at least 30 % shorter in travel than placement order on a generated 200-contour sheet', () => {
    const { layout, designs } = generatedSheet(150, 7)
    const plan = planSheet(layout, designs, 0, profile, options())
    expect(plan.figures.contourCount).toBeGreaterThanOrEqual(200)
    expect(plan.figures.travelLengthMm).toBeLessThanOrEqual(0.7 * plan.figures.travelInPlacementOrderMm)
    const asPlaced = planSheet(layout, designs, 0, profile, options({ order: 'as-placed' }))
    expect(asPlaced.figures.travelLengthMm).toBeCloseTo(plan.figures.travelInPlacementOrderMm, 6)
  })

  it('never travels further after 2-opt and Or-opt than nearest neighbour alone, and keeps holes before outlines', () => {
    for (const seed of [1, 2, 3, 4, 5]) {
      const { layout, designs } = generatedSheet(40 + seed * 10, seed)
      const contours = sheetContours(layout, designs, 0)
      const before = insideFirstConstraints(contours)
      const start: [number, number] = [0, 650]
      const nearest = nearestNeighbourSequence(contours, before, start)
      const optimised = optimisedSequence(contours, before, start)
      expect(sequenceTravelMm(contours, optimised, start)).toBeLessThanOrEqual(sequenceTravelMm(contours, nearest, start) + 1e-9)
      const position = new Map(optimised.order.map((id, index) => [id, index]))
      before.forEach((firsts, id) => firsts.forEach((first) => expect(position.get(first)!).toBeLessThan(position.get(id)!)))
      expect([...optimised.order].sort((a, b) => a - b)).toEqual(contours.map((contour) => contour.id))
    }
  })
})

describe('cut plan of a layout', () => {
  it('plans every sheet and adds them up', () => {
    const designs = new Map([['square', design('Square', square(0, 0, 100))]])
    const layout = sheetLayout([placed('a', 'square', 0, 0), placed('b', 'square', 0, 0, { sheet: 1 })], 300, 300, 3)
    const plan = planLayout(layout, designs, profile, options())
    expect(plan.sheets).toHaveLength(3)
    expect(plan.sheets.map((sheet) => sheet.figures.cutLengthMm)).toEqual([400, 400, 0])
    expect(plan.totals.cutLengthMm).toBeCloseTo(800, 9)
    expect(plan.totals.sheetCount).toBe(2)
    expect(plan.totals.totalTimeS).toBeCloseTo(plan.sheets[0]!.figures.totalTimeS + plan.sheets[1]!.figures.totalTimeS, 9)
  })

  it('plans a roll as one sheet as long as the furthest piece plus the margin', () => {
    const designs = new Map([['square', design('Square', square(0, 0, 100))]])
    const plan = planLayout({ stock: { kind: 'roll', widthMm: 300, lengthMm: 5000 }, placements: [placed('a', 'square', 200, 0)], options: { marginMm: 5 } }, designs, profile, options())
    expect(plan.sheets).toHaveLength(1)
    expect(plan.sheets[0]!.figures.widthMm).toBe(305)
    expect(plan.sheets[0]!.figures.heightMm).toBe(300)
  })
})
