import type { ComparisonFigures, ComparisonStock } from '../../../shared/schemas/comparisons'
import { formatLength, mmToUnit, type LengthUnit } from '../../../shared/units'

/** Money in the comparison's currency (a code when given), two decimals; cost per piece keeps a little more. */
export function formatMoney(value: number | null, currency: string | null, digits = 2): string {
  if (value === null) return '—'
  const amount = value.toLocaleString(undefined, { minimumFractionDigits: digits, maximumFractionDigits: digits })
  return currency ? `${amount} ${currency}` : amount
}

/** An area in m² (mm) or ft² (in), the way stock is bought. */
export function formatArea(valueMm2: number, unit: LengthUnit): string {
  if (unit === 'in') return `${(mmToUnit(mmToUnit(valueMm2, 'in'), 'in') / 144).toFixed(2)} ft²`
  return `${(valueMm2 / 1_000_000).toFixed(3)} m²`
}

export function formatPercent(fraction: number): string {
  return `${(fraction * 100).toFixed(1)} %`
}

/** "2 sheets" or "1.24 m" of roll (in inches: feet). */
export function formatUsed(figures: ComparisonFigures, stock: ComparisonStock, unit: LengthUnit): string {
  if (stock.kind === 'sheets') return `${figures.sheetsUsed} ${figures.sheetsUsed === 1 ? 'sheet' : 'sheets'}`
  if (unit === 'in') return `${(mmToUnit(figures.usedLengthMm, 'in') / 12).toFixed(2)} ft`
  return `${(figures.usedLengthMm / 1000).toFixed(2)} m`
}

export function formatCutLength(valueMm: number, unit: LengthUnit): string {
  if (unit === 'in') return `${(mmToUnit(valueMm, 'in') / 12).toFixed(1)} ft`
  return `${(valueMm / 1000).toFixed(2)} m`
}

export function formatDuration(seconds: number | null): string {
  if (seconds === null) return '—'
  const minutes = Math.floor(seconds / 60)
  const rest = Math.round(seconds % 60)
  return minutes > 0 ? `${minutes} min ${rest} s` : `${rest} s`
}

/** "Sheets 305 × 305 mm · 1.20 per sheet" */
export function describeStock(stock: ComparisonStock, unit: LengthUnit): string {
  const size = stock.kind === 'sheets' ? `Sheets ${formatLength(stock.widthMm, unit)} × ${formatLength(stock.heightMm ?? 0, unit)}` : `Roll ${formatLength(stock.widthMm, unit)} wide`
  const price = stock.price === null ? 'no price' : `${formatMoney(stock.price, stock.currency)} per ${stock.priceUnit}`
  return `${size} · ${price}`
}
