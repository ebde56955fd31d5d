import PDFDocument from 'pdfkit'
import type { DesignForCutPlan, PlacementForCutPlan } from '../../../shared/cutplan/contours.js'
import type { LayoutCutPlan, SheetCutFigures, SheetCutPlan } from '../../../shared/cutplan/plan.js'
import type { LayoutStock } from '../../../shared/schemas/layouts.js'

export interface JobSheetInput {
  layoutName: string
  stock: LayoutStock
  plan: LayoutCutPlan
  /** The sheets to print (all, or the one asked for). */
  sheets: SheetCutPlan[]
  designs: ReadonlyMap<string, DesignForCutPlan>
  placements: readonly PlacementForCutPlan[]
  /** The job's material and its recipe in words; without it the sheet leaves lines to fill in by hand. */
  material?: { name: string; recipeText: string }
}

/** Checks, easiest first, when cuts do not go through (common practice of blade cutting, in our own words). */
export const cutThroughChecklist = [
  'Are the pinch rollers down and sitting over the grit areas (their working position)?',
  'Is there tape or adhesive left on the blade tip or inside the blade housing? Clean it off.',
  'Does the blade spring move freely and spring back when pressed?',
  'Is the blade still sharp? Ragged or torn edges on fine paper cuts are the first sign of a dull one.',
  'Is the right material chosen on the cutter, with its tested settings?',
  'Raise the force a little at a time (about 15 steps of the force scale) with a test cut after each change.',
  'Still not cutting? Contact the cutter maker\'s support.',
]

export const bladeCaution =
  'Caution: blades are very sharp. Hold the housing, never the tip; put the cap back on before storing a blade, and keep spare and used blades in a closed container away from children.'

const metres = (mm: number) => `${(mm / 1000).toFixed(2)} m`
const duration = (seconds: number) => {
  const total = Math.round(seconds)
  const minutes = Math.floor(total / 60)
  return minutes > 0 ? `${minutes} min ${String(total % 60).padStart(2, '0')} s` : `${total} s`
}
const size = (widthMm: number, heightMm: number) => `${Math.round(widthMm * 10) / 10} x ${Math.round(heightMm * 10) / 10} mm`

function figureRows(figures: Omit<SheetCutFigures, 'sheet' | 'widthMm' | 'heightMm'>): [string, string][] {
  const saving = figures.travelInPlacementOrderMm > 0 ? ` (${Math.round((1 - figures.travelLengthMm / figures.travelInPlacementOrderMm) * 100)} % less than in placement order)` : ''
  const rows: [string, string][] = [
    ['Pieces', String(figures.pieceCount)],
    ['Contours', String(figures.contourCount)],
    ['Cut length', metres(figures.cutLengthMm)],
    ['Travel, blade up', `${metres(figures.travelLengthMm)}${saving}`],
    ['Blade lifts', String(figures.lifts)],
    ['Estimated time', `${duration(figures.totalTimeS)} (cutting ${duration(figures.cutTimeS)}, travel ${duration(figures.travelTimeS)}, lifts ${duration(figures.liftTimeS)})`],
  ]
  if (figures.commonLineSavedMm > 0) rows.push(['Common-line saving', metres(figures.commonLineSavedMm)])
  if (figures.weedingLengthMm > 0) rows.push(['Weeding cuts', metres(figures.weedingLengthMm)])
  return rows
}

/**
 * The printable job sheet: summary figures, a drawing of each sheet in cut order with its own figures, the piece list
 * with counts, room to note material and settings, the easiest-first checklist and the blade caution. A4 portrait.
 */
