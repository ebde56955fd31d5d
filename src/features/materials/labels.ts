import type { BladeType, MaterialCategory, MaterialSummary, Recipe, RecipeField, RecipeValues, TestCutOutcome, UnitSystem } from '../../../shared/schemas/index'
import { formatBasisWeight } from '../../../shared/materials/basisWeight'
import { formatLength } from '../../../shared/units'

export const categoryLabels: Record<MaterialCategory, string> = {
  vinyl: 'Vinyl',
  film: 'Heat-transfer film',
  paper: 'Paper',
  cardstock: 'Cardstock',
  board: 'Board',
  leather: 'Faux leather',
  fabric: 'Fabric and felt',
  foam: 'Foam',
  other: 'Other',
}

export const categoryIcons: Record<MaterialCategory, string> = {
  vinyl: 'layers',
  film: 'iron',
  paper: 'description',
  cardstock: 'style',
  board: 'inventory_2',
  leather: 'texture',
  fabric: 'checkroom',
  foam: 'bubble_chart',
  other: 'category',
}

export const categoryOptions = (Object.keys(categoryLabels) as MaterialCategory[]).map((value) => ({ value, label: categoryLabels[value] }))

export const bladeTypeLabels: Record<BladeType, string> = {
  standard: 'Standard blade',
  'deep-cut': 'Deep-cut blade',
  fabric: 'Fabric blade',
  rotary: 'Rotary blade',
}

export const bladeTypeOptions = (Object.keys(bladeTypeLabels) as BladeType[]).map((value) => ({ value, label: bladeTypeLabels[value] }))

export const outcomeLabels: Record<TestCutOutcome, string> = { clean: 'Clean', not_through: 'Not through', torn: 'Torn', too_deep: 'Too deep' }
export const outcomeHints: Record<TestCutOutcome, string> = {
  clean: 'Cut through, edges clean, backing intact',
  not_through: 'Parts stay attached, or the cut shows only on top',
  torn: 'Edges ragged or material dragged',
  too_deep: 'Scored the backing or the mat',
}
export const outcomeColors: Record<TestCutOutcome, string> = { clean: 'positive', not_through: 'warning', torn: 'negative', too_deep: 'negative' }
export const outcomeIcons: Record<TestCutOutcome, string> = { clean: 'check_circle', not_through: 'content_cut', torn: 'broken_image', too_deep: 'vertical_align_bottom' }

export const fieldLabels: Record<RecipeField, string> = {
  bladeType: 'Blade',
  bladeAngleDeg: 'Blade angle',
  force: 'Force',
  passes: 'Passes',
  speedMmS: 'Speed',
  powerPercent: 'Power',
}

/** One recipe value for people: "45°", "200 mm/s", "22 %", "Deep-cut blade". */
export function formatRecipeValue(field: RecipeField, value: number | string | null): string {
  if (value === null) return '—'
  switch (field) {
    case 'bladeType':
      return bladeTypeLabels[value as BladeType] ?? String(value)
    case 'bladeAngleDeg':
      return `${value}°`
    case 'speedMmS':
      return `${value} mm/s`
    case 'powerPercent':
      return `${value} %`
    case 'passes':
      return Number(value) === 1 ? '1 pass' : `${value} passes`
    default:
      return String(value)
  }
}

/** "Standard blade 45° · force 95 · 1 pass · 200 mm/s" or "Power 22 % · 1 pass · 100 mm/s". */
export function recipeSummary(recipe: Pick<Recipe, 'bladeType' | 'bladeAngleDeg' | 'force' | 'passes' | 'speedMmS' | 'powerPercent'> & { toolKind?: string }, toolKind = recipe.toolKind): string {
  const values = recipe as RecipeValues
  const passes = formatRecipeValue('passes', values.passes)
  const speed = formatRecipeValue('speedMmS', values.speedMmS)
  if (toolKind === 'laser') return `Power ${formatRecipeValue('powerPercent', values.powerPercent)} · ${passes} · ${speed}`
  const blade = values.bladeType ? formatRecipeValue('bladeType', values.bladeType) : 'Blade'
  const angle = values.bladeAngleDeg === null ? '' : ` ${formatRecipeValue('bladeAngleDeg', values.bladeAngleDeg)}`
  return `${blade}${angle} · force ${values.force ?? '—'} · ${passes} · ${speed}`
}

/** "216 g/m² (80 lb cover)", "80 g/m²", or null. Grammage rounds to whole g/m² as paper is labelled. */
export function formatWeight(material: Pick<MaterialSummary, 'grammageGsm' | 'basisWeight'>): string | null {
  if (material.grammageGsm === null) return null
  const gsm = `${Math.round(material.grammageGsm)} g/m²`
  return material.basisWeight ? `${gsm} (${formatBasisWeight(material.basisWeight.pounds, material.basisWeight.kind)})` : gsm
}

export function formatThickness(thicknessMm: number | null, unit: UnitSystem): string | null {
  if (thicknessMm === null) return null
  return unit === 'in' ? formatLength(thicknessMm, 'in') : `${Number(thicknessMm.toFixed(2))} mm`
}
