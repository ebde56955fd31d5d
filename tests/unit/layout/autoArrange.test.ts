import { describe, expect, it } from 'vitest'
import { arrangementFromNestResult, capZones, nestRequestFromLayout } from '../../../shared/layout/autoArrange.js'
import { layoutFromNestRun } from '../../../shared/layout/fromNestRun.js'
import { createShapeCache } from '../../../shared/layout/placedGeometry.js'
import { boundingBox } from '../../../shared/geometry/polygon.js'
import { createLayoutRequestSchema } from '../../../shared/schemas/layouts.js'
import { createNestRunRequestSchema, type NestResultDto } from '../../../shared/schemas/nesting.js'
import { problemFromDesigns } from '../../../shared/nesting/designItems.js'
import { nest } from '../../../shared/nesting/nest.js'
import { verifyLayout } from '../../../shared/nesting/verify.js'
import { BAR_ID, SQUARE_ID, newTestId, placement, rectangle, testDesigns, testDocument } from './editorFixtures.js'

const designs = testDesigns()
const shapes = createShapeCache(designs)

function nestResult(placements: { designId: string; sheet: number; x: number; y: number }[]): NestResultDto {
  return {
    mode: 'sheets',
    placements: placements.map((entry, copy) => ({ designId: entry.designId, pieceIndex: 0, copy, sheet: entry.sheet, angleDeg: 90, mirrored: false, xMm: entry.x, yMm: entry.y, outline: [], holes: [] })),
    unplaced: [],
    lengthMm: 120,
    sheetCount: Math.max(...placements.map((entry) => entry.sheet)) + 1,
    utilisation: 0.5,
    perSheetUtilisation: [0.5],
    pieceAreaMm2: 1,
    usedStockAreaMm2: 2,
    evaluations: 1,
    elapsedMs: 1,
    firstFeasibleMs: 1,
    seed: 1,
    verified: true,
  }
}

