import polygonClipping, { type Polygon } from 'polygon-clipping'
import { boundingBox, signedArea } from '../geometry/polygon.js'
import { transformRing } from './variants.js'
import { zoneAppliesToSheet, type NestProblem, type NestResult, type Placement, type RingPoints } from './types.js'

/**
 * An independent check of a layout, in full floating-point precision with a different boolean library
 * (polygon-clipping, not the Clipper used by the search): every copy placed once, each placement's outline is the
 * item moved as stated, pieces inside the usable stock, no piece overlaps another or an excluded zone beyond
 * 1e-6 of its area, and the spacing is kept.
 */
export interface VerifyReport {
  ok: boolean
  problems: string[]
  maxOverlapRatio: number
  minGap: number
}

const areaOfRing = (ring: RingPoints) => Math.abs(signedArea(ring))
const areaOfPolygons = (polygons: Polygon[]) => polygons.reduce((sum, polygon) => sum + areaOfRing(polygon[0] as RingPoints) - polygon.slice(1).reduce((holes, hole) => holes + areaOfRing(hole as RingPoints), 0), 0)


type Point = RingPoints[number]

function pointToSegment(p: Point, s: Point, e: Point): number {
  const dx = e[0] - s[0]
  const dy = e[1] - s[1]
  const lengthSquared = dx * dx + dy * dy
  const t = lengthSquared === 0 ? 0 : Math.max(0, Math.min(1, ((p[0] - s[0]) * dx + (p[1] - s[1]) * dy) / lengthSquared))
  return Math.hypot(p[0] - (s[0] + t * dx), p[1] - (s[1] + t * dy))
}

function cross(o: Point, p: Point, q: Point): number {
  return (p[0] - o[0]) * (q[1] - o[1]) - (p[1] - o[1]) * (q[0] - o[0])
}

function segmentDistance(a: Point, b: Point, c: Point, d: Point): number {
  const d1 = cross(c, d, a)
  const d2 = cross(c, d, b)
  const d3 = cross(a, b, c)
  const d4 = cross(a, b, d)
  if (((d1 > 0 && d2 < 0) || (d1 < 0 && d2 > 0)) && ((d3 > 0 && d4 < 0) || (d3 < 0 && d4 > 0))) return 0
  return Math.min(pointToSegment(a, c, d), pointToSegment(b, c, d), pointToSegment(c, a, b), pointToSegment(d, a, b))
}

/** Smallest distance between the boundaries of two placed pieces (outlines and holes). */
function boundaryGap(first: RingPoints[], second: RingPoints[], limit: number): number {
  let best = Infinity
  for (const ringA of first) {
    for (const ringB of second) {
      const boxA = boundingBox(ringA)
      const boxB = boundingBox(ringB)
      if (boxA.minX - limit > boxB.maxX || boxB.minX - limit > boxA.maxX || boxA.minY - limit > boxB.maxY || boxB.minY - limit > boxA.maxY) continue
      for (let i = 0; i < ringA.length; i++) {
        const a = ringA[i]!
        const b = ringA[(i + 1) % ringA.length]!
        // A segment further than `limit` from the other ring's box cannot set a gap below the limit.
        if (Math.min(a[0], b[0]) - limit > boxB.maxX || Math.max(a[0], b[0]) + limit < boxB.minX || Math.min(a[1], b[1]) - limit > boxB.maxY || Math.max(a[1], b[1]) + limit < boxB.minY) continue
        for (let j = 0; j < ringB.length; j++) {
          const distance = segmentDistance(a, b, ringB[j]!, ringB[(j + 1) % ringB.length]!)
          if (distance < best) best = distance
        }
      }
    }
  }
  return best
}

