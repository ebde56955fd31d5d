import { applyCommonLine } from './commonLine.js'
import { insideFirstConstraints, polylineLength, sheetContours, sheetCountOf, sheetSize, type ContourRole, type CutContour, type DesignForCutPlan, type LayoutForCutPlan, type Point } from './contours.js'
import { cutPathTimeS, travelTimeS } from './kinematics.js'
import { optimisedSequence, placementOrder, sequenceTravelMm, type CutSequence } from './order.js'
import { defaultCutPlanOptions, defaultCutterProfile, type CutPlanOptions, type CutterProfile } from './profile.js'
import { weedingContours } from './weeding.js'

/** One contour as the blade cuts it. */
export interface PlannedCut {
  contourId: number
  role: ContourRole
  closed: boolean
  groupKey: string
  groupLabel: string
  /** The contour once, from where the cut starts (closed contours: not repeated at the end), for drawings and SVG. */
  outline: Point[]
  /** Everything the blade traces while down: all passes (open ones back and forth) and the overcut. */
  path: Point[]
  /** The blade is still down from the cut before (the previous cut ended where this one starts). */
  joined: boolean
  /** True contour length × passes (overcut not included). */
  cutLengthMm: number
  overcutLengthMm: number
}

export interface SheetCutFigures {
  sheet: number
  widthMm: number
  heightMm: number
  contourCount: number
  /** Pieces cut on this sheet (placed pieces; weeding aids are not pieces). */
  pieceCount: number
  cutLengthMm: number
  overcutLengthMm: number
  travelLengthMm: number
  /** Travel the same contours would need cut in placement order from their first vertex, for comparison. */
  travelInPlacementOrderMm: number
  lifts: number
  commonLineSavedMm: number
  weedingLengthMm: number
  cutTimeS: number
  travelTimeS: number
  liftTimeS: number
  totalTimeS: number
}

export interface SheetCutPlan {
  figures: SheetCutFigures
  /** Where the pen starts (the cutter's origin corner), sheet millimetres. */
  start: Point
  cuts: PlannedCut[]
}

export type LayoutCutTotals = Omit<SheetCutFigures, 'sheet' | 'widthMm' | 'heightMm'> & { sheetCount: number }

export interface LayoutCutPlan {
  profile: CutterProfile
  options: CutPlanOptions
  sheets: SheetCutPlan[]
  totals: LayoutCutTotals
}

/** The cutter's origin corner in sheet coordinates (origin top-left, y down). */
export function originOnSheet(profile: CutterProfile, size: { widthMm: number; heightMm: number }): Point {
  const right = profile.origin.endsWith('right')
  const bottom = profile.origin.startsWith('bottom')
  return [right ? size.widthMm : 0, bottom ? size.heightMm : 0]
}

/** The point `distanceMm` along a closed ring from vertex `start`, with the vertices passed on the way. */
function walkRing(ring: readonly Point[], start: number, distanceMm: number): Point[] {
  const walked: Point[] = []
  let left = distanceMm
  for (let step = 0; step < ring.length && left > 1e-9; step++) {
    const a = ring[(start + step) % ring.length]!
    const b = ring[(start + step + 1) % ring.length]!
    const length = Math.hypot(b[0] - a[0], b[1] - a[1])
    if (length >= left) {
      walked.push([a[0] + ((b[0] - a[0]) * left) / length, a[1] + ((b[1] - a[1]) * left) / length])
      return walked
    }
    walked.push(b)
    left -= length
  }
  return walked
}

function plannedCut(contour: CutContour, sequence: CutSequence, options: CutPlanOptions): PlannedCut {
  const base = { contourId: contour.id, role: contour.role, closed: contour.closed, groupKey: contour.groupKey, groupLabel: contour.groupLabel, joined: false }
  const onePassMm = polylineLength(contour.points, contour.closed)
  const cutLengthMm = onePassMm * contour.lengthFactor * options.passes
  if (contour.closed) {
    const start = sequence.startVertex[contour.id]!
    const outline = contour.points.map((_, index) => contour.points[(start + index) % contour.points.length]!)
    const path: Point[] = [outline[0]!]
    for (let pass = 0; pass < options.passes; pass++) path.push(...outline.slice(1), outline[0]!)
    const overcutLengthMm = Math.min(options.overcutMm, onePassMm)
    path.push(...walkRing(contour.points, start, overcutLengthMm))
    return { ...base, outline, path, cutLengthMm, overcutLengthMm }
  }
  const outline = sequence.reversed[contour.id] ? [...contour.points].reverse() : [...contour.points]
  const backwards = [...outline].reverse()
  // Further passes of an open line go back and forth in the same groove rather than lifting to return to its start.
  const path: Point[] = [...outline]
  for (let pass = 1; pass < options.passes; pass++) path.push(...(pass % 2 === 1 ? backwards : outline).slice(1))
  return { ...base, outline, path, cutLengthMm, overcutLengthMm: 0 }
}

/** Travel below this is no travel: the next cut starts where the last one ended (common-line stretches), blade down. */
const joinMm = 1e-3

/**
 * The cut plan of one sheet (or the roll, sheet 0): contours with holes, inner contours and anything inside a contour
 * before it; weeding aids and common-line cutting if asked; an order that keeps pen-up travel short; figures with the
 * trapezoidal time model. Pure and deterministic.
 */
