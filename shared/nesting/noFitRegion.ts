import ClipperLib from 'clipper-lib'
import { convexParts, convexSum } from './convexParts.js'
import { interiorPoint, offsetPaths, orient, pathArea, pointInShape, unionPaths, type IntPath, type IntShape } from './intGeometry.js'

const negate = (path: IntPath): IntPath => path.map((point) => ({ X: -point.X, Y: -point.Y }))

/** Convex parts per shape object: variants keep their shapes for the whole job, so each is split once. */
const partsByShape = new WeakMap<IntShape, IntPath[]>()
const thinnedPartsByShape = new WeakMap<IntShape, Map<number, IntPath[]>>()

function partsOf(shape: IntShape): IntPath[] {
  let parts = partsByShape.get(shape)
  if (!parts) {
    parts = convexParts(shape)
    partsByShape.set(shape, parts)
  }
  return parts
}

/** The convex parts of −B (B thinned by `shrink` first); a point reflection keeps each part counter-clockwise. */
function reflectedPartsOf(shape: IntShape, shrink: number): IntPath[] {
  let byShrink = thinnedPartsByShape.get(shape)
  if (!byShrink) {
    byShrink = new Map()
    thinnedPartsByShape.set(shape, byShrink)
  }
  let parts = byShrink.get(shrink)
  if (!parts) {
    parts = convexParts(shrink > 0 ? thinned(shape, shrink) : shape).map(negate)
    byShrink.set(shrink, parts)
  }
  return parts
}

/**
 * The no-fit region of B around A: the positions of B's reference point (relative to A's) where B's interior
 * overlaps A's, i.e. A ⊕ (−B). Both shapes (holes included) are split into convex parts, the parts are summed
 * pairwise (each sum is convex, O(n + m)) and the sums are united pairwise in a balanced tree, which keeps every
 * boolean step small (one union of all sums at once is about a hundred times slower on detailed outlines). Holes of
 * the result are positions where B sits in a hole or an enclosed pocket of A, so nothing needs classifying.
 *
 * `shrink` (integer units) thins B before the sum, so positions where B exactly touches A (a piece sliding into a
 * slot of its own width, or between two pieces) form a thin free strip rather than a line the boolean step would
 * drop; callers grow the shapes by at least as much, so nothing overlaps for real.
 * Returns closed paths for non-zero filling: outer boundaries positive, free holes negative.
 */
export function noFitRegion(a: IntShape, b: IntShape, shrink: number): IntPath[] {
  const aParts = partsOf(a)
  const bParts = reflectedPartsOf(b, shrink)
  const sums: IntPath[][] = []
  for (const aPart of aParts) for (const bPart of bParts) sums.push([convexSum(aPart, bPart)])
  return unionTree(sums)
}

/** Unites groups of paths two by two until one group is left. */
function unionTree(groups: IntPath[][]): IntPath[] {
  if (groups.length === 0) return []
  let level = groups
  while (level.length > 1) {
    const next: IntPath[][] = []
    for (let index = 0; index < level.length; index += 2) {
      next.push(index + 1 < level.length ? unionPaths([...level[index]!, ...level[index + 1]!]) : level[index]!)
    }
    level = next
  }
  return level[0]!.length === 1 ? [orient(level[0]![0]!, true)] : level[0]!
}

/** The shape pulled in by `amount` units (outline shrinks, holes grow); unchanged if that would erase it. */
function thinned(shape: IntShape, amount: number): IntShape {
  const paths = offsetPaths([orient(shape.outer, true), ...shape.holes.map((hole) => orient(hole, false))], -amount)
  const outers = paths.filter((path) => pathArea(path) > 0)
  if (outers.length !== 1) return shape
  return { outer: outers[0]!, holes: paths.filter((path) => pathArea(path) < 0) }
}

/**
 * Positions of B's reference point where B lies inside a container region (a remnant's outline with holes):
 * the enclosed regions of ∂C ⊕ (−∂B) whose test point has B inside C. Returns paths for non-zero filling.
 */
export function innerFitRegion(container: IntShape, b: IntShape, grow: number): IntPath[] {
  const bRings = [b.outer, ...b.holes].map(negate)
  const sweep: IntPath[] = []
  for (const cRing of [container.outer, ...container.holes]) {
    for (const bRing of bRings) for (const path of ClipperLib.Clipper.MinkowskiSum(bRing, cRing, true) as IntPath[]) sweep.push(path)
  }
  const clipper = new ClipperLib.Clipper()
  clipper.AddPaths(sweep, ClipperLib.PolyType.ptSubject, true)
  const tree = new ClipperLib.PolyTree()
  clipper.Execute(ClipperLib.ClipType.ctUnion, tree, ClipperLib.PolyFillType.pftNonZero, ClipperLib.PolyFillType.pftNonZero)
  const result: IntPath[] = []
  const insideAt = (x: number, y: number) => b.outer.every((vertex) => pointInShape(vertex.X + x, vertex.Y + y, container))
  const visit = (node: ClipperLib.PolyNode) => {
    for (const hole of node.Childs()) {
      const islands = hole.Childs()
      const point = interiorPoint([hole.Contour() as IntPath, ...islands.map((island) => island.Contour() as IntPath)])
      if (point && insideAt(point[0], point[1])) {
        result.push(orient(hole.Contour() as IntPath, true))
        for (const island of islands) result.push(orient(island.Contour() as IntPath, false))
      }
      for (const island of islands) visit(island)
    }
  }
  for (const node of tree.Childs()) visit(node)
  return grow > 0 ? offsetPaths(result, grow) : result
}
