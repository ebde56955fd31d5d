/** A point [x, y]. Nesting works in the units of its input (millimetres in the product; abstract units for benchmarks). */
export type Vec = [number, number]
export type RingPoints = Vec[]

export type MirrorPolicy = 'never' | 'allowed' | 'always'

export interface NestItem {
  id: string
  /** Outer outline, any orientation, any position. */
  outline: RingPoints
  holes?: RingPoints[]
  quantity: number
  /** Allowed rotation angles in degrees (e.g. [0], [0, 180], [0, 90, 180, 270]). */
  rotationsDeg: number[]
  mirror?: MirrorPolicy
}

export type NestStock =
  | { kind: 'roll'; width: number; maxLength?: number }
  | { kind: 'sheets'; width: number; height: number; maxSheets?: number }
  | { kind: 'polygon'; outline: RingPoints; holes?: RingPoints[] }

/** An area of the stock that must stay clear: on one sheet (0-based), or on every sheet when `sheet` is left out. */
export interface ExcludedZone {
  outline: RingPoints
  sheet?: number
}

/** Whether a zone keeps an area of `sheet` clear. A roll or a stock outline is sheet 0. */
export const zoneAppliesToSheet = (zone: { sheet?: number }, sheet: number): boolean => zone.sheet === undefined || zone.sheet === sheet

export interface NestProblem {
  items: NestItem[]
  stock: NestStock
  /** Clear distance kept between pieces (each piece grows by half of it). */
  spacing?: number
  /** Clear distance kept from the stock's edges. */
  margin?: number
  /** Areas of the stock that must stay clear (in stock coordinates), each on one sheet or on all. */
  excludedZones?: ExcludedZone[]
  /** Curves are simplified for the search within this distance (the shapes grow by it, so it is always safe). */
  simplifyTolerance?: number
}

export interface NestOptions {
  seed?: number
  /** Stop after this long (wall time). */
  timeBudgetMs?: number
  /** Stop after this many layouts were evaluated: with a seed, the result is then fully reproducible. */
  maxEvaluations?: number
  onProgress?: (progress: NestProgress) => void
  /** Checked between evaluations; true stops the search and returns the best so far. */
  shouldStop?: () => boolean
}

export interface NestProgress {
  evaluations: number
  elapsedMs: number
  bestUtilisation: number
  bestLength?: number
  bestSheets?: number
  placedCount: number
}

export interface Placement {
  itemId: string
  /** Which copy of the item (0-based). */
  copy: number
  /** Sheet index (0 for a roll or a single stock polygon). */
  sheet: number
  angleDeg: number
  mirrored: boolean
  /** The item's outline is mirrored (x → −x) first if `mirrored`, then rotated by angleDeg about the origin, then translated by (x, y). */
  x: number
  y: number
  /** The placed outline and holes in stock coordinates. */
  outline: RingPoints
  holes: RingPoints[]
}

export interface NestResult {
  mode: 'roll' | 'sheets' | 'polygon'
  placements: Placement[]
  /** Items (with copies) that could not be placed, e.g. larger than the stock. */
  unplaced: { itemId: string; copy: number; reason: string }[]
  /** Roll: length used along x including the margin. Sheets: used length of the last sheet. */
  length: number
  sheetCount: number
  /** Total piece area / used stock area. */
  utilisation: number
  pieceArea: number
  usedStockArea: number
  evaluations: number
  elapsedMs: number
  firstFeasibleMs: number
  seed: number
}
