import type { ComparisonColumn, ComparisonFigures } from '../schemas/comparisons.js'

/** What the costing needs of a stock: its kind and size in millimetres, and its price per sheet or per metre. */
export interface StockForCosting {
  kind: 'sheets' | 'roll'
  widthMm: number
  /** Sheets only. */
  heightMm: number | null
  /** Per sheet for sheets, per metre for a roll; null when not known. */
  price: number | null
}

/** What one stock's layout used: from a nest result plus the designs' cut lengths. */
export interface LayoutUsage {
  sheetsUsed: number
  /** Roll: the used length including the end margin; ignored for sheets. */
  usedLengthMm: number
  /** True area of the placed pieces (outline minus holes). */
  pieceAreaMm2: number
  placedCount: number
  wantedCount: number
  cutLengthMm: number
  cutTimeSeconds: number | null
}

/**
 * The figures of one row of a comparison. Material is counted as bought: whole sheets (a part-used last sheet is
 * paid for, whatever may later be kept as a remnant), or the roll's width × used length. So
 * - used area = sheets × width × height, or width × used length;
 * - utilisation = piece area / used area; waste area = used area − piece area;
 * - material cost = sheets × price per sheet, or used length in metres × price per metre;
 * - cost per piece = material cost / placed pieces.
 * An unknown price gives null costs; nothing placed gives a null cost per piece and utilisation 0.
 */
export function comparisonFigures(stock: StockForCosting, usage: LayoutUsage): ComparisonFigures {
  const isRoll = stock.kind === 'roll'
  const sheetsUsed = isRoll ? 0 : usage.sheetsUsed
  const usedLengthMm = isRoll ? usage.usedLengthMm : 0
  const usedAreaMm2 = isRoll ? stock.widthMm * usedLengthMm : sheetsUsed * stock.widthMm * (stock.heightMm ?? 0)
  const materialCost = stock.price === null ? null : isRoll ? (usedLengthMm / 1000) * stock.price : sheetsUsed * stock.price
  return {
    sheetsUsed,
    usedLengthMm,
    usedAreaMm2,
    pieceAreaMm2: usage.pieceAreaMm2,
    utilisation: usedAreaMm2 > 0 ? usage.pieceAreaMm2 / usedAreaMm2 : 0,
    wasteAreaMm2: Math.max(0, usedAreaMm2 - usage.pieceAreaMm2),
    materialCost,
    costPerPiece: materialCost !== null && usage.placedCount > 0 ? materialCost / usage.placedCount : null,
    placedCount: usage.placedCount,
    wantedCount: usage.wantedCount,
    cutLengthMm: usage.cutLengthMm,
    cutTimeSeconds: usage.cutTimeSeconds,
    complete: usage.placedCount >= usage.wantedCount && usage.wantedCount > 0,
  }
}

/** Utilisation is better high; waste, money, cut length and time are better low. */
const higherIsBetter: Record<ComparisonColumn, boolean> = {
  utilisation: true,
  wasteAreaMm2: false,
  materialCost: false,
  costPerPiece: false,
  cutLengthMm: false,
  cutTimeSeconds: false,
}

/**
 * Differences smaller than these are not a difference to a maker (a tenth of a percent, a square centimetre, half a
 * cent, a millimetre, a second), so values that close share the mark.
 */
const sameWithin: Record<ComparisonColumn, number> = {
  utilisation: 0.001,
  wasteAreaMm2: 100,
  materialCost: 0.005,
  costPerPiece: 0.00005,
  cutLengthMm: 1,
  cutTimeSeconds: 1,
}

/**
 * For each row, the columns in which it holds the best value. Only complete rows compete (a stock that left pieces
 * out would look cheap for the wrong reason), a column needs at least two values to have a best, values within
 * `sameWithin` of the best share the mark, and a column where every value is that close marks nothing (the same cut
 * length on every stock tells the maker nothing).
 */
export function bestPerColumn(rows: readonly (ComparisonFigures | null)[]): ComparisonColumn[][] {
  const marks: ComparisonColumn[][] = rows.map(() => [])
  for (const column of Object.keys(higherIsBetter) as ComparisonColumn[]) {
    const candidates = rows.flatMap((figures, index) => {
      const value = figures?.complete ? figures[column] : null
      return value === null || value === undefined || !Number.isFinite(value) ? [] : [{ index, value }]
    })
    if (candidates.length < 2) continue
    const values = candidates.map((candidate) => candidate.value)
    const best = higherIsBetter[column] ? Math.max(...values) : Math.min(...values)
    const isBest = (value: number) => Math.abs(value - best) < sameWithin[column]
    if (candidates.every((candidate) => isBest(candidate.value))) continue
    for (const candidate of candidates) if (isBest(candidate.value)) marks[candidate.index]!.push(column)
  }
  return marks
}

/** The comparison's state from its runs' states: running while any run works, then the worst way any ended. */
export function comparisonStatusOf(runStatuses: readonly string[]): 'queued' | 'running' | 'succeeded' | 'failed' | 'cancelled' {
  if (runStatuses.some((status) => status === 'running')) return 'running'
  if (runStatuses.some((status) => status === 'queued')) return runStatuses.every((status) => status === 'queued') ? 'queued' : 'running'
  if (runStatuses.length > 0 && runStatuses.every((status) => status === 'failed')) return 'failed'
  if (runStatuses.some((status) => status === 'cancelled')) return 'cancelled'
  return runStatuses.some((status) => status === 'failed') ? 'failed' : 'succeeded'
}
