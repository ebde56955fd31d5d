import type { DesignGeometry } from '../schemas/designs.js'
import type { CreateNestRunRequest, NestRunItem } from '../schemas/nesting.js'
import type { ExcludedZone, NestItem, NestProblem, NestStock, RingPoints, Vec } from './types.js'

/** Andrew's monotone chain: the convex hull of a point set, counter-clockwise, O(n log n). */
export function convexHull(points: Vec[]): RingPoints {
  const sorted = [...points].sort((a, b) => a[0] - b[0] || a[1] - b[1])
  if (sorted.length < 3) return sorted
  const cross = (o: Vec, a: Vec, b: Vec) => (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0])
  const lower: Vec[] = []
  for (const point of sorted) {
    while (lower.length >= 2 && cross(lower[lower.length - 2]!, lower[lower.length - 1]!, point) <= 0) lower.pop()
    lower.push(point)
  }
  const upper: Vec[] = []
  for (let index = sorted.length - 1; index >= 0; index--) {
    const point = sorted[index]!
    while (upper.length >= 2 && cross(upper[upper.length - 2]!, upper[upper.length - 1]!, point) <= 0) upper.pop()
    upper.push(point)
  }
  upper.pop()
  lower.pop()
  return [...lower, ...upper]
}

/** The angles a rotation policy allows; grain lock keeps the grain's direction (0° and 180° at most). */
export function allowedAngles(item: Pick<NestRunItem, 'rotation' | 'rotationStepDeg' | 'grainLock'>): number[] {
  let angles: number[]
  switch (item.rotation ?? 'quarter-turns') {
    case 'none':
      angles = [0]
      break
    case 'half-turn':
      angles = [0, 180]
      break
    case 'quarter-turns':
      angles = [0, 90, 180, 270]
      break
    case 'any-step': {
      const step = item.rotationStepDeg ?? 15
      angles = []
      for (let angle = 0; angle < 360 - 1e-9; angle += step) angles.push(Number(angle.toFixed(6)))
      break
    }
  }
  return item.grainLock ? angles.filter((angle) => angle === 0 || angle === 180) : angles
}

/** A request's excluded zones as the engine takes them: an outline alone acts on every sheet, `{ sheet, outline }` on that sheet. */
export function nestZonesOf(zones: CreateNestRunRequest['excludedZones']): ExcludedZone[] {
  return (zones ?? []).map((zone) => (Array.isArray(zone) ? { outline: zone } : { sheet: zone.sheet, outline: zone.outline }))
}

/** Item ids carry where a piece came from: `<designId>:<pieceIndex>`, with -1 for a design kept together. */
export const itemIdFor = (designId: string, pieceIndex: number) => `${designId}:${pieceIndex}`
export function parseItemId(itemId: string): { designId: string; pieceIndex: number } {
  const separator = itemId.lastIndexOf(':')
  return { designId: itemId.slice(0, separator), pieceIndex: Number(itemId.slice(separator + 1)) }
}

export interface DesignForNesting {
  id: string
  keepTogether: boolean
  geometry: DesignGeometry
}

/**
 * Turns a nest-run request and the stored designs into a nesting problem in millimetres.
 * A design kept together is one item: the convex hull of its pieces (they move as one; the hull keeps them
 * apart from other pieces, so nothing is nested between them). Otherwise every piece is an item with its holes,
 * so small pieces can land inside them.
 */
export function problemFromDesigns(request: CreateNestRunRequest, designs: Map<string, DesignForNesting>): NestProblem {
  const items: NestItem[] = []
  for (const entry of request.items) {
    const design = designs.get(entry.designId)
    if (!design) throw new Error(`design ${entry.designId} is missing`)
    const angles = allowedAngles(entry)
    const mirror = entry.mirror ?? 'never'
    const pieces = design.geometry.pieces
    if (pieces.length === 0) continue
    if (design.keepTogether && pieces.length > 1) {
      const hull = convexHull(pieces.flatMap((piece) => piece.outline))
      items.push({ id: itemIdFor(design.id, -1), outline: hull, quantity: entry.quantity, rotationsDeg: angles, mirror })
    } else {
      pieces.forEach((piece, pieceIndex) => {
        items.push({ id: itemIdFor(design.id, pieceIndex), outline: piece.outline, holes: piece.holes, quantity: entry.quantity, rotationsDeg: angles, mirror })
      })
    }
  }
  const stockInput = request.stock
  const stock: NestStock =
    stockInput.kind === 'roll'
      ? { kind: 'roll', width: stockInput.widthMm, maxLength: stockInput.maxLengthMm }
      : stockInput.kind === 'sheets'
        ? { kind: 'sheets', width: stockInput.widthMm, height: stockInput.heightMm, maxSheets: stockInput.maxSheets }
        : { kind: 'polygon', outline: stockInput.outline, holes: stockInput.holes }
  return {
    items,
    stock,
    spacing: request.spacingMm ?? 2,
    margin: request.marginMm ?? 5,
    excludedZones: nestZonesOf(request.excludedZones),
    // Flattened curves carry many points and the cost of a no-fit region grows with the product of two shapes' point
    // counts. Shapes grow by the tolerance so no piece comes closer than the spacing; 0.1 mm is the value checked on
    // coarse integer grids (with 0.3 mm a long roll's coarser grid let keyring fobs come 0.5 mm too close).
    simplifyTolerance: 0.1,
  }
}
