import RBush from 'rbush'
import type { Box } from '../geometry/polygon.js'

export interface IndexedPiece extends Box {
  id: string
  sheet: number
}

/**
 * The placed pieces' boxes, one R-tree per sheet, so "what is near this box on this sheet" costs log n instead of a
 * pass over every piece. Entries are replaced, not mutated, when a piece moves (rbush finds an entry by identity).
 */
export function createPieceIndex(initial: readonly IndexedPiece[] = []) {
  const trees = new Map<number, RBush<IndexedPiece>>()
  const entries = new Map<string, IndexedPiece>()

  function treeOf(sheet: number): RBush<IndexedPiece> {
    let tree = trees.get(sheet)
    if (!tree) {
      tree = new RBush<IndexedPiece>()
      trees.set(sheet, tree)
    }
    return tree
  }

  function remove(id: string): void {
    const entry = entries.get(id)
    if (!entry) return
    trees.get(entry.sheet)?.remove(entry)
    entries.delete(id)
  }

  /** Puts a piece in, or moves it (to another sheet too). */
  function upsert(id: string, sheet: number, box: Box): void {
    remove(id)
    const entry: IndexedPiece = { id, sheet, minX: box.minX, minY: box.minY, maxX: box.maxX, maxY: box.maxY }
    entries.set(id, entry)
    treeOf(sheet).insert(entry)
  }

  /** Pieces on `sheet` whose box meets `box` grown by `grow` on every side. */
  function search(sheet: number, box: Box, grow = 0): IndexedPiece[] {
    const tree = trees.get(sheet)
    if (!tree) return []
    return tree.search({ minX: box.minX - grow, minY: box.minY - grow, maxX: box.maxX + grow, maxY: box.maxY + grow })
  }

  function clear(): void {
    trees.clear()
    entries.clear()
  }

  /** Replaces everything with a bulk load, which builds a better tree than one insert at a time. */
  function load(pieces: readonly IndexedPiece[]): void {
    clear()
    const bySheet = new Map<number, IndexedPiece[]>()
    for (const piece of pieces) {
      const entry = { ...piece }
      entries.set(entry.id, entry)
      let list = bySheet.get(entry.sheet)
      if (!list) bySheet.set(entry.sheet, (list = []))
      list.push(entry)
    }
    for (const [sheet, list] of bySheet) treeOf(sheet).load(list)
  }

  if (initial.length) load(initial)

  return {
    upsert,
    remove,
    search,
    load,
    clear,
    get: (id: string): IndexedPiece | undefined => entries.get(id),
    has: (id: string): boolean => entries.has(id),
    get size() {
      return entries.size
    },
  }
}
export type PieceIndex = ReturnType<typeof createPieceIndex>
