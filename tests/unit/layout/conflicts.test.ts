import { describe, expect, it } from 'vitest'
import { nest } from '../../../shared/nesting/nest.js'
import { conflictsOfShape, createConflictTracker, relatePolygons, type ConflictEnvironment } from '../../../shared/layout/conflicts.js'
import { createShapeCache, polygonFromRings } from '../../../shared/layout/placedGeometry.js'
import { createPieceIndex } from '../../../shared/layout/spatialIndex.js'
import type { LayoutPlacement } from '../../../shared/schemas/layouts.js'
import { FRAME_ID, PAIR_ID, SQUARE_ID, placement, rectangle, testDesigns } from './editorFixtures.js'

const square = (x: number, y: number, size = 10) => polygonFromRings(rectangle(x, y, size, size))

describe('overlap and spacing of two polygons (10 mm squares, checked by hand)', () => {
  it('squares sharing area overlap', () => {
    expect(relatePolygons(square(0, 0), square(5, 5), 0)).toBe('overlap')
    expect(relatePolygons(square(0, 0), square(9.9, 0), 2)).toBe('overlap')
  })

  it('a square wholly inside another overlaps, and so do two identical squares', () => {
    expect(relatePolygons(square(0, 0, 30), square(10, 10), 0)).toBe('overlap')
    expect(relatePolygons(square(10, 10), square(0, 0, 30), 0)).toBe('overlap')
    expect(relatePolygons(square(0, 0), square(0, 0), 0)).toBe('overlap')
  })

  it('squares that touch along an edge do not overlap; with spacing they are too close', () => {
    expect(relatePolygons(square(0, 0), square(10, 0), 0)).toBe('clear')
    expect(relatePolygons(square(0, 0), square(10, 0), 2)).toBe('spacing')
    expect(relatePolygons(square(0, 0), square(10, 10), 2)).toBe('spacing')
  })

  it('a gap of 1.5 mm breaks a 2 mm spacing; exactly 2 mm keeps it', () => {
    expect(relatePolygons(square(0, 0), square(11.5, 0), 2)).toBe('spacing')
    expect(relatePolygons(square(0, 0), square(12, 0), 2)).toBe('clear')
    expect(relatePolygons(square(0, 0), square(12.5, 3), 2)).toBe('clear')
  })

  it('measures corner to corner along the diagonal: √(1.5² + 1.5²) ≈ 2.12 mm is clear of 2 mm, not of 2.2 mm', () => {
    expect(relatePolygons(square(0, 0), square(11.5, 11.5), 2)).toBe('clear')
    expect(relatePolygons(square(0, 0), square(11.5, 11.5), 2.2)).toBe('spacing')
  })

  it('judges boundaries that share a line or meet at corners (labels set edge to edge)', () => {
    // Touching along part of an edge, shifted along it.
    expect(relatePolygons(square(0, 0), square(10, 5), 0)).toBe('clear')
    // Corner to corner.
    expect(relatePolygons(square(0, 0), square(10, 10), 0)).toBe('clear')
    // A 20 × 5 strip over the top of the square: both outlines share the top and left edges, and the strip overlaps.
    expect(relatePolygons(square(0, 0), polygonFromRings(rectangle(0, 0, 20, 5)), 0)).toBe('overlap')
    // A diamond with its corners on the square's edge midpoints lies inside it.
    const diamond = polygonFromRings([
      [5, 0],
      [10, 5],
      [5, 10],
      [0, 5],
    ])
    expect(relatePolygons(square(0, 0), diamond, 0)).toBe('overlap')
  })

  it('a piece that exactly fills a window touches the frame but does not overlap it', () => {
    const frame = polygonFromRings(rectangle(0, 0, 100, 100), [[...rectangle(25, 25, 50, 50)].reverse()])
    expect(relatePolygons(square(25, 25, 50), frame, 0)).toBe('clear')
    expect(relatePolygons(square(25, 25, 50), frame, 2)).toBe('spacing')
  })

  it('a square in a frame’s window is clear of it when the window leaves room, too close when it does not, overlapping across the edge', () => {
    // Frame 0..100 with a window 25..75.
    const frame = polygonFromRings(rectangle(0, 0, 100, 100), [[...rectangle(25, 25, 50, 50)].reverse()])
    expect(relatePolygons(square(40, 40), frame, 2)).toBe('clear')
    expect(relatePolygons(frame, square(40, 40), 2)).toBe('clear')
    expect(relatePolygons(square(26, 40), frame, 2)).toBe('spacing')
    expect(relatePolygons(square(20, 40), frame, 2)).toBe('overlap')
    // A square in the frame's material, away from the window.
    expect(relatePolygons(square(5, 5), frame, 0)).toBe('overlap')
  })
})

