import { randomUUID } from 'node:crypto'
import polygonClipping, { type Polygon } from 'polygon-clipping'
import { beforeAll, describe, expect, it } from 'vitest'
import { layoutStockOfStockItem, nestStockOfStockItem } from '../../shared/jobs/remnantStock.js'
import { layoutFromNestRun } from '../../shared/layout/fromNestRun.js'
import { polygonStockAreaMm2 } from '../../shared/layout/polygonStock.js'
import { jobSchema } from '../../shared/schemas/jobs.js'
import { layoutDetailSchema, type LayoutStock } from '../../shared/schemas/layouts.js'
import { nestRunSchema, type NestRunDto } from '../../shared/schemas/nesting.js'
import { stockItemSchema, type StockItem } from '../../shared/schemas/stock.js'
import { api, bearer, signUp, type SignedUpUser } from './helpers.js'
import { completeJob, cornerLayout, createJob, createStock, uploadSquare, workspaceUrl } from './jobsFixtures.js'

// Worked examples by hand. The job cuts one 50 × 50 square from the corner of a 100 × 100 sheet (margin and spacing 0),
// so the remnant is the L of 10 000 − 2 500 = 7 500 mm²: a right arm x 50..100 × y 0..100 and a bottom arm
// x 0..50 × y 50..100. A 20 × 20 square has 400 mm².

const areaOf = (polygons: ReturnType<typeof polygonClipping.difference>) =>
  polygons.reduce((sum, polygon) => {
    const ring = (points: [number, number][]) => Math.abs(points.reduce((twice, [x, y], index) => twice + x * points[(index + 1) % points.length]![1] - points[(index + 1) % points.length]![0] * y, 0)) / 2
    return sum + ring(polygon[0] as [number, number][]) - polygon.slice(1).reduce((holes, hole) => holes + ring(hole as [number, number][]), 0)
  }, 0)

async function waitForRun(owner: SignedUpUser, runId: string, timeoutMs = 60_000): Promise<NestRunDto> {
  const deadline = Date.now() + timeoutMs
  while (Date.now() < deadline) {
    const run = nestRunSchema.parse((await api().get(`${workspaceUrl(owner)}/nest-runs/${runId}`).set(bearer(owner.accessToken)).expect(200)).body)
    if (run.status === 'succeeded' || run.status === 'failed' || run.status === 'cancelled') return run
    await new Promise((resolve) => setTimeout(resolve, 300))
  }
  throw new Error(`run ${runId} did not finish within ${timeoutMs} ms`)
}

