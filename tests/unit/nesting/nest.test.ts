import { readdirSync, readFileSync } from 'node:fs'
import path from 'node:path'
import { describe, expect, it } from 'vitest'
import { nest } from '../../../shared/nesting/nest.js'
import { verifyLayout } from '../../../shared/nesting/verify.js'
import type { NestProblem, NestResult } from '../../../shared/nesting/types.js'

const esicupDir = path.resolve('../shared/data/esicup')
const square = (size: number): [number, number][] => [
  [0, 0],
  [size, 0],
  [size, size],
  [0, size],
]

function loadInstance(name: string): NestProblem {
  const instance = JSON.parse(readFileSync(path.join(esicupDir, `${name}.json`), 'utf8'))
  return {
    items: instance.pieces.map((piece: { id: string; polygon: [number, number][]; quantity: number }) => ({ id: piece.id, outline: piece.polygon, quantity: piece.quantity, rotationsDeg: instance.rotations })),
    stock: { kind: 'roll', width: instance.stripWidth },
  }
}

describe('nesting engine on the ESICUP instances (open benchmark data, team data folder)', () => {
  const instances = readdirSync(esicupDir)
    .filter((file) => file.endsWith('.json'))
    .map((file) => file.replace('.json', ''))
  it('has the seven instances to test', () => expect(instances.length).toBe(7))
  for (const name of instances) {
    it(`places every piece of ${name} in a verified layout at a short budget`, () => {
      const problem = loadInstance(name)
      const result = nest(problem, { maxEvaluations: 3, seed: 7 })
      const report = verifyLayout(problem, result)
      expect(report.problems).toEqual([])
      expect(result.unplaced).toEqual([])
      const pieceCount = problem.items.reduce((sum, item) => sum + item.quantity, 0)
      expect(result.placements).toHaveLength(pieceCount)
      // Density can never beat 100 %, and the length can never be shorter than area / width (a lower bound).
      expect(result.utilisation).toBeLessThanOrEqual(1)
      expect(result.length).toBeGreaterThanOrEqual(result.pieceArea / (problem.stock as { width: number }).width - 1e-9)
    })
  }

  it('gives the same layout for the same seed and number of evaluations', () => {
    const problem = loadInstance('jakobs1')
    const first = nest(problem, { maxEvaluations: 20, seed: 3 })
    const second = nest(problem, { maxEvaluations: 20, seed: 3 })
    expect(second.placements.map((placement) => [placement.itemId, placement.x, placement.y, placement.angleDeg])).toEqual(
      first.placements.map((placement) => [placement.itemId, placement.x, placement.y, placement.angleDeg]),
    )
  })
})

