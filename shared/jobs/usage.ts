import type { LayoutFigures } from '../schemas/layouts.js'
import type { JobUsage } from '../schemas/jobs.js'

export interface UsageInput {
  /** The saved layout's figures: one run of the job. */
  figures: Pick<LayoutFigures, 'sheetsUsed' | 'usedLengthMm' | 'usedStockAreaMm2' | 'pieceAreaMm2'>
  stockKind: 'sheets' | 'roll'
  /** The cut plan's total cut length of one run, already × passes (weeding aids included, common lines saved). */
  cutPlanCutLengthMm: number
  passes: number
  quantity: number
}

/**
 * What a job uses, all runs together: one run of the layout times the quantity. Waste is the used stock area less the
 * piece area (never negative). Cut length is the cut plan's figure (which already counts the passes) × quantity.
 */
export function jobUsage(input: UsageInput): JobUsage {
  const { figures, quantity } = input
  const stockAreaMm2 = figures.usedStockAreaMm2 * quantity
  const pieceAreaMm2 = figures.pieceAreaMm2 * quantity
  return {
    sheetsUsed: input.stockKind === 'sheets' ? figures.sheetsUsed * quantity : 0,
    rollLengthUsedMm: input.stockKind === 'roll' ? figures.usedLengthMm * quantity : 0,
    stockAreaMm2,
    pieceAreaMm2,
    wasteAreaMm2: Math.max(0, stockAreaMm2 - pieceAreaMm2),
    cutLengthMm: input.cutPlanCutLengthMm * quantity,
    passes: input.passes,
  }
}

export interface StockOnHand {
  kind: 'sheet' | 'roll'
  quantityOnHand: number
  /** Rolls: the length on hand of the roll. */
  lengthMm: number | null
}

export interface StockChange {
  /** The stock item after the job. */
  quantityOnHand: number
  lengthMm: number | null
  /** Less was on hand than the job used. */
  short: boolean
  /** A sentence for the short case ("only 3 sheets on hand, the job used 5"). */
  shortMessage: string | null
  /** Roll remnant: the rest of the roll, when one is kept. */
  remnantLengthMm: number | null
}

const metres = (mm: number) => `${(mm / 1000).toLocaleString('en-GB', { maximumFractionDigits: 2 })} m`

/**
 * How a done job changes its stock item.
 * - Sheets: quantity on hand − sheets used, never below 0.
 * - Roll: the job is cut from the roll's length on hand. Without a remnant the length goes down by the used length;
 *   a roll used up to its end (or beyond, when short stock is allowed) is taken off: one roll fewer, the length kept for
 *   the rolls left. Keeping a remnant moves the rest of this roll into its own stock item: one roll fewer here.
 */
export function stockAfterJob(stock: StockOnHand, usage: Pick<JobUsage, 'sheetsUsed' | 'rollLengthUsedMm'>, keepRemnant: boolean): StockChange {
  if (stock.kind === 'sheet') {
    const short = usage.sheetsUsed > stock.quantityOnHand
    return {
      quantityOnHand: Math.max(0, stock.quantityOnHand - usage.sheetsUsed),
      lengthMm: stock.lengthMm,
      short,
      shortMessage: short ? `Only ${stock.quantityOnHand} sheet${stock.quantityOnHand === 1 ? '' : 's'} on hand; the job uses ${usage.sheetsUsed}` : null,
      remnantLengthMm: null,
    }
  }
  const lengthMm = stock.lengthMm ?? 0
  const short = stock.quantityOnHand < 1 || usage.rollLengthUsedMm > lengthMm
  const shortMessage = short
    ? stock.quantityOnHand < 1
      ? 'No roll of this stock is on hand'
      : `Only ${metres(lengthMm)} on the roll; the job uses ${metres(usage.rollLengthUsedMm)}`
    : null
  const restMm = Math.max(0, lengthMm - usage.rollLengthUsedMm)
  const rollTakenOff = restMm === 0 || keepRemnant
  return {
    quantityOnHand: rollTakenOff ? Math.max(0, stock.quantityOnHand - 1) : stock.quantityOnHand,
    lengthMm: rollTakenOff ? lengthMm : restMm,
    short,
    shortMessage,
    remnantLengthMm: keepRemnant && restMm > 0 ? restMm : null,
  }
}
