import { describe, expect, it } from 'vitest'
import { customerLines, draftQuoteLines, lineAmountMinor, priceQuote, type JobFactsForQuote, type PricingForQuote } from '../../../shared/quotes/arithmetic.js'
import { formatMinor, minorDigits, roundHalfUp, toMinor } from '../../../shared/quotes/money.js'

// Worked example by hand (prices chosen so every step is exact in cents):
//   material  2 sheets per run × 3 runs = 6 sheets × 4.50            = 27.00
//   markup    27.00 × 40 %                                           = 10.80
//   machine   600 s per run × 3 runs = 1800 s = 0.5 h × 24.00 / h    = 12.00
//   labour    1.5 min × (8 pieces × 3 runs = 24) = 36 min = 0.6 h × 18.00 / h = 10.80
//   setup     1 job × 10.00                                          = 10.00
//   subtotal  27.00 + 10.80 + 12.00 + 10.80 + 10.00                  = 70.60 (≥ minimum 50.00, no top-up)
//   tax       70.60 × 20 %                                           = 14.12
//   total     70.60 + 14.12                                          = 84.72
const pricing: PricingForQuote = { machineRatePerHourMinor: 2400, labourRatePerHourMinor: 1800, setupFeeMinor: 1000, weedingMinutesPerPiece: 1.5, materialMarkupPercent: 40 }
const sheetJob: JobFactsForQuote = { stockName: 'Matte vinyl 300 × 600', stockKind: 'sheet', stockPriceMinor: 450, runs: 3, sheetsPerRun: 2, rollLengthPerRunMm: 0, cutTimePerRunS: 600, piecesPerRun: 8 }

describe('quote arithmetic', () => {
  it('prices the worked example exactly, line by line, with its arithmetic', () => {
    const lines = draftQuoteLines(sheetJob, pricing)
    const quote = priceQuote(lines, { currency: 'EUR', minimumOrderMinor: 5000, taxRatePercent: 20 })

    expect(quote.lines.map((line) => [line.kind, line.amountMinor])).toEqual([
      ['material', 2700],
      ['markup', 1080],
      ['machine', 1200],
      ['labour', 1080],
      ['setup', 1000],
    ])
    expect(quote.lines.map((line) => line.arithmetic)).toEqual([
      '6 sheets × 4.50 = 27.00',
      '27.00 × 40% = 10.80',
      '0.5 h × 24.00 = 12.00',
      '0.6 h × 18.00 = 10.80',
      '1 job × 10.00 = 10.00',
    ])
    expect(quote.lines[0]!.basis).toBe('2 sheets per run × 3 runs')
    expect(quote.lines[2]!.basis).toBe('cut plan 600 s per run × 3 runs = 1800 s')
    expect(quote.lines[3]!.basis).toBe('1.5 min per piece × 24 pieces = 36 min')
    expect(quote.subtotalMinor).toBe(7060)
    expect(quote.minimumTopUpMinor).toBe(0)
    expect(quote.taxMinor).toBe(1412)
    expect(quote.totalMinor).toBe(8472)
    expect(quote.arithmetic.tax).toBe('70.60 × 20% = 14.12')
    expect(quote.arithmetic.total).toBe('70.60 + 14.12 = 84.72')
  })

  it('prices a roll by the metre and tops a small order up to the minimum', () => {
    // Worked example by hand: 350 mm × 2 runs = 0.7 m × 12.99 = 9.093 → 9.09; markup 0 (no line); 45 s × 2 = 90 s =
    // 0.025 h × 24.00 = 0.60; subtotal 9.69; minimum 25.00 → top-up 15.31; tax 7.5 % of 25.00 = 1.875 → 1.88 (half up).
    const roll: JobFactsForQuote = { stockName: 'Heat-transfer film', stockKind: 'roll', stockPriceMinor: 1299, runs: 2, sheetsPerRun: 0, rollLengthPerRunMm: 350, cutTimePerRunS: 45, piecesPerRun: 4 }
    const lines = draftQuoteLines(roll, { ...pricing, materialMarkupPercent: 0, weedingMinutesPerPiece: 0, setupFeeMinor: 0 })
    const quote = priceQuote(lines, { currency: 'EUR', minimumOrderMinor: 2500, taxRatePercent: 7.5 })

    expect(quote.lines.map((line) => line.arithmetic)).toEqual(['0.7 m × 12.99 = 9.09', '0.025 h × 24.00 = 0.60'])
    expect(quote.subtotalMinor).toBe(969)
    expect(quote.minimumTopUpMinor).toBe(1531)
    expect(quote.arithmetic.minimumTopUp).toBe('minimum order 25.00 − 9.69 = 15.31')
    expect(quote.taxMinor).toBe(188)
    expect(quote.totalMinor).toBe(2688)
  })

  it('lets the markup follow edited material lines and keeps a discount line negative', () => {
    const lines = draftQuoteLines(sheetJob, pricing)
    lines[0]!.quantity = 10
    lines.push({ kind: 'custom', description: 'Returning customer', quantity: 1, unit: '', unitPriceMinor: -500 })
    const quote = priceQuote(lines, { currency: 'EUR', minimumOrderMinor: 0, taxRatePercent: 0 })

    // 10 × 4.50 = 45.00; 45.00 × 40 % = 18.00; discount −5.00.
    expect(quote.lines[0]!.amountMinor).toBe(4500)
    expect(quote.lines[1]!.amountMinor).toBe(1800)
    expect(quote.lines.at(-1)!.amountMinor).toBe(-500)
    expect(quote.subtotalMinor).toBe(4500 + 1800 + 1200 + 1080 + 1000 - 500)
  })

  it('marks a stock without price and starts its line at zero', () => {
    const lines = draftQuoteLines({ ...sheetJob, stockPriceMinor: null }, pricing)
    expect(lines[0]!.unitPriceMinor).toBe(0)
    expect(lines[0]!.description).toMatch(/no price/)
  })
})

