import { formatMinor, formatQuantity, roundHalfUp } from './money.js'

/**
 * The arithmetic of a quote, pure and shared by server (authority) and client (live preview while editing).
 *
 * Every line is quantity × unit price, rounded half up to whole minor units once, on that line:
 * - material: sheets used × price per sheet, or roll metres used × price per metre (whole sheets as bought, the
 *   used roll length as cut; no pro rata by area);
 * - markup: material amount × markup % (its base follows the material lines whenever they change);
 * - machine: cut-plan estimated time per run × runs / 3600 = hours × machine rate per hour;
 * - labour: weeding minutes per piece × pieces / 60 = hours × labour rate per hour;
 * - setup: 1 job × setup fee; custom lines: whatever the owner enters.
 * Then subtotal = Σ lines; a minimum-order top-up brings a smaller subtotal up to the minimum; tax = (subtotal +
 * top-up) × tax rate, rounded half up; total = subtotal + top-up + tax. Quantities keep at most 4 decimals.
 */

export const quoteLineKinds = ['material', 'markup', 'machine', 'labour', 'setup', 'custom'] as const
export type QuoteLineKind = (typeof quoteLineKinds)[number]

export interface QuoteLineInput {
  kind: QuoteLineKind
  description: string
  quantity: number
  /** 'sheet', 'm', 'h', 'job', '%' (markup: quantity is the percent), or any short word for custom lines. */
  unit: string
  unitPriceMinor: number
  /** Where the quantity came from ("2 sheets per run × 3 runs"); empty for lines typed by hand. */
  basis?: string
}

export interface PricedQuoteLine extends QuoteLineInput {
  basis: string
  amountMinor: number
  /** The line's sum as text: "6 sheets × 4.50 = 27.00". */
  arithmetic: string
}

export interface QuoteTotalsInput {
  currency: string
  minimumOrderMinor: number
  taxRatePercent: number
}

export interface PricedQuote {
  lines: PricedQuoteLine[]
  subtotalMinor: number
  minimumTopUpMinor: number
  taxMinor: number
  totalMinor: number
  /** The sums below the lines, as text. */
  arithmetic: { subtotal: string; minimumTopUp: string; tax: string; total: string }
}

const quantityDigits = 4

export function roundQuantity(value: number): number {
  return Number(value.toFixed(quantityDigits))
}

const plurals: Record<string, string> = { sheet: 'sheets', job: 'jobs', piece: 'pieces', run: 'runs' }

/** "6 sheets", "1 sheet", "0.75 h", "40%". */
export function quantityWithUnit(quantity: number, unit: string): string {
  const text = formatQuantity(quantity, quantityDigits)
  if (unit === '%') return `${text}%`
  const word = quantity === 1 ? unit : (plurals[unit] ?? unit)
  return word ? `${text} ${word}` : text
}

/** Amount of one line: quantity × unit price (percent lines: ÷ 100), rounded half up once. */
export function lineAmountMinor(line: Pick<QuoteLineInput, 'quantity' | 'unit' | 'unitPriceMinor'>): number {
  const product = line.quantity * line.unitPriceMinor
  return roundHalfUp(line.unit === '%' ? product / 100 : product)
}

/**
 * Prices a list of lines: markup bases follow the material lines, each amount and its arithmetic text are computed,
 * then subtotal, minimum top-up, tax and total.
 */
