import type { UnitSystem } from '../../../shared/schemas/index'
import { MM_PER_INCH, formatLength, mmToUnit } from '../../../shared/units'

/** 1 in² = 25.4² mm² exactly, from the inch's definition in shared/units.ts. */
export const MM2_PER_SQUARE_INCH = MM_PER_INCH * MM_PER_INCH

export { formatLength }

const lengthDigits = (unit: UnitSystem) => (unit === 'in' ? 3 : 1)

export function mm2ToUnit(valueMm2: number, unit: UnitSystem): number {
  return unit === 'in' ? valueMm2 / MM2_PER_SQUARE_INCH : valueMm2
}

export function unitToMm2(value: number, unit: UnitSystem): number {
  return unit === 'in' ? value * MM2_PER_SQUARE_INCH : value
}

/** Areas with the same precision as lengths: mm² with one decimal, in² with three. */
export function formatArea(valueMm2: number, unit: UnitSystem): string {
  return `${mm2ToUnit(valueMm2, unit).toFixed(lengthDigits(unit))} ${unit}²`
}

/** "40.0 × 25.5 mm": width by height, the unit once. */
export function formatSize(widthMm: number, heightMm: number, unit: UnitSystem): string {
  const digits = lengthDigits(unit)
  return `${mmToUnit(widthMm, unit).toFixed(digits)} × ${mmToUnit(heightMm, unit).toFixed(digits)} ${unit}`
}

/** A small number without trailing zeros, at most `digits` decimals: 0.02, 0.00079. */
export function trimmedNumber(value: number, digits: number): string {
  return String(Number(value.toFixed(digits)))
}

/** Tolerances are far below a tenth of a millimetre, so they get more digits than other lengths. */
export function formatTolerance(valueMm: number, unit: UnitSystem): string {
  return `${trimmedNumber(mmToUnit(valueMm, unit), unit === 'in' ? 5 : 3)} ${unit}`
}

export function pluralize(count: number, singular: string, plural = `${singular}s`): string {
  return `${count} ${count === 1 ? singular : plural}`
}
