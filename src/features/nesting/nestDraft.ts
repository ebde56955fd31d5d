import {
  createNestRunRequestSchema,
  type CreateNestRunRequest,
  type DesignSummary,
  type UnitSystem,
  type mirrorPolicies,
  type rotationPolicies,
} from '../../../shared/schemas/index'
import { mmToUnit, unitToMm } from '../../../shared/units'
import { trimmedNumber } from '../designs/measures'
import { standardStockSizes } from '../../../shared/materials/standardSizes'

export type RotationPolicy = (typeof rotationPolicies)[number]
export type MirrorPolicy = (typeof mirrorPolicies)[number]
export type StockKind = 'sheets' | 'roll'

/** The server's defaults (shared/schemas/nesting.ts), shown in the form and sent as they are when left alone. */
export const defaultSpacingMm = 2
export const defaultMarginMm = 5
export const defaultTimeBudgetSeconds = 20
export const defaultRotationStepDeg = 15
export const quantityLimits = { min: 1, max: 2000 } as const
export const timeBudgetLimits = { min: 1, max: 600 } as const

/** One design of the run as the form holds it; `key` keeps rows stable while others are removed. */
export interface NestItemDraft {
  key: number
  design: DesignSummary
  /** Null while the box is empty. */
  quantity: number | null
  rotation: RotationPolicy
  rotationStepDeg: number | null
  mirror: MirrorPolicy
  grainLock: boolean
}

export interface NestStockPreset {
  id: string
  kind: StockKind
  label: string
  widthMm: number
  /** Sheets only. */
  heightMm?: number
}

/**
 * Common sizes on a studio's shelf: the shared standard sizes (shared/materials/standardSizes.ts, with their
 * sources), as nest-run stocks. Rolls are labelled with their width in both units, as the run form shows them.
 */
export const stockPresets: readonly NestStockPreset[] = standardStockSizes.map((size) =>
  size.kind === 'roll'
    ? { id: size.id, kind: 'roll', label: `${Math.round(size.widthMm / 25.4)} in (${Math.round(size.widthMm)} mm)`, widthMm: size.widthMm }
    : { id: size.id, kind: 'sheets', label: size.label, widthMm: size.widthMm, heightMm: size.heightMm },
)

export function presetsFor(kind: StockKind): NestStockPreset[] {
  return stockPresets.filter((preset) => preset.kind === kind)
}

export function findPreset(id: string | null): NestStockPreset | null {
  return stockPresets.find((preset) => preset.id === id) ?? null
}

/** A stock of its own outline picked from the shelf (a sheet remnant), sent as polygon stock. */
export interface NestRemnantDraft {
  /** Null for the outline of an earlier run loaded again. */
  stockItemId: string | null
  name: string
  outline: [number, number][]
  holes: [number, number][][]
}

/** Stock as typed, in the person's unit; which preset it is follows from the size (presetOfDraft). */
export interface NestStockDraft {
  kind: StockKind
  width: string
  height: string
  /** Roll only, optional: how much of the roll is on hand. */
  length: string
  /** Set when a sheet remnant is picked: it takes the place of the size typed above. */
  remnant?: NestRemnantDraft | null
}

export interface NestSettingsDraft {
  spacing: string
  margin: string
  timeBudgetSeconds: number | null
}

const lengthDigits = (unit: UnitSystem) => (unit === 'in' ? 3 : 1)

/** A length for an input box: no unit, no trailing zeros (210, 8.268). */
export function lengthText(valueMm: number, unit: UnitSystem): string {
  return trimmedNumber(mmToUnit(valueMm, unit), lengthDigits(unit))
}

export function parseNumber(text: string): number | null {
  const normalised = text.trim().replace(',', '.')
  if (normalised === '') return null
  const value = Number(normalised)
  return Number.isFinite(value) ? value : null
}

export function stockDraftForPreset(preset: NestStockPreset, unit: UnitSystem, length = ''): NestStockDraft {
  return {
    kind: preset.kind,
    width: lengthText(preset.widthMm, unit),
    height: preset.heightMm === undefined ? '' : lengthText(preset.heightMm, unit),
    length,
  }
}

/** A studio working in inches most likely keeps 12 × 12 in sheets; one in millimetres, A4. */
export function defaultStockDraft(unit: UnitSystem): NestStockDraft {
  return stockDraftForPreset(findPreset(unit === 'in' ? 'sheet-12x12in' : 'a4')!, unit)
}

export function defaultSettingsDraft(unit: UnitSystem): NestSettingsDraft {
  return { spacing: lengthText(defaultSpacingMm, unit), margin: lengthText(defaultMarginMm, unit), timeBudgetSeconds: defaultTimeBudgetSeconds }
}

