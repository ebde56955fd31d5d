import type { Box } from '../geometry/polygon.js'
import type { PlacedPolygon, PlacedShape } from './placedGeometry.js'
import { polygonsOutsideRegion, type RegionPolygon } from './polygonStock.js'
import { boundaryPlace, boxesTouch, boxGap, ringsCloserThan, ringsCross, TOUCH_MM, type FlatRing } from './rings.js'
import type { PieceIndex } from './spatialIndex.js'

/** How two pieces stand: apart by at least the spacing, closer than the spacing, or sharing area. */
export type PairRelation = 'clear' | 'spacing' | 'overlap'

const ringsOf = (polygon: PlacedPolygon): [FlatRing, Box][] => [[polygon.outer, polygon.box], ...polygon.holes.map((hole, index): [FlatRing, Box] => [hole, polygon.holeBoxes[index]!])]

/** Where every ring of a runs relative to b's material (see boundaryPlace): inside wins, then outside. */
function polygonBoundaryPlace(a: PlacedPolygon, b: PlacedPolygon): 'inside' | 'outside' | 'boundary' {
  let sawOutside = false
  for (const [ring, box] of ringsOf(a)) {
    if (!boxesTouch(box, b.box, TOUCH_MM)) {
      sawOutside = true
      continue
    }
    const place = boundaryPlace(ring, box, b.outer, b.box, b.holes, b.holeBoxes)
    if (place === 'inside') return 'inside'
    if (place === 'outside') sawOutside = true
  }
  return sawOutside ? 'outside' : 'boundary'
}

/**
 * Whether a and b share area. If their interiors meet, some stretch of one's boundary runs inside the other's
 * material, unless the two boundaries coincide; a piece sitting in the other's hole shares none. Outlines crossing
 * outright decide at once; otherwise every boundary stretch near the other polygon is tested.
 */
function polygonsOverlap(a: PlacedPolygon, b: PlacedPolygon): boolean {
  if (ringsCross(a.outer, a.box, b.outer, b.box)) return true
  const aInB = polygonBoundaryPlace(a, b)
  if (aInB === 'inside') return true
  const bInA = polygonBoundaryPlace(b, a)
  if (bInA === 'inside') return true
  return aInB === 'boundary' && bInA === 'boundary'
}

/** Some ring of a comes closer than `distance` to some ring of b (rings whose boxes are further apart are skipped). */
function polygonsCloserThan(a: PlacedPolygon, b: PlacedPolygon, distance: number): boolean {
  const ringsOfB = ringsOf(b)
  for (const [ringA, boxA] of ringsOf(a)) {
    if (!boxesTouch(boxA, b.box, distance)) continue
    for (const [ringB, boxB] of ringsOfB) {
      if (boxesTouch(boxA, boxB, distance) && ringsCloserThan(ringA, boxA, ringB, boxB, distance)) return true
    }
  }
  return false
}

/**
 * How two placed polygons stand, for a clear distance `spacingMm` (0: only overlap counts). A gap exactly equal to the
 * spacing is clear. Boxes further apart than the spacing decide at once, which is what keeps 500 pieces cheap.
 */
export function relatePolygons(a: PlacedPolygon, b: PlacedPolygon, spacingMm: number): PairRelation {
  const gap = boxGap(a.box, b.box)
  if (gap >= spacingMm - TOUCH_MM) return 'clear'
  if (gap < 0 && polygonsOverlap(a, b)) return 'overlap'
  return spacingMm > TOUCH_MM && polygonsCloserThan(a, b, spacingMm - TOUCH_MM) ? 'spacing' : 'clear'
}

/** The worse relation of any polygon of a with any polygon of b (a design kept together is several polygons). */
export function relateShapes(a: PlacedShape, b: PlacedShape, spacingMm: number): PairRelation {
  if (boxGap(a.box, b.box) >= spacingMm - TOUCH_MM) return 'clear'
  let worst: PairRelation = 'clear'
  for (const polygonA of a.polygons) {
    for (const polygonB of b.polygons) {
      const relation = relatePolygons(polygonA, polygonB, spacingMm)
      if (relation === 'overlap') return 'overlap'
      if (relation === 'spacing') worst = 'spacing'
    }
  }
  return worst
}

