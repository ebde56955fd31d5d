import { describe, expect, it } from 'vitest'
import { bladeWearStatus, defaultBladeWearLimitsM, wearLimitM } from '../../../shared/cutters/wear.js'
import { careDueOf } from '../../../server/features/cutters/cutters.service.js'
import { createCutterRequestSchema, fitBladeRequestSchema, updateStudioSettingsRequestSchema } from '../../../shared/schemas/cutters.js'

// Thresholds: a gentle warning from 80 % of the limit, a warning from 100 % (issue 9). All figures worked by hand.
describe('blade wear levels', () => {
  it('is ok just under 80 % of the limit', () => {
    // 2000 m limit → 2 000 000 mm; 79.9 % = 1 598 000 mm (worked example by hand).
    expect(bladeWearStatus(1_598_000, 2000)).toEqual({ wornMm: 1_598_000, limitMm: 2_000_000, ratio: 0.799, level: 'ok' })
  })

  it('is near from exactly 80 % of the limit', () => {
    // 80 % of 1200 m = 960 m = 960 000 mm (worked example by hand).
    const status = bladeWearStatus(960_000, 1200)
    expect(status.level).toBe('near')
    expect(status.ratio).toBeCloseTo(0.8, 12)
  })

  it('is near just under the limit and over from exactly 100 %', () => {
    // 1500 m limit: 1 499 999 mm is 99.99993 %; 1 500 000 mm is 100 % (worked example by hand).
    expect(bladeWearStatus(1_499_999, 1500).level).toBe('near')
    expect(bladeWearStatus(1_500_000, 1500).level).toBe('over')
    // 3600 m cut on a 3000 m blade = 120 % (worked example by hand).
    expect(bladeWearStatus(3_600_000, 3000)).toMatchObject({ ratio: 1.2, level: 'over' })
  })

  it('never warns without a limit', () => {
    expect(bladeWearStatus(5_000_000, 0)).toEqual({ wornMm: 5_000_000, limitMm: 0, ratio: 0, level: 'ok' })
    expect(bladeWearStatus(5_000_000, undefined).level).toBe('ok')
  })
})

describe('wear limits per blade type', () => {
  it('takes the workspace value over the starting point, and the standard blade for an unknown type', () => {
    expect(wearLimitM('deep-cut', {})).toBe(defaultBladeWearLimitsM['deep-cut'])
    expect(wearLimitM('deep-cut', { 'deep-cut': 900 })).toBe(900)
    expect(wearLimitM('engraving', {})).toBe(defaultBladeWearLimitsM.standard)
  })

  it('uses the same blade type names as cut recipes', () => {
    // shared/schemas/materials.ts bladeTypes: standard, deep-cut, fabric, rotary.
    expect(Object.keys(defaultBladeWearLimitsM).sort()).toEqual(['deep-cut', 'fabric', 'rotary', 'standard'])
  })
})

describe('care reminders', () => {
  const created = new Date('2026-10-01T09:00:00Z')
  const now = new Date('2026-12-02T09:00:00Z')

  it('is due interval days after the last time, overdue once that has passed', () => {
    const lastDone = new Map([['housing_cleaned', new Date('2026-11-20T09:00:00Z')]])
    const [due] = careDueOf([{ kind: 'housing_cleaned', intervalDays: 14 }], lastDone, created, now)
    // 20 Nov + 14 days = 4 Dec, after 2 Dec: not overdue (worked example by hand).
    expect(due).toEqual({ kind: 'housing_cleaned', intervalDays: 14, lastDoneAt: '2026-11-20T09:00:00.000Z', dueAt: '2026-12-04T09:00:00.000Z', overdue: false })
  })

  it('counts a care never logged from when the cutter was added', () => {
    const [due] = careDueOf([{ kind: 'roller_checked', intervalDays: 30 }], new Map(), created, now)
    // 1 Oct + 30 days = 31 Oct, before 2 Dec: overdue (worked example by hand).
    expect(due).toMatchObject({ lastDoneAt: null, dueAt: '2026-10-31T09:00:00.000Z', overdue: true })
  })
})

describe('cutter request checks', () => {
  const valid = { name: 'Bench cutter', toolKind: 'blade', cuttingWidthMm: 330, maxLengthMm: 3000, cutSpeedMmS: 100, travelSpeedMmS: 300, accelerationMmS2: 1500, liftLowerS: 0.15 }

  it('fills defaults for a minimal blade cutter', () => {
    expect(createCutterRequestSchema.parse(valid)).toMatchObject({ cornerAngleDeg: 30, origin: 'bottom-left', swapAxes: false, forceMin: null, forceMax: null, careReminders: [] })
  })

  it('names the field of a bad value', () => {
    const flipped = createCutterRequestSchema.safeParse({ ...valid, forceMin: 300, forceMax: 100 })
    expect(flipped.success).toBe(false)
    expect(flipped.error!.issues[0]).toMatchObject({ path: ['forceMin'], message: 'Lowest force must not be above the highest force' })
    const slow = createCutterRequestSchema.safeParse({ ...valid, cutSpeedMmS: 0 })
    expect(slow.error!.issues[0]).toMatchObject({ path: ['cutSpeedMmS'], message: 'Cut speed must be above 0' })
    const corner = createCutterRequestSchema.safeParse({ ...valid, origin: 'middle' })
    expect(corner.error!.issues[0]!.path).toEqual(['origin'])
    const twice = createCutterRequestSchema.safeParse({ ...valid, careReminders: [{ kind: 'spring_checked', intervalDays: 30 }, { kind: 'spring_checked', intervalDays: 60 }] })
    expect(twice.error!.issues[0]).toMatchObject({ path: ['careReminders'] })
  })

  it('keeps blade angles and wear limits in range', () => {
    expect(fitBladeRequestSchema.safeParse({ bladeType: 'standard', angleDeg: 90 }).error!.issues[0]!.path).toEqual(['angleDeg'])
    expect(updateStudioSettingsRequestSchema.safeParse({ bladeWearLimitsM: { standard: 0 } }).success).toBe(false)
    expect(updateStudioSettingsRequestSchema.safeParse({ bladeWearLimitsM: { standard: 1800 } }).success).toBe(true)
  })
})
