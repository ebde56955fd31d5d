/**
 * Blade wear: how far a blade has cut against the workspace's limit for its type. The limits are a studio's own
 * judgement; the defaults below are invented starting points (common practice is to swap when cuts start to
 * tear or fail to go through), and the UI says so.
 */

/** The same names as the blade types of cut recipes (shared/schemas/materials.ts), so a recipe's blade finds its limit. */
export const bladeTypes = ['standard', 'deep-cut', 'fabric', 'rotary'] as const

/** Metres of cut per blade type before a swap is due: starting points, not a machine maker's figures. */
export const defaultBladeWearLimitsM: Record<string, number> = {
  standard: 2000,
  'deep-cut': 1200,
  fabric: 1500,
  rotary: 3000,
}

/** Wear from this fraction of the limit shows a gentle warning. */
export const nearWearRatio = 0.8

export type WearLevel = 'ok' | 'near' | 'over'

export interface BladeWearStatus {
  wornMm: number
  limitMm: number
  /** worn / limit; 0 when there is no limit. */
  ratio: number
  level: WearLevel
}

/** The wear level: `near` from 80 % of the limit, `over` from 100 %. A limit of 0 or less never warns. */
export function bladeWearStatus(wornMm: number, limitM: number | undefined): BladeWearStatus {
  const limitMm = Math.max(0, (limitM ?? 0) * 1000)
  if (limitMm === 0) return { wornMm, limitMm, ratio: 0, level: 'ok' }
  const ratio = wornMm / limitMm
  return { wornMm, limitMm, ratio, level: ratio >= 1 ? 'over' : ratio >= nearWearRatio ? 'near' : 'ok' }
}

/** The limit of a blade type: the workspace's own value, else the starting point, else the standard blade's. */
export function wearLimitM(bladeType: string, workspaceLimitsM: Record<string, number>): number {
  return workspaceLimitsM[bladeType] ?? defaultBladeWearLimitsM[bladeType] ?? defaultBladeWearLimitsM.standard!
}
