import type { LayoutStock } from '../schemas/layouts.js'
import type { NestStockInput } from '../schemas/nesting.js'
import type { StockItem } from '../schemas/stock.js'
import { polygonArea } from './remnant.js'

/**
 * A stock item from the shelf as the stock of a layout or a nest run, so remnants kept from jobs are used again:
 * - a sheet with an outline (a sheet remnant) → polygon stock: outer ring first, then holes, in the item's box. The
 *   old layout's margin is already inside that outline (shared/jobs/remnant.ts starts from the sheet less its margin
 *   and keeps the spacing to every cut), so the suggested margin is 0;
 * - a plain sheet → one sheet of its size; a roll (a roll remnant is a shorter roll) → a roll of its width and length.
 *   Both suggest the item's widest margin (a layout has one margin for every side).
 */

export type StockItemForLayout = Pick<StockItem, 'id' | 'kind' | 'widthMm' | 'heightMm' | 'lengthMm' | 'outline' | 'margins'>

export interface StockFromShelf<T> {
  stock: T
  marginMm: number
}

const widestMargin = (item: StockItemForLayout) => Math.max(item.margins.topMm, item.margins.rightMm, item.margins.bottomMm, item.margins.leftMm)

const hasOutline = (item: StockItemForLayout): item is StockItemForLayout & { outline: [number, number][][] } => item.kind === 'sheet' && !!item.outline && item.outline.length > 0 && item.outline[0]!.length >= 3

export function layoutStockOfStockItem(item: StockItemForLayout): StockFromShelf<LayoutStock> {
  if (hasOutline(item)) {
    const [outline, ...holes] = item.outline
    return { stock: { kind: 'polygon', widthMm: item.widthMm, heightMm: item.heightMm ?? 0, outline: outline!, holes, stockItemId: item.id }, marginMm: 0 }
  }
  if (item.kind === 'sheet') return { stock: { kind: 'sheets', widthMm: item.widthMm, heightMm: item.heightMm ?? 0, sheetCount: 1 }, marginMm: widestMargin(item) }
  return { stock: { kind: 'roll', widthMm: item.widthMm, lengthMm: item.lengthMm ?? 0 }, marginMm: widestMargin(item) }
}

export function nestStockOfStockItem(item: StockItemForLayout): StockFromShelf<NestStockInput> {
  if (hasOutline(item)) {
    const [outline, ...holes] = item.outline
    return { stock: { kind: 'polygon', outline: outline!, ...(holes.length > 0 ? { holes } : {}) }, marginMm: 0 }
  }
  if (item.kind === 'sheet') return { stock: { kind: 'sheets', widthMm: item.widthMm, heightMm: item.heightMm ?? 0, maxSheets: 1 }, marginMm: widestMargin(item) }
  return { stock: { kind: 'roll', widthMm: item.widthMm, ...(item.lengthMm ? { maxLengthMm: item.lengthMm } : {}) }, marginMm: widestMargin(item) }
}

/** The area of one piece of the item: a sheet remnant's outline less its holes, else width × height (or length). */
export function stockItemAreaMm2(item: Pick<StockItem, 'kind' | 'widthMm' | 'heightMm' | 'lengthMm' | 'outline'>): number {
  if (item.kind === 'sheet') return item.outline && item.outline.length > 0 ? polygonArea(item.outline) : item.widthMm * (item.heightMm ?? 0)
  return item.widthMm * (item.lengthMm ?? 0)
}
