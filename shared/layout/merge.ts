import type { LayoutItem, LayoutPlacement } from '../schemas/layouts.js'
import type { LayoutDocument } from './document.js'

/** JSON with object keys in sorted order, so two equal values compare equal whatever order their keys were set in. */
function canonical(value: unknown): string {
  return JSON.stringify(value, (_key, entry: unknown) => {
    if (entry === null || typeof entry !== 'object' || Array.isArray(entry)) return entry
    const sorted: Record<string, unknown> = {}
    for (const key of Object.keys(entry).sort()) sorted[key] = (entry as Record<string, unknown>)[key]
    return sorted
  })
}

const same = (a: unknown, b: unknown) => a === b || canonical(a) === canonical(b)

/**
 * Keyed lists merged three ways: an entry I added, changed or deleted since `base` takes my side; anything else takes
 * theirs. Their order comes first, my new entries after it.
 */
function mergeKeyed<T>(base: readonly T[], mine: readonly T[], theirs: readonly T[], keyOf: (entry: T) => string): T[] {
  const baseBy = new Map(base.map((entry) => [keyOf(entry), entry]))
  const mineBy = new Map(mine.map((entry) => [keyOf(entry), entry]))
  const result: T[] = []
  const seen = new Set<string>()
  for (const entry of theirs) {
    const key = keyOf(entry)
    seen.add(key)
    const before = baseBy.get(key)
    const mineNow = mineBy.get(key)
    if (before === undefined) {
      // Theirs is new; if I added the same key too, mine wins.
      result.push(mineNow ?? entry)
    } else if (mineNow === undefined) {
      // I deleted it: it stays deleted unless they changed it since.
      if (!same(before, entry)) result.push(entry)
    } else {
      result.push(same(before, mineNow) ? entry : mineNow)
    }
  }
  for (const entry of mine) {
    const key = keyOf(entry)
    if (seen.has(key)) continue
    // Mine and not theirs: either I added it (keep), or they deleted it and I left it alone (drop).
    const before = baseBy.get(key)
    if (before === undefined || !same(before, entry)) result.push(entry)
  }
  return result
}

/**
 * My unsaved changes re-applied on top of a newer saved version (after a stale save was refused): placements by id and
 * items by design, field by field for name, stock and options. Where both sides changed the same thing, mine wins:
 * the maker asked to re-apply their change.
 */
export function mergeLayoutChanges(base: LayoutDocument, mine: LayoutDocument, theirs: LayoutDocument): LayoutDocument {
  const pick = <K extends 'name' | 'stock' | 'options'>(key: K): LayoutDocument[K] => (same(base[key], mine[key]) ? theirs[key] : mine[key])
  const placements = mergeKeyed<LayoutPlacement>(base.placements, mine.placements, theirs.placements, (placement) => placement.id)
  const items = mergeKeyed<LayoutItem>(base.items, mine.items, theirs.items, (item) => item.designId)
  const designIds = new Set(items.map((item) => item.designId))
  return {
    name: pick('name'),
    stock: pick('stock'),
    options: pick('options'),
    items,
    // A design taken out on one side takes its pieces with it.
    placements: placements.filter((placement) => designIds.has(placement.designId)),
  }
}

/** Whether two documents say the same (for "unsaved" and for offering a draft back). */
export function sameDocument(a: LayoutDocument, b: LayoutDocument): boolean {
  return same(a, b)
}
