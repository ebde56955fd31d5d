import { describe, expect, it } from 'vitest'
import { computeLayoutFigures, cutLineOwners, type DesignForLayout, type LayoutForFigures } from '../../../shared/layout/figures.js'
import type { DesignGeometry, DesignPiece } from '../../../shared/schemas/designs.js'

// Every expected value below is worked out by hand: rectangle area = width × height, a hole subtracts its area and
// adds its perimeter (elementary geometry, shoelace formula), utilisation = piece area / used stock area.

type Ring = [number, number][]
const rectangle = (x: number, y: number, width: number, height: number): Ring => [
  [x, y],
  [x + width, y],
  [x + width, y + height],
  [x, y + height],
]

/** A piece with its stored figures as the importer would store them for straight-edged shapes. */
function piece(outline: Ring, holes: Ring[] = [], areaMm2: number, cutLengthMm: number): DesignPiece {
  const xs = outline.map(([x]) => x)
  const ys = outline.map(([, y]) => y)
  return { outline, holes, areaMm2, cutLengthMm, bbox: { minX: Math.min(...xs), minY: Math.min(...ys), maxX: Math.max(...xs), maxY: Math.max(...ys) } }
}

const design = (geometry: DesignGeometry, keepTogether = true): DesignForLayout => ({ geometry, keepTogether })

const squareId = '00000000-0000-4000-8000-000000000001'
const stripId = '00000000-0000-4000-8000-000000000002'
const frameId = '00000000-0000-4000-8000-000000000003'
const pairId = '00000000-0000-4000-8000-000000000004'

/** 50 × 50 mm square: area 2500 mm², cut length 200 mm. */
const square = design({ pieces: [piece(rectangle(0, 0, 50, 50), [], 2500, 200)], cutLines: [] })
/** 50 × 20 mm strip: area 1000 mm², cut length 140 mm. */
const strip = design({ pieces: [piece(rectangle(0, 0, 50, 20), [], 1000, 140)], cutLines: [] })
/** 40 × 40 mm frame with a 20 × 20 mm window: area 1600 − 400 = 1200 mm², cut length 160 + 80 = 240 mm. */
const frame = design({ pieces: [piece(rectangle(0, 0, 40, 40), [rectangle(10, 10, 20, 20).reverse()], 1200, 240)], cutLines: [] })
/**
 * Two 10 × 10 mm squares 20 mm apart (area 100 mm², cut 40 mm each) and a 6 mm score line inside the second one.
 */
const pairGeometry: DesignGeometry = {
  pieces: [piece(rectangle(0, 0, 10, 10), [], 100, 40), piece(rectangle(30, 0, 10, 10), [], 100, 40)],
  cutLines: [
    {
      points: [
        [32, 5],
        [38, 5],
      ],
      lengthMm: 6,
    },
  ],
}

const designs = new Map<string, DesignForLayout>([
  [squareId, square],
  [stripId, strip],
  [frameId, frame],
  [pairId, design(pairGeometry, true)],
])

const at = (designId: string, xMm: number, yMm: number, extra: Partial<LayoutForFigures['placements'][number]> = {}) => ({
  designId,
  pieceIndex: 0,
  sheet: 0,
  xMm,
  yMm,
  angleDeg: 0,
  mirrored: false,
  ...extra,
})