describe('sheets, margins, spacing and excluded zones', () => {
  // ISO 216: A4 is 210 × 297 mm.
  const problem: NestProblem = {
    items: [
      { id: 'tag', outline: square(40), quantity: 14, rotationsDeg: [0, 90] },
      { id: 'strip', outline: [[0, 0], [120, 0], [120, 15], [0, 15]], quantity: 6, rotationsDeg: [0, 90, 180, 270] },
    ],
    stock: { kind: 'sheets', width: 210, height: 297 },
    margin: 10,
    spacing: 3,
    excludedZones: [{ outline: [[150, 0], [210, 0], [210, 60], [150, 60]] }],
  }

  it('keeps every piece inside the margin, apart by the spacing and off the excluded zone', () => {
    const result = nest(problem, { maxEvaluations: 5, seed: 1 })
    const report = verifyLayout(problem, result)
    expect(report.problems).toEqual([])
    expect(result.placements).toHaveLength(20)
    expect(report.minGap).toBeGreaterThanOrEqual(3 - 1e-6)
    for (const placement of result.placements) {
      for (const [x, y] of placement.outline) {
        expect(x).toBeGreaterThanOrEqual(10 - 1e-6)
        expect(y).toBeGreaterThanOrEqual(10 - 1e-6)
        expect(x).toBeLessThanOrEqual(200 + 1e-6)
        expect(y).toBeLessThanOrEqual(287 + 1e-6)
        expect(x > 150 && y < 60).toBe(false)
      }
    }
  })

  it('opens a second sheet only when the first is full', () => {
    const crowded: NestProblem = { ...problem, items: [{ id: 'tag', outline: square(40), quantity: 30, rotationsDeg: [0] }], excludedZones: [] }
    const result = nest(crowded, { maxEvaluations: 2, seed: 1 })
    expect(verifyLayout(crowded, result).problems).toEqual([])
    // Usable 190 × 277 mm with 3 mm spacing: 4 columns × 6 rows of 40 mm squares fit (4·40 + 3·3 = 169, 6·40 + 5·3 = 255).
    expect(result.placements.filter((placement) => placement.sheet === 0)).toHaveLength(24)
    expect(result.sheetCount).toBe(2)
  })

  it('reports a piece larger than the sheet as unplaced instead of failing', () => {
    const tooBig: NestProblem = { items: [{ id: 'banner', outline: square(400), quantity: 1, rotationsDeg: [0] }], stock: { kind: 'sheets', width: 210, height: 297 } }
    const result = nest(tooBig, { maxEvaluations: 1 })
    expect(result.placements).toHaveLength(0)
    expect(result.unplaced).toEqual([{ itemId: 'banner', copy: 0, reason: expect.any(String) }])
  })

  it('reports the pieces it had no time to place instead of running past a stop', () => {
    const many: NestProblem = { items: [{ id: 'tag', outline: square(20), quantity: 10, rotationsDeg: [0] }], stock: { kind: 'roll', width: 100 } }
    let checks = 0
    // Stop is asked for from the fourth check on: a few pieces get placed, the rest are reported, nothing hangs.
    const result = nest(many, { maxEvaluations: 1, shouldStop: () => ++checks > 3 })
    expect(verifyLayout(many, result).problems).toEqual([])
    expect(result.placements.length).toBeGreaterThan(0)
    expect(result.placements.length).toBeLessThan(10)
    expect(result.unplaced.length + result.placements.length).toBe(10)
    expect(result.unplaced.every((entry) => /time budget/.test(entry.reason))).toBe(true)
  })

  it('places small pieces inside the hole of a frame', () => {
    const frame: [number, number][] = square(100)
    const hole: [number, number][] = [[20, 20], [20, 80], [80, 80], [80, 20]]
    const framed: NestProblem = {
      items: [
        { id: 'frame', outline: frame, holes: [hole], quantity: 1, rotationsDeg: [0] },
        { id: 'chip', outline: square(25), quantity: 4, rotationsDeg: [0] },
      ],
      stock: { kind: 'roll', width: 100 },
    }
    const result = nest(framed, { maxEvaluations: 1 })
    expect(verifyLayout(framed, result).problems).toEqual([])
    // Four 25 mm chips fit in the 60 mm hole (2 × 2), so the roll is used for the frame's 100 mm only.
    expect(result.length).toBeCloseTo(100, 3)
  })

  it('mirrors every copy when the item must be cut mirrored', () => {
    const mirrored: NestProblem = { items: [{ id: 'flag', outline: [[0, 0], [30, 0], [0, 20]], quantity: 3, rotationsDeg: [0], mirror: 'always' }], stock: { kind: 'roll', width: 100 } }
    const result = nest(mirrored, { maxEvaluations: 1 })
    expect(verifyLayout(mirrored, result).problems).toEqual([])
    expect(result.placements.every((placement) => placement.mirrored)).toBe(true)
  })

  it('nests inside a remnant outline', () => {
    const remnant: NestProblem = {
      items: [{ id: 'chip', outline: square(20), quantity: 6, rotationsDeg: [0] }],
      stock: { kind: 'polygon', outline: [[0, 0], [100, 0], [100, 30], [30, 30], [30, 100], [0, 100]] },
      margin: 2,
      spacing: 2,
    }
    const result = nest(remnant, { maxEvaluations: 2 })
    expect(verifyLayout(remnant, result).problems).toEqual([])
    expect(result.placements).toHaveLength(6)
  })
})

describe('the independent verifier', () => {
  const problem: NestProblem = { items: [{ id: 'tile', outline: square(10), quantity: 2, rotationsDeg: [0] }], stock: { kind: 'roll', width: 30 }, spacing: 1 }
  const layout = (): NestResult => nest(problem, { maxEvaluations: 1 })

  it('accepts the engine layout', () => {
    expect(verifyLayout(problem, layout()).ok).toBe(true)
  })

  it('catches a deliberately overlapping layout', () => {
    const result = layout()
    const [first, second] = result.placements
    const moved = { ...second!, x: first!.x + 5, y: first!.y, outline: first!.outline.map(([x, y]) => [x + 5, y] as [number, number]) }
    const report = verifyLayout(problem, { ...result, placements: [first!, moved] })
    expect(report.ok).toBe(false)
    expect(report.problems.join(' ')).toMatch(/overlaps/)
  })

  it('catches spacing that is not kept, a piece off the roll and a missing copy', () => {
    const result = layout()
    const [first, second] = result.placements
    const close = { ...second!, x: first!.x + 10.5, y: first!.y, outline: first!.outline.map(([x, y]) => [x + 10.5, y] as [number, number]) }
    expect(verifyLayout(problem, { ...result, placements: [first!, close] }).problems.join(' ')).toMatch(/closer than the spacing/)
    const off = { ...second!, y: 25, outline: first!.outline.map(([x, y]) => [x + 40, y + 25] as [number, number]) }
    expect(verifyLayout(problem, { ...result, placements: [first!, off] }).problems.join(' ')).toMatch(/outside the usable roll/)
    expect(verifyLayout(problem, { ...result, placements: [first!] }).problems.join(' ')).toMatch(/neither placed nor reported/)
  })
})
