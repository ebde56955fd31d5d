import { describe, expect, it } from 'vitest'
import { createPieceIndex } from '../../../shared/layout/spatialIndex.js'

const box = (minX: number, minY: number, size = 10) => ({ minX, minY, maxX: minX + size, maxY: minY + size })

describe('the spatial index of placed pieces', () => {
  it('finds pieces by box on their own sheet, grown by a distance', () => {
    const index = createPieceIndex([
      { id: 'a', sheet: 0, ...box(0, 0) },
      { id: 'b', sheet: 0, ...box(30, 0) },
      { id: 'c', sheet: 1, ...box(0, 0) },
    ])
    expect(index.search(0, box(5, 5)).map((entry) => entry.id)).toEqual(['a'])
    expect(index.search(0, box(15, 0), 4).map((entry) => entry.id)).toEqual([])
    expect(index.search(0, box(15, 0), 5).map((entry) => entry.id).sort()).toEqual(['a', 'b'])
    expect(index.search(1, box(5, 5)).map((entry) => entry.id)).toEqual(['c'])
    expect(index.search(7, box(5, 5))).toEqual([])
  })

  it('follows a piece that moves, also to another sheet, and forgets a removed one', () => {
    const index = createPieceIndex([{ id: 'a', sheet: 0, ...box(0, 0) }])
    index.upsert('a', 1, box(100, 100))
    expect(index.search(0, box(0, 0))).toEqual([])
    expect(index.search(1, box(100, 100)).map((entry) => entry.id)).toEqual(['a'])
    expect(index.get('a')).toMatchObject({ sheet: 1, minX: 100 })
    index.remove('a')
    expect(index.search(1, box(100, 100))).toEqual([])
    expect(index.size).toBe(0)
  })

  it('finds a piece moved 500 times at its last place, among 500', () => {
    const index = createPieceIndex(Array.from({ length: 500 }, (_, i) => ({ id: `p${i}`, sheet: 0, ...box((i % 25) * 12, Math.floor(i / 25) * 12) })))
    for (let step = 0; step < 500; step++) index.upsert('p0', 0, box(step, step))
    expect(index.size).toBe(500)
    expect(index.search(0, box(499, 499), 0).map((entry) => entry.id)).toContain('p0')
  })
})