describe('auto-arrange through a nest run', () => {
  it('asks for the copies locked pieces do not already hold and keeps their area clear, grown by the spacing', () => {
    const document = testDocument([placement('kept', SQUARE_ID, 10, 10, { locked: true }), placement('free', SQUARE_ID, 100, 10), placement('bar', BAR_ID, 10, 100)])
    const answer = nestRequestFromLayout(document, { designs, shapes }, 10)
    if (!answer.request) throw new Error(answer.reason)
    expect(answer.lockedCount).toBe(1)
    expect(answer.request.items.map((item) => [item.designId, item.quantity])).toEqual([
      [SQUARE_ID, 1],
      [BAR_ID, 1],
    ])
    expect(answer.request.stock).toMatchObject({ kind: 'sheets', widthMm: 300, heightMm: 200 })
    expect(answer.request).toMatchObject({ spacingMm: 2, marginMm: 5, timeBudgetSeconds: 10 })
    // The locked 50 mm square at 10..60, grown by the 2 mm spacing (and the 0.1 mm allowance for thinning): 7.9..62.1.
    expect(answer.request.excludedZones).toHaveLength(1)
    const zone = answer.request.excludedZones![0]!
    if (Array.isArray(zone)) throw new Error('the zone of a locked piece names its sheet')
    expect(zone.sheet).toBe(0)
    const box = boundingBox(zone.outline)
    expect(box.minX).toBeCloseTo(7.9, 3)
    expect(box.maxX).toBeCloseTo(62.1, 3)
    expect(box.minY).toBeCloseTo(7.9, 3)
  })

  it('refuses when every piece is locked or there is nothing to arrange', () => {
    const locked = testDocument([placement('a', SQUARE_ID, 10, 10, { locked: true }), placement('b', SQUARE_ID, 70, 10, { locked: true }), placement('c', BAR_ID, 10, 100, { locked: true })])
    expect(nestRequestFromLayout(locked, { designs, shapes }, 10).request).toBeNull()
    expect(nestRequestFromLayout({ ...testDocument(), items: [] }, { designs, shapes }, 10).request).toBeNull()
  })

  it('maps a nest placement 1:1 and drops pieces beyond the wanted count', () => {
    const document = testDocument([placement('kept', SQUARE_ID, 10, 10, { locked: true })])
    const result = nestResult([
      { designId: SQUARE_ID, sheet: 0, x: 120, y: 5 },
      { designId: SQUARE_ID, sheet: 1, x: 60, y: 5 },
      { designId: BAR_ID, sheet: 0, x: 200, y: 5 },
    ])
    const arranged = arrangementFromNestResult(document, result, { shapes, newId: newTestId })
    // Two squares wanted, one locked: one more square and the bar.
    expect(arranged.placements.map((entry) => [entry.designId, entry.sheet, entry.xMm, entry.yMm, entry.angleDeg, entry.mirrored])).toEqual([
      [SQUARE_ID, 0, 120, 5, 90, false],
      [BAR_ID, 0, 200, 5, 90, false],
    ])
    expect(arranged.stock).toMatchObject({ kind: 'sheets', sheetCount: 1 })
  })

  it('merges zones beyond the nest run’s limit into hulls that cover them', () => {
    const zones = Array.from({ length: 5 }, (_, index) => ({ sheet: 0, outline: rectangle(index * 20, 0, 10, 10) }))
    const capped = capZones(zones, 3)
    expect(capped).toHaveLength(3)
    expect(capped.every((zone) => zone.sheet === 0)).toBe(true)
    const covered = boundingBox(capped.flatMap((zone) => zone.outline))
    expect(covered).toEqual({ minX: 0, minY: 0, maxX: 90, maxY: 10 })
  })

  it('merges zones of the same sheet before zones of different sheets, which then apply to every sheet', () => {
    // Sheet 1's two zones lie 100 mm apart, the zones of sheets 0 and 2 only 20 mm: the same sheet merges first.
    const zones = [
      { sheet: 0, outline: rectangle(0, 0, 10, 10) },
      { sheet: 2, outline: rectangle(20, 0, 10, 10) },
      { sheet: 1, outline: rectangle(0, 100, 10, 10) },
      { sheet: 1, outline: rectangle(100, 100, 10, 10) },
    ]
    const capped = capZones(zones, 3)
    expect(capped.map((zone) => [zone.sheet, boundingBox(zone.outline)])).toEqual([
      [0, { minX: 0, minY: 0, maxX: 10, maxY: 10 }],
      [2, { minX: 20, minY: 0, maxX: 30, maxY: 10 }],
      [1, { minX: 0, minY: 100, maxX: 110, maxY: 110 }],
    ])
    const hull = capZones(capped, 2)
    expect(hull).toHaveLength(2)
    expect(hull[0]).toEqual({ outline: expect.any(Array) })
    expect(boundingBox(hull[0]!.outline)).toEqual({ minX: 0, minY: 0, maxX: 30, maxY: 10 })
  })

  it('keeps a piece locked on sheet 1 clear on sheet 1 only, so sheet 0 stays free to arrange', () => {
    const document = testDocument([placement('kept', SQUARE_ID, 10, 10, { locked: true, sheet: 1 }), placement('free', SQUARE_ID, 100, 10), placement('bar', BAR_ID, 10, 100)])
    document.options = { ...document.options, excludedZones: [{ sheet: 1, outline: rectangle(200, 100, 30, 30) }] }
    const answer = nestRequestFromLayout(document, { designs, shapes }, 10)
    if (!answer.request) throw new Error(answer.reason)
    // The layout's own zone and the locked piece's grown outline both name sheet 1.
    expect(answer.request.excludedZones!.map((zone) => (Array.isArray(zone) ? 'every sheet' : zone.sheet))).toEqual([1, 1])
    expect(createNestRunRequestSchema.safeParse(answer.request).success).toBe(true)

    // Nested for real: the free square takes sheet 0's corner at the 5 mm margin, which the locked piece (at 10..60 on
    // sheet 1, kept clear from 7.9) would have blocked were its zone applied to every sheet.
    const designsForNesting = new Map([...designs].map(([id, design]) => [id, { id, ...design }]))
    const problem = problemFromDesigns(createNestRunRequestSchema.parse(answer.request), designsForNesting)
    const result = nest(problem, { maxEvaluations: 3, seed: 1 })
    expect(verifyLayout(problem, result).problems).toEqual([])
    const square = result.placements.find((entry) => entry.itemId === `${SQUARE_ID}:0`)!
    expect(square.sheet).toBe(0)
    expect(boundingBox(square.outline)).toMatchObject({ minX: 5, minY: 5 })
  })

  it('opens a nest run’s result as a valid new layout', () => {
    const result = nestResult([
      { designId: SQUARE_ID, sheet: 0, x: 60, y: 5 },
      { designId: SQUARE_ID, sheet: 1, x: 60, y: 5 },
    ])
    const request = layoutFromNestRun(
      {
        request: { items: [{ designId: SQUARE_ID, quantity: 2, rotation: 'quarter-turns', mirror: 'never', grainLock: false }], stock: { kind: 'sheets', widthMm: 210, heightMm: 297 }, spacingMm: 3, marginMm: 4, excludedZones: [rectangle(0, 0, 20, 20)], timeBudgetSeconds: 5 },
        result,
      },
      'From a nest run',
      newTestId,
    )
    expect(request).not.toBeNull()
    const parsed = createLayoutRequestSchema.parse(request)
    expect(parsed.stock).toEqual({ kind: 'sheets', widthMm: 210, heightMm: 297, sheetCount: 2 })
    expect(parsed.placements).toHaveLength(2)
    expect(parsed.options).toMatchObject({ spacingMm: 3, marginMm: 4 })
    expect(parsed.options.excludedZones.map((zone) => zone.sheet)).toEqual([0, 1])
  })

  it('opens a run’s zone of one sheet as a layout zone on that sheet only', () => {
    const result = nestResult([
      { designId: SQUARE_ID, sheet: 0, x: 60, y: 5 },
      { designId: SQUARE_ID, sheet: 1, x: 60, y: 5 },
    ])
    const request = layoutFromNestRun(
      {
        request: { items: [{ designId: SQUARE_ID, quantity: 2, rotation: 'quarter-turns', mirror: 'never', grainLock: false }], stock: { kind: 'sheets', widthMm: 210, heightMm: 297 }, spacingMm: 2, marginMm: 5, timeBudgetSeconds: 5, excludedZones: [rectangle(0, 0, 20, 20), { sheet: 1, outline: rectangle(100, 100, 20, 20) }] },
        result,
      },
      'From a nest run',
      newTestId,
    )
    const parsed = createLayoutRequestSchema.parse(request)
    expect(parsed.options.excludedZones.map((zone) => [zone.sheet, zone.outline[0]])).toEqual([
      [0, [0, 0]],
      [1, [0, 0]],
      [1, [100, 100]],
    ])
  })
})
