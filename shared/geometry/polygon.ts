/** A closed ring of points (first point not repeated at the end), millimetres. */
export type Ring = [number, number][]

export interface Box {
  minX: number
  minY: number
  maxX: number
  maxY: number
}

/** Shoelace signed area: positive for rings that turn from +x towards +y. */
export function signedArea(ring: readonly (readonly [number, number])[]): number {
  let twice = 0
  for (let index = 0, previous = ring.length - 1; index < ring.length; previous = index++) {
    twice += (ring[previous]![0] - ring[index]![0]) * (ring[previous]![1] + ring[index]![1])
  }
  return twice / 2
}

export function perimeter(ring: readonly (readonly [number, number])[], closed = true): number {
  let total = 0
  for (let index = 1; index < ring.length; index++) total += Math.hypot(ring[index]![0] - ring[index - 1]![0], ring[index]![1] - ring[index - 1]![1])
  if (closed && ring.length > 2) total += Math.hypot(ring[0]![0] - ring[ring.length - 1]![0], ring[0]![1] - ring[ring.length - 1]![1])
  return total
}

export function boundingBox(points: readonly (readonly [number, number])[]): Box {
  let minX = Infinity
  let minY = Infinity
  let maxX = -Infinity
  let maxY = -Infinity
  for (const [x, y] of points) {
    if (x < minX) minX = x
    if (y < minY) minY = y
    if (x > maxX) maxX = x
    if (y > maxY) maxY = y
  }
  return { minX, minY, maxX, maxY }
}

export function mergeBoxes(boxes: Box[]): Box | undefined {
  if (boxes.length === 0) return undefined
  return {
    minX: Math.min(...boxes.map((box) => box.minX)),
    minY: Math.min(...boxes.map((box) => box.minY)),
    maxX: Math.max(...boxes.map((box) => box.maxX)),
    maxY: Math.max(...boxes.map((box) => box.maxY)),
  }
}
