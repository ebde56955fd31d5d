import { describe, expect, it } from 'vitest'
import type { MaterialSettings, Recipe } from '../../../shared/schemas/materials.js'
import { canStep, describePending, stepValue } from '../../../src/features/materials/recipeTuning.js'
import { fieldLabels } from '../../../src/features/materials/labels.js'

// Step 15 force units: ../shared/REFERENCES.md "Cutting practice" (common practice); range 1–400 is our default.
const settings: MaterialSettings = { forceStep: 15, forceMin: 1, forceMax: 400, powerStepPercent: 5 }
const recipe = (force: number, passes = 1): Recipe => ({
  id: 'r',
  toolKind: 'blade',
  bladeType: 'standard',
  bladeAngleDeg: 45,
  force,
  passes,
  speedMmS: 200,
  powerPercent: null,
  catalogue: null,
  tuned: false,
  updatedAt: '2026-01-01T00:00:00.000Z',
  updatedByName: null,
})

describe('tuning a recipe on its card', () => {
  it('steps force by the workspace step and forgets a value back at the start', () => {
    const up = stepValue(recipe(95), {}, 'force', 1, settings)
    expect(up).toEqual({ force: 110 })
    expect(stepValue(recipe(95), up, 'force', -1, settings)).toEqual({})
  })

  it('stops at the ends of the range, and says it cannot go further', () => {
    expect(stepValue(recipe(395), {}, 'force', 1, settings)).toEqual({ force: 400 })
    expect(canStep(recipe(400), {}, 'force', 1, settings)).toBe(false)
    expect(canStep(recipe(400), {}, 'force', -1, settings)).toBe(true)
    expect(canStep(recipe(95, 1), {}, 'passes', -1, settings)).toBe(false)
  })

  it('describes the pending change for the reason box', () => {
    const pending = stepValue(recipe(185), stepValue(recipe(185), {}, 'force', 1, settings), 'passes', 1, settings)
    expect(describePending(recipe(185), pending, fieldLabels)).toBe('force 185 → 200, passes 1 → 2')
  })
})
