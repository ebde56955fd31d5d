import { beforeAll, describe, expect, it } from 'vitest'
import { comparisonDetailSchema, comparisonSummarySchema, type ComparisonDetail } from '../../shared/schemas/comparisons.js'
import { addMember, api, bearer, signUp, type SignedUpUser } from './helpers.js'

const svg = (body: string) => `<svg xmlns="http://www.w3.org/2000/svg" width="100mm" height="100mm" viewBox="0 0 100 100">${body}</svg>`

async function uploadDesign(owner: SignedUpUser, filename: string, body: string): Promise<{ id: string; areaMm2: number }> {
  const response = await api()
    .post(`/api/workspaces/${owner.workspace.id}/designs`)
    .set(bearer(owner.accessToken))
    .attach('files', Buffer.from(svg(body)), { filename, contentType: 'image/svg+xml' })
    .expect(201)
  return response.body.designs[0]
}

const finished = new Set(['succeeded', 'failed', 'cancelled'])

async function waitForComparison(owner: SignedUpUser, comparisonId: string, timeoutMs = 90_000): Promise<ComparisonDetail> {
  const deadline = Date.now() + timeoutMs
  while (Date.now() < deadline) {
    const response = await api().get(`/api/workspaces/${owner.workspace.id}/comparisons/${comparisonId}`).set(bearer(owner.accessToken)).expect(200)
    const comparison = comparisonDetailSchema.parse(response.body)
    if (finished.has(comparison.status)) return comparison
    await new Promise((resolve) => setTimeout(resolve, 300))
  }
  throw new Error(`comparison ${comparisonId} did not finish within ${timeoutMs} ms`)
}

