import type { CreateNestRunRequest, NestPlacementDto, NestResultDto, UnitSystem } from '../../../shared/schemas/index'
import { formatLength, formatSize } from '../designs/measures'
import { defaultMarginMm, presetMatching } from './nestDraft'

type Point = [number, number]

export interface NestResultFigures {
  placedCount: number
  wantedCount: number
  /** Area of the pieces that were placed (unplaced ones use no stock). */
  placedAreaMm2: number
  /** Whole sheets for sheet stock (a started sheet is a used sheet); the used length for a roll. */
  usedStockAreaMm2: number
  wasteAreaMm2: number
  utilisation: number
  /**
   * Sheets only: utilisation counting the last sheet only up to its last piece, as the search scores it;
   * the rest of that sheet is a remnant that can be kept. Null for rolls, where the two are the same.
   */
  upToLastPieceUtilisation: number | null
}

/**
 * The figures a maker reads off a result. For sheets, utilisation is over whole sheets, since a started sheet is
 * bought and cut. Piece areas come from the server's per-sheet figures, which use each piece's true area (from the
 * design's curves, not the flattened outline) and count placed pieces only, so the total is their area-weighted mean.
 */
export function resultFigures(request: CreateNestRunRequest, result: NestResultDto): NestResultFigures {
  const stock = request.stock
  const sheetShares = (areaMm2: number) => result.perSheetUtilisation.reduce((sum, share) => sum + share * areaMm2, 0)
  let usedStockAreaMm2: number
  let placedAreaMm2: number
  if (stock.kind === 'sheets') {
    usedStockAreaMm2 = result.sheetCount * stock.widthMm * stock.heightMm
    placedAreaMm2 = sheetShares(stock.widthMm * stock.heightMm)
  } else if (stock.kind === 'roll') {
    usedStockAreaMm2 = stock.widthMm * result.lengthMm
    placedAreaMm2 = sheetShares(usedStockAreaMm2)
  } else {
    usedStockAreaMm2 = result.usedStockAreaMm2
    placedAreaMm2 = result.pieceAreaMm2
  }
  return {
    placedCount: result.placements.length,
    wantedCount: result.placements.length + result.unplaced.length,
    placedAreaMm2,
    usedStockAreaMm2,
    wasteAreaMm2: Math.max(0, usedStockAreaMm2 - placedAreaMm2),
    utilisation: usedStockAreaMm2 > 0 ? placedAreaMm2 / usedStockAreaMm2 : 0,
    upToLastPieceUtilisation: stock.kind === 'sheets' ? result.utilisation : null,
  }
}

/** "62.3 %": one decimal is finer than any choice between layouts needs. */
export function formatPercent(fraction: number): string {
  return `${(fraction * 100).toFixed(1)} %`
}

export function formatSeconds(milliseconds: number): string {
  return `${(milliseconds / 1000).toFixed(1)} s`
}

/**
 * Fills for pieces, one per design in the order of the run's items: the house teal, terracotta and amber first,
 * then colours far enough apart in hue to tell neighbours apart on a busy sheet.
 */
export const designPalette = ['#1f7a73', '#c8553d', '#d19a2e', '#5f5aa2', '#5d8a3c', '#2f6f9f', '#a8557f', '#7c6a46', '#3b8f8a', '#b07a2a'] as const

export function colourForItem(index: number): string {
  return designPalette[index % designPalette.length]!
}

export interface NestDrawingFrame {
  /** Sheet index (0 for a roll). */
  index: number
  /** Extent drawn, in stock millimetres; x runs along a roll's length. */
  widthMm: number
  heightMm: number
  /** Stock that exists beyond what was used (a roll goes on): drawn faded past `usedWidthMm`. */
  usedWidthMm: number
  marginMm: number
  /** For stock given as an outline; rectangles leave it null. */
  outlinePath: string | null
  placements: NestPlacementDto[]
  utilisation: number
}

/**
 * What to draw for a result: each sheet, or the used length of the roll with a little of the roll beyond it,
 * with the placements that belong there. Placements are already in stock coordinates.
 */
export function drawingFrames(request: CreateNestRunRequest, result: NestResultDto): NestDrawingFrame[] {
  const marginMm = request.marginMm ?? defaultMarginMm
  const stock = request.stock
  if (stock.kind === 'roll') {
    const tailMm = Math.max(stock.widthMm * 0.08, 10)
    return [
      {
        index: 0,
        widthMm: result.lengthMm + tailMm,
        heightMm: stock.widthMm,
        usedWidthMm: result.lengthMm,
        marginMm,
        outlinePath: null,
        placements: result.placements,
        utilisation: result.perSheetUtilisation[0] ?? result.utilisation,
      },
    ]
  }
  if (stock.kind === 'sheets') {
    return Array.from({ length: result.sheetCount }, (_, index) => ({
      index,
      widthMm: stock.widthMm,
      heightMm: stock.heightMm,
      usedWidthMm: stock.widthMm,
      marginMm,
      outlinePath: null,
      placements: result.placements.filter((placement) => placement.sheet === index),
      utilisation: result.perSheetUtilisation[index] ?? 0,
    }))
  }
  const points = stock.outline
  const maxX = Math.max(...points.map(([x]) => x))
  const maxY = Math.max(...points.map(([, y]) => y))
  const ring = (list: readonly Point[]) => `M${list.map(([x, y]) => `${x} ${y}`).join('L')}Z`
  return [
    {
      index: 0,
      widthMm: maxX,
      heightMm: maxY,
      usedWidthMm: maxX,
      marginMm,
      outlinePath: [points, ...(stock.holes ?? [])].map(ring).join(''),
      placements: result.placements,
      utilisation: result.perSheetUtilisation[0] ?? result.utilisation,
    },
  ]
}

/** A short name for the stock of a request: "A4 sheets", "Sheets 300.0 × 450.0 mm", "24 in (610 mm) roll", "Roll 500.0 mm wide". */
export function stockDescription(stock: CreateNestRunRequest['stock'], unit: UnitSystem): string {
  if (stock.kind === 'sheets') {
    const preset = presetMatching('sheets', stock.widthMm, stock.heightMm)
    return preset ? `${preset.label} sheets` : `Sheets ${formatSize(stock.widthMm, stock.heightMm, unit)}`
  }
  if (stock.kind === 'roll') {
    const preset = presetMatching('roll', stock.widthMm)
    return preset ? `${preset.label} roll` : `Roll ${formatLength(stock.widthMm, unit)} wide`
  }
  return 'Stock of its own outline'
}
