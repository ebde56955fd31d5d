import { describe, expect, it } from 'vitest'
import { nestZonesOf } from '../../../shared/nesting/designItems.js'
import { nest } from '../../../shared/nesting/nest.js'
import { verifyLayout } from '../../../shared/nesting/verify.js'
import type { NestProblem, NestResult, Placement } from '../../../shared/nesting/types.js'
import { createNestRunRequestSchema } from '../../../shared/schemas/nesting.js'

type Ring = [number, number][]
const rectangle = (x: number, y: number, width: number, height: number): Ring => [
  [x, y],
  [x + width, y],
  [x + width, y + height],
  [x, y + height],
]
const leftHalf = rectangle(0, 0, 50, 100)

/**
 * Worked example by hand: 100 × 100 sheets, no margin or spacing, six 49 × 49 squares (49, not 50: the engine keeps a
 * hair's breadth between pieces, so squares of exactly half the sheet do not pair up). A free sheet holds 2 × 2 of
 * them (98 ≤ 100 both ways); a sheet whose left half (x < 50) is excluded holds only the 1 × 2 of its right half.
 */
const squares = (zones: NestProblem['excludedZones'], maxSheets: number): NestProblem => ({
  items: [{ id: 'square', outline: rectangle(0, 0, 49, 49), quantity: 6, rotationsDeg: [0] }],
  stock: { kind: 'sheets', width: 100, height: 100, maxSheets },
  margin: 0,
  spacing: 0,
  excludedZones: zones,
})
const onSheet = (result: NestResult, sheet: number) => result.placements.filter((placement) => placement.sheet === sheet)

describe('excluded zones of one sheet in the engine', () => {
  it('keeps a zone of sheet 1 clear on sheet 1 only, so six squares fit on two sheets', () => {
    const problem = squares([{ sheet: 1, outline: leftHalf }], 2)
    const result = nest(problem, { maxEvaluations: 3, seed: 1 })
    expect(verifyLayout(problem, result).problems).toEqual([])
    expect(result.unplaced).toEqual([])
    // Sheet 0 is free: 4 squares. Sheet 1 keeps x < 50 clear: the other 2 stand in its right half.
    expect(onSheet(result, 0)).toHaveLength(4)
    expect(onSheet(result, 1)).toHaveLength(2)
    for (const placement of onSheet(result, 1)) expect(Math.min(...placement.outline.map(([x]) => x))).toBeGreaterThanOrEqual(50 - 1e-6)
  })

  it('still keeps a zone without a sheet clear on every sheet (the original form): two squares are left over', () => {
    const problem = squares([{ outline: leftHalf }], 2)
    const result = nest(problem, { maxEvaluations: 3, seed: 1 })
    expect(verifyLayout(problem, result).problems).toEqual([])
    // Only the right half of each sheet: 2 + 2 placed, 2 of 6 have no sheet left.
    expect(result.placements).toHaveLength(4)
    expect(result.unplaced).toHaveLength(2)
  })

  it('skips a sheet its own zone fills and carries on on the next one', () => {
    const problem = squares([{ sheet: 1, outline: rectangle(0, 0, 100, 100) }], 3)
    const result = nest(problem, { maxEvaluations: 3, seed: 1 })
    expect(verifyLayout(problem, result).problems).toEqual([])
    expect(result.unplaced).toEqual([])
    expect([onSheet(result, 0).length, onSheet(result, 1).length, onSheet(result, 2).length]).toEqual([4, 0, 2])
    expect(result.sheetCount).toBe(3)
  })

  it('gives the same layout for the same seed with zones of single sheets', () => {
    const problem = squares([{ sheet: 1, outline: leftHalf }, { outline: rectangle(0, 0, 10, 10) }], 3)
    const positions = (result: NestResult) => result.placements.map((placement) => [placement.sheet, placement.x, placement.y])
    expect(positions(nest(problem, { maxEvaluations: 6, seed: 4 }))).toEqual(positions(nest(problem, { maxEvaluations: 6, seed: 4 })))
  })

  it('on a roll, applies a zone of sheet 0 and leaves out a zone of another sheet', () => {
    // A 50 mm roll and two 50 mm squares: with the first 50 mm of the roll excluded, they stand at 50..150.
    const roll = (sheet: number): NestProblem => ({
      items: [{ id: 'square', outline: rectangle(0, 0, 50, 50), quantity: 2, rotationsDeg: [0] }],
      stock: { kind: 'roll', width: 50 },
      excludedZones: [{ sheet, outline: rectangle(0, 0, 50, 50) }],
    })
    const blocked = nest(roll(0), { maxEvaluations: 4, seed: 1 })
    expect(verifyLayout(roll(0), blocked).problems).toEqual([])
    expect(blocked.length).toBeCloseTo(150, 3)
    const free = nest(roll(1), { maxEvaluations: 4, seed: 1 })
    expect(verifyLayout(roll(1), free).problems).toEqual([])
    expect(free.length).toBeCloseTo(100, 3)
  })
})

