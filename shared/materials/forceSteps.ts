/**
 * Force arithmetic for tuning a blade recipe. Force is a number on the cutter's own scale (whole units); a studio
 * raises or lowers it in steps (about 15 units is common practice, ../shared/REFERENCES.md "Cutting practice")
 * and never past the cutter's range.
 */
export interface ForceRange {
  min: number
  max: number
}

/** The studio default until cutters (with their own range) exist; invented, a workspace changes it in its settings. */
export const defaultForceRange: ForceRange = { min: 1, max: 400 }
export const defaultForceStep = 15
/** Laser power is tuned in percentage points; invented default, a workspace setting. */
export const defaultPowerStepPercent = 5

export function clamp(value: number, range: ForceRange): number {
  return Math.min(range.max, Math.max(range.min, value))
}

export function isWithin(value: number, range: ForceRange): boolean {
  return value >= range.min && value <= range.max
}

/**
 * Force after `steps` steps of `step` units (negative steps lower it), kept inside the range.
 * A force already outside the range (the range was narrowed later) comes back to its nearest end.
 */
export function stepForce(force: number, steps: number, step: number, range: ForceRange): number {
  return clamp(Math.round(force + steps * step), range)
}

/**
 * The range a recipe is checked against. The workspace range stands in until cutters carry their own; a cutter's
 * maximum, when one is given, is the real top of the scale and replaces the workspace's.
 */
export function effectiveForceRange(workspaceRange: ForceRange, cutterMaxForce?: number | null): ForceRange {
  if (cutterMaxForce === undefined || cutterMaxForce === null) return workspaceRange
  return { min: workspaceRange.min, max: Math.max(workspaceRange.min, Math.round(cutterMaxForce)) }
}