describe('conflicts of a moved piece against the layout', () => {
  function environment(placements: LayoutPlacement[], zones: [number, number][][] = []) {
    const shapes = createShapeCache(testDesigns())
    const byId = new Map(placements.map((entry) => [entry.id, entry]))
    const shapeOf = (id: string) => (byId.has(id) ? shapes.shapeOf(byId.get(id)!) : undefined)
    const index = createPieceIndex(placements.map((entry) => ({ id: entry.id, sheet: entry.sheet, ...shapeOf(entry.id)!.box })))
    const env: ConflictEnvironment = {
      index,
      shapeOf,
      spacingMm: 2,
      usable: { minX: 5, minY: 5, maxX: 295, maxY: 195 },
      laneCount: 2,
      zonesOf: (sheet) => (sheet === 0 ? zones.map((zone) => polygonFromRings(zone)) : []),
    }
    return { env, shapes, byId, index }
  }

  it('names the piece it overlaps, the one it comes too close to, and whether it leaves the usable area', () => {
    const { env, shapes } = environment([placement('a', SQUARE_ID, 10, 10), placement('b', SQUARE_ID, 100, 10)])
    const moved = shapes.shapeOf(placement('m', SQUARE_ID, 40, 10))!
    const conflict = conflictsOfShape(moved, 0, env, () => false)
    expect(conflict.overlapWith).toEqual(['a'])
    expect(conflict.tooCloseTo).toEqual([])
    expect(conflict.outside).toBe(false)

    const near = conflictsOfShape(shapes.shapeOf(placement('m', SQUARE_ID, 151, 10))!, 0, env, () => false)
    expect(near.overlapWith).toEqual([])
    expect(near.tooCloseTo).toEqual(['b'])

    // 4 mm from the top edge with a 5 mm margin.
    const edge = conflictsOfShape(shapes.shapeOf(placement('m', SQUARE_ID, 200, 4))!, 0, env, () => false)
    expect(edge.outside).toBe(true)
    // A sheet that does not exist.
    expect(conflictsOfShape(moved, 5, env, () => false).outside).toBe(true)
  })

  it('ignores the pieces it is told to skip (the dragged piece itself and those dragged with it)', () => {
    const { env, shapes } = environment([placement('a', SQUARE_ID, 10, 10)])
    const moved = shapes.shapeOf(placement('a', SQUARE_ID, 20, 10))!
    expect(conflictsOfShape(moved, 0, env, (id) => id === 'a').overlapWith).toEqual([])
  })

  it('flags a piece on an excluded zone of its sheet, not of another sheet', () => {
    const { env, shapes } = environment([], [rectangle(100, 100, 40, 40)])
    const onZone = shapes.shapeOf(placement('m', SQUARE_ID, 120, 120))!
    expect(conflictsOfShape(onZone, 0, env, () => false).inExcludedZone).toBe(true)
    expect(conflictsOfShape(onZone, 1, env, () => false).inExcludedZone).toBe(false)
  })

  it('tracks conflicts of every piece and clears a neighbour when a piece moves away', () => {
    const placements = [placement('a', SQUARE_ID, 10, 10), placement('b', SQUARE_ID, 30, 10), placement('c', PAIR_ID, 200, 100, { pieceIndex: 1 })]
    const { env, shapes, byId, index } = environment(placements)
    const tracker = createConflictTracker(() => env)
    tracker.rebuild(byId.keys())
    expect(tracker.conflictOf('a').overlapWith).toEqual(['b'])
    expect(tracker.conflictOf('b').overlapWith).toEqual(['a'])
    expect([...tracker.conflictedIds()].sort()).toEqual(['a', 'b'])

    const moved = placement('b', SQUARE_ID, 100, 10)
    byId.set('b', moved)
    index.upsert('b', 0, shapes.shapeOf(moved)!.box)
    tracker.refresh(['b'])
    expect(tracker.conflictOf('a').overlapWith).toEqual([])
    expect([...tracker.conflictedIds()]).toEqual([])
  })

  it('finds a frame’s nested piece clear and a piece on the frame overlapping', () => {
    const placements = [placement('frame', FRAME_ID, 10, 10), placement('inside', PAIR_ID, 45, 45), placement('onTop', PAIR_ID, 12, 12)]
    const { env, byId } = environment(placements)
    const tracker = createConflictTracker(() => env)
    tracker.rebuild(byId.keys())
    expect(tracker.conflictOf('inside').overlapWith).toEqual([])
    expect(tracker.conflictOf('inside').tooCloseTo).toEqual([])
    expect(tracker.conflictOf('onTop').overlapWith).toEqual(['frame'])
  })
})