describe('the verifier with zones of one sheet', () => {
  const problem = squares([{ sheet: 1, outline: leftHalf }], 2)
  const square = (sheet: number): Placement => ({ itemId: 'square', copy: 0, sheet, angleDeg: 0, mirrored: false, x: 0, y: 0, outline: rectangle(0, 0, 49, 49), holes: [] })
  const resultWith = (placement: Placement): NestResult => ({
    mode: 'sheets',
    placements: [placement],
    unplaced: Array.from({ length: 5 }, (_, index) => ({ itemId: 'square', copy: index + 1, reason: 'left out for the test' })),
    length: 50,
    sheetCount: placement.sheet + 1,
    utilisation: 0.25,
    pieceArea: 2401,
    usedStockArea: 10_000,
    evaluations: 1,
    elapsedMs: 1,
    firstFeasibleMs: 1,
    seed: 1,
  })

  it('refuses a piece over a zone of its own sheet', () => {
    const report = verifyLayout(problem, resultWith(square(1)))
    expect(report.ok).toBe(false)
    expect(report.problems.join(' ')).toMatch(/covers excluded zone 1 of sheet 1/)
  })

  it('accepts the same piece over a zone of another sheet', () => {
    expect(verifyLayout(problem, resultWith(square(0))).problems).toEqual([])
  })
})

describe('excluded zones in a nest-run request', () => {
  const designId = '00000000-0000-4000-8000-000000000001'
  const request = (stock: object, excludedZones: unknown[]) => ({ items: [{ designId, quantity: 1 }], stock, excludedZones })
  const sheets = { kind: 'sheets', widthMm: 100, heightMm: 100 }

  it('takes the original outline form and the form with a sheet side by side', () => {
    const parsed = createNestRunRequestSchema.parse(request(sheets, [leftHalf, { sheet: 2, outline: rectangle(10, 10, 5, 5) }]))
    // Stored as sent, so a stored run reads back unchanged.
    expect(parsed.excludedZones).toEqual([leftHalf, { sheet: 2, outline: rectangle(10, 10, 5, 5) }])
    expect(nestZonesOf(parsed.excludedZones)).toEqual([{ outline: leftHalf }, { sheet: 2, outline: rectangle(10, 10, 5, 5) }])
  })

  it('names the field of a zone that is not valid', () => {
    const issuesOf = (body: unknown) => {
      const parsed = createNestRunRequestSchema.safeParse(body)
      expect(parsed.success).toBe(false)
      return parsed.error!.issues.map((issue) => [issue.path.join('.'), issue.message])
    }
    expect(issuesOf(request(sheets, [{ sheet: -1, outline: leftHalf }]))).toEqual([['excludedZones.0.sheet', 'The zone’s sheet counts from 0']])
    expect(issuesOf(request(sheets, [[[0, 0], [1, 1]]]))).toEqual([['excludedZones.0', 'An excluded zone needs at least 3 points']])
    expect(issuesOf(request({ kind: 'roll', widthMm: 600 }, [{ sheet: 1, outline: leftHalf }]))).toEqual([['excludedZones.0.sheet', 'A roll or a stock outline is one sheet: the zone’s sheet must be 0']])
    expect(issuesOf(request({ ...sheets, maxSheets: 2 }, [{ sheet: 2, outline: leftHalf }]))[0]![0]).toBe('excludedZones.0.sheet')
    expect(createNestRunRequestSchema.safeParse(request({ kind: 'roll', widthMm: 600 }, [{ sheet: 0, outline: leftHalf }])).success).toBe(true)
  })
})