/** The preset a size is, either way round (so a run loaded again, or a turned sheet, still shows "A4"). */
export function presetMatching(kind: StockKind, widthMm: number, heightMm?: number): NestStockPreset | null {
  const close = (a: number, b: number) => Math.abs(a - b) < 0.05
  return (
    presetsFor(kind).find((preset) => {
      if (kind === 'roll') return close(preset.widthMm, widthMm)
      const height = preset.heightMm ?? 0
      return (close(preset.widthMm, widthMm) && close(height, heightMm ?? 0)) || (close(height, widthMm) && close(preset.widthMm, heightMm ?? 0))
    }) ?? null
  )
}

/** The preset the typed stock is, or null for a size of the person's own. */
export function presetOfDraft(stock: NestStockDraft, unit: UnitSystem): NestStockPreset | null {
  const width = parseNumber(stock.width)
  const height = parseNumber(stock.height)
  if (width === null || (stock.kind === 'sheets' && height === null)) return null
  return presetMatching(stock.kind, unitToMm(width, unit), height === null ? undefined : unitToMm(height, unit))
}

/** Field messages keyed by the request body's dotted path, as the server keys them (`stock.widthMm`, `items.0.quantity`). */
export type NestFieldErrors = Record<string, string>

type BuildResult = { request: CreateNestRunRequest; errors: null } | { request: null; errors: NestFieldErrors }

/**
 * The request in millimetres, or a message per field. A preset size or a default left as shown is sent as its
 * exact millimetre value, so converting an inch display back cannot nudge it. The same zod schema as the server's
 * checks the result, so the wording is the same before and after a round trip.
 */
export function buildNestRequest(items: readonly NestItemDraft[], stock: NestStockDraft, settings: NestSettingsDraft, unit: UnitSystem): BuildResult {
  const errors: NestFieldErrors = {}
  const lengthMm = (text: string, knownMm: readonly number[], field: string, required: boolean): number | undefined => {
    const known = knownMm.find((valueMm) => text.trim() === lengthText(valueMm, unit))
    if (known !== undefined) return known
    const value = parseNumber(text)
    if (value === null) {
      if (required || text.trim() !== '') errors[field] = 'Enter a number'
      return undefined
    }
    return unitToMm(value, unit)
  }

  // Either side of a preset, so a sheet turned a quarter keeps its exact size too.
  const presetSidesMm = presetsFor(stock.kind).flatMap((preset) => (preset.heightMm === undefined ? [preset.widthMm] : [preset.widthMm, preset.heightMm]))
  const remnant = stock.remnant
  const requestStock: CreateNestRunRequest['stock'] = remnant
    ? { kind: 'polygon', outline: remnant.outline, ...(remnant.holes.length > 0 ? { holes: remnant.holes } : {}) }
    : stock.kind === 'sheets'
      ? { kind: 'sheets', widthMm: lengthMm(stock.width, presetSidesMm, 'stock.widthMm', true) ?? 0, heightMm: lengthMm(stock.height, presetSidesMm, 'stock.heightMm', true) ?? 0 }
      : { kind: 'roll', widthMm: lengthMm(stock.width, presetSidesMm, 'stock.widthMm', true) ?? 0, maxLengthMm: lengthMm(stock.length, [], 'stock.maxLengthMm', false) }

  items.forEach((item, index) => {
    if (item.quantity === null) errors[`items.${index}.quantity`] = 'Enter how many copies'
    if (item.rotation === 'any-step' && item.rotationStepDeg === null) errors[`items.${index}.rotationStepDeg`] = 'Enter a step'
  })
  if (settings.timeBudgetSeconds === null) errors.timeBudgetSeconds = 'Enter a number of seconds'

  const request: CreateNestRunRequest = {
    items: items.map((item) => ({
      designId: item.design.id,
      quantity: item.quantity ?? 0,
      rotation: item.rotation,
      ...(item.rotation === 'any-step' ? { rotationStepDeg: item.rotationStepDeg ?? 0 } : {}),
      mirror: item.mirror,
      grainLock: item.grainLock,
    })),
    stock: requestStock,
    spacingMm: lengthMm(settings.spacing, [defaultSpacingMm], 'spacingMm', true) ?? 0,
    marginMm: lengthMm(settings.margin, [defaultMarginMm], 'marginMm', true) ?? 0,
    timeBudgetSeconds: settings.timeBudgetSeconds ?? 0,
  }

  const checked = createNestRunRequestSchema.safeParse(request)
  if (!checked.success) {
    for (const issue of checked.error.issues) errors[issue.path.join('.')] ??= issue.message
  }
  return Object.keys(errors).length > 0 ? { request: null, errors } : { request, errors: null }
}

/** How many parts one copy of a design becomes: a design kept together is one, else one per piece. */
export function partsPerCopy(design: Pick<DesignSummary, 'pieceCount' | 'keepTogether'>): number {
  if (design.pieceCount === 0) return 0
  return design.keepTogether ? 1 : design.pieceCount
}
