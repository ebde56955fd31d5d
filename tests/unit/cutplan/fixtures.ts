import type { DesignGeometry } from '../../../shared/schemas/designs.js'
import type { DesignForCutPlan, LayoutForCutPlan, PlacementForCutPlan } from '../../../shared/cutplan/index.js'
import { boundingBox, perimeter, signedArea } from '../../../shared/geometry/polygon.js'

export type Ring = [number, number][]

/** An axis-aligned square ring, counter-clockwise in y-down coordinates as the importer stores outlines. */
export const square = (x: number, y: number, side: number): Ring => [
  [x, y],
  [x + side, y],
  [x + side, y + side],
  [x, y + side],
]

/** A design of one piece with holes (rings as given) and cut lines; area and cut length by elementary geometry. */
export function design(name: string, outline: Ring, holes: Ring[] = [], cutLines: Ring[] = []): DesignForCutPlan {
  const geometry: DesignGeometry = {
    pieces: [
      {
        outline,
        holes,
        areaMm2: Math.abs(signedArea(outline)) - holes.reduce((sum, hole) => sum + Math.abs(signedArea(hole)), 0),
        cutLengthMm: perimeter(outline) + holes.reduce((sum, hole) => sum + perimeter(hole), 0),
        bbox: boundingBox(outline),
      },
    ],
    cutLines: cutLines.map((points) => ({ points, lengthMm: perimeter(points, false) })),
  }
  return { name, geometry }
}

export function placed(id: string, designId: string, xMm: number, yMm: number, extra: Partial<PlacementForCutPlan> = {}): PlacementForCutPlan {
  return { id, designId, pieceIndex: 0, sheet: 0, xMm, yMm, angleDeg: 0, mirrored: false, ...extra }
}

export function sheetLayout(placements: PlacementForCutPlan[], widthMm = 300, heightMm = 300, sheetCount = 1): LayoutForCutPlan {
  return { stock: { kind: 'sheets', widthMm, heightMm, sheetCount }, placements, options: { marginMm: 0 } }
}

/** Small deterministic generator (LCG, Numerical Recipes constants) so generated sheets are the same on every run. */
export function seeded(seed: number): () => number {
  let state = seed >>> 0
  return () => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0
    return state / 2 ** 32
  }
}
