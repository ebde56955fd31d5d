import { describe, expect, it } from 'vitest'
import {
  addItem,
  addSheet,
  applyArrangement,
  deletePlacements,
  duplicatePlacements,
  mirrorPlacements,
  movePlacements,
  movePlacementsToSheet,
  placePlacements,
  removeItem,
  removeSheet,
  renameLayout,
  rotatePlacements,
  setItemQuantity,
  setOptions,
  setPlacementsLocked,
  setStock,
  updateItem,
} from '../../../shared/layout/actions.js'
import type { LayoutDocument } from '../../../shared/layout/document.js'
import { createHistory } from '../../../shared/layout/history.js'
import { createShapeCache } from '../../../shared/layout/placedGeometry.js'
import { BAR_ID, PAIR_ID, SQUARE_ID, newTestId, placement, testDesigns, testDocument } from './editorFixtures.js'

const designs = testDesigns()
const environment = { designs, shapes: createShapeCache(designs), newId: newTestId }

function startingDocument(): LayoutDocument {
  return testDocument([
    placement('s1', SQUARE_ID, 10, 10),
    placement('s2', SQUARE_ID, 100, 10),
    placement('bar', BAR_ID, 10, 100),
    placement('other-sheet', SQUARE_ID, 10, 10, { sheet: 1 }),
  ])
}

const clone = <T>(value: T): T => JSON.parse(JSON.stringify(value)) as T

/** Each editor action, applied to the starting document: what it must have changed. */
const actions: { name: string; act: (document: LayoutDocument) => LayoutDocument; check: (after: LayoutDocument) => void }[] = [
  {
    name: 'move',
    act: (document) => movePlacements(document, ['s1'], 5, -3),
    check: (after) => expect(after.placements[0]).toMatchObject({ xMm: 15, yMm: 7 }),
  },
  {
    name: 'drag to another sheet',
    act: (document) => placePlacements(document, new Map([['s2', { sheet: 1, xMm: 120, yMm: 40 }]])),
    check: (after) => expect(after.placements[1]).toMatchObject({ sheet: 1, xMm: 120, yMm: 40 }),
  },
  {
    name: 'move to sheet',
    act: (document) => movePlacementsToSheet(document, ['s1'], 1),
    check: (after) => expect(after.placements[0]!.sheet).toBe(1),
  },
  {
    name: 'rotate',
    act: (document) => rotatePlacements(document, ['s1'], environment).document,
    // A square turned a quarter about its centre (35, 35) covers the same ground: 90° moves its origin to (60, 10).
    check: (after) => expect(after.placements[0]).toMatchObject({ angleDeg: 90, xMm: 60, yMm: 10 }),
  },
  {
    name: 'mirror',
    act: (document) => mirrorPlacements(document, ['s2'], environment).document,
    check: (after) => expect(after.placements[1]).toMatchObject({ mirrored: true, xMm: 150, yMm: 10 }),
  },
  {
    name: 'duplicate',
    act: (document) => duplicatePlacements(document, ['s1', 'bar'], environment, 5, 5).document,
    check: (after) => {
      expect(after.placements).toHaveLength(6)
      expect(after.placements[4]).toMatchObject({ designId: SQUARE_ID, xMm: 15, yMm: 15, locked: false })
    },
  },
  {
    name: 'delete',
    act: (document) => deletePlacements(document, ['s2']).document,
    check: (after) => expect(after.placements.map((entry) => entry.id)).toEqual(['s1', 'bar', 'other-sheet']),
  },
  {
    name: 'lock',
    act: (document) => setPlacementsLocked(document, ['s1', 'bar'], true),
    check: (after) => expect(after.placements.filter((entry) => entry.locked).map((entry) => entry.id)).toEqual(['s1', 'bar']),
  },
  {
    name: 'add a sheet',
    act: (document) => addSheet(document),
    check: (after) => expect(after.stock).toMatchObject({ kind: 'sheets', sheetCount: 3 }),
  },
  {
    name: 'remove a sheet',
    act: (document) => removeSheet(document, 0),
    check: (after) => {
      expect(after.stock).toMatchObject({ sheetCount: 1 })
      expect(after.placements.map((entry) => [entry.id, entry.sheet])).toEqual([['other-sheet', 0]])
    },
  },
  {
    name: 'more copies of an item',
    act: (document) => setItemQuantity(document, SQUARE_ID, 4, environment),
    check: (after) => {
      expect(after.items[0]!.quantity).toBe(4)
      expect(after.placements.filter((entry) => entry.designId === SQUARE_ID)).toHaveLength(5)
    },
  },
  {
    name: 'fewer copies of an item',
    act: (document) => setItemQuantity(document, SQUARE_ID, 1, environment),
    check: (after) => {
      expect(after.items[0]!.quantity).toBe(1)
      // The newest unlocked square goes first.
      expect(after.placements.map((entry) => entry.id)).toEqual(['s1', 's2', 'bar'])
    },
  },
  {
    name: 'change item options',
    act: (document) => updateItem(document, SQUARE_ID, { rotation: 'any-step', rotationStepDeg: 15, mirror: 'never', grainLock: true }),
    check: (after) => expect(after.items[0]).toMatchObject({ rotation: 'any-step', rotationStepDeg: 15, mirror: 'never', grainLock: true }),
  },
  {
    name: 'add an item',
    act: (document) => addItem(document, { designId: PAIR_ID, quantity: 2, rotation: 'none', mirror: 'never', grainLock: false }, environment),
    check: (after) => {
      expect(after.items.map((item) => item.designId)).toContain(PAIR_ID)
      // Two copies of a design of two pieces placed piece by piece.
      expect(after.placements.filter((entry) => entry.designId === PAIR_ID).map((entry) => entry.pieceIndex).sort()).toEqual([0, 0, 1, 1])
    },
  },
  {
    name: 'remove an item',
    act: (document) => removeItem(document, BAR_ID),
    check: (after) => {
      expect(after.items.map((item) => item.designId)).toEqual([SQUARE_ID])
      expect(after.placements.some((entry) => entry.designId === BAR_ID)).toBe(false)
    },
  },
  {
    name: 'change the stock',
    act: (document) => setStock(document, { kind: 'sheets', widthMm: 210, heightMm: 297, sheetCount: 2 }),
    check: (after) => expect(after.stock).toEqual({ kind: 'sheets', widthMm: 210, heightMm: 297, sheetCount: 2 }),
  },
  {
    name: 'change spacing and margin',
    act: (document) => setOptions(document, { spacingMm: 4, marginMm: 0 }),
    check: (after) => expect(after.options).toMatchObject({ spacingMm: 4, marginMm: 0 }),
  },
  {
    name: 'rename',
    act: (document) => renameLayout(document, 'Spring market stickers'),
    check: (after) => expect(after.name).toBe('Spring market stickers'),
  },
  {
    name: 'snap to a grid',
    act: (document) => setOptions(document, { snapToGrid: true, gridMm: 10 }),
    check: (after) => expect(after.options).toMatchObject({ snapToGrid: true, gridMm: 10 }),
  },
  {
    name: 'apply an auto-arrangement',
    act: (document) =>
      applyArrangement(
        setPlacementsLocked(document, ['bar'], true),
        [placement('n1', SQUARE_ID, 5, 5), placement('n2', SQUARE_ID, 57, 5)],
        { kind: 'sheets', widthMm: 300, heightMm: 200, sheetCount: 1 },
      ),
    check: (after) => {
      expect(after.placements.map((entry) => entry.id)).toEqual(['bar', 'n1', 'n2'])
      expect(after.stock).toMatchObject({ sheetCount: 1 })
    },
  },
]

