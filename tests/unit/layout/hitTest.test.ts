import { describe, expect, it } from 'vitest'
import { pieceAt, piecesInBox, pointInShape } from '../../../shared/layout/hitTest.js'
import { createShapeCache } from '../../../shared/layout/placedGeometry.js'
import { createPieceIndex } from '../../../shared/layout/spatialIndex.js'
import type { LayoutPlacement } from '../../../shared/schemas/layouts.js'
import { FRAME_ID, PAIR_ID, SQUARE_ID, placement, testDesigns } from './editorFixtures.js'

/** A frame at (10, 10) (material from 10 to 110, window from 35 to 85), a square inside its window, and one apart. */
function scene(extra: LayoutPlacement[] = []) {
  const designs = testDesigns()
  const shapes = createShapeCache(designs)
  const placements = [placement('frame', FRAME_ID, 10, 10), placement('nested', SQUARE_ID, 200, 20), ...extra]
  const byId = new Map(placements.map((entry) => [entry.id, entry]))
  const shapeOf = (id: string) => shapes.shapeOf(byId.get(id)!)
  const index = createPieceIndex(placements.map((entry) => ({ id: entry.id, sheet: entry.sheet, ...shapeOf(entry.id)!.box })))
  const order = (id: string) => placements.findIndex((entry) => entry.id === id)
  return { placements, shapeOf, index, order }
}

describe('hit testing on placed pieces', () => {
  it('hits a piece on its material and misses it inside its hole', () => {
    const { shapeOf } = scene()
    const frame = shapeOf('frame')!
    expect(pointInShape(frame, 20, 20)).toBe(true)
    // The window runs from 35 to 85 on both axes: its middle is not material.
    expect(pointInShape(frame, 60, 60)).toBe(false)
    expect(pointInShape(frame, 120, 60)).toBe(false)
  })

  it('a click inside a hole misses the piece with the hole', () => {
    const { index, shapeOf, order } = scene()
    expect(pieceAt(index, shapeOf, 0, 60, 60, order)).toBeNull()
    expect(pieceAt(index, shapeOf, 0, 20, 60, order)).toBe('frame')
  })

  it('a click inside a hole finds a smaller piece nested in it', () => {
    const { index, shapeOf, order } = scene([placement('inner', PAIR_ID, 40, 40)])
    // The pair's first piece is 20 × 20 mm, here at 40..60.
    expect(pieceAt(index, shapeOf, 0, 50, 50, order)).toBe('inner')
    expect(pieceAt(index, shapeOf, 0, 70, 70, order)).toBeNull()
  })

  it('picks the topmost of overlapping pieces and only looks at the given sheet', () => {
    const { index, shapeOf, order } = scene([placement('over', SQUARE_ID, 5, 5)])
    expect(pieceAt(index, shapeOf, 0, 20, 20, order)).toBe('over')
    expect(pieceAt(index, shapeOf, 1, 20, 20, order)).toBeNull()
  })

  it('box select takes pieces whose material the box touches, not a frame whose window holds the box', () => {
    const { index, shapeOf } = scene()
    expect(piecesInBox(index, shapeOf, 0, { minX: 40, minY: 40, maxX: 80, maxY: 80 })).toEqual([])
    expect(piecesInBox(index, shapeOf, 0, { minX: 0, minY: 0, maxX: 15, maxY: 15 }).sort()).toEqual(['frame'])
    expect(piecesInBox(index, shapeOf, 0, { minX: 0, minY: 0, maxX: 300, maxY: 100 }).sort()).toEqual(['frame', 'nested'])
    // Degenerate box: nothing.
    expect(piecesInBox(index, shapeOf, 0, { minX: 20, minY: 20, maxX: 20, maxY: 60 })).toEqual([])
  })

  it('follows a turned and mirrored piece', () => {
    // The 50 × 50 square turned 90° about the origin covers x −50..0, y 0..50; moved by (100, 0) it covers 50..100.
    const designs = testDesigns()
    const shapes = createShapeCache(designs)
    const turned = shapes.shapeOf(placement('t', SQUARE_ID, 100, 0, { angleDeg: 90 }))!
    expect(turned.box).toEqual({ minX: 50, minY: 0, maxX: 100, maxY: 50 })
    expect(pointInShape(turned, 75, 25)).toBe(true)
    expect(pointInShape(turned, 125, 25)).toBe(false)
    // Mirrored (x → −x) first: covers −50..0, moved by (50, 0): 0..50.
    const mirrored = shapes.shapeOf(placement('m', SQUARE_ID, 50, 0, { mirrored: true }))!
    expect(mirrored.box).toEqual({ minX: 0, minY: 0, maxX: 50, maxY: 50 })
  })
})
