import ClipperLib from 'clipper-lib'
import { contourEnd, contourLength, contourSignedArea, contourStart, flattenContour, type Contour } from './curves.js'
import { boundingBox, perimeter, signedArea, type Box, type Ring } from './polygon.js'
import type { DrawnShape, ReadWarning } from './svgDocument.js'
import { SvgReadError } from './xmlTree.js'

/** Integer grid of the boolean operations: 1 unit = 1 µm, far below any cutting tolerance. */
const clipperScale = 1000
/** Ends of an open subpath closer than this are taken as closed (mm). */
const closingGapMm = 1e-4
/** Limits that keep one upload from tying up the server: far beyond any real cutting design. */
const maxVertices = 2_000_000
const maxCoordinateMm = 100_000

export interface PieceGeometry {
  /** Outer outline, positive signed area. */
  outline: Ring
  /** Holes, negative signed area. */
  holes: Ring[]
  areaMm2: number
  /** Length of outline and holes along the true curves where they were not changed by the boolean step. */
  cutLengthMm: number
  bbox: Box
}

export interface CutLineGeometry {
  points: [number, number][]
  lengthMm: number
}

interface ClosedRing {
  ring: Ring
  lengthMm: number
  /** Area enclosed by the true curves (the flattened ring's area is slightly smaller). */
  exactAreaMm2: number
  absoluteArea: number
  perimeter: number
  bbox: Box
  used: boolean
}

type IntPath = { X: number; Y: number }[]

const toIntPath = (ring: Ring): IntPath => ring.map(([x, y]) => ({ X: Math.round(x * clipperScale), Y: Math.round(y * clipperScale) }))
const fromIntPath = (path: IntPath): Ring => path.map((point) => [point.X / clipperScale, point.Y / clipperScale])

function union(paths: IntPath[], fillRule: 'nonzero' | 'evenodd'): ClipperLib.Clipper {
  const clipper = new ClipperLib.Clipper()
  clipper.AddPaths(paths, ClipperLib.PolyType.ptSubject, true)
  return clipper
}

const fillType = (fillRule: 'nonzero' | 'evenodd') => (fillRule === 'evenodd' ? ClipperLib.PolyFillType.pftEvenOdd : ClipperLib.PolyFillType.pftNonZero)

/**
 * Finds the input ring an output ring came from, unchanged, so its true curve length can be used.
 * Rings are sorted by minX; a match has the same bounding box (within 2 µm) and area (within the rounding to the grid).
 */
function matchOriginal(sorted: ClosedRing[], ring: Ring): ClosedRing | undefined {
  const box = boundingBox(ring)
  const area = Math.abs(signedArea(ring))
  const slack = 2 / clipperScale
  let low = 0
  let high = sorted.length
  while (low < high) {
    const middle = (low + high) >> 1
    if (sorted[middle]!.bbox.minX < box.minX - slack) low = middle + 1
    else high = middle
  }
  for (let index = low; index < sorted.length && sorted[index]!.bbox.minX <= box.minX + slack; index++) {
    const candidate = sorted[index]!
    if (candidate.used) continue
    if (Math.abs(candidate.bbox.minY - box.minY) > slack || Math.abs(candidate.bbox.maxX - box.maxX) > slack || Math.abs(candidate.bbox.maxY - box.maxY) > slack) continue
    // Rounding every vertex to the 1 µm grid moves the area by at most about perimeter × 1 µm.
    if (Math.abs(candidate.absoluteArea - area) > candidate.perimeter * (1 / clipperScale) + 1e-9) continue
    candidate.used = true
    return candidate
  }
  return undefined
}

/** Groups shapes (each a set of paths) whose bounding boxes overlap, directly or through others; O(n log n + overlaps). */
function overlappingClusters(shapes: IntPath[][]): IntPath[][] {
  const boxes = shapes.map((paths) => {
    let minX = Infinity
    let minY = Infinity
    let maxX = -Infinity
    let maxY = -Infinity
    for (const path of paths) {
      for (const point of path) {
        if (point.X < minX) minX = point.X
        if (point.X > maxX) maxX = point.X
        if (point.Y < minY) minY = point.Y
        if (point.Y > maxY) maxY = point.Y
      }
    }
    return { minX, minY, maxX, maxY }
  })
  const parent = shapes.map((_, index) => index)
  const find = (index: number): number => {
    while (parent[index] !== index) {
      parent[index] = parent[parent[index]!]!
      index = parent[index]!
    }
    return index
  }
  const order = shapes.map((_, index) => index).sort((left, right) => boxes[left]!.minX - boxes[right]!.minX)
  const active: number[] = []
  for (const index of order) {
    const box = boxes[index]!
    for (let position = active.length - 1; position >= 0; position--) {
      const other = boxes[active[position]!]!
      if (other.maxX < box.minX) {
        active.splice(position, 1)
        continue
      }
      if (other.minY <= box.maxY && box.minY <= other.maxY) parent[find(active[position]!)] = find(index)
    }
    active.push(index)
  }
  const clusters = new Map<number, IntPath[]>()
  shapes.forEach((paths, index) => {
    const root = find(index)
    const cluster = clusters.get(root)
    if (cluster) cluster.push(...paths)
    else clusters.set(root, [...paths])
  })
  return [...clusters.values()]
}

/**
 * Turns drawn shapes into pieces (outer outline + holes) and cut lines.
 * Inside one element its fill rule decides what is filled (W3C SVG 1.1 §11.3); between elements, a contour
 * inside another element's area cuts a hole in it (even-odd over the elements' resolved areas), which is what
 * cutting every drawn contour does. Self-intersections are resolved by the same boolean step (Clipper).
 */
