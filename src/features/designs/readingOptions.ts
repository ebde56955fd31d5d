import type { UnitSystem } from '../../../shared/schemas/index'
import { mmToUnit, unitToMm } from '../../../shared/units'
import type { DesignReadingOptions } from './api'
import { mm2ToUnit, trimmedNumber, unitToMm2 } from './measures'

/** The server's defaults and limits (shared/schemas/designs.ts, uploadDesignOptionsSchema). */
export const defaultToleranceMm = 0.02
export const defaultMinSpeckAreaMm2 = 0.5
const toleranceLimitsMm = { min: 0.001, max: 1 } as const
const speckLimitsMm2 = { min: 0, max: 1000 } as const

/** The two inputs as typed, in the person's unit (mm / mm² or in / in²). */
export interface ReadingOptionsInput {
  tolerance: string
  speckArea: string
}

export type ReadingOptionsErrors = Partial<Record<keyof ReadingOptionsInput, string>>

const digits = (unit: UnitSystem) => (unit === 'in' ? 5 : 3)

export function defaultReadingOptionsInput(unit: UnitSystem): ReadingOptionsInput {
  return {
    tolerance: trimmedNumber(mmToUnit(defaultToleranceMm, unit), digits(unit)),
    speckArea: trimmedNumber(mm2ToUnit(defaultMinSpeckAreaMm2, unit), digits(unit)),
  }
}

function parseNumber(text: string): number | null {
  const normalised = text.trim().replace(',', '.')
  if (normalised === '') return null
  const value = Number(normalised)
  return Number.isFinite(value) ? value : null
}

function range(min: number, max: number, unit: UnitSystem, toUnit: (value: number, unit: UnitSystem) => number): string {
  return `${trimmedNumber(toUnit(min, unit), digits(unit))} and ${trimmedNumber(toUnit(max, unit), digits(unit))}`
}

/**
 * The typed options in millimetres, or a message per input. A value left at its default is not sent,
 * so converting the inch default back does not nudge the server's own default.
 */
export function readingOptionsToMm(
  input: ReadingOptionsInput,
  unit: UnitSystem,
): { options: DesignReadingOptions; errors: null } | { options: null; errors: ReadingOptionsErrors } {
  const defaults = defaultReadingOptionsInput(unit)
  const errors: ReadingOptionsErrors = {}
  const options: DesignReadingOptions = {}

  if (input.tolerance.trim() !== defaults.tolerance) {
    const value = parseNumber(input.tolerance)
    const valueMm = value === null ? null : unitToMm(value, unit)
    if (valueMm === null || valueMm < toleranceLimitsMm.min - 1e-12 || valueMm > toleranceLimitsMm.max + 1e-12) {
      errors.tolerance = `Enter a tolerance between ${range(toleranceLimitsMm.min, toleranceLimitsMm.max, unit, mmToUnit)} ${unit}`
    } else options.toleranceMm = Math.min(Math.max(valueMm, toleranceLimitsMm.min), toleranceLimitsMm.max)
  }

  if (input.speckArea.trim() !== defaults.speckArea) {
    const value = parseNumber(input.speckArea)
    const valueMm2 = value === null ? null : unitToMm2(value, unit)
    if (valueMm2 === null || valueMm2 < speckLimitsMm2.min || valueMm2 > speckLimitsMm2.max + 1e-9) {
      errors.speckArea = `Enter an area between ${range(speckLimitsMm2.min, speckLimitsMm2.max, unit, mm2ToUnit)} ${unit}²`
    } else options.minSpeckAreaMm2 = Math.min(valueMm2, speckLimitsMm2.max)
  }

  return Object.keys(errors).length > 0 ? { options: null, errors } : { options, errors: null }
}