export function priceQuote(input: readonly QuoteLineInput[], totals: QuoteTotalsInput): PricedQuote {
  const money = (minor: number) => formatMinor(minor, totals.currency)
  const materialMinor = input.filter((line) => line.kind === 'material').reduce((sum, line) => sum + lineAmountMinor(line), 0)
  const lines: PricedQuoteLine[] = input.map((line) => {
    const quantity = roundQuantity(line.quantity)
    const unitPriceMinor = line.kind === 'markup' ? materialMinor : Math.trunc(line.unitPriceMinor)
    const amountMinor = lineAmountMinor({ quantity, unit: line.unit, unitPriceMinor })
    const arithmetic =
      line.unit === '%'
        ? `${money(unitPriceMinor)} × ${quantityWithUnit(quantity, '%')} = ${money(amountMinor)}`
        : `${quantityWithUnit(quantity, line.unit)} × ${money(unitPriceMinor)} = ${money(amountMinor)}`
    return { ...line, quantity, unitPriceMinor, basis: line.basis ?? '', amountMinor, arithmetic }
  })
  const subtotalMinor = lines.reduce((sum, line) => sum + line.amountMinor, 0)
  const minimumTopUpMinor = Math.max(0, totals.minimumOrderMinor - subtotalMinor)
  const taxableMinor = subtotalMinor + minimumTopUpMinor
  const taxMinor = roundHalfUp((taxableMinor * totals.taxRatePercent) / 100)
  const totalMinor = taxableMinor + taxMinor
  return {
    lines,
    subtotalMinor,
    minimumTopUpMinor,
    taxMinor,
    totalMinor,
    arithmetic: {
      subtotal: lines.length === 0 ? `${money(0)}` : `${lines.map((line) => money(line.amountMinor)).join(' + ')} = ${money(subtotalMinor)}`,
      minimumTopUp:
        minimumTopUpMinor > 0
          ? `minimum order ${money(totals.minimumOrderMinor)} − ${money(subtotalMinor)} = ${money(minimumTopUpMinor)}`
          : `${money(subtotalMinor)} is at least the minimum order ${money(totals.minimumOrderMinor)}: no top-up`,
      tax: `${money(taxableMinor)} × ${formatQuantity(totals.taxRatePercent, 4)}% = ${money(taxMinor)}`,
      total: `${money(taxableMinor)} + ${money(taxMinor)} = ${money(totalMinor)}`,
    },
  }
}

/** A line as the customer reads it (public page and printed quote). */
export interface CustomerQuoteLine {
  description: string
  quantity: number
  unit: string
  /** Null on a material line with the handling folded in: its unit price would not be a whole number of cents. */
  unitPriceMinor: number | null
  amountMinor: number
  arithmetic: string
}

/**
 * The lines a customer sees: the markup is folded into the material lines, shared in proportion to their amounts
 * (whole cents, the cents left over to the largest lines first), so the studio's margin is not itemised while every sum
 * stays the same. Lines of other kinds pass unchanged; a markup line with nothing to fold into stays as it is.
 */
export function customerLines(lines: readonly PricedQuoteLine[], currency: string): CustomerQuoteLine[] {
  const money = (minor: number) => formatMinor(minor, currency)
  const materials = lines.filter((line) => line.kind === 'material')
  const materialMinor = materials.reduce((sum, line) => sum + line.amountMinor, 0)
  const markupMinor = lines.filter((line) => line.kind === 'markup').reduce((sum, line) => sum + line.amountMinor, 0)
  const fold = materials.length > 0 && materialMinor > 0
  const share = new Map<PricedQuoteLine, number>()
  if (fold) {
    for (const line of materials) share.set(line, Math.floor((markupMinor * line.amountMinor) / materialMinor))
    let left = markupMinor - [...share.values()].reduce((sum, value) => sum + value, 0)
    for (const line of [...materials].sort((a, b) => b.amountMinor - a.amountMinor)) {
      if (left <= 0) break
      share.set(line, share.get(line)! + 1)
      left -= 1
    }
  }
  const plain = (line: PricedQuoteLine): CustomerQuoteLine => ({
    description: line.description,
    quantity: line.quantity,
    unit: line.unit,
    unitPriceMinor: line.unitPriceMinor,
    amountMinor: line.amountMinor,
    arithmetic: line.arithmetic,
  })
  return lines.flatMap((line): CustomerQuoteLine[] => {
    if (!fold) return [plain(line)]
    if (line.kind === 'markup') return []
    const extra = share.get(line) ?? 0
    if (line.kind !== 'material' || extra === 0) return [plain(line)]
    const amountMinor = line.amountMinor + extra
    return [{ ...plain(line), unitPriceMinor: null, amountMinor, arithmetic: `${quantityWithUnit(line.quantity, line.unit)}, handling included = ${money(amountMinor)}` }]
  })
}

