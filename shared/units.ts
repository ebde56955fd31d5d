/**
 * Length units at the edge of the product. Inside, everything is millimetres.
 * 1 in = 25.4 mm exactly (W3C CSS Values and Units Level 3, "Absolute lengths").
 */
export const MM_PER_INCH = 25.4

export type LengthUnit = 'mm' | 'in'

export function mmToUnit(valueMm: number, unit: LengthUnit): number {
  return unit === 'in' ? valueMm / MM_PER_INCH : valueMm
}

export function unitToMm(value: number, unit: LengthUnit): number {
  return unit === 'in' ? value * MM_PER_INCH : value
}

/** Formats a length for people: mm with one decimal, inches with three. */
export function formatLength(valueMm: number, unit: LengthUnit): string {
  const value = mmToUnit(valueMm, unit)
  const digits = unit === 'in' ? 3 : 1
  return `${value.toFixed(digits)} ${unit}`
}