describe('agreement with the nesting engine', () => {
  it('finds no conflict in a layout the engine packed with 2 mm spacing, and finds one once a piece is pushed 1 mm towards a neighbour', () => {
    // An L of 30 × 30 mm with a 15 mm notch, and the frame of the fixtures; the engine keeps 2 mm between them and 5 mm from the edges.
    const ell: [number, number][] = [
      [0, 0],
      [30, 0],
      [30, 15],
      [15, 15],
      [15, 30],
      [0, 30],
    ]
    const frame = testDesigns().get(FRAME_ID)!.geometry.pieces[0]!
    const result = nest(
      {
        items: [
          { id: 'ell', outline: ell, quantity: 8, rotationsDeg: [0, 90, 180, 270] },
          { id: 'frame', outline: frame.outline, holes: frame.holes, quantity: 2, rotationsDeg: [0, 90] },
        ],
        stock: { kind: 'sheets', width: 210, height: 297 },
        spacing: 2,
        margin: 5,
      },
      { maxEvaluations: 2, seed: 3 },
    )
    expect(result.unplaced).toEqual([])
    const ellDesign = { keepTogether: false, geometry: { pieces: [{ outline: ell, holes: [], areaMm2: 675, cutLengthMm: 120, bbox: { minX: 0, minY: 0, maxX: 30, maxY: 30 } }], cutLines: [] } }
    const designs = new Map([...testDesigns(), ['ell', ellDesign]])
    const shapes = createShapeCache(designs)
    const placements = result.placements.map((entry, index) =>
      placement(`p${index}`, entry.itemId === 'ell' ? 'ell' : FRAME_ID, entry.x, entry.y, { sheet: entry.sheet, angleDeg: entry.angleDeg, mirrored: entry.mirrored }),
    )
    const byId = new Map(placements.map((entry) => [entry.id, entry]))
    const index = createPieceIndex(placements.map((entry) => ({ id: entry.id, sheet: entry.sheet, ...shapes.shapeOf(entry)!.box })))
    const env: ConflictEnvironment = {
      index,
      shapeOf: (id) => shapes.shapeOf(byId.get(id)!),
      spacingMm: 2,
      usable: { minX: 5, minY: 5, maxX: 205, maxY: 292 },
      laneCount: result.sheetCount,
      zonesOf: () => [],
    }
    const tracker = createConflictTracker(() => env)
    tracker.rebuild(byId.keys())
    expect([...tracker.conflictedIds()]).toEqual([])

    // Every piece, moved 1 mm each way in turn, either stays clear (room on that side) or breaks the spacing; at least one breaks it.
    let broken = 0
    for (const entry of placements) {
      for (const [dx, dy] of [[1, 0], [-1, 0], [0, 1], [0, -1]] as const) {
        const moved = shapes.shapeOf({ ...entry, xMm: entry.xMm + dx, yMm: entry.yMm + dy })!
        const conflict = conflictsOfShape(moved, entry.sheet, env, (id) => id === entry.id)
        expect(conflict.overlapWith).toEqual([])
        if (conflict.tooCloseTo.length || conflict.outside) broken += 1
      }
    }
    expect(broken).toBeGreaterThan(0)
  })
})
