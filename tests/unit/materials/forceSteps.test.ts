import { describe, expect, it } from 'vitest'
import { clamp, defaultForceStep, effectiveForceRange, isWithin, stepForce } from '../../../shared/materials/forceSteps.js'
import { matchStandardSize, standardStockSizes } from '../../../shared/materials/standardSizes.js'

const range = { min: 1, max: 400 }

describe('force steps', () => {
  it('defaults to steps of 15 units', () => {
    // ../shared/REFERENCES.md "Cutting practice": force is raised in small steps of about 15 units (common practice).
    expect(defaultForceStep).toBe(15)
  })

  it('steps up and down by whole steps', () => {
    expect(stepForce(95, 1, 15, range)).toBe(110)
    expect(stepForce(95, -2, 15, range)).toBe(65)
  })

  it('never leaves the range', () => {
    expect(stepForce(395, 1, 15, range)).toBe(400)
    expect(stepForce(10, -1, 15, range)).toBe(1)
    expect(stepForce(400, 3, 15, range)).toBe(400)
  })

  it('brings a force outside a narrowed range back to its nearest end', () => {
    expect(stepForce(420, 0, 15, range)).toBe(400)
    expect(clamp(-5, range)).toBe(1)
  })

  it('checks a value against the range, ends included', () => {
    expect(isWithin(1, range)).toBe(true)
    expect(isWithin(400, range)).toBe(true)
    expect(isWithin(401, range)).toBe(false)
    expect(isWithin(0, range)).toBe(false)
  })

  it("takes a cutter's maximum force over the workspace's", () => {
    expect(effectiveForceRange(range)).toEqual(range)
    expect(effectiveForceRange(range, 250)).toEqual({ min: 1, max: 250 })
    expect(effectiveForceRange(range, 600)).toEqual({ min: 1, max: 600 })
  })
})

describe('standard stock sizes', () => {
  it('holds ISO 216 A4 and A3, US Letter and the common inch sizes exactly', () => {
    const byId = Object.fromEntries(standardStockSizes.map((size) => [size.id, size]))
    // ISO 216: A4 = 210 × 297 mm, A3 = 297 × 420 mm.
    expect(byId.a4).toMatchObject({ widthMm: 210, heightMm: 297 })
    expect(byId.a3).toMatchObject({ widthMm: 297, heightMm: 420 })
    // ANSI/ASME Y14.1 size A: 8.5 × 11 in; 1 in = 25.4 mm (W3C CSS Values and Units Level 3).
    expect(byId['us-letter']!.widthMm).toBeCloseTo(215.9, 9)
    expect(byId['us-letter']!.heightMm).toBeCloseTo(279.4, 9)
    // Common practice: 12 × 12 in and 12 × 24 in sheets, 12 in (305 mm) and 24 in (610 mm) rolls.
    expect(byId['sheet-12x12in']).toMatchObject({ widthMm: 304.8, heightMm: 304.8 })
    expect(byId['sheet-12x24in']).toMatchObject({ widthMm: 304.8, heightMm: 609.6 })
    expect(byId['roll-12in']!.widthMm).toBeCloseTo(304.8, 9)
    expect(byId['roll-24in']!.widthMm).toBeCloseTo(609.6, 9)
  })

  it('recognises a standard sheet either way round, and a roll by its width', () => {
    expect(matchStandardSize('sheet', 297, 210)?.id).toBe('a4')
    expect(matchStandardSize('roll', 609.6)?.id).toBe('roll-24in')
    expect(matchStandardSize('sheet', 300, 200)).toBeNull()
  })
})
