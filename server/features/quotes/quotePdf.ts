import PDFDocument from 'pdfkit'
import { customerLines, quantityWithUnit } from '../../../shared/quotes/arithmetic.js'
import { formatMinor } from '../../../shared/quotes/money.js'
import type { QuoteRow, QuoteVersionRow } from './quotes.repo.js'

export interface QuotePdfInput {
  studioName: string
  quote: Pick<QuoteRow, 'number' | 'title' | 'customerName' | 'customerEmail' | 'currency' | 'createdAt'>
  version: QuoteVersionRow
  expiresAt: Date | null
  /** Printed on a sent copy so a paper reader can find the online quote. */
  publicUrl: string | null
  payUrl: string | null
}

const day = (date: Date) => date.toISOString().slice(0, 10)

/** The printable quote: studio, customer, the customer's lines with quantity, unit price and amount, the sums and the tax. A4. */
export function quotePdf(input: QuotePdfInput): Promise<Buffer> {
  const { quote, version } = input
  const money = (minor: number) => formatMinor(minor, quote.currency)
  const doc = new PDFDocument({ size: 'A4', margin: 48, info: { Title: `Quote ${quote.number}`, Creator: 'Sheetsmith' } })
  const chunks: Buffer[] = []
  doc.on('data', (chunk: Buffer) => chunks.push(chunk))
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)))
    doc.on('error', reject)
  })

  const left = doc.page.margins.left
  const width = doc.page.width - doc.page.margins.left - doc.page.margins.right
  doc.font('Helvetica-Bold').fontSize(18).text(input.studioName || 'Quote', left, 48)
  doc.font('Helvetica').fontSize(11).fillColor('#444444').text(`Quote ${quote.number}${quote.title ? ` · ${quote.title}` : ''}`)
  doc.moveDown(0.5)
  doc.fontSize(10).fillColor('#000000')
  doc.text(`For: ${quote.customerName || quote.customerEmail || '—'}${quote.customerName && quote.customerEmail ? ` <${quote.customerEmail}>` : ''}`)
  doc.text(`Date: ${day(version.createdAt)} · version ${version.version}`)
  if (input.expiresAt) doc.text(`Valid until: ${day(input.expiresAt)}`)
  doc.text(`Currency: ${quote.currency}`)
  doc.moveDown(1)

  const columns = [
    { label: 'Item', x: left, width: width * 0.46, align: 'left' as const },
    { label: 'Quantity', x: left + width * 0.46, width: width * 0.16, align: 'right' as const },
    { label: 'Unit price', x: left + width * 0.62, width: width * 0.18, align: 'right' as const },
    { label: 'Amount', x: left + width * 0.8, width: width * 0.2, align: 'right' as const },
  ]
  const row = (cells: string[], bold = false) => {
    const y = doc.y
    doc.font(bold ? 'Helvetica-Bold' : 'Helvetica').fontSize(10)
    let bottom = y
    cells.forEach((cell, index) => {
      const column = columns[index]!
      doc.text(cell, column.x, y, { width: column.width - 6, align: column.align })
      bottom = Math.max(bottom, doc.y)
    })
    doc.x = left
    doc.y = bottom + 4
  }
  row(columns.map((column) => column.label), true)
  doc.moveTo(left, doc.y).lineTo(left + width, doc.y).strokeColor('#999999').stroke()
  doc.y += 4
  // The printed quote goes to the customer: handling is folded into the material, as on the public page.
  for (const line of customerLines(version.lines, quote.currency)) {
    if (doc.y > doc.page.height - 140) doc.addPage()
    row([line.description, quantityWithUnit(line.quantity, line.unit), line.unitPriceMinor === null || line.unit === '%' ? '' : money(line.unitPriceMinor), money(line.amountMinor)])
  }
  doc.moveTo(left, doc.y).lineTo(left + width, doc.y).strokeColor('#999999').stroke()
  doc.y += 6
  const sum = (label: string, minor: number, bold = false) => row([label, '', '', money(minor)], bold)
  sum('Subtotal', version.subtotalMinor)
  if (version.minimumTopUpMinor > 0) sum(`Minimum order top-up (minimum ${money(version.minimumOrderMinor)})`, version.minimumTopUpMinor)
  sum(`Tax ${version.taxRatePercent}%`, version.taxMinor)
  sum(`Total (${quote.currency})`, version.totalMinor, true)
  doc.moveDown(1.5)
  doc.font('Helvetica').fontSize(9).fillColor('#444444')
  if (input.publicUrl) doc.text(`See this quote online, accept or decline it: ${input.publicUrl}`, left, doc.y, { width })
  if (input.payUrl) doc.text(`Pay link: ${input.payUrl}`, left, doc.y, { width })
  doc.end()
  return done
}