describe('computeLayoutFigures on sheets', () => {
  it('gives 50 % for two 50 × 50 mm squares on one 100 × 100 mm sheet with no margin', () => {
    const figures = computeLayoutFigures(
      {
        stock: { kind: 'sheets', widthMm: 100, heightMm: 100, sheetCount: 1 },
        items: [{ designId: squareId, quantity: 2 }],
        placements: [at(squareId, 0, 0), at(squareId, 50, 0)],
        options: { marginMm: 0 },
      },
      designs,
    )
    expect(figures).toEqual({
      utilisation: 0.5,
      perSheetUtilisation: [0.5],
      pieceAreaMm2: 5000,
      usedStockAreaMm2: 10_000,
      wasteAreaMm2: 5000,
      cutLengthMm: 400,
      sheetsUsed: 1,
      usedLengthMm: 0,
      placedCount: 2,
      wantedCount: 2,
    })
  })

  it('counts only the sheets that hold a piece in the total, and every sheet in the per-sheet list', () => {
    const figures = computeLayoutFigures(
      {
        stock: { kind: 'sheets', widthMm: 100, heightMm: 100, sheetCount: 3 },
        items: [{ designId: squareId, quantity: 3 }],
        placements: [at(squareId, 0, 0), at(squareId, 50, 50), at(squareId, 10, 10, { sheet: 2 })],
        options: { marginMm: 5 },
      },
      designs,
    )
    // 3 × 2500 = 7500 mm² on sheets 0 and 2: 7500 / (2 × 10 000) = 0.375.
    expect(figures.utilisation).toBe(0.375)
    expect(figures.perSheetUtilisation).toEqual([0.5, 0, 0.25])
    expect(figures.sheetsUsed).toBe(2)
    expect(figures.usedStockAreaMm2).toBe(20_000)
    expect(figures.wasteAreaMm2).toBe(12_500)
  })

  it('takes the area of a piece with a hole as outline minus hole, and cuts the hole too', () => {
    const figures = computeLayoutFigures(
      {
        stock: { kind: 'sheets', widthMm: 100, heightMm: 60, sheetCount: 1 },
        items: [{ designId: frameId, quantity: 2 }],
        placements: [at(frameId, 0, 0), at(frameId, 50, 10, { angleDeg: 90, mirrored: true })],
        options: { marginMm: 0 },
      },
      designs,
    )
    expect(figures.pieceAreaMm2).toBe(2400)
    expect(figures.utilisation).toBeCloseTo(2400 / 6000, 12)
    expect(figures.cutLengthMm).toBe(480)
  })

  it('keeps area and cut length the same when a piece is rotated or mirrored', () => {
    const base = {
      stock: { kind: 'sheets' as const, widthMm: 200, heightMm: 200, sheetCount: 1 },
      items: [{ designId: stripId, quantity: 1 }],
      options: { marginMm: 0 },
    }
    const plain = computeLayoutFigures({ ...base, placements: [at(stripId, 0, 0)] }, designs)
    for (const angleDeg of [90, 180, 270, -45, 33]) {
      for (const mirrored of [false, true]) {
        const turned = computeLayoutFigures({ ...base, placements: [at(stripId, 100, 100, { angleDeg, mirrored })] }, designs)
        expect(turned.pieceAreaMm2).toBe(plain.pieceAreaMm2)
        expect(turned.cutLengthMm).toBe(plain.cutLengthMm)
        expect(turned.utilisation).toBe(1000 / 40_000)
      }
    }
  })

  it('leaves out placements it cannot resolve (unknown design, piece or sheet) and items of unknown designs', () => {
    const figures = computeLayoutFigures(
      {
        stock: { kind: 'sheets', widthMm: 100, heightMm: 100, sheetCount: 1 },
        items: [
          { designId: squareId, quantity: 1 },
          { designId: '00000000-0000-4000-8000-0000000000ff', quantity: 4 },
        ],
        placements: [at(squareId, 0, 0), at(squareId, 0, 0, { sheet: 1 }), at(squareId, 0, 0, { pieceIndex: 3 }), at('00000000-0000-4000-8000-0000000000ff', 0, 0)],
        options: { marginMm: 0 },
      },
      designs,
    )
    expect(figures.placedCount).toBe(1)
    expect(figures.wantedCount).toBe(1)
    expect(figures.pieceAreaMm2).toBe(2500)
  })

  it('answers zeros for an empty layout', () => {
    const figures = computeLayoutFigures({ stock: { kind: 'sheets', widthMm: 100, heightMm: 100, sheetCount: 2 }, items: [], placements: [], options: { marginMm: 5 } }, designs)
    expect(figures).toEqual({
      utilisation: 0,
      perSheetUtilisation: [0, 0],
      pieceAreaMm2: 0,
      usedStockAreaMm2: 0,
      wasteAreaMm2: 0,
      cutLengthMm: 0,
      sheetsUsed: 0,
      usedLengthMm: 0,
      placedCount: 0,
      wantedCount: 0,
    })
  })
})

