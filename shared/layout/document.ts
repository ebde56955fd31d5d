import { boundingBox, type Box } from '../geometry/polygon.js'
import type { LayoutItem, LayoutOptions, LayoutPlacement, LayoutStock } from '../schemas/layouts.js'

/** What the editor edits and saves: the body of a layout without its server-kept fields (id, version, figures). */
export interface LayoutDocument {
  name: string
  stock: LayoutStock
  items: LayoutItem[]
  placements: LayoutPlacement[]
  options: LayoutOptions
}

/** Sheets side by side, or the one roll or polygon stock (lane 0). */
export function laneCount(stock: LayoutStock): number {
  return stock.kind === 'sheets' ? stock.sheetCount : 1
}

/**
 * The drawn size of one lane in sheet coordinates: a sheet (or the box around a polygon stock) as it is; a roll with
 * its length along x and its width along y, as the nesting engine lays a roll out.
 */
export function laneSize(stock: LayoutStock): { widthMm: number; heightMm: number } {
  return stock.kind === 'roll' ? { widthMm: stock.lengthMm, heightMm: stock.widthMm } : { widthMm: stock.widthMm, heightMm: stock.heightMm }
}

/**
 * Where pieces may lie on one lane, as a box: the stock less the margin on every side (the roll's drawn end counts as
 * an edge). For a polygon stock this is the box around its outline less the margin; the exact region is
 * `usableRegion` (shared/layout/polygonStock.ts).
 */
export function usableArea(stock: LayoutStock, options: Pick<LayoutOptions, 'marginMm'>): Box {
  const margin = options.marginMm
  if (stock.kind === 'polygon') {
    const box = boundingBox(stock.outline)
    return { minX: box.minX + margin, minY: box.minY + margin, maxX: box.maxX - margin, maxY: box.maxY - margin }
  }
  const { widthMm, heightMm } = laneSize(stock)
  return { minX: margin, minY: margin, maxX: widthMm - margin, maxY: heightMm - margin }
}

export function zonesOfSheet(options: Pick<LayoutOptions, 'excludedZones'>, sheet: number): [number, number][][] {
  return options.excludedZones.filter((zone) => zone.sheet === sheet).map((zone) => zone.outline)
}

/** One copy of a design becomes these placements: the whole design kept together (-1), else one per piece. */
export function copyPieceIndices(design: { keepTogether: boolean; geometry: { pieces: unknown[]; cutLines: unknown[] } }): number[] {
  const pieceCount = design.geometry.pieces.length
  if (pieceCount === 0) return design.geometry.cutLines.length > 0 ? [-1] : []
  if (design.keepTogether && pieceCount > 1) return [-1]
  return Array.from({ length: pieceCount }, (_, index) => index)
}

export const normaliseAngle = (angleDeg: number): number => {
  const turned = ((angleDeg % 360) + 360) % 360
  // 359.9999999 after floating steps is 0 to a maker.
  return Math.abs(turned - 360) < 1e-6 || Math.abs(turned) < 1e-6 ? 0 : Number(turned.toFixed(6))
}
