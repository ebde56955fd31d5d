import { describe, expect, it } from 'vitest'
import { defaultCutPlanOptions, planSheet, profileWith, sheetToHpgl, sheetToSvg, toPlotterUnits, type CutterProfile } from '../../../shared/cutplan/index.js'
import { importSvg } from '../../../shared/geometry/importSvg.js'
import { design, placed, sheetLayout, square } from './fixtures.js'

// HP-GL/2: 1 plotter unit = 0.025 mm, 40 units per mm (HP PCL 5 Printer Language Technical Reference Manual, Part II,
// ch. 17, Table 17-7).
const mmPerUnit = 0.025

/**
 * An independent reader of the HP-GL we write: only IN, SP, PA, PU and PD with absolute integer pairs. Returns the
 * pen-down polylines in plotter units.
 */
function readHpgl(text: string): { strokes: [number, number][][]; instructions: string[] } {
  const instructions = text
    .split(';')
    .map((part) => part.trim())
    .filter(Boolean)
  const strokes: [number, number][][] = []
  let pen: [number, number] = [0, 0]
  let down = false
  for (const instruction of instructions) {
    const mnemonic = instruction.slice(0, 2)
    const numbers = instruction.slice(2).split(',').filter(Boolean).map(Number)
    expect(numbers.every(Number.isInteger)).toBe(true)
    const pairs: [number, number][] = []
    for (let index = 0; index < numbers.length; index += 2) pairs.push([numbers[index]!, numbers[index + 1]!])
    if (mnemonic === 'PU') {
      down = false
      if (pairs.length) pen = pairs[pairs.length - 1]!
    } else if (mnemonic === 'PD') {
      if (!down) strokes.push([pen])
      down = true
      for (const pair of pairs) strokes[strokes.length - 1]!.push(pair)
      if (pairs.length) pen = pairs[pairs.length - 1]!
    } else expect(['IN', 'SP', 'PA']).toContain(mnemonic)
  }
  return { strokes, instructions }
}

const bottomLeft: CutterProfile = profileWith({ origin: 'bottom-left' })

describe('HP-GL export', () => {
  it('turns 10 mm into 400 plotter units (40 per mm, HP PCL 5 Technical Reference, Table 17-7)', () => {
    const size = { widthMm: 100, heightMm: 50 }
    expect(toPlotterUnits([10, 50], bottomLeft, size)).toEqual([400, 0])
    expect(toPlotterUnits([10, 40], bottomLeft, size)).toEqual([400, 400])
    expect(toPlotterUnits([10, 40], profileWith({ origin: 'top-left' }), size)).toEqual([400, 1600])
    expect(toPlotterUnits([10, 40], profileWith({ origin: 'top-right' }), size)).toEqual([3600, 1600])
    expect(toPlotterUnits([10, 40], profileWith({ origin: 'bottom-left', swapAxes: true }), size)).toEqual([400, 400].reverse() as [number, number])
  })

  it('starts with IN; and SP1; and draws the geometry back within 0.025 mm when read by an independent parser', () => {
    const designs = new Map([['frame', design('Frame', square(0, 0, 50.013), [square(10.004, 10.004, 20).reverse()])]])
    const layout = sheetLayout([placed('a', 'frame', 12.5, 7.25)], 200, 100)
    const plan = planSheet(layout, designs, 0, bottomLeft, defaultCutPlanOptions)
    const text = sheetToHpgl(plan, bottomLeft)
    const { strokes, instructions } = readHpgl(text)
    expect(instructions.slice(0, 2)).toEqual(['IN', 'SP1'])
    expect(strokes).toHaveLength(2)
    plan.cuts.forEach((cut, index) => {
      const stroke = strokes[index]!
      expect(stroke).toHaveLength(cut.path.length)
      stroke.forEach(([u, v], pointIndex) => {
        // Bottom-left origin: x = u × 0.025 mm, y (down the sheet) = height − v × 0.025 mm.
        expect(Math.abs(u * mmPerUnit - cut.path[pointIndex]![0])).toBeLessThanOrEqual(0.0125 + 1e-9)
        expect(Math.abs(100 - v * mmPerUnit - cut.path[pointIndex]![1])).toBeLessThanOrEqual(0.0125 + 1e-9)
      })
    })
  })

  it('repeats the contour for each pass without lifting', () => {
    const designs = new Map([['square', design('Square', square(0, 0, 10))]])
    const plan = planSheet(sheetLayout([placed('a', 'square', 0, 0)], 100, 100), designs, 0, bottomLeft, { ...defaultCutPlanOptions, passes: 3 })
    const { strokes } = readHpgl(sheetToHpgl(plan, bottomLeft))
    expect(strokes).toHaveLength(1)
    expect(strokes[0]).toHaveLength(1 + 3 * 4)
  })
})

describe('SVG export', () => {
  it('states its size in millimetres with a viewBox in millimetres and one group per piece', () => {
    const designs = new Map([['square', design('Square', square(0, 0, 10))]])
    const plan = planSheet(sheetLayout([placed('a', 'square', 0, 0), placed('b', 'square', 50, 0)], 304.8, 304.8), designs, 0, bottomLeft, defaultCutPlanOptions)
    const svg = sheetToSvg(plan, 'Sheet 1')
    expect(svg).toContain('width="304.8mm" height="304.8mm" viewBox="0 0 304.8 304.8"')
    expect(svg.match(/<g data-piece=/g)).toHaveLength(2)
    expect(svg.match(/<path /g)).toHaveLength(2)
  })

  it('gives back the same pieces when read by our importer (within the flattening tolerance)', () => {
    const circle = Array.from({ length: 180 }, (_, index) => [25 + 20 * Math.cos((index * Math.PI) / 90), 25 + 20 * Math.sin((index * Math.PI) / 90)] as [number, number])
    const designs = new Map([
      ['frame', design('Frame', square(0, 0, 60), [square(15, 15, 30).reverse()])],
      ['disc', design('Disc', circle)],
      ['tag', design('Tag', square(0, 0, 30), [], [[[5, 15], [25, 15]]])],
    ])
    const layout = sheetLayout([placed('f', 'frame', 10, 10), placed('d', 'disc', 130, 10, { angleDeg: 90 }), placed('t', 'tag', 40, 100, { mirrored: true })], 200, 200)
    const plan = planSheet(layout, designs, 0, bottomLeft, defaultCutPlanOptions)
    const imported = importSvg(sheetToSvg(plan))
    expect(imported.widthMm).toBeCloseTo(200, 9)
    expect(imported.heightMm).toBeCloseTo(200, 9)
    expect(imported.pieces).toHaveLength(3)
    expect(imported.cutLines).toHaveLength(1)
    const tolerance = 0.02
    // Expected areas by elementary geometry (the disc is the 180-gon as stored, shoelace).
    const discArea = 0.5 * 180 * 20 * 20 * Math.sin((2 * Math.PI) / 180)
    const areas = imported.pieces.map((piece) => piece.areaMm2).sort((a, b) => a - b)
    expect(areas[0]).toBeCloseTo(900, 1)
    expect(areas[1]).toBeCloseTo(discArea, 1)
    expect(areas[2]).toBeCloseTo(3600 - 900, 1)
    const frame = imported.pieces.find((piece) => piece.holes.length === 1)!
    expect(frame.bbox.minX).toBeCloseTo(10, 1)
    expect(Math.abs(frame.bbox.maxX - 70)).toBeLessThanOrEqual(tolerance)
    expect(imported.cutLengthMm).toBeCloseTo(plan.figures.cutLengthMm, 1)
  })
})
