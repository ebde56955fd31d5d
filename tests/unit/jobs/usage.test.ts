import { describe, expect, it } from 'vitest'
import { jobUsage, stockAfterJob } from '../../../shared/jobs/usage.js'

// Worked examples by hand: every figure of one run × quantity; waste = stock area − piece area.

describe('jobUsage', () => {
  it('multiplies one run of a sheet layout by the quantity', () => {
    // One run: 2 sheets of 300 × 200 mm (120 000 mm²), 45 000 mm² of pieces, cut plan 3 600 mm with 2 passes.
    const usage = jobUsage({
      figures: { sheetsUsed: 2, usedLengthMm: 0, usedStockAreaMm2: 120_000, pieceAreaMm2: 45_000 },
      stockKind: 'sheets',
      cutPlanCutLengthMm: 3600,
      passes: 2,
      quantity: 3,
    })
    expect(usage).toEqual({
      sheetsUsed: 6,
      rollLengthUsedMm: 0,
      stockAreaMm2: 360_000,
      pieceAreaMm2: 135_000,
      wasteAreaMm2: 225_000,
      cutLengthMm: 10_800,
      passes: 2,
    })
  })

  it('counts roll length, not sheets, for a roll layout', () => {
    // One run: 610 mm wide roll, 450 mm used (274 500 mm²), 200 000 mm² of pieces, 5 000 mm of cut.
    const usage = jobUsage({
      figures: { sheetsUsed: 0, usedLengthMm: 450, usedStockAreaMm2: 274_500, pieceAreaMm2: 200_000 },
      stockKind: 'roll',
      cutPlanCutLengthMm: 5000,
      passes: 1,
      quantity: 4,
    })
    expect(usage.sheetsUsed).toBe(0)
    expect(usage.rollLengthUsedMm).toBe(1800)
    expect(usage.wasteAreaMm2).toBe(298_000)
    expect(usage.cutLengthMm).toBe(20_000)
  })
})

describe('stockAfterJob', () => {
  it('takes sheets off and reports short stock', () => {
    expect(stockAfterJob({ kind: 'sheet', quantityOnHand: 10, lengthMm: null }, { sheetsUsed: 6, rollLengthUsedMm: 0 }, false)).toMatchObject({ quantityOnHand: 4, short: false })
    const short = stockAfterJob({ kind: 'sheet', quantityOnHand: 3, lengthMm: null }, { sheetsUsed: 5, rollLengthUsedMm: 0 }, false)
    expect(short).toMatchObject({ quantityOnHand: 0, short: true, shortMessage: 'Only 3 sheets on hand; the job uses 5' })
  })

  it('shortens the roll, or moves its rest into a remnant', () => {
    const roll = { kind: 'roll' as const, quantityOnHand: 2, lengthMm: 5000 }
    expect(stockAfterJob(roll, { sheetsUsed: 0, rollLengthUsedMm: 1800 }, false)).toMatchObject({ quantityOnHand: 2, lengthMm: 3200, remnantLengthMm: null, short: false })
    expect(stockAfterJob(roll, { sheetsUsed: 0, rollLengthUsedMm: 1800 }, true)).toMatchObject({ quantityOnHand: 1, lengthMm: 5000, remnantLengthMm: 3200 })
    expect(stockAfterJob(roll, { sheetsUsed: 0, rollLengthUsedMm: 6000 }, false)).toMatchObject({ short: true, quantityOnHand: 1, shortMessage: 'Only 5 m on the roll; the job uses 6 m' })
  })
})
