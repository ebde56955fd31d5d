import type { StockKind } from '../schemas/stock.js'

export interface StandardStockSize {
  id: string
  kind: StockKind
  label: string
  widthMm: number
  /** Sheets only. */
  heightMm?: number
}

/**
 * Common sizes on a studio's shelf. ISO 216: A4 is 210 × 297 mm, A3 297 × 420 mm; US Letter is 8.5 × 11 in
 * (ANSI/ASME Y14.1, size A); 12 × 12 in and 12 × 24 in sheets and 12 in and 24 in rolls are common practice.
 * Inch sizes are written out exactly in millimetres through 1 in = 25.4 mm.
 */
export const standardStockSizes: readonly StandardStockSize[] = [
  { id: 'a4', kind: 'sheet', label: 'A4', widthMm: 210, heightMm: 297 },
  { id: 'a3', kind: 'sheet', label: 'A3', widthMm: 297, heightMm: 420 },
  { id: 'us-letter', kind: 'sheet', label: 'US Letter', widthMm: 215.9, heightMm: 279.4 },
  { id: 'sheet-12x12in', kind: 'sheet', label: '12 × 12 in', widthMm: 304.8, heightMm: 304.8 },
  { id: 'sheet-12x24in', kind: 'sheet', label: '12 × 24 in', widthMm: 304.8, heightMm: 609.6 },
  { id: 'roll-12in', kind: 'roll', label: '12 in roll', widthMm: 304.8 },
  { id: 'roll-24in', kind: 'roll', label: '24 in roll', widthMm: 609.6 },
]

/** The standard size a stock is, either way round for sheets; null for a size of its own. */
export function matchStandardSize(kind: StockKind, widthMm: number, heightMm?: number | null): StandardStockSize | null {
  const close = (a: number, b: number) => Math.abs(a - b) < 0.05
  return (
    standardStockSizes.find((size) => {
      if (size.kind !== kind) return false
      if (kind === 'roll') return close(size.widthMm, widthMm)
      const height = size.heightMm ?? 0
      if (heightMm === undefined || heightMm === null) return false
      return (close(size.widthMm, widthMm) && close(height, heightMm)) || (close(size.widthMm, heightMm) && close(height, widthMm))
    }) ?? null
  )
}
