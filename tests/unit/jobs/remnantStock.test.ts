import { describe, expect, it } from 'vitest'
import { remnantAsStockOutline, sheetRemnant } from '../../../shared/jobs/remnant.js'
import { layoutStockOfStockItem, nestStockOfStockItem, stockItemAreaMm2, type StockItemForLayout } from '../../../shared/jobs/remnantStock.js'
import { polygonStockAreaMm2 } from '../../../shared/layout/polygonStock.js'
import { layoutStockSchema } from '../../../shared/schemas/layouts.js'
import { nestStockSchema } from '../../../shared/schemas/nesting.js'

type Ring = [number, number][]
const rectangle = (x: number, y: number, width: number, height: number): Ring => [
  [x, y],
  [x + width, y],
  [x + width, y + height],
  [x, y + height],
]
const noMargins = { topMm: 0, rightMm: 0, bottomMm: 0, leftMm: 0 }
const remnantId = '00000000-0000-4000-8000-0000000000aa'

// Worked examples by hand (rectangle areas: width × height; an L is its box less the corner cut away).

describe('a stock item as the stock of a layout or a nest run', () => {
  it('turns a sheet remnant kept from a job into polygon stock with the same area', () => {
    // A 300 × 200 sheet, margin 10: usable 10..290 × 10..190 = 280 × 180 = 50 400 mm². One
    // 100 × 80 piece at (10, 10), no spacing, takes 8 000 mm² from the corner: the L left is 50 400 − 8 000 = 42 400 mm².
    const leftover = sheetRemnant({ widthMm: 300, heightMm: 200, marginMm: 10, spacingMm: 0, pieceOutlines: [rectangle(10, 10, 100, 80)] })!
    expect(leftover.areaMm2).toBe(42_400)
    const shape = remnantAsStockOutline(leftover)
    // Stored from the box's corner: 280 × 180, the margin already outside the outline.
    expect([shape.widthMm, shape.heightMm]).toEqual([280, 180])
    const item: StockItemForLayout = { id: remnantId, kind: 'sheet', widthMm: shape.widthMm, heightMm: shape.heightMm, lengthMm: null, outline: shape.outline, margins: noMargins }

    const { stock, marginMm } = layoutStockOfStockItem(item)
    expect(stock.kind).toBe('polygon')
    if (stock.kind !== 'polygon') return
    expect(marginMm).toBe(0)
    expect(stock.stockItemId).toBe(remnantId)
    expect([stock.widthMm, stock.heightMm]).toEqual([280, 180])
    expect(stock.outline).toHaveLength(6)
    expect(polygonStockAreaMm2(stock)).toBe(42_400)
    expect(stockItemAreaMm2(item)).toBe(42_400)
    // The layout contract accepts it as it is.
    expect(layoutStockSchema.safeParse(stock).success).toBe(true)

    const nest = nestStockOfStockItem(item)
    expect(nest.marginMm).toBe(0)
    expect(nest.stock).toEqual({ kind: 'polygon', outline: stock.outline })
    expect(nestStockSchema.safeParse(nest.stock).success).toBe(true)
  })

  it('keeps the holes of a remnant around a piece cut from the middle', () => {
    // 100 × 100 sheet, no margin, a 20 × 20 piece at (40, 40): 10 000 − 400 = 9 600 mm², the piece's place a hole.
    const leftover = sheetRemnant({ widthMm: 100, heightMm: 100, marginMm: 0, spacingMm: 0, pieceOutlines: [rectangle(40, 40, 20, 20)] })!
    const shape = remnantAsStockOutline(leftover)
    const item: StockItemForLayout = { id: remnantId, kind: 'sheet', widthMm: shape.widthMm, heightMm: shape.heightMm, lengthMm: null, outline: shape.outline, margins: noMargins }
    const { stock } = layoutStockOfStockItem(item)
    if (stock.kind !== 'polygon') throw new Error('expected polygon stock')
    expect(stock.holes).toHaveLength(1)
    expect(polygonStockAreaMm2(stock)).toBe(9_600)
    const nest = nestStockOfStockItem(item).stock
    expect(nest.kind === 'polygon' && nest.holes).toHaveLength(1)
  })

  it('gives plain sheets and rolls (a roll remnant is a shorter roll) their own kind and the widest margin', () => {
    const sheet: StockItemForLayout = { id: remnantId, kind: 'sheet', widthMm: 305, heightMm: 305, lengthMm: null, outline: null, margins: { topMm: 5, rightMm: 8, bottomMm: 5, leftMm: 5 } }
    expect(layoutStockOfStockItem(sheet)).toEqual({ stock: { kind: 'sheets', widthMm: 305, heightMm: 305, sheetCount: 1 }, marginMm: 8 })
    expect(nestStockOfStockItem(sheet)).toEqual({ stock: { kind: 'sheets', widthMm: 305, heightMm: 305, maxSheets: 1 }, marginMm: 8 })
    // 305 × 305 = 93 025 mm².
    expect(stockItemAreaMm2(sheet)).toBe(93_025)

    const roll: StockItemForLayout = { id: remnantId, kind: 'roll', widthMm: 610, heightMm: null, lengthMm: 1250, outline: null, margins: noMargins }
    expect(layoutStockOfStockItem(roll)).toEqual({ stock: { kind: 'roll', widthMm: 610, lengthMm: 1250 }, marginMm: 0 })
    expect(nestStockOfStockItem(roll)).toEqual({ stock: { kind: 'roll', widthMm: 610, maxLengthMm: 1250 }, marginMm: 0 })
    // 610 × 1250 = 762 500 mm².
    expect(stockItemAreaMm2(roll)).toBe(762_500)
  })
})
