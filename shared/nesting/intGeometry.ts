import ClipperLib from 'clipper-lib'

/**
 * Integer polygon geometry for the search (Clipper works on integer coordinates, which keeps Minkowski sums
 * and boolean operations robust). Coordinates are input units × scale, rounded.
 */
export type IntPoint = { X: number; Y: number }
export type IntPath = IntPoint[]

export interface IntShape {
  outer: IntPath
  holes: IntPath[]
}

/** Largest coordinate magnitude Clipper handles without its slow 128-bit mode. */
const clipperFastRange = 4.6e7

/** A power-of-two-free decimal scale that keeps every coordinate of the job inside Clipper's fast range. */
export function chooseScale(maxExtent: number): number {
  const raw = clipperFastRange / 4 / Math.max(maxExtent, 1e-9)
  return 10 ** Math.floor(Math.log10(raw))
}

export const toIntPath = (ring: readonly (readonly [number, number])[], scale: number): IntPath =>
  ring.map(([x, y]) => ({ X: Math.round(x * scale), Y: Math.round(y * scale) }))

export const fromIntPath = (path: IntPath, scale: number): [number, number][] => path.map((point) => [point.X / scale, point.Y / scale])

export function pathArea(path: IntPath): number {
  return ClipperLib.Clipper.Area(path)
}

export function orient(path: IntPath, positive: boolean): IntPath {
  return pathArea(path) >= 0 === positive ? path : [...path].reverse()
}

export function translatePath(path: IntPath, dx: number, dy: number): IntPath {
  const moved = new Array<IntPoint>(path.length)
  for (let index = 0; index < path.length; index++) moved[index] = { X: path[index]!.X + dx, Y: path[index]!.Y + dy }
  return moved
}

/** Offsets closed paths by `delta` integer units (negative shrinks), with mitred corners (never smaller than the true offset). */
export function offsetPaths(paths: IntPath[], delta: number): IntPath[] {
  if (delta === 0) return paths
  const offset = new ClipperLib.ClipperOffset(2, 0.25)
  offset.AddPaths(paths, ClipperLib.JoinType.jtMiter, ClipperLib.EndType.etClosedPolygon)
  const solution: IntPath[] = []
  offset.Execute(solution, delta)
  return solution
}

export function unionPaths(paths: IntPath[], fill = ClipperLib.PolyFillType.pftNonZero): IntPath[] {
  const clipper = new ClipperLib.Clipper()
  clipper.AddPaths(paths, ClipperLib.PolyType.ptSubject, true)
  const solution: IntPath[] = []
  clipper.Execute(ClipperLib.ClipType.ctUnion, solution, fill, fill)
  return solution
}

export function differencePaths(subject: IntPath[], clip: IntPath[]): IntPath[] {
  const clipper = new ClipperLib.Clipper()
  clipper.AddPaths(subject, ClipperLib.PolyType.ptSubject, true)
  clipper.AddPaths(clip, ClipperLib.PolyType.ptClip, true)
  const solution: IntPath[] = []
  clipper.Execute(ClipperLib.ClipType.ctDifference, solution, ClipperLib.PolyFillType.pftNonZero, ClipperLib.PolyFillType.pftNonZero)
  return solution
}

/** Even-odd point in ring test; points exactly on an edge count as outside (callers test interior points only). */
export function pointInRing(x: number, y: number, ring: IntPath | readonly (readonly [number, number])[]): boolean {
  let inside = false
  const count = ring.length
  for (let index = 0, previous = count - 1; index < count; previous = index++) {
    const a = ring[index]!
    const b = ring[previous]!
    const ax = 'X' in a ? a.X : a[0]
    const ay = 'X' in a ? a.Y : a[1]
    const bx = 'X' in b ? b.X : b[0]
    const by = 'X' in b ? b.Y : b[1]
    if (ay > y !== by > y && x < ((bx - ax) * (y - ay)) / (by - ay) + ax) inside = !inside
  }
  return inside
}

export function pointInShape(x: number, y: number, shape: IntShape): boolean {
  if (!pointInRing(x, y, shape.outer)) return false
  for (const hole of shape.holes) if (pointInRing(x, y, hole)) return false
  return true
}

/**
 * A point strictly inside the region bounded by `rings` (a ring and the islands inside it): the middle of the
 * first interval of a horizontal scan line. The scan height avoids vertices.
 */
export function interiorPoint(rings: IntPath[]): [number, number] | undefined {
  const outer = rings[0]!
  let minY = Infinity
  let maxY = -Infinity
  for (const point of outer) {
    if (point.Y < minY) minY = point.Y
    if (point.Y > maxY) maxY = point.Y
  }
  if (maxY - minY < 1e-9) return undefined
  for (const fraction of [0.5, 0.3137, 0.6871, 0.1234, 0.8765]) {
    const y = minY + (maxY - minY) * fraction + 0.01234
    const crossings: number[] = []
    for (const ring of rings) {
      for (let index = 0, previous = ring.length - 1; index < ring.length; previous = index++) {
        const a = ring[index]!
        const b = ring[previous]!
        if (a.Y > y !== b.Y > y) crossings.push(((b.X - a.X) * (y - a.Y)) / (b.Y - a.Y) + a.X)
      }
    }
    crossings.sort((left, right) => left - right)
    if (crossings.length >= 2 && crossings[1]! - crossings[0]! > 1e-6) return [(crossings[0]! + crossings[1]!) / 2, y]
  }
  return undefined
}

export function boundsOf(paths: IntPath[]): { minX: number; minY: number; maxX: number; maxY: number } {
  let minX = Infinity
  let minY = Infinity
  let maxX = -Infinity
  let maxY = -Infinity
  for (const path of paths) {
    for (const point of path) {
      if (point.X < minX) minX = point.X
      if (point.Y < minY) minY = point.Y
      if (point.X > maxX) maxX = point.X
      if (point.Y > maxY) maxY = point.Y
    }
  }
  return { minX, minY, maxX, maxY }
}
