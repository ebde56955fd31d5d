import { describe, expect, it } from 'vitest'
import { fitView, laneAtX, laneContaining, laneLayout, rulerLabel, rulerStepMm, toWorld, worldBounds, zoomAt } from '../../../src/features/layouts/canvasView.js'

describe('the editor canvas view', () => {
  // ISO 216: A4 is 210 × 297 mm.
  const lanes = laneLayout({ kind: 'sheets', widthMm: 210, heightMm: 297, sheetCount: 3 })

  it('lays sheets side by side with a gap, and a roll along x with its width down', () => {
    expect(lanes.pitchMm).toBeCloseTo(210 + 210 * 0.08, 9)
    expect(worldBounds(lanes)).toEqual({ minX: 0, minY: 0, maxX: 2 * lanes.pitchMm + 210, maxY: 297 })
    expect(laneLayout({ kind: 'roll', widthMm: 610, lengthMm: 2000 })).toMatchObject({ count: 1, widthMm: 2000, heightMm: 610 })
  })

  it('finds the sheet under a point, the nearest one from a gap, none outside the paper', () => {
    expect(laneAtX(lanes, 100)).toBe(0)
    expect(laneAtX(lanes, lanes.pitchMm + 5)).toBe(1)
    expect(laneAtX(lanes, 5000)).toBe(2)
    expect(laneContaining(lanes, 215, 100)).toBe(-1)
    expect(laneContaining(lanes, lanes.pitchMm + 1, 100)).toBe(1)
    expect(laneContaining(lanes, 100, 300)).toBe(-1)
  })

  it('fits every sheet in view and zooms about the pointer', () => {
    const view = fitView(worldBounds(lanes), 1000, 600)
    const [left] = toWorld(view, 24 + 28, 300)
    expect(left).toBeCloseTo(0, 6)
    const zoomed = zoomAt(view, 2, 500, 300, { min: 0.1, max: 100 })
    expect(zoomed.scale).toBeCloseTo(view.scale * 2, 9)
    expect(toWorld(zoomed, 500, 300)[0]).toBeCloseTo(toWorld(view, 500, 300)[0], 9)
    expect(zoomAt(view, 1000, 0, 0, { min: 0.1, max: 5 }).scale).toBe(5)
  })

  it('steps rulers by 1, 2 or 5 of the person’s unit, at least 70 px apart', () => {
    expect(rulerStepMm(1, 'mm')).toBe(100)
    expect(rulerStepMm(4, 'mm')).toBe(20)
    // 1 in = 25.4 mm (shared/units.ts); at 4 px/mm an inch is 101.6 px.
    expect(rulerStepMm(4, 'in')).toBeCloseTo(25.4, 9)
    expect(rulerLabel(50.8, 'in')).toBe('2')
    expect(rulerLabel(12.5, 'mm')).toBe('12.5')
  })
})
