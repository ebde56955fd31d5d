import { describe, expect, it } from 'vitest'
import { sheetRemnant } from '../../../shared/jobs/remnant.js'
import { addItem, setStock } from '../../../shared/layout/actions.js'
import { nestRequestFromLayout } from '../../../shared/layout/autoArrange.js'
import { stockConflicts } from '../../../shared/layout/conflicts.js'
import { laneCount, laneSize, usableArea, type LayoutDocument } from '../../../shared/layout/document.js'
import { computeLayoutFigures } from '../../../shared/layout/figures.js'
import { layoutFromNestRun } from '../../../shared/layout/fromNestRun.js'
import { createShapeCache, placedShape } from '../../../shared/layout/placedGeometry.js'
import { boxInsideRegion, polygonStockAreaMm2, usableRegion } from '../../../shared/layout/polygonStock.js'
import { layoutStockSchema, type PolygonLayoutStock } from '../../../shared/schemas/layouts.js'
import { BAR_ID, SQUARE_ID, newTestId, placement, testDesigns, testDocument } from './editorFixtures.js'

// Worked examples by hand. The stock is an L: the 200 × 150 box less its top-right 100 × 100 corner,
// area 200 × 150 − 100 × 100 = 30 000 − 10 000 = 20 000 mm².
const lStock: PolygonLayoutStock = {
  kind: 'polygon',
  widthMm: 200,
  heightMm: 150,
  outline: [
    [0, 0],
    [100, 0],
    [100, 100],
    [200, 100],
    [200, 150],
    [0, 150],
  ],
  holes: [],
  stockItemId: null,
}

const lDocument = (placements: LayoutDocument['placements'] = [], marginMm = 0): LayoutDocument => ({ ...testDocument(placements), stock: lStock, options: { ...testDocument().options, marginMm } })