describe('money in minor units', () => {
  it('rounds halves up, also where binary fractions fall just below the half', () => {
    expect(roundHalfUp(2.5)).toBe(3)
    expect(roundHalfUp(1.005 * 100)).toBe(101)
    expect(roundHalfUp(-2.5)).toBe(-3)
    expect(lineAmountMinor({ quantity: 0.35, unit: 'm', unitPriceMinor: 1299 })).toBe(455) // 454.65 → 455
  })

  it('knows currencies without and with three minor digits (ISO 4217 minor unit column)', () => {
    expect(minorDigits('JPY')).toBe(0)
    expect(minorDigits('KWD')).toBe(3)
    expect(minorDigits('eur')).toBe(2)
    expect(formatMinor(1350, 'EUR')).toBe('13.50')
    expect(formatMinor(1350, 'JPY')).toBe('1350')
    expect(formatMinor(-5, 'EUR')).toBe('-0.05')
    expect(toMinor(4.5, 'EUR')).toBe(450)
  })

  it('folds the markup into the material line for the customer, keeping every sum', () => {
    // The worked example above: material 27.00 + markup 10.80 = 37.80 shown as one material line.
    const quote = priceQuote(draftQuoteLines(sheetJob, pricing), { currency: 'EUR', minimumOrderMinor: 5000, taxRatePercent: 20 })
    const shown = customerLines(quote.lines, 'EUR')
    expect(shown.map((line) => [line.description, line.amountMinor])).toEqual([
      [quote.lines[0]!.description, 3780],
      [quote.lines[2]!.description, 1200],
      [quote.lines[3]!.description, 1080],
      [quote.lines[4]!.description, 1000],
    ])
    expect(shown[0]).toMatchObject({ unitPriceMinor: null, arithmetic: '6 sheets, handling included = 37.80' })
    expect(shown.reduce((sum, line) => sum + line.amountMinor, 0)).toBe(quote.subtotalMinor)
  })

  it('shares the markup between material lines in whole cents, the odd cent to the largest line', () => {
    // Worked example by hand: three materials of 2.00, 1.00 and 1.00 with 10 % markup = 0.40 → shares 0.20, 0.10, 0.10;
    // with 3 % = 0.12 → exact shares 0.06, 0.03, 0.03; with 2.5 % = 0.10 → 0.05, 0.025, 0.025 → floors 5, 2, 2 and the
    // cent left over to the largest line: 0.06, 0.02, 0.02.
    const material = (description: string, unitPriceMinor: number) => ({ kind: 'material' as const, description, quantity: 1, unit: 'sheet', unitPriceMinor })
    const markup = (percent: number) => ({ kind: 'markup' as const, description: 'Handling', quantity: percent, unit: '%', unitPriceMinor: 0 })
    const folded = (percent: number) =>
      customerLines(priceQuote([material('A', 200), material('B', 100), material('C', 100), markup(percent)], { currency: 'EUR', minimumOrderMinor: 0, taxRatePercent: 0 }).lines, 'EUR').map(
        (line) => line.amountMinor,
      )
    expect(folded(10)).toEqual([220, 110, 110])
    expect(folded(3)).toEqual([206, 103, 103])
    expect(folded(2.5)).toEqual([206, 102, 102])
  })

  it('leaves a quote without material lines as it is', () => {
    const lines = priceQuote([{ kind: 'setup', description: 'Setup', quantity: 1, unit: 'job', unitPriceMinor: 800 }], { currency: 'EUR', minimumOrderMinor: 0, taxRatePercent: 0 }).lines
    expect(customerLines(lines, 'EUR')).toEqual([{ description: 'Setup', quantity: 1, unit: 'job', unitPriceMinor: 800, amountMinor: 800, arithmetic: '1 job × 8.00 = 8.00' }])
  })
})
