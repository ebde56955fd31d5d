import type { CutLineGeometry, PieceGeometry } from './pieces.js'
import type { Box } from './polygon.js'

/** Douglas–Peucker simplification of an open polyline: drops points within `tolerance` of the kept chord. */
export function simplifyPolyline(points: [number, number][], tolerance: number): [number, number][] {
  if (points.length <= 2) return points
  const keep = new Uint8Array(points.length)
  keep[0] = 1
  keep[points.length - 1] = 1
  const stack: [number, number][] = [[0, points.length - 1]]
  while (stack.length > 0) {
    const [first, last] = stack.pop()!
    const [ax, ay] = points[first]!
    const [bx, by] = points[last]!
    const dx = bx - ax
    const dy = by - ay
    const lengthSquared = dx * dx + dy * dy
    let farthest = -1
    let farthestDistance = tolerance
    for (let index = first + 1; index < last; index++) {
      const [px, py] = points[index]!
      let distance: number
      if (lengthSquared === 0) distance = Math.hypot(px - ax, py - ay)
      else distance = Math.abs(dy * px - dx * py + bx * ay - by * ax) / Math.sqrt(lengthSquared)
      if (distance > farthestDistance) {
        farthest = index
        farthestDistance = distance
      }
    }
    if (farthest >= 0) {
      keep[farthest] = 1
      stack.push([first, farthest], [farthest, last])
    }
  }
  return points.filter((_, index) => keep[index] === 1)
}

const format = (value: number) => Number(value.toFixed(2)).toString()

function ringPath(ring: [number, number][], tolerance: number): string {
  // Close the ring for simplification so the seam point is treated like any other.
  const simplified = simplifyPolyline([...ring, ring[0]!], tolerance)
  if (simplified.length < 4) return ''
  simplified.pop()
  return `M${simplified.map(([x, y]) => `${format(x)} ${format(y)}`).join('L')}Z`
}

/** A light SVG drawing of pieces and cut lines, in mm, for thumbnails: about 1/300 of the design's size in detail. */
export function buildPreview(pieces: PieceGeometry[], cutLines: CutLineGeometry[], bbox: Box) {
  const width = Math.max(bbox.maxX - bbox.minX, 1e-3)
  const height = Math.max(bbox.maxY - bbox.minY, 1e-3)
  const tolerance = Math.max(width, height) / 300
  const margin = Math.max(width, height) * 0.02
  return {
    viewBox: [bbox.minX - margin, bbox.minY - margin, width + 2 * margin, height + 2 * margin].map((value) => Number(value.toFixed(3))) as [number, number, number, number],
    piecePaths: pieces.map((piece) => [piece.outline, ...piece.holes].map((ring) => ringPath(ring, tolerance)).join('')),
    cutLinePaths: cutLines.map((line) => {
      const simplified = simplifyPolyline(line.points, tolerance)
      return `M${simplified.map(([x, y]) => `${format(x)} ${format(y)}`).join('L')}`
    }),
  }
}
