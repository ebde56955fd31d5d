import { describe, expect, it } from 'vitest'
import { basisWeightFromGsm, gsmFromBasisWeight, reamAreaM2 } from '../../../shared/materials/basisWeight.js'
import { catalogue } from '../../../shared/materials/catalogue.js'

describe('basis weight to grammage', () => {
  it('uses the definition: one ream is 500 sheets of 20 × 26 in for cover stock', () => {
    // Basis size of cover stock 20 × 26 in, 500 sheets to the ream: ../shared/REFERENCES.md "Paper weights"
    // (common practice of the US paper trade); 1 in = 0.0254 m exactly (W3C CSS Values and Units Level 3).
    expect(reamAreaM2('cover')).toBeCloseTo(500 * 20 * 26 * 0.0254 ** 2, 12)
    expect(reamAreaM2('cover')).toBeCloseTo(167.7416, 4)
  })

  it('gives 1 lb cover ≈ 2.704 g/m² (453.59237 g over the ream area)', () => {
    // ../shared/REFERENCES.md "Paper weights": g/m² = lb × 453.59237 g ÷ (500 × 20 × 26 × 0.00064516 m²) = lb × 2.7042.
    // The quoted factor is rounded: the formula itself gives 2.70411…, so it is held to three decimals.
    expect(gsmFromBasisWeight(1, 'cover')).toBeCloseTo(2.7042, 3)
    expect(gsmFromBasisWeight(1, 'cover')).toBeCloseTo(453.59237 / (500 * 20 * 26 * 0.00064516), 12)
  })

  // ../shared/REFERENCES.md "Paper weights": 65 lb cover ≈ 176 g/m², 80 lb ≈ 216 g/m², 110 lb ≈ 297 g/m².
  for (const [pounds, gsm] of [
    [65, 176],
    [80, 216],
    [110, 297],
  ] as const) {
    it(`reads ${pounds} lb cover as about ${gsm} g/m²`, () => {
      expect(Math.round(gsmFromBasisWeight(pounds, 'cover'))).toBe(gsm)
      // And from the exact formula, not just the rounded figure.
      expect(gsmFromBasisWeight(pounds, 'cover')).toBeCloseTo((pounds * 453.59237) / (500 * 20 * 26 * 0.00064516), 9)
    })
  }

  it('weighs text paper at 25 × 38 in: 1 lb text = 1.4801 g/m²', () => {
    // ../shared/REFERENCES.md "Paper weights": "Text" basis size 25 × 38 in gives lb × 1.4801.
    expect(gsmFromBasisWeight(1, 'text')).toBeCloseTo(1.4801, 4)
  })

  it('converts back to the same basis weight', () => {
    for (const pounds of [20, 65, 80, 110, 130]) {
      expect(basisWeightFromGsm(gsmFromBasisWeight(pounds, 'cover'), 'cover')).toBeCloseTo(pounds, 9)
    }
  })

  it('lists the three cover weights of cardstock in the catalogue', () => {
    const cover = catalogue.filter((entry) => entry.basisWeight?.kind === 'cover').map((entry) => entry.basisWeight!.pounds)
    expect(cover).toEqual([65, 80, 110])
  })
})
