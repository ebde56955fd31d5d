import { createStockRequestSchema, type CreateStockRequest, type StockItem, type StockKind, type UnitSystem } from '../../../shared/schemas/index'
import { matchStandardSize, standardStockSizes, type StandardStockSize } from '../../../shared/materials/standardSizes'
import { mmToUnit, unitToMm } from '../../../shared/units'
import { trimmedNumber } from '../designs/measures'

/** The stock form as typed: lengths in the person's unit, every number still text so a half-typed value stays. */
export interface StockDraft {
  kind: StockKind
  name: string
  /** False until the person types a name; until then it follows the size and material. */
  nameEdited: boolean
  width: string
  height: string
  length: string
  margin: { top: string; right: string; bottom: string; left: string }
  materialId: string | null
  price: string
  quantityOnHand: string
  supplierNote: string
}

/** Field names of the form, keyed like the API body so server messages land under the right input. */
export type StockField = 'kind' | 'name' | 'widthMm' | 'heightMm' | 'lengthMm' | 'margins.topMm' | 'margins.rightMm' | 'margins.bottomMm' | 'margins.leftMm' | 'materialId' | 'price' | 'quantityOnHand' | 'supplierNote'
export const stockFields: readonly StockField[] = ['kind', 'name', 'widthMm', 'heightMm', 'lengthMm', 'margins.topMm', 'margins.rightMm', 'margins.bottomMm', 'margins.leftMm', 'materialId', 'price', 'quantityOnHand', 'supplierNote']

const digits = (unit: UnitSystem) => (unit === 'in' ? 3 : 1)

/** A length for an input box: no unit, no trailing zeros (210, 8.268). */
export function lengthText(valueMm: number, unit: UnitSystem): string {
  return trimmedNumber(mmToUnit(valueMm, unit), digits(unit))
}

/** Text to a number; '' and anything unreadable become null (the schema then names the field). */
export function parseNumber(text: string): number | null {
  const normalised = text.trim().replace(',', '.')
  if (normalised === '') return null
  const value = Number(normalised)
  return Number.isFinite(value) ? value : null
}

/** 5 yd, the usual length of a small vinyl roll (common practice); 5 yd = 4572 mm. */
const defaultRollLengthMm = 4572

export function sizesFor(kind: StockKind): StandardStockSize[] {
  return standardStockSizes.filter((size) => size.kind === kind)
}

export function emptyStockDraft(unit: UnitSystem): StockDraft {
  const size = standardStockSizes.find((candidate) => candidate.id === (unit === 'in' ? 'sheet-12x12in' : 'a4'))!
  return applySize(
    { kind: 'sheet', name: '', nameEdited: false, width: '', height: '', length: '', margin: { top: '0', right: '0', bottom: '0', left: '0' }, materialId: null, price: '', quantityOnHand: '0', supplierNote: '' },
    size,
    unit,
  )
}

export function draftFromItem(item: StockItem, unit: UnitSystem): StockDraft {
  return {
    kind: item.kind,
    name: item.name,
    nameEdited: true,
    width: lengthText(item.widthMm, unit),
    height: item.heightMm === null ? '' : lengthText(item.heightMm, unit),
    length: item.lengthMm === null ? '' : lengthText(item.lengthMm, unit),
    margin: {
      top: lengthText(item.margins.topMm, unit),
      right: lengthText(item.margins.rightMm, unit),
      bottom: lengthText(item.margins.bottomMm, unit),
      left: lengthText(item.margins.leftMm, unit),
    },
    materialId: item.material?.id ?? null,
    price: item.price === null ? '' : String(item.price),
    quantityOnHand: String(item.quantityOnHand),
    supplierNote: item.supplierNote,
  }
}

export function applySize(draft: StockDraft, size: StandardStockSize, unit: UnitSystem): StockDraft {
  return {
    ...draft,
    kind: size.kind,
    width: lengthText(size.widthMm, unit),
    height: size.heightMm === undefined ? draft.height : lengthText(size.heightMm, unit),
    length: size.kind === 'roll' && draft.length === '' ? lengthText(defaultRollLengthMm, unit) : draft.length,
  }
}

export function standardSizeOf(draft: StockDraft, unit: UnitSystem): StandardStockSize | null {
  const width = parseNumber(draft.width)
  if (width === null) return null
  const height = parseNumber(draft.height)
  return matchStandardSize(draft.kind, unitToMm(width, unit), draft.kind === 'sheet' && height !== null ? unitToMm(height, unit) : null)
}

/** A name from what is known: "Kraft cardstock, 12 × 12 in sheet", "Matte vinyl, 24 in roll". */
export function suggestedName(draft: StockDraft, unit: UnitSystem, materialName: string | null): string {
  const standard = standardSizeOf(draft, unit)
  const size = standard
    ? standard.kind === 'roll'
      ? standard.label
      : `${standard.label} sheet`
    : draft.kind === 'roll'
      ? `${draft.width || '?'} ${unit} roll`
      : `${draft.width || '?'} × ${draft.height || '?'} ${unit} sheet`
  return materialName ? `${materialName}, ${size}` : size.charAt(0).toUpperCase() + size.slice(1)
}

/** The request the draft stands for, or field messages keyed like the API body. */
export function buildStockRequest(draft: StockDraft, unit: UnitSystem): { request: CreateStockRequest } | { errors: Partial<Record<StockField, string>> } {
  const length = (text: string) => {
    const value = parseNumber(text)
    return value === null ? (text.trim() === '' ? undefined : Number.NaN) : unitToMm(value, unit)
  }
  const margin = (text: string) => length(text) ?? 0
  const price = parseNumber(draft.price)
  const quantity = parseNumber(draft.quantityOnHand)
  const candidate = {
    kind: draft.kind,
    name: draft.name,
    widthMm: length(draft.width),
    ...(draft.kind === 'sheet' ? { heightMm: length(draft.height) } : { lengthMm: length(draft.length) }),
    margins: { topMm: margin(draft.margin.top), rightMm: margin(draft.margin.right), bottomMm: margin(draft.margin.bottom), leftMm: margin(draft.margin.left) },
    materialId: draft.materialId,
    price: draft.price.trim() === '' ? null : (price ?? Number.NaN),
    quantityOnHand: draft.quantityOnHand.trim() === '' ? 0 : (quantity ?? Number.NaN),
    supplierNote: draft.supplierNote,
  }
  const parsed = createStockRequestSchema.safeParse(candidate)
  if (parsed.success) return { request: parsed.data }
  const errors: Partial<Record<StockField, string>> = {}
  for (const issue of parsed.error.issues) {
    const key = issue.path.join('.') as StockField
    errors[key] ??= issue.message
  }
  return { errors }
}
