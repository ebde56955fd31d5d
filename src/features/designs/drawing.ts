import type { DesignGeometry, DesignPiece } from '../../../shared/schemas/index'

type Point = [number, number]
type Box = { minX: number; minY: number; maxX: number; maxY: number }

/** Thousandths of a millimetre are far below what a screen shows and keep the path text short. */
const coordinate = (value: number) => String(Number(value.toFixed(3)))

function pointList(points: readonly Point[]): string {
  return points.map(([x, y]) => `${coordinate(x)} ${coordinate(y)}`).join('L')
}

/** A closed ring as SVG path data; fewer than three points draw nothing. */
export function ringPathData(ring: readonly Point[]): string {
  return ring.length < 3 ? '' : `M${pointList(ring)}Z`
}

/** Outline and holes in one path, to be filled with fill-rule evenodd so the holes stay open. */
export function piecePathData(piece: Pick<DesignPiece, 'outline' | 'holes'>): string {
  return [piece.outline, ...piece.holes].map(ringPathData).join('')
}

/** An open polyline; a single point draws nothing. */
export function cutLinePathData(points: readonly Point[]): string {
  return points.length < 2 ? '' : `M${pointList(points)}`
}

/** The box around the whole drawing with a margin, so strokes at the edge are not clipped. */
export function drawingViewBox(bbox: Box, marginRatio = 0.03): [number, number, number, number] {
  const width = Math.max(bbox.maxX - bbox.minX, 1e-3)
  const height = Math.max(bbox.maxY - bbox.minY, 1e-3)
  const margin = Math.max(width, height) * marginRatio
  return [bbox.minX - margin, bbox.minY - margin, width + 2 * margin, height + 2 * margin]
}

export interface DesignDrawingPaths {
  pieces: string[]
  cutLines: string[]
}

export function geometryPaths(geometry: DesignGeometry): DesignDrawingPaths {
  return {
    pieces: geometry.pieces.map(piecePathData),
    cutLines: geometry.cutLines.map((line) => cutLinePathData(line.points)),
  }
}

/**
 * A round grid step (1, 2 or 5 × a power of ten, in the person's unit) giving roughly `targetLines`
 * lines across the longer side, returned in millimetres.
 */
export function gridStepMm(extentMm: number, unitMm: number, targetLines = 8): number {
  const extentInUnit = Math.max(extentMm / unitMm, 1e-6)
  const rough = extentInUnit / targetLines
  const power = 10 ** Math.floor(Math.log10(rough))
  const step = [1, 2, 5, 10].map((factor) => factor * power).find((candidate) => candidate >= rough) ?? 10 * power
  return step * unitMm
}

/** Grid lines at whole multiples of the step inside a viewBox, as one path. */
export function gridPathData(viewBox: readonly [number, number, number, number], stepMm: number): string {
  const [x, y, width, height] = viewBox
  if (!(stepMm > 0)) return ''
  const parts: string[] = []
  for (let lineX = Math.ceil(x / stepMm) * stepMm; lineX <= x + width; lineX += stepMm) {
    parts.push(`M${coordinate(lineX)} ${coordinate(y)}V${coordinate(y + height)}`)
  }
  for (let lineY = Math.ceil(y / stepMm) * stepMm; lineY <= y + height; lineY += stepMm) {
    parts.push(`M${coordinate(x)} ${coordinate(lineY)}H${coordinate(x + width)}`)
  }
  return parts.join('')
}
