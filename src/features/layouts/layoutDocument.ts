import type { LayoutDocument } from '../../../shared/layout/document'
import type { CreateLayoutRequest, LayoutDetail, LayoutStock } from '../../../shared/schemas/layouts'
import type { UnitSystem } from '../../../shared/schemas/index'
import { formatLength, formatSize } from '../designs/measures'
import { defaultMarginMm, defaultSpacingMm, findPreset, presetMatching } from '../nesting/nestDraft'

/** The editable part of a layout as the server sent it. */
export function documentOf(layout: Pick<LayoutDetail, 'name' | 'stock' | 'items' | 'placements' | 'options'>): LayoutDocument {
  return { name: layout.name, stock: layout.stock, items: layout.items, placements: layout.placements, options: layout.options }
}

/** Placement ids: short, unique within a layout (the contract allows 64 characters), made here so undo and selection can rely on them. */
export function newPlacementId(): string {
  const bytes = new Uint8Array(9)
  crypto.getRandomValues(bytes)
  return `p-${Array.from(bytes, (byte) => byte.toString(36).padStart(2, '0')).join('')}`
}

/** A studio working in inches most likely keeps 12 × 12 in sheets; one in millimetres, A4 (ISO 216: 210 × 297 mm). */
export function defaultStock(unit: UnitSystem): LayoutStock {
  const preset = findPreset(unit === 'in' ? 'sheet-12x12in' : 'a4')!
  return { kind: 'sheets', widthMm: preset.widthMm, heightMm: preset.heightMm!, sheetCount: 1 }
}

export function newLayoutBody(name: string, unit: UnitSystem): CreateLayoutRequest {
  return {
    name,
    isTemplate: false,
    stock: defaultStock(unit),
    items: [],
    placements: [],
    options: { spacingMm: defaultSpacingMm, marginMm: defaultMarginMm, excludedZones: [], snapToGrid: false, gridMm: unit === 'in' ? 6.35 : 5 },
  }
}

/** "A4 sheets × 2", "Sheets 300.0 × 450.0 mm × 1", "24 in (610 mm) roll", "Remnant within 280.0 × 180.0 mm". */
export function stockSummary(stock: LayoutStock, unit: UnitSystem): string {
  if (stock.kind === 'polygon') return `Remnant within ${formatSize(stock.widthMm, stock.heightMm, unit)}`
  if (stock.kind === 'sheets') {
    const preset = presetMatching('sheets', stock.widthMm, stock.heightMm)
    return `${preset ? `${preset.label} sheets` : `Sheets ${formatSize(stock.widthMm, stock.heightMm, unit)}`} × ${stock.sheetCount}`
  }
  const preset = presetMatching('roll', stock.widthMm)
  return preset ? `${preset.label} roll` : `Roll ${formatLength(stock.widthMm, unit)} wide`
}