export function jobSheetPdf(input: JobSheetInput): Promise<Buffer> {
  const doc = new PDFDocument({ size: 'A4', margin: 40, info: { Title: `${input.layoutName} - job sheet`, Creator: 'Sheetsmith' } })
  const chunks: Buffer[] = []
  doc.on('data', (chunk: Buffer) => chunks.push(chunk))
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)))
    doc.on('error', reject)
  })
  const left = doc.page.margins.left
  const usableWidth = doc.page.width - doc.page.margins.left - doc.page.margins.right

  const table = (rows: [string, string][]) => {
    for (const [label, value] of rows) {
      const y = doc.y
      doc.font('Helvetica-Bold').fontSize(10).text(label, left, y, { width: 140 })
      doc.font('Helvetica').fontSize(10).text(value, left + 150, y, { width: usableWidth - 150 })
      doc.moveDown(0.2)
    }
  }

  doc.font('Helvetica-Bold').fontSize(18).text(`Job sheet: ${input.layoutName}`)
  const stockText =
    input.stock.kind === 'sheets'
      ? `Sheets of ${size(input.stock.widthMm, input.stock.heightMm)}`
      : input.stock.kind === 'polygon'
        ? `Remnant within ${size(input.stock.widthMm, input.stock.heightMm)}`
        : `Roll ${Math.round(input.stock.widthMm)} mm wide`
  doc.font('Helvetica').fontSize(10).text(`${stockText}. Cutter profile: ${input.plan.profile.name} (cut ${input.plan.profile.cutSpeedMmS} mm/s, travel ${input.plan.profile.travelSpeedMmS} mm/s). Passes: ${input.plan.options.passes}.`)
  doc.moveDown(0.5)
  if (input.material) {
    doc.font('Helvetica-Bold').fontSize(10).text(`Material: ${input.material.name}`)
    doc.font('Helvetica').fontSize(10).text(`Recipe: ${input.material.recipeText}`)
  } else {
    doc.font('Helvetica-Bold').fontSize(10).text('Material: ______________________   Blade / force / speed: ______________________')
  }
  doc.moveDown(0.8)

  doc.font('Helvetica-Bold').fontSize(13).text('Whole job')
  doc.moveDown(0.3)
  table([['Sheets', String(input.plan.totals.sheetCount)], ...figureRows(input.plan.totals)])
  doc.moveDown(0.8)

  // Piece list: placed pieces per design and sheet.
  const counts = new Map<string, Map<number, number>>()
  for (const placement of input.placements) {
    const design = input.designs.get(placement.designId)
    if (!design) continue
    const pieces = placement.pieceIndex === -1 ? Math.max(1, design.geometry.pieces.length) : 1
    const perSheet = counts.get(design.name) ?? new Map<number, number>()
    perSheet.set(placement.sheet, (perSheet.get(placement.sheet) ?? 0) + pieces)
    counts.set(design.name, perSheet)
  }
  doc.font('Helvetica-Bold').fontSize(13).text('Pieces')
  doc.moveDown(0.3)
  if (counts.size === 0) doc.font('Helvetica').fontSize(10).text('No pieces are placed in this layout.')
  for (const [name, perSheet] of [...counts.entries()].sort(([a], [b]) => a.localeCompare(b))) {
    const total = [...perSheet.values()].reduce((sum, count) => sum + count, 0)
    const where = [...perSheet.entries()]
      .sort(([a], [b]) => a - b)
      .map(([sheet, count]) => `sheet ${sheet + 1}: ${count}`)
      .join(', ')
    table([[name, `${total} (${where})`]])
  }
  doc.moveDown(0.8)

  doc.font('Helvetica-Bold').fontSize(13).text('When a cut does not go through, check in this order')
  doc.moveDown(0.3)
  doc.font('Helvetica').fontSize(10).list(cutThroughChecklist, { listType: 'numbered' } as PDFKit.Mixins.TextOptions)
  doc.moveDown(0.8)
  doc.font('Helvetica-Bold').fontSize(10).fillColor('#9a1b1b').text(bladeCaution).fillColor('#000')

  for (const sheet of input.sheets) {
    doc.addPage()
    const { figures } = sheet
    doc.font('Helvetica-Bold').fontSize(15).text(`Sheet ${figures.sheet + 1} (${size(figures.widthMm, figures.heightMm)})`)
    doc.moveDown(0.3)
    table(figureRows(figures))
    doc.moveDown(0.5)
    drawSheet(doc, sheet, left, doc.y, usableWidth, doc.page.height - doc.page.margins.bottom - doc.y - 20)
  }
  doc.end()
  return done
}

/** The sheet to scale inside the box: its edge, every cut (inner contours grey, outlines black), the start marked. */
function drawSheet(doc: PDFKit.PDFDocument, sheet: SheetCutPlan, x: number, y: number, width: number, height: number) {
  const { widthMm, heightMm } = sheet.figures
  if (!(widthMm > 0 && heightMm > 0) || height < 40) return
  const scale = Math.min(width / widthMm, height / heightMm)
  const at = (point: readonly [number, number]): [number, number] => [x + point[0] * scale, y + point[1] * scale]
  doc.save().lineWidth(0.5).strokeColor('#888').rect(x, y, widthMm * scale, heightMm * scale).stroke().restore()
  for (const cut of sheet.cuts) {
    if (cut.outline.length < 2) continue
    const colour = cut.role === 'outline' ? '#000' : cut.role.startsWith('weeding') ? '#2a6fb0' : '#666'
    doc.save().lineWidth(0.6).strokeColor(colour)
    const [firstX, firstY] = at(cut.outline[0]!)
    doc.moveTo(firstX, firstY)
    for (const point of cut.outline.slice(1)) doc.lineTo(...at(point))
    if (cut.closed) doc.closePath()
    doc.stroke().restore()
  }
  const [startX, startY] = at(sheet.start)
  doc.save().fillColor('#c0392b').circle(startX, startY, 3).fill().restore()
  doc.font('Helvetica').fontSize(8).fillColor('#555').text('Red dot: cutter origin, where the blade starts.', x, y + heightMm * scale + 4).fillColor('#000')
}