describe('computeLayoutFigures on a roll', () => {
  it('measures the used length from the furthest piece after rotating and mirroring, plus the margin', () => {
    // Strip 50 × 20 turned 90°: (x, y) → (−y, x), so x spans −20..0; moved by 20 it ends at x = 20.
    // Strip mirrored (x → −x) spans −50..0; moved by 80 it ends at x = 80. Used length 80 + 5 = 85 mm.
    const figures = computeLayoutFigures(
      {
        stock: { kind: 'roll', widthMm: 100, lengthMm: 1000 },
        items: [{ designId: stripId, quantity: 2 }],
        placements: [at(stripId, 20, 0, { angleDeg: 90 }), at(stripId, 80, 30, { mirrored: true })],
        options: { marginMm: 5 },
      },
      designs,
    )
    expect(figures.usedLengthMm).toBe(85)
    expect(figures.usedStockAreaMm2).toBe(8500)
    expect(figures.utilisation).toBe(2000 / 8500)
    expect(figures.perSheetUtilisation).toEqual([2000 / 8500])
    expect(figures.sheetsUsed).toBe(0)
    expect(figures.wasteAreaMm2).toBe(6500)
  })

  it('turns by −90° and by 180° the other way round', () => {
    // −90°: (x, y) → (y, −x): x spans 0..20, moved by 10 → 30. 180°: x spans −50..0, moved by 100 → 100.
    const layout = (angleDeg: number, xMm: number): LayoutForFigures => ({
      stock: { kind: 'roll', widthMm: 100, lengthMm: 1000 },
      items: [{ designId: stripId, quantity: 1 }],
      placements: [at(stripId, xMm, 60, { angleDeg })],
      options: { marginMm: 0 },
    })
    expect(computeLayoutFigures(layout(-90, 10), designs).usedLengthMm).toBe(30)
    expect(computeLayoutFigures(layout(180, 100), designs).usedLengthMm).toBe(100)
  })

  it('uses no length when nothing is placed', () => {
    const figures = computeLayoutFigures({ stock: { kind: 'roll', widthMm: 610, lengthMm: 2000 }, items: [{ designId: squareId, quantity: 1 }], placements: [], options: { marginMm: 5 } }, designs)
    expect(figures.usedLengthMm).toBe(0)
    expect(figures.utilisation).toBe(0)
    expect(figures.perSheetUtilisation).toEqual([0])
  })
})

describe('computeLayoutFigures with designs of several pieces', () => {
  const stock = { kind: 'sheets' as const, widthMm: 100, heightMm: 100, sheetCount: 1 }

  it('places a design kept together as one unit with all its pieces and cut lines', () => {
    const figures = computeLayoutFigures({ stock, items: [{ designId: pairId, quantity: 2 }], placements: [at(pairId, 0, 0, { pieceIndex: -1 }), at(pairId, 0, 50, { pieceIndex: -1 })], options: { marginMm: 0 } }, designs)
    expect(figures.wantedCount).toBe(2)
    expect(figures.placedCount).toBe(2)
    expect(figures.pieceAreaMm2).toBe(400)
    // Per copy: 40 + 40 + 6 = 86 mm.
    expect(figures.cutLengthMm).toBe(172)
  })

  it('wants every piece of a design placed piece by piece, and cuts its score line with the piece that holds it', () => {
    const separate = new Map(designs).set(pairId, design(pairGeometry, false))
    const figures = computeLayoutFigures(
      { stock, items: [{ designId: pairId, quantity: 1 }], placements: [at(pairId, 0, 0, { pieceIndex: 0 }), at(pairId, 0, 50, { pieceIndex: 1 })], options: { marginMm: 0 } },
      separate,
    )
    expect(figures.wantedCount).toBe(2)
    expect(figures.placedCount).toBe(2)
    expect(figures.cutLengthMm).toBe(86)
    const firstOnly = computeLayoutFigures({ stock, items: [{ designId: pairId, quantity: 1 }], placements: [at(pairId, 0, 0, { pieceIndex: 0 })], options: { marginMm: 0 } }, separate)
    expect(firstOnly.cutLengthMm).toBe(40)
    const wholeDesign = computeLayoutFigures({ stock, items: [{ designId: pairId, quantity: 1 }], placements: [at(pairId, 0, 0, { pieceIndex: -1 })], options: { marginMm: 0 } }, separate)
    expect(wholeDesign.placedCount).toBe(2)
  })

  it('gives a cut line to the piece holding most of its points, and a loose line to piece 0', () => {
    const geometry: DesignGeometry = {
      ...pairGeometry,
      cutLines: [
        ...pairGeometry.cutLines,
        {
          points: [
            [12, 20],
            [28, 20],
          ],
          lengthMm: 16,
        },
      ],
    }
    expect(cutLineOwners(geometry)).toEqual([1, 0])
    expect(cutLineOwners({ pieces: [], cutLines: geometry.cutLines })).toEqual([-1, -1])
  })
})