export function buildPieces(
  shapes: DrawnShape[],
  options: { toleranceMm: number; minSpeckAreaMm2: number },
): { pieces: PieceGeometry[]; cutLines: CutLineGeometry[]; warnings: ReadWarning[] } {
  const warnings: ReadWarning[] = []
  const warn = (code: string, message: string, count = 1) => {
    const existing = warnings.find((warning) => warning.code === code)
    if (existing) existing.count += count
    else warnings.push({ code, message, count })
  }
  const cutLines: CutLineGeometry[] = []
  const originals: ClosedRing[] = []
  let vertexCount = 0
  const resolvedShapes: IntPath[][] = []
  const seenAreas = new Set<string>()
  let duplicateCount = 0

  for (const shape of shapes) {
    const shapePaths: IntPath[] = []
    for (const contour of shape.contours) {
      const start = contourStart(contour)
      const end = contourEnd(contour)
      const closed: Contour = contour.closed || !start || !end || Math.hypot(start[0] - end[0], start[1] - end[1]) > closingGapMm ? contour : { ...contour, closed: true }
      const points = flattenContour(closed, options.toleranceMm)
      vertexCount += points.length
      if (vertexCount > maxVertices) throw new SvgReadError('too_complex', `The drawing has more than ${maxVertices.toLocaleString('en')} outline points after flattening; simplify it or split it into several files`)
      for (const [x, y] of points) {
        if (!(Math.abs(x) <= maxCoordinateMm && Math.abs(y) <= maxCoordinateMm)) throw new SvgReadError('bad_size', 'The drawing reaches further than 100 m from its origin; check its units and size')
      }
      const lengthMm = contourLength(closed)
      if (!closed.closed) {
        if (lengthMm > 0) cutLines.push({ points, lengthMm })
        continue
      }
      if (points.length < 3) continue
      const absoluteArea = Math.abs(signedArea(points))
      if (absoluteArea === 0) continue
      originals.push({ ring: points, lengthMm, exactAreaMm2: Math.abs(contourSignedArea(closed)), absoluteArea, perimeter: perimeter(points), bbox: boundingBox(points), used: false })
      shapePaths.push(toIntPath(points))
    }
    if (shapePaths.length === 0) continue
    const clipper = union(shapePaths, shape.fillRule)
    const solution: IntPath[] = []
    clipper.Execute(ClipperLib.ClipType.ctUnion, solution, fillType(shape.fillRule), fillType(shape.fillRule))
    // The same outline drawn twice (a filled copy and a stroked copy is common) is one cut, not a hole in itself.
    const key = solution
      .map((path) => path.map((point) => `${point.X},${point.Y}`).join(' '))
      .sort()
      .join('|')
    if (seenAreas.has(key)) {
      duplicateCount += 1
      continue
    }
    seenAreas.add(key)
    resolvedShapes.push(solution)
  }
  if (duplicateCount > 0) warn('duplicate_outline', 'Outlines drawn more than once on top of each other were read once', duplicateCount)

  const pieces: PieceGeometry[] = []
  if (resolvedShapes.length > 0) {
    originals.sort((left, right) => left.bbox.minX - right.bbox.minX)
    let resolvedCount = 0
    let speckCount = 0

    /** True-curve length and area of a resolved ring when it is an input ring unchanged; else the ring's own. */
    const measureRing = (ring: Ring) => {
      const original = matchOriginal(originals, ring)
      if (original) return { lengthMm: original.lengthMm, areaMm2: original.exactAreaMm2 }
      resolvedCount += 1
      return { lengthMm: perimeter(ring), areaMm2: Math.abs(signedArea(ring)) }
    }
    const visitOuter = (node: ClipperLib.PolyNode) => {
      let outline = fromIntPath(node.Contour() as IntPath)
      if (signedArea(outline) < 0) outline = outline.reverse()
      const holes: Ring[] = []
      for (const child of node.Childs()) {
        let hole = fromIntPath(child.Contour() as IntPath)
        if (signedArea(hole) > 0) hole = hole.reverse()
        holes.push(hole)
        for (const island of child.Childs()) visitOuter(island)
      }
      const roughAreaMm2 = signedArea(outline) + holes.reduce((sum, hole) => sum + signedArea(hole), 0)
      if (roughAreaMm2 < options.minSpeckAreaMm2) {
        speckCount += 1
        return
      }
      const outer = measureRing(outline)
      const inner = holes.map(measureRing)
      pieces.push({
        outline,
        holes,
        areaMm2: outer.areaMm2 - inner.reduce((sum, hole) => sum + hole.areaMm2, 0),
        cutLengthMm: outer.lengthMm + inner.reduce((sum, hole) => sum + hole.lengthMm, 0),
        bbox: boundingBox(outline),
      })
    }
    // Only elements whose extents meet can interact, so each cluster is combined on its own: the same answer as one
    // combined pass, much faster for a sheet of thousands of separate shapes.
    for (const cluster of overlappingClusters(resolvedShapes)) {
      const clipper = union(cluster, 'evenodd')
      const tree = new ClipperLib.PolyTree()
      clipper.Execute(ClipperLib.ClipType.ctUnion, tree, ClipperLib.PolyFillType.pftEvenOdd, ClipperLib.PolyFillType.pftEvenOdd)
      for (const node of tree.Childs()) visitOuter(node)
    }
    if (resolvedCount > 0) {
      warn('resolved_outline', 'Crossing or overlapping outlines were resolved; the cut length of the changed outlines is measured on the resolved outline', resolvedCount)
    }
    if (speckCount > 0) warn('speck', `Pieces smaller than ${options.minSpeckAreaMm2} mm² were left out as specks`, speckCount)
  }
  // Largest first: the order people expect in a list, and a good default order for nesting.
  pieces.sort((left, right) => right.areaMm2 - left.areaMm2)
  return { pieces, cutLines, warnings }
}