describe('stock comparisons', () => {
  let owner: SignedUpUser
  let tagId: string
  let tagArea: number
  let rollItemId: string
  const base = () => `/api/workspaces/${owner.workspace.id}/comparisons`

  beforeAll(async () => {
    owner = await signUp('comparer')
    const tag = await uploadDesign(owner, 'tag.svg', '<rect x="0" y="0" width="40" height="25"/>')
    tagId = tag.id
    tagArea = tag.areaMm2
    const roll = await api()
      .post(`/api/workspaces/${owner.workspace.id}/stock`)
      .set(bearer(owner.accessToken))
      .send({ kind: 'roll', name: 'Felt roll 200 mm', widthMm: 200, lengthMm: 5000, price: 3 })
      .expect(201)
    rollItemId = roll.body.id
  })

  it('compares three stocks to completion, prices each and marks the best, then runs again', async () => {
    const started = await api()
      .post(base())
      .set(bearer(owner.accessToken))
      .send({
        items: [{ designId: tagId, quantity: 6, rotation: 'quarter-turns' }],
        stocks: [
          { kind: 'sheets', label: 'Small sheet', widthMm: 150, heightMm: 100, pricePerSheet: 0.8, currency: 'eur' },
          { kind: 'sheets', label: 'Large sheet', widthMm: 300, heightMm: 200, pricePerSheet: 2.5 },
          { kind: 'stock-item', stockItemId: rollItemId },
        ],
        spacingMm: 2,
        marginMm: 5,
        timeBudgetSeconds: 1,
      })
    expect(started.status).toBe(202)
    expect(started.headers.location).toBe(`${base()}/${started.body.id}`)
    expect(started.body.rows).toHaveLength(3)
    expect(started.body.rows.map((row: { stock: { label: string } }) => row.stock.label)).toEqual(['Small sheet', 'Large sheet', 'Felt roll 200 mm'])

    const comparison = await waitForComparison(owner, started.body.id)
    expect(comparison.status).toBe('succeeded')
    expect(comparison.name).toBe('3 stocks: Small sheet, Large sheet, Felt roll 200 mm')
    const [small, large, roll] = comparison.rows
    for (const row of comparison.rows) {
      expect(row.runStatus).toBe('succeeded')
      expect(row.stock.currency).toBe('EUR')
      const figures = row.figures!
      expect(figures.placedCount).toBe(6)
      expect(figures.wantedCount).toBe(6)
      expect(figures.complete).toBe(true)
      // 6 rectangles of 40 × 25 mm: 6 × 1,000 mm² of pieces and 6 × 130 mm of cut.
      expect(figures.pieceAreaMm2).toBeCloseTo(6 * tagArea, 6)
      expect(figures.pieceAreaMm2).toBeCloseTo(6000, 3)
      expect(figures.cutLengthMm).toBeCloseTo(6 * 130, 3)
      expect(figures.wasteAreaMm2).toBeCloseTo(figures.usedAreaMm2 - figures.pieceAreaMm2, 6)
      expect(figures.costPerPiece).toBeCloseTo(figures.materialCost! / 6, 9)
      // From the cut plan: at least the 780 mm of cut at the default profile's 100 mm/s.
      expect(figures.cutTimeSeconds).toBeGreaterThan(780 / 100)
    }
    // Sheets are paid whole: used area = sheets × sheet area, cost = sheets × price per sheet.
    expect(small!.figures!.usedAreaMm2).toBe(small!.figures!.sheetsUsed * 150 * 100)
    expect(small!.figures!.materialCost).toBeCloseTo(small!.figures!.sheetsUsed * 0.8, 9)
    // 6 tags fit on one 300 × 200 sheet (8 of 42 × 27 mm fit within 290 × 190).
    expect(large!.figures!.sheetsUsed).toBe(1)
    expect(large!.figures!.materialCost).toBe(2.5)
    // The shelf roll (3.00 per metre) is paid by used length in metres.
    expect(roll!.stock).toMatchObject({ kind: 'roll', widthMm: 200, price: 3, priceUnit: 'metre', stockItemId: rollItemId })
    expect(roll!.figures!.usedLengthMm).toBeGreaterThan(0)
    expect(roll!.figures!.materialCost).toBeCloseTo((roll!.figures!.usedLengthMm / 1000) * 3, 9)

    // The best cost is marked on the cheapest row(s), and only there.
    const cheapest = Math.min(...comparison.rows.map((row) => row.figures!.materialCost!))
    for (const row of comparison.rows) expect(row.best.includes('materialCost')).toBe(Math.abs(row.figures!.materialCost! - cheapest) < 1e-6)
    const fullest = Math.max(...comparison.rows.map((row) => row.figures!.utilisation))
    for (const row of comparison.rows) expect(row.best.includes('utilisation')).toBe(Math.abs(row.figures!.utilisation - fullest) < 1e-6)

    const list = await api().get(base()).set(bearer(owner.accessToken)).expect(200)
    const summary = comparisonSummarySchema.parse(list.body.find((entry: { id: string }) => entry.id === comparison.id))
    expect(summary).toMatchObject({ status: 'succeeded', itemCount: 1, pieceQuantity: 6, stockLabels: ['Small sheet', 'Large sheet', 'Felt roll 200 mm'] })

    // A re-run uses the stored snapshot on new nest runs, even after the shelf item changed.
    await api().patch(`/api/workspaces/${owner.workspace.id}/stock/${rollItemId}`).set(bearer(owner.accessToken)).send({ price: 9 }).expect(200)
    const rerun = await api().post(`${base()}/${comparison.id}/rerun`).set(bearer(owner.accessToken)).expect(202)
    expect(rerun.body.rows.map((row: { runId: string }) => row.runId)).not.toEqual(comparison.rows.map((row) => row.runId))
    const again = await waitForComparison(owner, comparison.id)
    expect(again.status).toBe('succeeded')
    expect(again.rows[2]!.stock.price).toBe(3)
  }, 180_000)

  it('cancels every run of a comparison', async () => {
    const started = await api()
      .post(base())
      .set(bearer(owner.accessToken))
      .send({
        items: [{ designId: tagId, quantity: 60 }],
        stocks: [
          { kind: 'roll', label: 'Roll 305', widthMm: 305 },
          { kind: 'sheets', label: 'A4', widthMm: 210, heightMm: 297 },
        ],
        timeBudgetSeconds: 120,
      })
      .expect(202)
    const cancelled = await api().post(`${base()}/${started.body.id}/cancel`).set(bearer(owner.accessToken)).expect(200)
    expect(cancelled.body.rows).toHaveLength(2)
    const comparison = await waitForComparison(owner, started.body.id, 30_000)
    expect(comparison.status).toBe('cancelled')
    for (const row of comparison.rows) expect(row.runStatus).toBe('cancelled')
  }, 60_000)

  it('refuses bad input with the field named', async () => {
    const one = await api()
      .post(base())
      .set(bearer(owner.accessToken))
      .send({ items: [{ designId: tagId, quantity: 2 }], stocks: [{ kind: 'roll', label: 'Only roll', widthMm: 300 }] })
    expect(one.status).toBe(400)
    expect(Object.keys(one.body.error.fields)).toEqual(['body.stocks'])

    const nine = await api()
      .post(base())
      .set(bearer(owner.accessToken))
      .send({ items: [{ designId: tagId, quantity: 2 }], stocks: Array.from({ length: 9 }, (_, index) => ({ kind: 'roll', label: `Roll ${index}`, widthMm: 300 })) })
    expect(nine.status).toBe(400)
    expect(Object.keys(nine.body.error.fields)).toEqual(['body.stocks'])

    const fields = await api()
      .post(base())
      .set(bearer(owner.accessToken))
      .send({ items: [{ designId: tagId, quantity: 0 }], stocks: [{ kind: 'stock-item', stockItemId: 'nope' }, { kind: 'sheets', label: 'Sheet', widthMm: -5, heightMm: 100 }] })
    expect(fields.status).toBe(400)
    expect(Object.keys(fields.body.error.fields).sort()).toEqual(['body.items.0.quantity', 'body.stocks.0.stockItemId', 'body.stocks.1.widthMm'])

    const unknown = await api()
      .post(base())
      .set(bearer(owner.accessToken))
      .send({ items: [{ designId: tagId, quantity: 2 }], stocks: [{ kind: 'stock-item', stockItemId: '00000000-0000-4000-8000-000000000000' }, { kind: 'roll', label: 'Roll', widthMm: 300 }] })
    expect(unknown.status).toBe(400)
    expect(unknown.body.error.fields).toHaveProperty(['body.stocks.0.stockItemId'])

    const mixed = await api()
      .post(base())
      .set(bearer(owner.accessToken))
      .send({ items: [{ designId: tagId, quantity: 2 }], stocks: [{ kind: 'roll', label: 'Roll', widthMm: 300, pricePerMetre: 2, currency: 'EUR' }, { kind: 'roll', label: 'Other roll', widthMm: 600, pricePerMetre: 3, currency: 'USD' }] })
    expect(mixed.status).toBe(400)
    expect(mixed.body.error.fields).toHaveProperty(['body.stocks.1.currency'])

    const foreignDesign = await api()
      .post(base())
      .set(bearer(owner.accessToken))
      .send({ items: [{ designId: '00000000-0000-4000-8000-000000000000', quantity: 2 }], stocks: [{ kind: 'roll', label: 'Roll', widthMm: 300 }, { kind: 'roll', label: 'Wide roll', widthMm: 600 }] })
    expect(foreignDesign.status).toBe(400)
    expect(foreignDesign.body.error.fields).toHaveProperty(['body.items.0.designId'])
  })

  it('lets a viewer read but not start or cancel, and hides comparisons from other workspaces', async () => {
    const started = await api()
      .post(base())
      .set(bearer(owner.accessToken))
      .send({ items: [{ designId: tagId, quantity: 2 }], stocks: [{ kind: 'roll', label: 'Roll', widthMm: 300 }, { kind: 'roll', label: 'Wide roll', widthMm: 600 }], timeBudgetSeconds: 1 })
      .expect(202)
    const viewer = await addMember(owner, 'viewer')
    await api().get(base()).set(bearer(viewer.accessToken)).expect(200)
    await api().get(`${base()}/${started.body.id}`).set(bearer(viewer.accessToken)).expect(200)
    const refused = await api()
      .post(base())
      .set(bearer(viewer.accessToken))
      .send({ items: [{ designId: tagId, quantity: 2 }], stocks: [{ kind: 'roll', label: 'Roll', widthMm: 300 }, { kind: 'roll', label: 'Wide roll', widthMm: 600 }] })
    expect(refused.status).toBe(403)
    await api().post(`${base()}/${started.body.id}/cancel`).set(bearer(viewer.accessToken)).expect(403)
    await api().post(`${base()}/${started.body.id}/rerun`).set(bearer(viewer.accessToken)).expect(403)

    const stranger = await signUp('stranger')
    await api().get(`${base()}/${started.body.id}`).set(bearer(stranger.accessToken)).expect(404)
    await api().get(`/api/workspaces/${stranger.workspace.id}/comparisons/${started.body.id}`).set(bearer(stranger.accessToken)).expect(404)
    await waitForComparison(owner, started.body.id)
  }, 120_000)
})
