import type { CutterProfile } from './profile.js'
import type { Point } from './contours.js'
import type { SheetCutPlan } from './plan.js'

/** HP-GL/2 plotter units per millimetre: 1 plu = 0.025 mm (HP PCL 5 Technical Reference, Part II ch. 17, Table 17-7). */
export const plotterUnitsPerMm = 40

/**
 * Sheet millimetres (origin top-left, y down) to the cutter's integer plotter units: measured from the profile's origin
 * corner, x and y pointing into the sheet, then swapped if the cutter's x runs along the sheet's y.
 */
export function toPlotterUnits(point: Point, profile: CutterProfile, size: { widthMm: number; heightMm: number }): [number, number] {
  const x = profile.origin.endsWith('right') ? size.widthMm - point[0] : point[0]
  const y = profile.origin.startsWith('bottom') ? size.heightMm - point[1] : point[1]
  const [u, v] = profile.swapAxes ? [y, x] : [x, y]
  // Adding 0 turns a -0 from rounding into 0, so files never show "-0".
  return [Math.round(u * plotterUnitsPerMm) + 0, Math.round(v * plotterUnitsPerMm) + 0]
}

/**
 * One sheet as HP-GL: `IN;` (initialise), `SP1;` (pen/tool 1), `PA;` (absolute), then per cut a pen-up move to its
 * start and pen-down moves along everything the blade traces (all passes, the overcut); a cut that continues the one
 * before stays down. Ends with the pen up at the origin and `SP0;`. Points that round to the same plotter unit as the
 * one before are dropped.
 */
export function sheetToHpgl(plan: SheetCutPlan, profile: CutterProfile): string {
  const size = { widthMm: plan.figures.widthMm, heightMm: plan.figures.heightMm }
  const lines = ['IN;', 'SP1;', 'PA;']
  for (const cut of plan.cuts) {
    const units = cut.path.map((point) => toPlotterUnits(point, profile, size))
    const [first, ...rest] = units
    if (!first) continue
    if (!cut.joined) lines.push(`PU${first[0]},${first[1]};`)
    const down: [number, number][] = []
    let last = first
    for (const point of rest) {
      if (point[0] === last[0] && point[1] === last[1]) continue
      down.push(point)
      last = point
    }
    if (down.length > 0) lines.push(`PD${down.map(([u, v]) => `${u},${v}`).join(',')};`)
  }
  lines.push('PU0,0;', 'SP0;', '')
  return lines.join('\n')
}
