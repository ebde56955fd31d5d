import ClipperLib from 'clipper-lib'
import { interiorPoint, offsetPaths, orient, pathArea, pointInShape, type IntPath, type IntShape } from './intGeometry.js'

const negate = (path: IntPath): IntPath => path.map((point) => ({ X: -point.X, Y: -point.Y }))

/**
 * The no-fit region of B around A: the positions of B's reference point (relative to A's) where B's interior
 * overlaps A's. Built from the Minkowski sum of the boundaries ∂A ⊕ (−∂B) (Bennell & Oliveira 2008, EJOR 184):
 * the plane outside that sum splits into regions that are wholly overlapping or wholly free; each enclosed
 * region is classified with one test point, so B may sit in a hole of A, in a pocket of A, or around A inside
 * a hole of B.
 *
 * `shrink` (integer units) thins B before the sum, so positions where B exactly touches A (a piece sliding into a
 * slot of its own width, or between two pieces) form a thin free strip rather than a line the boolean step would
 * drop; callers grow the shapes by at least as much, so nothing overlaps for real.
 * Returns closed paths for non-zero filling: outer boundaries positive, free holes negative.
 */
export function noFitRegion(a: IntShape, bInput: IntShape, shrink: number): IntPath[] {
  const b = shrink > 0 ? thinned(bInput, shrink) : bInput
  const bRings = [b.outer, ...b.holes].map(negate)
  const aRings = [a.outer, ...a.holes]
  const sweep: IntPath[] = []
  for (const aRing of aRings) {
    for (const bRing of bRings) {
      const sum = ClipperLib.Clipper.MinkowskiSum(bRing, aRing, true) as IntPath[]
      for (const path of sum) sweep.push(path)
    }
  }
  const clipper = new ClipperLib.Clipper()
  clipper.AddPaths(sweep, ClipperLib.PolyType.ptSubject, true)
  const tree = new ClipperLib.PolyTree()
  clipper.Execute(ClipperLib.ClipType.ctUnion, tree, ClipperLib.PolyFillType.pftNonZero, ClipperLib.PolyFillType.pftNonZero)

  const result: IntPath[] = []
  const overlapsAt = (x: number, y: number) => {
    // The region does not meet the sweep, so the shapes are either disjoint or one lies inside the other.
    const bVertex = b.outer[0]!
    if (pointInShape(bVertex.X + x, bVertex.Y + y, a)) return true
    const aVertex = a.outer[0]!
    return pointInShape(aVertex.X - x, aVertex.Y - y, b)
  }
  const visitOuter = (node: ClipperLib.PolyNode) => {
    result.push(orient(node.Contour() as IntPath, true))
    for (const hole of node.Childs()) {
      const islands = hole.Childs()
      const point = interiorPoint([hole.Contour() as IntPath, ...islands.map((island) => island.Contour() as IntPath)])
      // An enclosed region where the shapes overlap is filled; a free one stays a hole of the no-fit region.
      if (point && overlapsAt(point[0], point[1])) continue
      result.push(orient(hole.Contour() as IntPath, false))
      for (const island of islands) visitOuter(island)
    }
  }
  for (const node of tree.Childs()) visitOuter(node)
  return result
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