/** What is wrong with one placed piece. */
export interface PieceConflict {
  /** Pieces it shares area with. */
  overlapWith: string[]
  /** Pieces closer than the spacing (without sharing area). */
  tooCloseTo: string[]
  /** Some of it lies in the margin or beyond the stock (or on a sheet that does not exist). */
  outside: boolean
  /** It covers an excluded zone of its sheet. */
  inExcludedZone: boolean
  /** Its angle or side is not one its item allows (the item's rules changed after it was placed). */
  orientationNotAllowed: boolean
}

export const noConflict = (): PieceConflict => ({ overlapWith: [], tooCloseTo: [], outside: false, inExcludedZone: false, orientationNotAllowed: false })

export function hasConflict(conflict: PieceConflict | undefined): boolean {
  return !!conflict && (conflict.overlapWith.length > 0 || conflict.tooCloseTo.length > 0 || conflict.outside || conflict.inExcludedZone || conflict.orientationNotAllowed)
}

/** The one-line reason a maker reads beside a highlighted piece, worst first. */
export function describeConflict(conflict: PieceConflict): string | null {
  if (conflict.overlapWith.length) return 'Overlaps another piece'
  if (conflict.inExcludedZone) return 'Covers an excluded zone'
  if (conflict.outside) return 'Outside the usable area'
  if (conflict.tooCloseTo.length) return 'Closer than the spacing'
  if (conflict.orientationNotAllowed) return 'Turned or mirrored against its rules'
  return null
}

/** What the checks need to know of the layout as it stands. */
export interface ConflictEnvironment {
  index: PieceIndex
  shapeOf: (id: string) => PlacedShape | undefined
  spacingMm: number
  /** The same on every lane: the stock less its margin. */
  usable: Box
  /** Polygon stock only: the exact region pieces may use (its outline less the margin, holes left out). */
  usableRegion?: readonly RegionPolygon[] | null
  laneCount: number
  zonesOf: (sheet: number) => readonly PlacedPolygon[]
  /** Optional rule check per piece (angle and side against its item). */
  orientationAllowed?: (id: string) => boolean
}

/** The checks of a shape against the stock alone (margin, excluded zones), independent of other pieces. */
export function stockConflicts(
  shape: PlacedShape,
  sheet: number,
  environment: Pick<ConflictEnvironment, 'usable' | 'laneCount' | 'zonesOf' | 'usableRegion'>,
): { outside: boolean; inExcludedZone: boolean } {
  const { usable } = environment
  const box = shape.box
  let outside =
    sheet < 0 ||
    sheet >= environment.laneCount ||
    box.minX < usable.minX - TOUCH_MM ||
    box.minY < usable.minY - TOUCH_MM ||
    box.maxX > usable.maxX + TOUCH_MM ||
    box.maxY > usable.maxY + TOUCH_MM
  // Inside the box of a polygon stock is not yet on it: a notch or a hole may still be under the piece.
  if (!outside && environment.usableRegion) outside = polygonsOutsideRegion(shape.polygons, environment.usableRegion)
  let inExcludedZone = false
  for (const zone of environment.zonesOf(sheet)) {
    if (!boxesTouch(zone.box, box)) continue
    if (shape.polygons.some((polygon) => relatePolygons(polygon, zone, 0) === 'overlap')) {
      inExcludedZone = true
      break
    }
  }
  return { outside, inExcludedZone }
}

/**
 * Everything wrong with `shape` if it lay on `sheet`, against the other pieces in the index (those for which `skip`
 * says true are left out: the piece itself, and pieces dragged along with it). Candidates come from the index by
 * box grown by the spacing, exact polygon tests follow. This is the check run on every frame of a drag.
 */
export function conflictsOfShape(shape: PlacedShape, sheet: number, environment: ConflictEnvironment, skip: (id: string) => boolean): PieceConflict {
  const conflict = noConflict()
  const stock = stockConflicts(shape, sheet, environment)
  conflict.outside = stock.outside
  conflict.inExcludedZone = stock.inExcludedZone
  for (const candidate of environment.index.search(sheet, shape.box, environment.spacingMm)) {
    if (skip(candidate.id)) continue
    const other = environment.shapeOf(candidate.id)
    if (!other) continue
    const relation = relateShapes(shape, other, environment.spacingMm)
    if (relation === 'overlap') conflict.overlapWith.push(candidate.id)
    else if (relation === 'spacing') conflict.tooCloseTo.push(candidate.id)
  }
  return conflict
}

