import type { DesignGeometry, DesignPiece } from '../../../shared/schemas/designs.js'
import type { LayoutDocument } from '../../../shared/layout/document.js'
import type { DesignForLayout } from '../../../shared/layout/figures.js'
import type { LayoutPlacement } from '../../../shared/schemas/layouts.js'

type Ring = [number, number][]

/** An axis-aligned rectangle, counter-clockwise in y-down drawing terms as the importer stores outlines (positive area). */
export const rectangle = (x: number, y: number, width: number, height: number): Ring => [
  [x, y],
  [x + width, y],
  [x + width, y + height],
  [x, y + height],
]

const reversed = (ring: Ring): Ring => [...ring].reverse()

/** A piece with its area and perimeter worked out by hand from rectangles. */
export function rectanglePiece(width: number, height: number, hole?: { x: number; y: number; width: number; height: number }): DesignPiece {
  const holes = hole ? [reversed(rectangle(hole.x, hole.y, hole.width, hole.height))] : []
  const holeArea = hole ? hole.width * hole.height : 0
  const holeLength = hole ? 2 * (hole.width + hole.height) : 0
  return {
    outline: rectangle(0, 0, width, height),
    holes,
    areaMm2: width * height - holeArea,
    cutLengthMm: 2 * (width + height) + holeLength,
    bbox: { minX: 0, minY: 0, maxX: width, maxY: height },
  }
}

export function designOf(pieces: DesignPiece[], keepTogether = false, cutLines: DesignGeometry['cutLines'] = []): DesignForLayout {
  return { keepTogether, geometry: { pieces, cutLines } }
}

/** Ids in the shape of real design ids (the layout schema wants UUIDs). */
export const SQUARE_ID = '00000000-0000-4000-8000-000000000001'
export const FRAME_ID = '00000000-0000-4000-8000-000000000002'
export const PAIR_ID = '00000000-0000-4000-8000-000000000003'
export const BAR_ID = '00000000-0000-4000-8000-000000000004'

/**
 * A 50 × 50 mm square; a 100 × 100 mm frame with a 50 × 50 mm window in its middle; a design of two 20 × 20 mm
 * squares (the second drawn 30 mm to the right) placed piece by piece; a 40 × 10 mm bar.
 */
export function testDesigns(): Map<string, DesignForLayout> {
  const secondSquare: DesignPiece = { ...rectanglePiece(20, 20), outline: rectangle(30, 0, 20, 20), bbox: { minX: 30, minY: 0, maxX: 50, maxY: 20 } }
  return new Map([
    [SQUARE_ID, designOf([rectanglePiece(50, 50)])],
    [FRAME_ID, designOf([rectanglePiece(100, 100, { x: 25, y: 25, width: 50, height: 50 })])],
    [PAIR_ID, designOf([rectanglePiece(20, 20), secondSquare])],
    [BAR_ID, designOf([rectanglePiece(40, 10)])],
  ])
}

let counter = 0
export const newTestId = () => `piece-${++counter}`

export function placement(id: string, designId: string, xMm: number, yMm: number, extra: Partial<LayoutPlacement> = {}): LayoutPlacement {
  return { id, designId, pieceIndex: 0, sheet: 0, xMm, yMm, angleDeg: 0, mirrored: false, locked: false, ...extra }
}

/** A 300 × 200 mm sheet (two of them), 5 mm margin, 2 mm spacing, with the given pieces. */
export function testDocument(placements: LayoutPlacement[] = []): LayoutDocument {
  return {
    name: 'Test layout',
    stock: { kind: 'sheets', widthMm: 300, heightMm: 200, sheetCount: 2 },
    items: [
      { designId: SQUARE_ID, quantity: 2, rotation: 'quarter-turns', mirror: 'allowed', grainLock: false },
      { designId: BAR_ID, quantity: 1, rotation: 'none', mirror: 'never', grainLock: false },
    ],
    placements,
    options: { spacingMm: 2, marginMm: 5, excludedZones: [], snapToGrid: false, gridMm: 5 },
  }
}