/** What a job (or a comparison row) used, per run of its layout, and the price of its stock. */
export interface JobFactsForQuote {
  stockName: string
  stockKind: 'sheet' | 'roll'
  /** Per sheet, or per metre of roll, in minor units; null when the stock has no price. */
  stockPriceMinor: number | null
  /** How many times the layout is cut. */
  runs: number
  sheetsPerRun: number
  rollLengthPerRunMm: number
  /** Cut-plan estimate for one run (cutting, travel and lifts), seconds. */
  cutTimePerRunS: number
  piecesPerRun: number
}

export interface PricingForQuote {
  machineRatePerHourMinor: number
  labourRatePerHourMinor: number
  setupFeeMinor: number
  weedingMinutesPerPiece: number
  materialMarkupPercent: number
}

/** The starting lines of a quote from what the job uses and the workspace's pricing settings. */
export function draftQuoteLines(facts: JobFactsForQuote, pricing: PricingForQuote): QuoteLineInput[] {
  const runs = Math.max(1, Math.trunc(facts.runs))
  const runsText = runs === 1 ? '1 run' : `${runs} runs`
  const lines: QuoteLineInput[] = []
  const price = facts.stockPriceMinor ?? 0
  const noPrice = facts.stockPriceMinor === null ? ' (the stock has no price: enter one here)' : ''
  if (facts.stockKind === 'sheet') {
    lines.push({
      kind: 'material',
      description: `${facts.stockName}${noPrice}`,
      quantity: facts.sheetsPerRun * runs,
      unit: 'sheet',
      unitPriceMinor: price,
      basis: `${quantityWithUnit(facts.sheetsPerRun, 'sheet')} per run × ${runsText}`,
    })
  } else {
    const metres = roundQuantity((facts.rollLengthPerRunMm * runs) / 1000)
    lines.push({
      kind: 'material',
      description: `${facts.stockName}${noPrice}`,
      quantity: metres,
      unit: 'm',
      unitPriceMinor: price,
      basis: `${formatQuantity(facts.rollLengthPerRunMm, 1)} mm of roll per run × ${runsText} = ${formatQuantity(metres)} m`,
    })
  }
  if (pricing.materialMarkupPercent > 0) {
    lines.push({ kind: 'markup', description: 'Material handling and markup', quantity: pricing.materialMarkupPercent, unit: '%', unitPriceMinor: 0, basis: 'of the material lines' })
  }
  if (facts.cutTimePerRunS > 0) {
    const seconds = facts.cutTimePerRunS * runs
    lines.push({
      kind: 'machine',
      description: 'Machine time',
      quantity: roundQuantity(seconds / 3600),
      unit: 'h',
      unitPriceMinor: pricing.machineRatePerHourMinor,
      basis: `cut plan ${formatQuantity(facts.cutTimePerRunS, 1)} s per run × ${runsText} = ${formatQuantity(seconds, 1)} s`,
    })
  }
  const pieces = facts.piecesPerRun * runs
  if (pricing.weedingMinutesPerPiece > 0 && pieces > 0) {
    const minutes = pricing.weedingMinutesPerPiece * pieces
    lines.push({
      kind: 'labour',
      description: 'Weeding and finishing',
      quantity: roundQuantity(minutes / 60),
      unit: 'h',
      unitPriceMinor: pricing.labourRatePerHourMinor,
      basis: `${formatQuantity(pricing.weedingMinutesPerPiece)} min per piece × ${pieces} pieces = ${formatQuantity(minutes)} min`,
    })
  }
  if (pricing.setupFeeMinor > 0) {
    lines.push({ kind: 'setup', description: 'Setup', quantity: 1, unit: 'job', unitPriceMinor: pricing.setupFeeMinor, basis: 'per job' })
  }
  return lines
}
