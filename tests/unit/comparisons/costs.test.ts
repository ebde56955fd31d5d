import { describe, expect, it } from 'vitest'
import { bestPerColumn, comparisonFigures, comparisonStatusOf, type LayoutUsage } from '../../../shared/comparisons/costs.js'

/**
 * Worked example (numbers chosen so every answer is exact): 36 square pieces of 50 × 50 mm = 2,500 mm² each,
 * 36 × 2,500 = 90,000 mm² of pieces, each with a 200 mm outline, so 36 × 200 = 7,200 mm of cut.
 */
const usage = (overrides: Partial<LayoutUsage> = {}): LayoutUsage => ({
  sheetsUsed: 0,
  usedLengthMm: 0,
  pieceAreaMm2: 90_000,
  placedCount: 36,
  wantedCount: 36,
  cutLengthMm: 7_200,
  cutTimeSeconds: null,
  ...overrides,
})

describe('comparison costs', () => {
  it('prices whole sheets: 3 sheets of 300 × 200 mm at 1.50 each', () => {
    const figures = comparisonFigures({ kind: 'sheets', widthMm: 300, heightMm: 200, price: 1.5 }, usage({ sheetsUsed: 3 }))
    // used area 3 × 300 × 200 = 180,000 mm²; utilisation 90,000 / 180,000 = 0.5; waste 180,000 − 90,000 = 90,000 mm²
    expect(figures.usedAreaMm2).toBe(180_000)
    expect(figures.utilisation).toBe(0.5)
    expect(figures.wasteAreaMm2).toBe(90_000)
    // cost 3 × 1.50 = 4.50; per piece 4.50 / 36 = 0.125
    expect(figures.materialCost).toBe(4.5)
    expect(figures.costPerPiece).toBe(0.125)
    expect(figures.usedLengthMm).toBe(0)
    expect(figures.complete).toBe(true)
  })

  it('prices a roll by the metre: 562.5 mm of a 400 mm roll at 4.00 per metre', () => {
    const figures = comparisonFigures({ kind: 'roll', widthMm: 400, heightMm: null, price: 4 }, usage({ sheetsUsed: 1, usedLengthMm: 562.5 }))
    // used area 400 × 562.5 = 225,000 mm²; utilisation 90,000 / 225,000 = 0.4; waste 135,000 mm²
    expect(figures.usedAreaMm2).toBe(225_000)
    expect(figures.utilisation).toBe(0.4)
    expect(figures.wasteAreaMm2).toBe(135_000)
    // cost 0.5625 m × 4.00 = 2.25; per piece 2.25 / 36 = 0.0625
    expect(figures.materialCost).toBe(2.25)
    expect(figures.costPerPiece).toBe(0.0625)
    // A roll is not counted in sheets.
    expect(figures.sheetsUsed).toBe(0)
  })

  it('leaves costs empty when the price is not known, and per piece empty when nothing was placed', () => {
    const unpriced = comparisonFigures({ kind: 'sheets', widthMm: 300, heightMm: 200, price: null }, usage({ sheetsUsed: 1 }))
    expect(unpriced.materialCost).toBeNull()
    expect(unpriced.costPerPiece).toBeNull()
    const empty = comparisonFigures({ kind: 'roll', widthMm: 400, heightMm: null, price: 4 }, usage({ usedLengthMm: 0, pieceAreaMm2: 0, placedCount: 0 }))
    expect(empty.utilisation).toBe(0)
    expect(empty.costPerPiece).toBeNull()
    expect(empty.complete).toBe(false)
  })

  it('marks the best value per column among complete rows only', () => {
    const rows = [
      // A: 3 sheets 300 × 200 at 1.50 → utilisation 0.5, waste 90,000, cost 4.50, per piece 0.125
      comparisonFigures({ kind: 'sheets', widthMm: 300, heightMm: 200, price: 1.5 }, usage({ sheetsUsed: 3 })),
      // B: 562.5 mm of a 400 mm roll at 4.00/m → utilisation 0.4, waste 135,000, cost 2.25, per piece 0.0625
      comparisonFigures({ kind: 'roll', widthMm: 400, heightMm: null, price: 4 }, usage({ usedLengthMm: 562.5 })),
      // C: 1 sheet 600 × 400 at 3.60 → used 240,000; utilisation 0.375, waste 150,000, cost 3.60
      comparisonFigures({ kind: 'sheets', widthMm: 600, heightMm: 400, price: 3.6 }, usage({ sheetsUsed: 1 })),
      // D: left 6 pieces out (30 of 36, 75,000 mm²) on 1 sheet 300 × 250 at 0.50: utilisation 1, cost 0.50 — cheapest
      // and fullest only because it cut less, so it must not win any column.
      comparisonFigures({ kind: 'sheets', widthMm: 300, heightMm: 250, price: 0.5 }, usage({ sheetsUsed: 1, pieceAreaMm2: 75_000, placedCount: 30, cutLengthMm: 6_000 })),
      null,
    ]
    expect(rows[2]!.utilisation).toBe(0.375)
    expect(rows[3]!.utilisation).toBe(1)
    const best = bestPerColumn(rows)
    expect(best[0]).toEqual(['utilisation', 'wasteAreaMm2'])
    expect(best[1]).toEqual(['materialCost', 'costPerPiece'])
    // Every complete row cuts the same 7,200 mm, so cut length marks nothing; no row has a cut time, so no best time.
    expect(best[2]).toEqual([])
    expect(best[3]).toEqual([])
    expect(best[4]).toEqual([])
  })

  it('shares the mark between equal best values', () => {
    // Two rolls of 400 mm at 4.00/m each using 562.5 mm cost 2.25 each; a third using 625 mm costs 2.50.
    const roll = (usedLengthMm: number) => comparisonFigures({ kind: 'roll', widthMm: 400, heightMm: null, price: 4 }, usage({ usedLengthMm }))
    const best = bestPerColumn([roll(562.5), roll(562.5), roll(625)])
    expect(best[0]).toContain('materialCost')
    expect(best[1]).toContain('materialCost')
    expect(best[2]).toEqual([])
  })

  it('treats cut times within a second as equal', () => {
    const timed = (cutTimeSeconds: number) => comparisonFigures({ kind: 'sheets', widthMm: 300, heightMm: 200, price: 1.5 }, usage({ sheetsUsed: 3, cutTimeSeconds }))
    expect(bestPerColumn([timed(218.2), timed(218.6)]).map((marks) => marks.includes('cutTimeSeconds'))).toEqual([false, false])
    expect(bestPerColumn([timed(218.2), timed(230)]).map((marks) => marks.includes('cutTimeSeconds'))).toEqual([true, false])
  })

  it('gives no best when fewer than two rows can be compared', () => {
    const only = comparisonFigures({ kind: 'sheets', widthMm: 300, heightMm: 200, price: 1.5 }, usage({ sheetsUsed: 3 }))
    expect(bestPerColumn([only, null])).toEqual([[], []])
  })

  it('derives the comparison status from its runs', () => {
    expect(comparisonStatusOf(['queued', 'queued'])).toBe('queued')
    expect(comparisonStatusOf(['succeeded', 'queued'])).toBe('running')
    expect(comparisonStatusOf(['running', 'succeeded'])).toBe('running')
    expect(comparisonStatusOf(['succeeded', 'succeeded'])).toBe('succeeded')
    expect(comparisonStatusOf(['succeeded', 'cancelled'])).toBe('cancelled')
    expect(comparisonStatusOf(['failed', 'failed'])).toBe('failed')
    expect(comparisonStatusOf(['succeeded', 'failed'])).toBe('failed')
  })
})
