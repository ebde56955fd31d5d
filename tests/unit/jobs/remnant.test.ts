import { describe, expect, it } from 'vitest'
import { lastUsedSheet, remnantAsStockOutline, sheetRemnant } from '../../../shared/jobs/remnant.js'

type Ring = [number, number][]
const rectangle = (x: number, y: number, width: number, height: number): Ring => [
  [x, y],
  [x + width, y],
  [x + width, y + height],
  [x, y + height],
]

// Worked examples by hand (rectangle areas: width × height).

describe('sheetRemnant', () => {
  it('leaves an L-shaped 7500 mm² remnant around one 50 × 50 piece in the corner of a 100 × 100 sheet', () => {
    // 100 × 100 = 10 000 mm², less the 50 × 50 = 2 500 mm² piece = 7 500 mm².
    const remnant = sheetRemnant({ widthMm: 100, heightMm: 100, marginMm: 0, spacingMm: 0, pieceOutlines: [rectangle(0, 0, 50, 50)] })
    expect(remnant).not.toBeNull()
    expect(remnant!.areaMm2).toBe(7500)
    expect(remnant!.rings).toHaveLength(1)
    // The L has six corners.
    expect(remnant!.rings[0]).toHaveLength(6)
  })

  it('starts inside the margin and keeps the spacing to the pieces', () => {
    // Usable: 10..90 × 10..90 = 80 × 80 = 6 400 mm². The 30 × 30 piece at (10, 10) grown by 5 mm (mitred corners on
    // a square stay square) becomes 10..45 × 10..45 inside the usable area = 35 × 35 = 1 225 mm². 6 400 − 1 225 = 5 175.
    const remnant = sheetRemnant({ widthMm: 100, heightMm: 100, marginMm: 10, spacingMm: 5, pieceOutlines: [rectangle(10, 10, 30, 30)] })
    expect(remnant!.areaMm2).toBeCloseTo(5175, 3)
    expect(remnant!.box).toEqual({ minX: 10, minY: 10, maxX: 90, maxY: 90 })
  })

  it('keeps only the largest region when the pieces split the sheet', () => {
    // A 100 × 10 strip across a 100 × 100 sheet at y = 20..30: above it 100 × 20 = 2 000, below 100 × 70 = 7 000.
    const remnant = sheetRemnant({ widthMm: 100, heightMm: 100, marginMm: 0, spacingMm: 0, pieceOutlines: [rectangle(0, 20, 100, 10)] })
    expect(remnant!.areaMm2).toBe(7000)
    expect(remnant!.box).toEqual({ minX: 0, minY: 30, maxX: 100, maxY: 100 })
  })

  it('keeps a piece in the middle as a hole of the remnant', () => {
    // 10 000 − 20 × 20 = 9 600 mm², one outer ring and one hole.
    const remnant = sheetRemnant({ widthMm: 100, heightMm: 100, marginMm: 0, spacingMm: 0, pieceOutlines: [rectangle(40, 40, 20, 20)] })
    expect(remnant!.areaMm2).toBe(9600)
    expect(remnant!.rings).toHaveLength(2)
  })

  it('finds nothing left on a full sheet', () => {
    expect(sheetRemnant({ widthMm: 100, heightMm: 100, marginMm: 0, spacingMm: 0, pieceOutlines: [rectangle(0, 0, 100, 100)] })).toBeNull()
  })

  it('moves the outline to its own origin for the stock item', () => {
    const remnant = sheetRemnant({ widthMm: 100, heightMm: 100, marginMm: 0, spacingMm: 0, pieceOutlines: [rectangle(0, 20, 100, 10)] })!
    const stock = remnantAsStockOutline(remnant)
    expect(stock.widthMm).toBe(100)
    expect(stock.heightMm).toBe(70)
    expect(Math.min(...stock.outline[0]!.map(([, y]) => y))).toBe(0)
  })
})

describe('lastUsedSheet', () => {
  it('is the highest sheet index with a piece', () => {
    expect(lastUsedSheet([{ sheet: 0 }, { sheet: 2 }, { sheet: 1 }])).toBe(2)
    expect(lastUsedSheet([])).toBeNull()
  })
})
