import type { RecipeField, RecipeToolKind, RecipeValues, TestCutOutcome } from '../schemas/materials.js'
import { maxPasses } from '../schemas/materials.js'
import type { ForceRange } from './forceSteps.js'
import { clamp } from './forceSteps.js'

export type SuggestionAction = 'keep' | 'raise-force' | 'add-pass' | 'lower-force' | 'remove-pass' | 'raise-power' | 'lower-power' | 'check-setup'

export interface RecipeSuggestion {
  action: SuggestionAction
  /** Absolute values, from the recipe as cut to the suggested one; empty for keep and check-setup. */
  changes: { field: RecipeField; from: number; to: number }[]
  message: string
}

export interface SuggestionInput {
  toolKind: RecipeToolKind
  recipe: RecipeValues
  outcome: TestCutOutcome
  forceStep: number
  /** The workspace's range, or the cutter's when its maximum force is known (effectiveForceRange). */
  forceRange: ForceRange
  powerStepPercent: number
}

const powerRange: ForceRange = { min: 1, max: 100 }

const dullBladeHint = ' Ragged or torn edges on fine paper detail are also the first sign of a dulling blade: look at the blade if this repeats.'
const notThroughHint = ' If it still does not go through, check the pinch rollers, residue on the blade and the blade spring before raising further.'

/**
 * What to change after a test cut (common practice, ../shared/REFERENCES.md "Cutting practice"): not through →
 * one force step more, or one more pass once the force is at the top of the cutter's range; torn or too deep → one
 * force step less (one pass less at the bottom of the range); clean → keep. Lasers work the same way on power.
 * Pure: the same input always gives the same suggestion, so it can be recomputed whenever a test cut is read.
 */
export function suggestFromTestCut(input: SuggestionInput): RecipeSuggestion {
  const { recipe, outcome } = input
  if (outcome === 'clean') return { action: 'keep', changes: [], message: 'Clean cut: keep this recipe.' }

  const isLaser = input.toolKind === 'laser'
  const field: RecipeField = isLaser ? 'powerPercent' : 'force'
  const current = (isLaser ? recipe.powerPercent : recipe.force) ?? null
  const range = isLaser ? powerRange : input.forceRange
  const step = isLaser ? input.powerStepPercent : input.forceStep
  const noun = isLaser ? 'power' : 'force'
  const unit = isLaser ? ' %' : ''

  if (current === null) return { action: 'check-setup', changes: [], message: `This recipe has no ${noun} to tune: set one first.` }

  if (outcome === 'not_through') {
    if (current < range.max) {
      const to = clamp(roundValue(current + step, isLaser), range)
      const atTop = to === range.max && current + step > range.max
      return {
        action: isLaser ? 'raise-power' : 'raise-force',
        changes: [{ field, from: current, to }],
        message: `Not through: raise ${noun} ${atTop ? 'to the maximum' : 'one step'}, ${current}${unit} → ${to}${unit}.${isLaser ? '' : notThroughHint}`,
      }
    }
    if (recipe.passes < maxPasses) {
      return {
        action: 'add-pass',
        changes: [{ field: 'passes', from: recipe.passes, to: recipe.passes + 1 }],
        message: `Not through at the maximum ${noun} (${current}${unit}): add a pass, ${recipe.passes} → ${recipe.passes + 1}.`,
      }
    }
    return {
      action: 'check-setup',
      changes: [],
      message: `Not through at the maximum ${noun} with ${maxPasses} passes: this material may be beyond the machine. ${isLaser ? 'Check focus and the lens before anything else.' : 'Check the blade, its depth and the mat.'}`,
    }
  }

  const what = outcome === 'torn' ? 'Torn' : 'Too deep'
  const hint = outcome === 'torn' && !isLaser ? dullBladeHint : ''
  if (current > range.min) {
    const to = clamp(roundValue(current - step, isLaser), range)
    return {
      action: isLaser ? 'lower-power' : 'lower-force',
      changes: [{ field, from: current, to }],
      message: `${what}: lower ${noun} one step, ${current}${unit} → ${to}${unit}.${hint}`,
    }
  }
  if (recipe.passes > 1) {
    return {
      action: 'remove-pass',
      changes: [{ field: 'passes', from: recipe.passes, to: recipe.passes - 1 }],
      message: `${what} at the lowest ${noun}: drop a pass, ${recipe.passes} → ${recipe.passes - 1}.${hint}`,
    }
  }
  return {
    action: 'check-setup',
    changes: [],
    message: `${what} at the lowest ${noun} with one pass: ${isLaser ? 'raise the speed or check focus' : 'shorten the blade out of its holder and check its sharpness'}.${hint}`,
  }
}

/** Force is whole units; power keeps one decimal. */
function roundValue(value: number, isLaser: boolean): number {
  return isLaser ? Math.round(value * 10) / 10 : Math.round(value)
}

const fieldWords: Partial<Record<RecipeField, string>> = { force: 'force', passes: 'passes', powerPercent: 'power', speedMmS: 'speed' }

/** "force 95 → 110", for history reasons and buttons. */
export function describeChanges(changes: RecipeSuggestion['changes']): string {
  return changes.map((change) => `${fieldWords[change.field] ?? change.field} ${change.from} → ${change.to}`).join(', ')
}