describe('polygon stock in a layout', () => {
  it('has the area of its outline less its holes, one lane the size of its box', () => {
    expect(polygonStockAreaMm2(lStock)).toBe(20_000)
    // A 20 × 20 hole: 20 000 − 400 = 19 600.
    expect(polygonStockAreaMm2({ ...lStock, holes: [[[10, 10], [30, 10], [30, 30], [10, 30]]] })).toBe(19_600)
    expect(laneCount(lStock)).toBe(1)
    expect(laneSize(lStock)).toEqual({ widthMm: 200, heightMm: 150 })
    expect(usableArea(lStock, { marginMm: 5 })).toEqual({ minX: 5, minY: 5, maxX: 195, maxY: 145 })
  })

  it('refuses an outline outside its box', () => {
    const result = layoutStockSchema.safeParse({ ...lStock, widthMm: 150 })
    expect(result.success).toBe(false)
    expect(result.error?.issues[0]?.message).toBe('The stock outline must lie inside its width × height, from (0, 0)')
  })

  it('measures utilisation as piece area over the stock area', () => {
    // One 50 × 50 square (2 500 mm²) on the 20 000 mm² L: 2 500 / 20 000 = 0.125; waste 17 500.
    const figures = computeLayoutFigures(lDocument([placement('a', SQUARE_ID, 10, 10)]), testDesigns())
    expect(figures.pieceAreaMm2).toBe(2_500)
    expect(figures.usedStockAreaMm2).toBe(20_000)
    expect(figures.utilisation).toBe(0.125)
    expect(figures.perSheetUtilisation).toEqual([0.125])
    expect(figures.wasteAreaMm2).toBe(17_500)
    expect(figures.sheetsUsed).toBe(1)
    expect(figures.usedLengthMm).toBe(0)
    // Nothing placed: nothing used.
    expect(computeLayoutFigures(lDocument([]), testDesigns()).usedStockAreaMm2).toBe(0)
  })

  it('flags a piece in the cut-away corner, inside the box but off the outline', () => {
    const designs = testDesigns()
    const environment = { usable: usableArea(lStock, { marginMm: 0 }), usableRegion: usableRegion(lStock, 0), laneCount: 1, zonesOf: () => [] }
    const inside = placedShape(designs.get(SQUARE_ID)!, placement('a', SQUARE_ID, 10, 10))
    const inCorner = placedShape(designs.get(SQUARE_ID)!, placement('b', SQUARE_ID, 130, 20))
    // Touching the inner corner's edges exactly (square at 100..150 × 100..150) is still on the stock.
    const onEdges = placedShape(designs.get(SQUARE_ID)!, placement('c', SQUARE_ID, 100, 100))
    expect(stockConflicts(inside, 0, environment).outside).toBe(false)
    expect(stockConflicts(inCorner, 0, environment).outside).toBe(true)
    expect(stockConflicts(onEdges, 0, environment).outside).toBe(false)
  })

  it('keeps the margin inside the outline', () => {
    // With a 5 mm margin the L's arms are 5..95 wide at the top and 105..145 along the bottom.
    const region = usableRegion(lStock, 5)
    expect(region).toHaveLength(1)
    expect(boxInsideRegion({ minX: 5, minY: 5, maxX: 95, maxY: 145 }, region)).toBe(true)
    expect(boxInsideRegion({ minX: 5, minY: 105, maxX: 195, maxY: 145 }, region)).toBe(true)
    expect(boxInsideRegion({ minX: 4, minY: 5, maxX: 95, maxY: 145 }, region)).toBe(false)
    expect(boxInsideRegion({ minX: 5, minY: 5, maxX: 96, maxY: 145 }, region)).toBe(false)
    // The inner corner area: wholly outside.
    expect(boxInsideRegion({ minX: 120, minY: 10, maxX: 180, maxY: 90 }, region)).toBe(false)
  })

  it('adds new pieces only where the outline has room', () => {
    // Two 50 × 50 squares fit in the left arm (0..100 wide); a third goes to the bottom arm, never into the corner.
    const start = { ...lDocument([], 0), items: [], placements: [] }
    const designs = testDesigns()
    const next = addItem(start, { designId: SQUARE_ID, quantity: 4, rotation: 'quarter-turns', mirror: 'never', grainLock: false }, { designs, shapes: createShapeCache(designs), newId: newTestId })
    expect(next.placements).toHaveLength(4)
    const environment = { usable: usableArea(lStock, { marginMm: 0 }), usableRegion: usableRegion(lStock, 0), laneCount: 1, zonesOf: () => [] }
    for (const piece of next.placements) {
      expect(stockConflicts(placedShape(designs.get(SQUARE_ID)!, piece), piece.sheet, environment).outside).toBe(false)
    }
  })

  it('moves every piece onto the one lane when sheets become a polygon stock', () => {
    const document = testDocument([placement('a', SQUARE_ID, 10, 10), placement('b', BAR_ID, 10, 10, { sheet: 1 })])
    const next = setStock(document, lStock)
    expect(next.stock).toBe(lStock)
    expect(next.placements.map((piece) => piece.sheet)).toEqual([0, 0])
  })

  it('asks a nest run to arrange on the outline itself, and opens a polygon run as a layout', () => {
    const designs = testDesigns()
    const arranged = nestRequestFromLayout(lDocument([]), { designs, shapes: createShapeCache(designs) }, 5)
    expect(arranged.request?.stock).toEqual({ kind: 'polygon', outline: lStock.outline })
    const layout = layoutFromNestRun(
      {
        request: { items: [{ designId: SQUARE_ID, quantity: 1, rotation: 'none', mirror: 'never', grainLock: false }], stock: { kind: 'polygon', outline: lStock.outline }, marginMm: 0, spacingMm: 0, excludedZones: [], timeBudgetSeconds: 5 },
        result: {
          mode: 'polygon',
          placements: [{ designId: SQUARE_ID, pieceIndex: 0, copy: 0, sheet: 0, angleDeg: 0, mirrored: false, xMm: 0, yMm: 0, outline: [], holes: [] }],
          unplaced: [],
          lengthMm: 50,
          sheetCount: 1,
          utilisation: 0.125,
          perSheetUtilisation: [0.125],
          pieceAreaMm2: 2500,
          usedStockAreaMm2: 20_000,
          evaluations: 1,
          elapsedMs: 1,
          firstFeasibleMs: 1,
          seed: 1,
          verified: true,
        },
      },
      'From a run',
      newTestId,
    )
    expect(layout?.stock).toEqual({ kind: 'polygon', widthMm: 200, heightMm: 150, outline: lStock.outline, holes: [], stockItemId: null })
  })

  it('keeps a remnant of a remnant inside the old outline', () => {
    // A 50 × 50 square at (0, 0) on the L, no margin or spacing: 20 000 − 2 500 = 17 500 mm² left, all of it in the L.
    const leftover = sheetRemnant({ widthMm: 200, heightMm: 150, marginMm: 0, spacingMm: 0, pieceOutlines: [[[0, 0], [50, 0], [50, 50], [0, 50]]], usableRegion: usableRegion(lStock, 0) })
    expect(leftover?.areaMm2).toBe(17_500)
  })
})
