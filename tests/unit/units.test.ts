import { describe, expect, it } from 'vitest'
import { formatLength, mmToUnit, unitToMm } from '../../shared/units.js'

describe('length units', () => {
  // 1 in = 25.4 mm exactly: W3C CSS Values and Units Level 3, "Absolute lengths".
  it('converts inches and millimetres by the exact definition', () => {
    expect(unitToMm(1, 'in')).toBe(25.4)
    expect(mmToUnit(254, 'in')).toBeCloseTo(10, 12)
    expect(unitToMm(12, 'in')).toBeCloseTo(304.8, 12)
  })

  // ISO 216: A4 is 210 × 297 mm.
  it('formats A4 in both units', () => {
    expect(formatLength(210, 'mm')).toBe('210.0 mm')
    expect(formatLength(210, 'in')).toBe('8.268 in')
    expect(formatLength(297, 'in')).toBe('11.693 in')
  })

  it('leaves millimetres unchanged', () => {
    expect(mmToUnit(123.4, 'mm')).toBe(123.4)
    expect(unitToMm(123.4, 'mm')).toBe(123.4)
  })
})