describe('remnants as stock for later layouts and nest runs', () => {
  let owner: SignedUpUser
  let remnant: StockItem
  let smallSquareId: string
  let polygonStock: LayoutStock

  beforeAll(async () => {
    owner = await signUp('remnant-user')
    const squareId = await uploadSquare(owner, 50)
    smallSquareId = await uploadSquare(owner, 20)
    const layoutId = await cornerLayout(owner, squareId, 'sheets')
    const stockId = await createStock(owner, { kind: 'sheet', name: 'Card 100 square', widthMm: 100, heightMm: 100, quantityOnHand: 1, price: 4 })
    const job = await createJob(owner, { layoutId, stockItemId: stockId })
    const done = jobSchema.parse((await completeJob(owner, job, { keepRemnant: true })).body)
    remnant = stockItemSchema.parse((await api().get(`${workspaceUrl(owner)}/stock/${done.remnant!.id}`).set(bearer(owner.accessToken)).expect(200)).body)
    polygonStock = layoutStockOfStockItem(remnant).stock
  })

  it('gives the remnant as polygon stock with the area of the L', () => {
    expect(polygonStock.kind).toBe('polygon')
    if (polygonStock.kind !== 'polygon') return
    expect(polygonStock.stockItemId).toBe(remnant.id)
    expect(polygonStockAreaMm2(polygonStock)).toBe(7_500)
  })

  it('saves a layout on the remnant with utilisation = piece area / remnant area', async () => {
    const response = await api()
      .post(`${workspaceUrl(owner)}/layouts`)
      .set(bearer(owner.accessToken))
      .send({
        name: 'On the remnant',
        stock: polygonStock,
        items: [{ designId: smallSquareId, quantity: 1 }],
        // In the right arm: x 60..80, y 10..30.
        placements: [{ id: randomUUID(), designId: smallSquareId, pieceIndex: 0, sheet: 0, xMm: 60, yMm: 10, angleDeg: 0 }],
        options: { spacingMm: 0, marginMm: 0 },
      })
      .expect(201)
    const layout = layoutDetailSchema.parse(response.body)
    expect(layout.stock).toEqual(polygonStock)
    // 400 / 7 500 = 0.05333…; waste 7 100; one piece of stock used.
    expect(layout.figures.pieceAreaMm2).toBeCloseTo(400, 6)
    expect(layout.figures.usedStockAreaMm2).toBeCloseTo(7_500, 6)
    expect(layout.figures.utilisation).toBeCloseTo(400 / 7_500, 9)
    expect(layout.figures.wasteAreaMm2).toBeCloseTo(7_100, 6)
    expect(layout.figures.sheetsUsed).toBe(1)
  })

  it('refuses a polygon stock whose outline leaves its box, and a piece on a second lane', async () => {
    if (polygonStock.kind !== 'polygon') throw new Error('expected polygon stock')
    const base = { name: 'Broken', items: [{ designId: smallSquareId, quantity: 1 }], options: { spacingMm: 0, marginMm: 0 } }
    const outside = await api()
      .post(`${workspaceUrl(owner)}/layouts`)
      .set(bearer(owner.accessToken))
      .send({ ...base, stock: { ...polygonStock, widthMm: 60 }, placements: [] })
      .expect(400)
    expect(outside.body.error.fields['body.stock.outline']).toEqual(['The stock outline must lie inside its width × height, from (0, 0)'])
    const secondLane = await api()
      .post(`${workspaceUrl(owner)}/layouts`)
      .set(bearer(owner.accessToken))
      .send({ ...base, stock: polygonStock, placements: [{ id: randomUUID(), designId: smallSquareId, pieceIndex: 0, sheet: 1, xMm: 60, yMm: 10, angleDeg: 0 }] })
      .expect(400)
    expect(secondLane.body.error.fields['body.placements.0.sheet']).toEqual(['A stock of its own outline is one piece of stock: use sheet 0'])
  })

  it('nests on the remnant: a verified result with every piece inside the outline, and opens it as a layout', async () => {
    const { stock, marginMm } = nestStockOfStockItem(remnant)
    const started = await api()
      .post(`${workspaceUrl(owner)}/nest-runs`)
      .set(bearer(owner.accessToken))
      .send({ items: [{ designId: smallSquareId, quantity: 6 }], stock, spacingMm: 2, marginMm, timeBudgetSeconds: 2 })
      .expect(202)
    const run = await waitForRun(owner, started.body.id)
    expect(run.status).toBe('succeeded')
    const result = run.result!
    expect(result.verified).toBe(true)
    expect(result.mode).toBe('polygon')
    // Six 20 × 20 squares fit easily (the right arm alone holds 2 × 4 with 2 mm between them).
    expect(result.placements).toHaveLength(6)
    expect(result.unplaced).toHaveLength(0)
    // 6 × 400 / 7 500 = 0.32.
    expect(result.utilisation).toBeCloseTo(0.32, 6)
    const stockPolygon = remnant.outline as Polygon
    for (const placement of result.placements) {
      const outside = polygonClipping.difference([placement.outline] as Polygon, stockPolygon)
      expect(areaOf(outside)).toBeLessThan(1e-6)
      // Never in the corner the first job cut away.
      const inCorner = polygonClipping.intersection([placement.outline] as Polygon, [[[0, 0], [50, 0], [50, 50], [0, 50]]])
      expect(areaOf(inCorner)).toBeLessThan(1e-6)
    }

    const body = layoutFromNestRun(run, 'From the remnant run', randomUUID)
    expect(body?.stock.kind).toBe('polygon')
    const layout = layoutDetailSchema.parse((await api().post(`${workspaceUrl(owner)}/layouts`).set(bearer(owner.accessToken)).send(body!).expect(201)).body)
    expect(layout.figures.utilisation).toBeCloseTo(0.32, 6)
  })

  it('keeps a remnant of the remnant, taken from its outline', async () => {
    const layout = layoutDetailSchema.parse(
      (
        await api()
          .post(`${workspaceUrl(owner)}/layouts`)
          .set(bearer(owner.accessToken))
          .send({
            name: 'Cut from the remnant',
            stock: polygonStock,
            items: [{ designId: smallSquareId, quantity: 1 }],
            placements: [{ id: randomUUID(), designId: smallSquareId, pieceIndex: 0, sheet: 0, xMm: 60, yMm: 10, angleDeg: 0 }],
            options: { spacingMm: 0, marginMm: 0 },
          })
          .expect(201)
      ).body,
    )
    const job = await createJob(owner, { layoutId: layout.id, stockItemId: remnant.id })
    const done = jobSchema.parse((await completeJob(owner, job, { keepRemnant: true })).body)
    expect(done.status).toBe('done')
    // 7 500 − 400 = 7 100 mm², the square's place a hole in the L.
    expect(done.remnant).toMatchObject({ kind: 'sheet' })
    expect(done.remnant!.areaMm2).toBeCloseTo(7_100, 6)
    const used = stockItemSchema.parse((await api().get(`${workspaceUrl(owner)}/stock/${remnant.id}`).set(bearer(owner.accessToken)).expect(200)).body)
    expect(used.quantityOnHand).toBe(0)
    const second = stockItemSchema.parse((await api().get(`${workspaceUrl(owner)}/stock/${done.remnant!.id}`).set(bearer(owner.accessToken)).expect(200)).body)
    expect(second.outline).toHaveLength(2)
    // Price pro rata of the first remnant (4 × 7 500 / 10 000 = 3) × 7 100 / 7 500 = 2.84.
    expect(second.price).toBeCloseTo(2.84, 4)
  })
})
