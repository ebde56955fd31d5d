import type { SheetCutPlan } from './plan.js'

/** Millimetres to at most three decimals (a micrometre), without trailing zeros: exact enough, small files. */
export const formatMm = (value: number) => {
  const rounded = Math.round(value * 1000) / 1000
  return Object.is(rounded, -0) ? '0' : String(rounded)
}

const escapeXml = (text: string) => text.replace(/[<>&"']/g, (character) => `&#${character.charCodeAt(0)};`)

/**
 * One sheet as SVG in millimetres (width, height and viewBox in mm, so one user unit is 1 mm). Paths follow the cut
 * order, each contour from where the blade enters; consecutive contours of one placed piece share a <g>, labelled with
 * the piece (a piece whose contours are cut apart appears in more than one group). Only a thin stroke is set, so the
 * file shows the cut lines in any viewer; passes and overcut belong to the cutter file, not here.
 */
export function sheetToSvg(plan: SheetCutPlan, title?: string): string {
  const { widthMm, heightMm } = plan.figures
  const lines: string[] = [
    '<?xml version="1.0" encoding="UTF-8"?>',
    `<svg xmlns="http://www.w3.org/2000/svg" width="${formatMm(widthMm)}mm" height="${formatMm(heightMm)}mm" viewBox="0 0 ${formatMm(widthMm)} ${formatMm(heightMm)}">`,
  ]
  if (title) lines.push(`<title>${escapeXml(title)}</title>`)
  lines.push('<g fill="none" stroke="#000" stroke-width="0.2">')
  let openGroup: string | undefined
  for (const cut of plan.cuts) {
    if (cut.groupKey !== openGroup) {
      if (openGroup !== undefined) lines.push('</g>')
      lines.push(`<g data-piece="${escapeXml(cut.groupLabel)}">`)
      openGroup = cut.groupKey
    }
    const data = cut.outline.map((point, index) => `${index === 0 ? 'M' : 'L'}${formatMm(point[0])} ${formatMm(point[1])}`).join(' ')
    lines.push(`<path d="${data}${cut.closed ? ' Z' : ''}"/>`)
  }
  if (openGroup !== undefined) lines.push('</g>')
  lines.push('</g>', '</svg>', '')
  return lines.join('\n')
}