describe('undo and redo of every editor action', () => {
  for (const action of actions) {
    it(`undoes and redoes: ${action.name}`, () => {
      const start = startingDocument()
      const pristine = clone(start)
      const history = createHistory(start)
      const after = history.apply(action.name, action.act(start))
      expect(after).not.toBe(start)
      action.check(after)
      const afterCopy = clone(after)

      expect(history.canUndo).toBe(true)
      expect(history.undoLabel).toBe(action.name)
      expect(history.undo()).toBe(start)
      // Actions never change the document they were given.
      expect(start).toEqual(pristine)

      expect(history.canRedo).toBe(true)
      expect(history.redo()).toBe(after)
      expect(after).toEqual(afterCopy)
      expect(history.canRedo).toBe(false)
    })
  }

  it('steps back and forth through several actions in order, and a new action drops what was undone', () => {
    const start = startingDocument()
    const history = createHistory(start)
    const moved = history.apply('move', movePlacements(start, ['s1'], 10, 0))
    const locked = history.apply('lock', setPlacementsLocked(moved, ['s1'], true))
    const deleted = history.apply('delete', deletePlacements(locked, ['s2']).document)
    expect(history.undo()).toBe(locked)
    expect(history.undo()).toBe(moved)
    expect(history.redo()).toBe(locked)
    history.apply('add a sheet', addSheet(locked))
    expect(history.canRedo).toBe(false)
    expect(history.undo()).toBe(locked)
    expect(history.present).not.toBe(deleted)
    expect(history.undo()).toBe(moved)
    expect(history.undo()).toBe(start)
    expect(history.undo()).toBeNull()
  })

  it('makes a run of nudges with one key a single step', () => {
    const start = startingDocument()
    const history = createHistory(start)
    let document = start
    for (let step = 0; step < 5; step++) document = history.apply('nudge', movePlacements(document, ['s1'], 1, 0), 'nudge:s1')
    expect(document.placements[0]!.xMm).toBe(15)
    expect(history.undo()).toBe(start)
    expect(history.canUndo).toBe(false)
  })

  it('leaves locked pieces where they are', () => {
    const locked = setPlacementsLocked(startingDocument(), ['s1'], true)
    expect(movePlacements(locked, ['s1'], 5, 5)).toBe(locked)
    expect(rotatePlacements(locked, ['s1'], environment).document).toBe(locked)
    expect(deletePlacements(locked, ['s1'])).toEqual({ document: locked, skipped: 1 })
  })

  it('turns only through the angles an item allows, and mirrors only where it may', () => {
    const start = startingDocument()
    // The bar's item allows no turn and no mirror.
    expect(rotatePlacements(start, ['bar'], environment)).toEqual({ document: start, skipped: 1 })
    expect(mirrorPlacements(start, ['bar'], environment)).toEqual({ document: start, skipped: 1 })
    // Quarter turns: 0 → 90 → 180 → 270 → 0, and back the other way.
    let document = start
    const angles: number[] = []
    for (let step = 0; step < 4; step++) {
      document = rotatePlacements(document, ['s1'], environment).document
      angles.push(document.placements[0]!.angleDeg)
    }
    expect(angles).toEqual([90, 180, 270, 0])
    expect(rotatePlacements(start, ['s1'], environment, -1).document.placements[0]!.angleDeg).toBe(270)
  })
})