export function verifyLayout(problem: NestProblem, result: NestResult): VerifyReport {
  const problems: string[] = []
  const tolerance = 1e-6
  const spacing = problem.spacing ?? 0
  const margin = problem.margin ?? 0
  const scaleOfJob = Math.max(...problem.items.flatMap((item) => item.outline.flat().map(Math.abs)), 1)
  const linearSlack = 1e-6 * scaleOfJob + 1e-9
  let maxOverlapRatio = 0
  let minGap = Infinity

  const seen = new Set<string>()
  for (const entry of [...result.placements, ...result.unplaced]) {
    const key = `${entry.itemId}#${entry.copy}`
    if (seen.has(key)) problems.push(`${key} appears twice`)
    seen.add(key)
  }
  for (const item of problem.items) {
    for (let copy = 0; copy < item.quantity; copy++) if (!seen.has(`${item.id}#${copy}`)) problems.push(`${item.id}#${copy} is neither placed nor reported unplaced`)
  }

  const itemsById = new Map(problem.items.map((item) => [item.id, item]))
  for (const placement of result.placements) {
    const item = itemsById.get(placement.itemId)
    if (!item) {
      problems.push(`placement of unknown item ${placement.itemId}`)
      continue
    }
    if (!item.rotationsDeg.some((angle) => (((angle - placement.angleDeg) % 360) + 360) % 360 < 1e-9)) problems.push(`${placement.itemId}#${placement.copy} uses an angle that is not allowed (${placement.angleDeg}°)`)
    if (placement.mirrored && (item.mirror ?? 'never') === 'never') problems.push(`${placement.itemId}#${placement.copy} is mirrored but mirroring is not allowed`)
    if (!placement.mirrored && item.mirror === 'always') problems.push(`${placement.itemId}#${placement.copy} must be mirrored`)
    const expected: RingPoints = transformRing(item.outline, placement.angleDeg, placement.mirrored).map(([x, y]) => [x + placement.x, y + placement.y])
    const drift = Math.max(...expected.map(([x, y], index) => Math.hypot(x - placement.outline[index]![0], y - placement.outline[index]![1])))
    if (!(drift <= linearSlack)) problems.push(`${placement.itemId}#${placement.copy}: the reported outline is not the item moved as stated (off by ${drift})`)
  }

  const polygonOf = (placement: Placement): Polygon => [placement.outline, ...placement.holes] as Polygon
  const stock = problem.stock
  for (const placement of result.placements) {
    const box = boundingBox(placement.outline)
    const label = `${placement.itemId}#${placement.copy}`
    if (stock.kind === 'roll') {
      if (box.minY < margin - linearSlack || box.maxY > stock.width - margin + linearSlack || box.minX < margin - linearSlack) problems.push(`${label} is outside the usable roll`)
      if (box.maxX > result.length + linearSlack) problems.push(`${label} reaches past the reported length`)
    } else if (stock.kind === 'sheets') {
      if (box.minX < margin - linearSlack || box.minY < margin - linearSlack || box.maxX > stock.width - margin + linearSlack || box.maxY > stock.height - margin + linearSlack) problems.push(`${label} is outside the usable sheet`)
    } else {
      const outside = areaOfPolygons(polygonClipping.difference(polygonOf(placement), [stock.outline, ...(stock.holes ?? [])] as Polygon))
      if (outside > tolerance * areaOfRing(placement.outline)) problems.push(`${label} lies partly outside the stock (${outside})`)
      if (margin > 0) {
        const gap = boundaryGap([placement.outline], [stock.outline, ...(stock.holes ?? [])], margin)
        if (gap < margin - linearSlack) problems.push(`${label} is ${gap} from the stock edge, closer than the margin ${margin}`)
      }
    }
    // A zone keeps only its own sheet clear (every sheet when it names none); a roll or a stock outline is sheet 0.
    for (const [index, zone] of (problem.excludedZones ?? []).entries()) {
      if (!zoneAppliesToSheet(zone, placement.sheet)) continue
      const overlap = areaOfPolygons(polygonClipping.intersection(polygonOf(placement), [zone.outline] as Polygon))
      if (overlap > tolerance * areaOfRing(placement.outline)) problems.push(`${label} covers excluded zone ${index + 1}${zone.sheet === undefined ? '' : ` of sheet ${zone.sheet}`} (${overlap})`)
    }
  }

  const placements = result.placements.map((placement) => ({ placement, box: boundingBox(placement.outline), area: areaOfRing(placement.outline) }))
  placements.sort((left, right) => left.box.minX - right.box.minX)
  for (let i = 0; i < placements.length; i++) {
    const first = placements[i]!
    for (let j = i + 1; j < placements.length; j++) {
      const second = placements[j]!
      if (second.box.minX > first.box.maxX + spacing) break
      if (first.placement.sheet !== second.placement.sheet) continue
      if (second.box.minY > first.box.maxY + spacing || first.box.minY > second.box.maxY + spacing) continue
      const overlap = areaOfPolygons(polygonClipping.intersection(polygonOf(first.placement), polygonOf(second.placement)))
      const ratio = overlap / Math.min(first.area, second.area)
      maxOverlapRatio = Math.max(maxOverlapRatio, ratio)
      if (ratio > tolerance) problems.push(`${first.placement.itemId}#${first.placement.copy} overlaps ${second.placement.itemId}#${second.placement.copy} (${(ratio * 100).toPrecision(3)} % of the smaller)`)
      else if (spacing > 0) {
        const gap = boundaryGap([first.placement.outline, ...first.placement.holes], [second.placement.outline, ...second.placement.holes], spacing)
        minGap = Math.min(minGap, gap)
        if (gap < spacing - linearSlack) problems.push(`${first.placement.itemId}#${first.placement.copy} and ${second.placement.itemId}#${second.placement.copy} are ${gap.toPrecision(4)} apart, closer than the spacing ${spacing}`)
      }
    }
  }
  return { ok: problems.length === 0, problems, maxOverlapRatio, minGap }
}