export function planSheet(
  layout: LayoutForCutPlan,
  designs: ReadonlyMap<string, DesignForCutPlan>,
  sheet: number,
  profile: CutterProfile = defaultCutterProfile,
  options: CutPlanOptions = defaultCutPlanOptions,
): SheetCutPlan {
  let contours = sheetContours(layout, designs, sheet)
  const size = sheetSize(layout, contours)
  const pieceCount = new Set(contours.map((contour) => contour.groupKey)).size
  if (options.weedingGapMm !== undefined && contours.length > 0) {
    for (const added of weedingContours(contours, size, options.weedingGapMm, options.weedingLines)) {
      contours.push({ ...added, id: contours.length, box: boxOf(added.points) })
    }
  }
  let before = insideFirstConstraints(contours)
  let commonLineSavedMm = 0
  if (options.commonLine) {
    const shared = applyCommonLine(contours, before)
    contours = shared.contours
    before = shared.before
    commonLineSavedMm = shared.savedMm * options.passes
  }
  const start = originOnSheet(profile, size)
  const asPlaced = placementOrder(contours, before)
  const sequence = options.order === 'as-placed' ? asPlaced : optimisedSequence(contours, before, start)

  const cuts = sequence.order.map((id) => plannedCut(contours[id]!, sequence, options))
  let pen = start
  let travelLengthMm = 0
  let travelTime = 0
  let cutTime = 0
  let lifts = 0
  for (const cut of cuts) {
    const gap = Math.hypot(cut.path[0]![0] - pen[0], cut.path[0]![1] - pen[1])
    if (gap < joinMm && lifts > 0) cut.joined = true
    else {
      travelLengthMm += gap
      travelTime += travelTimeS(gap, profile)
      lifts += 1
    }
    cutTime += cutPathTimeS(cut.path, profile)
    pen = cut.path[cut.path.length - 1]!
  }
  const sum = (pick: (cut: PlannedCut) => number, filter: (cut: PlannedCut) => boolean = () => true) => cuts.filter(filter).reduce((total, cut) => total + pick(cut), 0)
  const liftTimeS = lifts * profile.liftLowerS
  return {
    start,
    cuts,
    figures: {
      sheet,
      widthMm: size.widthMm,
      heightMm: size.heightMm,
      contourCount: cuts.length,
      pieceCount,
      cutLengthMm: sum((cut) => cut.cutLengthMm),
      overcutLengthMm: sum((cut) => cut.overcutLengthMm),
      travelLengthMm,
      travelInPlacementOrderMm: sequenceTravelMm(contours, asPlaced, start),
      lifts,
      commonLineSavedMm,
      weedingLengthMm: sum((cut) => cut.cutLengthMm, (cut) => cut.role === 'weeding-border' || cut.role === 'weeding-line'),
      cutTimeS: cutTime,
      travelTimeS: travelTime,
      liftTimeS,
      totalTimeS: cutTime + travelTime + liftTimeS,
    },
  }
}

function boxOf(points: readonly Point[]) {
  let minX = Infinity
  let minY = Infinity
  let maxX = -Infinity
  let maxY = -Infinity
  for (const [x, y] of points) {
    minX = Math.min(minX, x)
    minY = Math.min(minY, y)
    maxX = Math.max(maxX, x)
    maxY = Math.max(maxY, y)
  }
  return { minX, minY, maxX, maxY }
}

/** Adds up per-sheet figures; `sheetCount` counts the sheets that cut something. */
export function totalsOf(sheets: readonly SheetCutFigures[]): LayoutCutTotals {
  const add = (pick: (figures: SheetCutFigures) => number) => sheets.reduce((total, figures) => total + pick(figures), 0)
  return {
    sheetCount: sheets.filter((figures) => figures.contourCount > 0).length,
    contourCount: add((f) => f.contourCount),
    pieceCount: add((f) => f.pieceCount),
    cutLengthMm: add((f) => f.cutLengthMm),
    overcutLengthMm: add((f) => f.overcutLengthMm),
    travelLengthMm: add((f) => f.travelLengthMm),
    travelInPlacementOrderMm: add((f) => f.travelInPlacementOrderMm),
    lifts: add((f) => f.lifts),
    commonLineSavedMm: add((f) => f.commonLineSavedMm),
    weedingLengthMm: add((f) => f.weedingLengthMm),
    cutTimeS: add((f) => f.cutTimeS),
    travelTimeS: add((f) => f.travelTimeS),
    liftTimeS: add((f) => f.liftTimeS),
    totalTimeS: add((f) => f.totalTimeS),
  }
}

/** The cut plan of every sheet of a layout (the roll is one sheet) with totals. */
export function planLayout(
  layout: LayoutForCutPlan,
  designs: ReadonlyMap<string, DesignForCutPlan>,
  profile: CutterProfile = defaultCutterProfile,
  options: CutPlanOptions = defaultCutPlanOptions,
): LayoutCutPlan {
  const sheets = Array.from({ length: sheetCountOf(layout.stock) }, (_, sheet) => planSheet(layout, designs, sheet, profile, options))
  return { profile, options, sheets, totals: totalsOf(sheets.map((plan) => plan.figures)) }
}
