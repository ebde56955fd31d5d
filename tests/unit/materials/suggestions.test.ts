import { describe, expect, it } from 'vitest'
import { describeChanges, suggestFromTestCut, type SuggestionInput } from '../../../shared/materials/suggestions.js'
import { effectiveForceRange } from '../../../shared/materials/forceSteps.js'
import type { RecipeValues } from '../../../shared/schemas/materials.js'

const blade = (force: number, passes = 1): RecipeValues => ({ bladeType: 'standard', bladeAngleDeg: 45, force, passes, speedMmS: 200, powerPercent: null })
const laser = (powerPercent: number, passes = 1): RecipeValues => ({ bladeType: null, bladeAngleDeg: null, force: null, passes, speedMmS: 100, powerPercent })

// Force step 15 units: ../shared/REFERENCES.md "Cutting practice" (common practice). The range 1–400 is our default.
const base: Omit<SuggestionInput, 'recipe' | 'outcome'> = { toolKind: 'blade', forceStep: 15, forceRange: { min: 1, max: 400 }, powerStepPercent: 5 }

describe('suggestion from a test cut', () => {
  it('keeps a clean cut as it is', () => {
    const suggestion = suggestFromTestCut({ ...base, recipe: blade(95), outcome: 'clean' })
    expect(suggestion).toMatchObject({ action: 'keep', changes: [] })
  })

  it('raises force one step when the cut did not go through', () => {
    const suggestion = suggestFromTestCut({ ...base, recipe: blade(95), outcome: 'not_through' })
    expect(suggestion.action).toBe('raise-force')
    expect(suggestion.changes).toEqual([{ field: 'force', from: 95, to: 110 }])
    expect(suggestion.message).toContain('95 → 110')
  })

  it('raises force only up to the maximum, then adds a pass at the maximum', () => {
    const nearTop = suggestFromTestCut({ ...base, recipe: blade(390), outcome: 'not_through' })
    expect(nearTop.changes).toEqual([{ field: 'force', from: 390, to: 400 }])
    expect(nearTop.message).toContain('to the maximum')

    const atTop = suggestFromTestCut({ ...base, recipe: blade(400, 2), outcome: 'not_through' })
    expect(atTop.action).toBe('add-pass')
    expect(atTop.changes).toEqual([{ field: 'passes', from: 2, to: 3 }])
  })

  it("uses the cutter's maximum force when it is given", () => {
    const range = effectiveForceRange({ min: 1, max: 400 }, 250)
    const suggestion = suggestFromTestCut({ ...base, forceRange: range, recipe: blade(250), outcome: 'not_through' })
    expect(suggestion.action).toBe('add-pass')
    expect(suggestion.changes).toEqual([{ field: 'passes', from: 1, to: 2 }])
  })

  it('asks to check the setup instead of adding passes without end', () => {
    const suggestion = suggestFromTestCut({ ...base, recipe: blade(400, 10), outcome: 'not_through' })
    expect(suggestion).toMatchObject({ action: 'check-setup', changes: [] })
  })

  for (const outcome of ['torn', 'too_deep'] as const) {
    it(`lowers force one step when the cut was ${outcome.replace('_', ' ')}`, () => {
      const suggestion = suggestFromTestCut({ ...base, recipe: blade(160), outcome })
      expect(suggestion.action).toBe('lower-force')
      expect(suggestion.changes).toEqual([{ field: 'force', from: 160, to: 145 }])
    })
  }

  it('names a dulling blade as a cause of torn edges', () => {
    expect(suggestFromTestCut({ ...base, recipe: blade(160), outcome: 'torn' }).message).toMatch(/dulling blade/)
  })

  it('lowers force no further than the minimum, then drops a pass', () => {
    expect(suggestFromTestCut({ ...base, recipe: blade(10), outcome: 'too_deep' }).changes).toEqual([{ field: 'force', from: 10, to: 1 }])
    const atBottom = suggestFromTestCut({ ...base, recipe: blade(1, 3), outcome: 'too_deep' })
    expect(atBottom.action).toBe('remove-pass')
    expect(atBottom.changes).toEqual([{ field: 'passes', from: 3, to: 2 }])
    expect(suggestFromTestCut({ ...base, recipe: blade(1, 1), outcome: 'too_deep' }).action).toBe('check-setup')
  })

  it('tunes laser power in its own steps, up to 100 %', () => {
    const raise = suggestFromTestCut({ ...base, toolKind: 'laser', recipe: laser(22), outcome: 'not_through' })
    expect(raise).toMatchObject({ action: 'raise-power', changes: [{ field: 'powerPercent', from: 22, to: 27 }] })
    const full = suggestFromTestCut({ ...base, toolKind: 'laser', recipe: laser(100), outcome: 'not_through' })
    expect(full).toMatchObject({ action: 'add-pass', changes: [{ field: 'passes', from: 1, to: 2 }] })
    const lower = suggestFromTestCut({ ...base, toolKind: 'laser', recipe: laser(12.5), outcome: 'too_deep' })
    expect(lower.changes).toEqual([{ field: 'powerPercent', from: 12.5, to: 7.5 }])
  })

  it('describes the changes for the history', () => {
    expect(describeChanges([{ field: 'force', from: 95, to: 110 }])).toBe('force 95 → 110')
  })
})
