import type { Box } from '../../../shared/geometry/polygon'
import { laneCount, laneSize } from '../../../shared/layout/document'
import type { LayoutStock } from '../../../shared/schemas/layouts'
import type { UnitSystem } from '../../../shared/schemas/index'
import { MM_PER_INCH } from '../../../shared/units'

/**
 * Where the lanes (sheets side by side, or the roll) lie in the canvas's world: millimetres, x to the right, y down.
 * Lane k starts at k × pitch; the gap between sheets grows with the sheet so a row of them reads as separate.
 */
export interface LaneLayout {
  count: number
  widthMm: number
  heightMm: number
  pitchMm: number
}

export function laneLayout(stock: LayoutStock): LaneLayout {
  const { widthMm, heightMm } = laneSize(stock)
  const gap = Math.max(12, Math.min(widthMm, heightMm) * 0.08)
  return { count: laneCount(stock), widthMm, heightMm, pitchMm: widthMm + gap }
}

export const laneOffsetX = (lanes: LaneLayout, lane: number) => lane * lanes.pitchMm

/** The lane whose column holds world x (the nearest one in a gap or beyond the ends). */
export function laneAtX(lanes: LaneLayout, worldX: number): number {
  const lane = Math.round((worldX - lanes.widthMm / 2) / lanes.pitchMm)
  return Math.min(lanes.count - 1, Math.max(0, lane))
}

/** A lane holding the point (inside its sheet, not in a gap), or -1. */
export function laneContaining(lanes: LaneLayout, worldX: number, worldY: number): number {
  const lane = laneAtX(lanes, worldX)
  const localX = worldX - laneOffsetX(lanes, lane)
  return localX >= 0 && localX <= lanes.widthMm && worldY >= 0 && worldY <= lanes.heightMm ? lane : -1
}

export function worldBounds(lanes: LaneLayout): Box {
  return { minX: 0, minY: 0, maxX: laneOffsetX(lanes, lanes.count - 1) + lanes.widthMm, maxY: lanes.heightMm }
}

/** Screen pixels per millimetre and where the world origin lands on screen. */
export interface CanvasView {
  scale: number
  x: number
  y: number
}

/** Rulers take this many pixels along the top and left edges. */
export const RULER_PX = 24

/** The view that shows every lane with room around it (space above for the sheet captions). */
export function fitView(bounds: Box, widthPx: number, heightPx: number): CanvasView {
  const padPx = 28
  const availableWidth = Math.max(40, widthPx - RULER_PX - 2 * padPx)
  const availableHeight = Math.max(40, heightPx - RULER_PX - 2 * padPx - 14)
  const worldWidth = Math.max(1, bounds.maxX - bounds.minX)
  const worldHeight = Math.max(1, bounds.maxY - bounds.minY)
  const scale = Math.min(availableWidth / worldWidth, availableHeight / worldHeight)
  return {
    scale,
    x: RULER_PX + padPx + (availableWidth - worldWidth * scale) / 2 - bounds.minX * scale,
    y: RULER_PX + padPx + 14 + (availableHeight - worldHeight * scale) / 2 - bounds.minY * scale,
  }
}

/** Zooms by `factor` keeping the world point under (screenX, screenY) where it is. */
export function zoomAt(view: CanvasView, factor: number, screenX: number, screenY: number, limits: { min: number; max: number }): CanvasView {
  const scale = Math.min(limits.max, Math.max(limits.min, view.scale * factor))
  const worldX = (screenX - view.x) / view.scale
  const worldY = (screenY - view.y) / view.scale
  return { scale, x: screenX - worldX * scale, y: screenY - worldY * scale }
}

export const toWorld = (view: CanvasView, screenX: number, screenY: number): [number, number] => [(screenX - view.x) / view.scale, (screenY - view.y) / view.scale]

/**
 * A ruler step in millimetres: 1, 2 or 5 × a power of ten of the person's unit, the smallest whose ticks stand at
 * least `minPx` apart on screen.
 */
export function rulerStepMm(scale: number, unit: UnitSystem, minPx = 70): number {
  const unitMm = unit === 'in' ? MM_PER_INCH : 1
  const rough = minPx / scale / unitMm
  const power = 10 ** Math.floor(Math.log10(rough))
  const step = [1, 2, 5, 10].map((factor) => factor * power).find((candidate) => candidate >= rough) ?? 10 * power
  return step * unitMm
}

/** A ruler label: whole numbers where they are, else up to two decimals, in the person's unit. */
export function rulerLabel(valueMm: number, unit: UnitSystem): string {
  const value = unit === 'in' ? valueMm / MM_PER_INCH : valueMm
  return String(Number(value.toFixed(2)))
}
