import { buildPieces, type CutLineGeometry, type PieceGeometry } from './pieces.js'
import { boundingBox, mergeBoxes, type Box } from './polygon.js'
import { readSvgDrawing, type ReadWarning } from './svgDocument.js'
import { SvgReadError } from './xmlTree.js'

export interface ImportOptions {
  /** Largest distance between a flattened chord and the true curve, mm. */
  toleranceMm?: number
  /** Closed areas smaller than this are reported as specks and left out, mm². */
  minSpeckAreaMm2?: number
}

export const defaultImportOptions = { toleranceMm: 0.02, minSpeckAreaMm2: 0.5 } as const

export interface ImportedDesign {
  /** The document's own size (its width and height, or viewBox size in px). */
  widthMm: number
  heightMm: number
  /** Extent of the pieces and cut lines. */
  bbox: Box
  areaMm2: number
  /** Pieces' outlines and holes plus cut lines, along the true curves. */
  cutLengthMm: number
  pieces: PieceGeometry[]
  cutLines: CutLineGeometry[]
  holeCount: number
  /** How the file was read: everything ignored, approximated or resolved, with counts. */
  warnings: ReadWarning[]
  toleranceMm: number
}

/**
 * SVG text → pieces and cut lines in millimetres. Pure: no DOM, no I/O, same answer on server and client.
 * Throws SvgReadError (with a code and a message for people) when the file cannot be used.
 */
export function importSvg(text: string, options: ImportOptions = {}): ImportedDesign {
  const toleranceMm = options.toleranceMm ?? defaultImportOptions.toleranceMm
  const minSpeckAreaMm2 = options.minSpeckAreaMm2 ?? defaultImportOptions.minSpeckAreaMm2
  if (!(toleranceMm > 0) || toleranceMm > 5) throw new RangeError('toleranceMm must be above 0 and at most 5')
  if (!(minSpeckAreaMm2 >= 0)) throw new RangeError('minSpeckAreaMm2 must be 0 or more')
  const drawing = readSvgDrawing(text)
  const { pieces, cutLines, warnings } = buildPieces(drawing.shapes, { toleranceMm, minSpeckAreaMm2 })
  const bbox = mergeBoxes([...pieces.map((piece) => piece.bbox), ...cutLines.map((line) => boundingBox(line.points))])
  if (!bbox) throw new SvgReadError('empty', 'The file has no outlines to cut')
  return {
    widthMm: drawing.widthMm || bbox.maxX,
    heightMm: drawing.heightMm || bbox.maxY,
    bbox,
    areaMm2: pieces.reduce((sum, piece) => sum + piece.areaMm2, 0),
    cutLengthMm: pieces.reduce((sum, piece) => sum + piece.cutLengthMm, 0) + cutLines.reduce((sum, line) => sum + line.lengthMm, 0),
    pieces,
    cutLines,
    holeCount: pieces.reduce((sum, piece) => sum + piece.holes.length, 0),
    warnings: [...drawing.warnings, ...warnings],
    toleranceMm,
  }
}

export { SvgReadError }
