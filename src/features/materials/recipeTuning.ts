import type { BladeType, MaterialSettings, Recipe, RecipeField, RecipeToolKind } from '../../../shared/schemas/index'
import { maxPasses } from '../../../shared/schemas/index'
import { clamp, stepForce } from '../../../shared/materials/forceSteps'

/** Values a tuning step changes, before they are saved with a reason. */
export type PendingValues = Partial<Record<'force' | 'passes' | 'speedMmS' | 'powerPercent', number>>

/** Speed moves in steps of 10 mm/s: fine enough for a drag blade, coarse enough to click (our choice). */
export const speedStepMmS = 10
const speedRange = { min: 10, max: 2000 }
const powerRange = { min: 1, max: 100 }

export function tunableFields(toolKind: RecipeToolKind): ('force' | 'passes' | 'speedMmS' | 'powerPercent')[] {
  return toolKind === 'blade' ? ['force', 'passes', 'speedMmS'] : ['powerPercent', 'passes', 'speedMmS']
}

export function currentValue(recipe: Recipe, pending: PendingValues, field: keyof PendingValues): number | null {
  return pending[field] ?? recipe[field]
}

/** The value one step up (+1) or down (−1) from `value`, kept inside the field's range. */
export function nextValue(value: number, field: keyof PendingValues, direction: 1 | -1, settings: MaterialSettings): number {
  switch (field) {
    case 'force':
      return stepForce(value, direction, settings.forceStep, { min: settings.forceMin, max: settings.forceMax })
    case 'powerPercent':
      return Math.round(clamp(value + direction * settings.powerStepPercent, powerRange) * 10) / 10
    case 'passes':
      return clamp(value + direction, { min: 1, max: maxPasses })
    case 'speedMmS':
      return clamp(value + direction * speedStepMmS, speedRange)
  }
}

/**
 * One step of a field: force by the workspace's step and range, power by its step up to 100 %, passes one at a
 * time, speed by 10 mm/s. A value back at the recipe's own leaves the pending set.
 */
export function stepValue(recipe: Recipe, pending: PendingValues, field: keyof PendingValues, direction: 1 | -1, settings: MaterialSettings): PendingValues {
  const value = currentValue(recipe, pending, field)
  if (value === null) return pending
  const next = nextValue(value, field, direction, settings)
  const result = { ...pending }
  if (next === recipe[field]) delete result[field]
  else result[field] = next
  return result
}

export function canStep(recipe: Recipe, pending: PendingValues, field: keyof PendingValues, direction: 1 | -1, settings: MaterialSettings): boolean {
  const value = currentValue(recipe, pending, field)
  return value !== null && nextValue(value, field, direction, settings) !== value
}

export function hasPending(pending: PendingValues): boolean {
  return Object.keys(pending).length > 0
}

/** The change the person is about to save, in words: "force 185 → 200, passes 1 → 2". */
export function describePending(recipe: Recipe, pending: PendingValues, labels: Record<RecipeField, string>): string {
  return (Object.keys(pending) as (keyof PendingValues)[]).map((field) => `${labels[field].toLowerCase()} ${recipe[field]} → ${pending[field]}`).join(', ')
}

/** The add-recipe and change-blade form (MaterialRecipeDialog). */
export interface RecipeForm {
  bladeType: BladeType
  bladeAngleDeg: number | null
  force: number
  passes: number
  speedMmS: number
  powerPercent: number
  reason: string
}