/**
 * Conflicts of every placed piece, kept up to date piece by piece: after a move only the moved pieces are tested
 * again (a pair relation is stored on both sides, so the neighbours they left are cleared too).
 */
export function createConflictTracker(environment: () => ConflictEnvironment) {
  const pairs = new Map<string, Map<string, 'spacing' | 'overlap'>>()
  const stock = new Map<string, { outside: boolean; inExcludedZone: boolean; orientationNotAllowed: boolean }>()

  function forget(id: string): void {
    const mine = pairs.get(id)
    if (mine) for (const other of mine.keys()) pairs.get(other)?.delete(id)
    pairs.delete(id)
    stock.delete(id)
  }

  function link(a: string, b: string, relation: 'spacing' | 'overlap'): void {
    let mine = pairs.get(a)
    if (!mine) pairs.set(a, (mine = new Map()))
    mine.set(b, relation)
    let theirs = pairs.get(b)
    if (!theirs) pairs.set(b, (theirs = new Map()))
    theirs.set(a, relation)
  }

  function test(id: string, env: ConflictEnvironment): void {
    const entry = env.index.get(id)
    const shape = env.shapeOf(id)
    if (!entry || !shape) return
    const checked = stockConflicts(shape, entry.sheet, env)
    stock.set(id, { ...checked, orientationNotAllowed: env.orientationAllowed ? !env.orientationAllowed(id) : false })
    for (const candidate of env.index.search(entry.sheet, shape.box, env.spacingMm)) {
      if (candidate.id === id) continue
      const other = env.shapeOf(candidate.id)
      if (!other) continue
      const relation = relateShapes(shape, other, env.spacingMm)
      if (relation !== 'clear') link(id, candidate.id, relation)
    }
  }

  /** Tests these pieces again (moved, turned, added or removed); the index must already hold their new places. */
  function refresh(ids: Iterable<string>): void {
    const env = environment()
    const list = [...new Set(ids)]
    for (const id of list) forget(id)
    for (const id of list) test(id, env)
  }

  /** Tests every piece in the index, e.g. after the spacing, the margin or the stock changed. Each pair once. */
  function rebuild(ids: Iterable<string>): void {
    pairs.clear()
    stock.clear()
    const env = environment()
    const done = new Set<string>()
    for (const id of ids) {
      const entry = env.index.get(id)
      const shape = env.shapeOf(id)
      done.add(id)
      if (!entry || !shape) continue
      const checked = stockConflicts(shape, entry.sheet, env)
      stock.set(id, { ...checked, orientationNotAllowed: env.orientationAllowed ? !env.orientationAllowed(id) : false })
      for (const candidate of env.index.search(entry.sheet, shape.box, env.spacingMm)) {
        if (done.has(candidate.id)) continue
        const other = env.shapeOf(candidate.id)
        if (!other) continue
        const relation = relateShapes(shape, other, env.spacingMm)
        if (relation !== 'clear') link(id, candidate.id, relation)
      }
    }
  }

  function conflictOf(id: string): PieceConflict {
    const conflict = noConflict()
    const own = stock.get(id)
    if (own) {
      conflict.outside = own.outside
      conflict.inExcludedZone = own.inExcludedZone
      conflict.orientationNotAllowed = own.orientationNotAllowed
    }
    for (const [other, relation] of pairs.get(id) ?? []) {
      if (relation === 'overlap') conflict.overlapWith.push(other)
      else conflict.tooCloseTo.push(other)
    }
    return conflict
  }

  /** Ids of every piece with something wrong. */
  function conflictedIds(): Set<string> {
    const ids = new Set<string>()
    for (const [id, others] of pairs) if (others.size > 0) ids.add(id)
    for (const [id, own] of stock) if (own.outside || own.inExcludedZone || own.orientationNotAllowed) ids.add(id)
    return ids
  }

  return { refresh, rebuild, forget, conflictOf, conflictedIds }
}
export type ConflictTracker = ReturnType<typeof createConflictTracker>
