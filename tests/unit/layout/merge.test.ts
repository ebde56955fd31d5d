import { describe, expect, it } from 'vitest'
import { movePlacements, setOptions, setPlacementsLocked } from '../../../shared/layout/actions.js'
import { mergeLayoutChanges, sameDocument } from '../../../shared/layout/merge.js'
import { BAR_ID, SQUARE_ID, placement, testDocument } from './editorFixtures.js'

describe('re-applying unsaved changes on a newer saved version', () => {
  const base = testDocument([placement('a', SQUARE_ID, 10, 10), placement('b', SQUARE_ID, 100, 10), placement('bar', BAR_ID, 10, 100)])

  it('keeps both sides’ changes where they touch different things', () => {
    const mine = setOptions(movePlacements(base, ['a'], 5, 0), { spacingMm: 3 })
    const theirs = { ...setPlacementsLocked(movePlacements(base, ['b'], 0, 20), ['bar'], true), name: 'Renamed by a colleague' }
    const merged = mergeLayoutChanges(base, mine, theirs)
    expect(merged.name).toBe('Renamed by a colleague')
    expect(merged.options.spacingMm).toBe(3)
    expect(merged.placements.map((entry) => [entry.id, entry.xMm, entry.yMm, entry.locked])).toEqual([
      ['a', 15, 10, false],
      ['b', 100, 30, false],
      ['bar', 10, 100, true],
    ])
  })

  it('lets my change win where both changed the same piece, and keeps my deletions and additions', () => {
    const mine = { ...movePlacements(base, ['a'], 5, 0), placements: [...movePlacements(base, ['a'], 5, 0).placements.filter((entry) => entry.id !== 'b'), placement('new', SQUARE_ID, 200, 100)] }
    const theirs = movePlacements(base, ['a'], 0, 50)
    const merged = mergeLayoutChanges(base, mine, theirs)
    expect(merged.placements.map((entry) => [entry.id, entry.xMm, entry.yMm])).toEqual([
      ['a', 15, 10],
      ['bar', 10, 100],
      ['new', 200, 100],
    ])
  })

  it('compares documents whatever order their keys were written in', () => {
    const reordered = JSON.parse(JSON.stringify({ options: base.options, placements: base.placements, items: base.items, stock: base.stock, name: base.name }))
    expect(sameDocument(base, reordered)).toBe(true)
    expect(sameDocument(base, movePlacements(base, ['a'], 1, 0))).toBe(false)
  })
})
