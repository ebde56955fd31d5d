import type { Box } from '../geometry/polygon.js'
import type { LayoutPlacement } from '../schemas/layouts.js'
import { transformRing } from '../nesting/variants.js'
import { cutLineOwners, placementPieceIndices, type DesignForLayout } from './figures.js'
import { flatRing, flatRingBox, translateFlatRing, type FlatRing } from './rings.js'

/** One piece as it lies on the stock: its outline and holes (flat rings, sheet millimetres). */
export interface PlacedPolygon {
  outer: FlatRing
  holes: FlatRing[]
  box: Box
  holeBoxes: Box[]
}

/**
 * What a placement puts on a sheet: one polygon for a single piece, one per piece for a design kept together, plus the
 * cut lines that travel with it (open paths). `box` bounds the polygons and the cut lines.
 */
export interface PlacedShape {
  polygons: PlacedPolygon[]
  cutLines: FlatRing[]
  box: Box
}

export type PlacementPose = Pick<LayoutPlacement, 'designId' | 'pieceIndex' | 'angleDeg' | 'mirrored'>
export type PlacementAt = PlacementPose & Pick<LayoutPlacement, 'xMm' | 'yMm'>

const emptyBox = (): Box => ({ minX: 0, minY: 0, maxX: 0, maxY: 0 })

function unionBox(boxes: Box[]): Box {
  if (boxes.length === 0) return emptyBox()
  const box = { ...boxes[0]! }
  for (const next of boxes) {
    if (next.minX < box.minX) box.minX = next.minX
    if (next.minY < box.minY) box.minY = next.minY
    if (next.maxX > box.maxX) box.maxX = next.maxX
    if (next.maxY > box.maxY) box.maxY = next.maxY
  }
  return box
}

/**
 * The shape of a placement before it is moved: the design's geometry mirrored (x → −x) if asked, then turned by
 * angleDeg about the design origin, with the same `transformRing` as the nesting engine, so a nest result lands
 * exactly where the engine put it. Cost: linear in the piece's points.
 */
export function orientedShape(design: DesignForLayout, pose: PlacementPose, owners: readonly number[] = cutLineOwners(design.geometry)): PlacedShape {
  const { geometry } = design
  const polygons: PlacedPolygon[] = placementPieceIndices(geometry, pose.pieceIndex).map((pieceIndex) => {
    const piece = geometry.pieces[pieceIndex]!
    const outer = flatRing(transformRing(piece.outline, pose.angleDeg, pose.mirrored))
    const holes = piece.holes.map((hole) => flatRing(transformRing(hole, pose.angleDeg, pose.mirrored)))
    return { outer, holes, box: flatRingBox(outer), holeBoxes: holes.map(flatRingBox) }
  })
  const cutLines = geometry.cutLines
    .filter((_, lineIndex) => pose.pieceIndex === -1 || owners[lineIndex] === pose.pieceIndex)
    .filter((line) => line.points.length > 0)
    .map((line) => flatRing(transformRing(line.points, pose.angleDeg, pose.mirrored)))
  return { polygons, cutLines, box: unionBox([...polygons.map((polygon) => polygon.box), ...cutLines.map(flatRingBox)]) }
}

/** A polygon from plain rings (an excluded zone, a selection rectangle). */
export function polygonFromRings(outline: readonly (readonly [number, number])[], holes: readonly (readonly (readonly [number, number])[])[] = []): PlacedPolygon {
  const outer = flatRing(outline)
  const flatHoles = holes.map(flatRing)
  return { outer, holes: flatHoles, box: flatRingBox(outer), holeBoxes: flatHoles.map(flatRingBox) }
}

export function translateBox(box: Box, dx: number, dy: number): Box {
  return { minX: box.minX + dx, minY: box.minY + dy, maxX: box.maxX + dx, maxY: box.maxY + dy }
}

export function translateShape(shape: PlacedShape, dx: number, dy: number): PlacedShape {
  return {
    polygons: shape.polygons.map((polygon) => ({
      outer: translateFlatRing(polygon.outer, dx, dy),
      holes: polygon.holes.map((hole) => translateFlatRing(hole, dx, dy)),
      box: translateBox(polygon.box, dx, dy),
      holeBoxes: polygon.holeBoxes.map((box) => translateBox(box, dx, dy)),
    })),
    cutLines: shape.cutLines.map((line) => translateFlatRing(line, dx, dy)),
    box: translateBox(shape.box, dx, dy),
  }
}

/** A placement's shape in sheet coordinates (without a cache; the editor uses `createShapeCache`). */
export function placedShape(design: DesignForLayout, placement: PlacementAt): PlacedShape {
  return translateShape(orientedShape(design, placement), placement.xMm, placement.yMm)
}

const poseKey = (pose: PlacementPose) => `${pose.designId}|${pose.pieceIndex}|${pose.angleDeg}|${pose.mirrored ? 1 : 0}`

/**
 * Oriented shapes computed once per design, piece, angle and side, and placed shapes once per placement position:
 * a drag only translates, and 500 copies of one design share one oriented shape.
 */
export function createShapeCache(designs: ReadonlyMap<string, DesignForLayout>) {
  const oriented = new Map<string, PlacedShape>()
  const owners = new Map<string, number[]>()
  const placed = new WeakMap<object, PlacedShape>()

  function orientedOf(pose: PlacementPose): PlacedShape | undefined {
    const key = poseKey(pose)
    let shape = oriented.get(key)
    if (!shape) {
      const design = designs.get(pose.designId)
      if (!design) return undefined
      let designOwners = owners.get(pose.designId)
      if (!designOwners) {
        designOwners = cutLineOwners(design.geometry)
        owners.set(pose.designId, designOwners)
      }
      shape = orientedShape(design, pose, designOwners)
      oriented.set(key, shape)
    }
    return shape
  }

  /** Placements are immutable snapshots in the editor, so the object itself is the cache key. */
  function shapeOf(placement: PlacementAt): PlacedShape | undefined {
    let shape = placed.get(placement)
    if (!shape) {
      const base = orientedOf(placement)
      if (!base) return undefined
      shape = translateShape(base, placement.xMm, placement.yMm)
      placed.set(placement, shape)
    }
    return shape
  }

  /** The box a placement would have at a position, without building its rings. */
  function boxAt(pose: PlacementPose, xMm: number, yMm: number): Box | undefined {
    const base = orientedOf(pose)
    return base ? translateBox(base.box, xMm, yMm) : undefined
  }

  return { orientedOf, shapeOf, boxAt }
}
export type ShapeCache = ReturnType<typeof createShapeCache>

/** Centre of a box: rotating and mirroring keep it in place, as a maker expects of a turn on the spot. */
export const boxCentre = (box: Box): [number, number] => [(box.minX + box.maxX) / 2, (box.minY + box.maxY) / 2]
