import { afterAll } from 'vitest'
import { loadConfig } from '../../server/config.js'
import { connectDatabase } from '../../server/db/client.js'
import { cutJobs, quotes } from '../../server/db/schema/index.js'
import { randomUUID } from 'node:crypto'
import { eq } from 'drizzle-orm'
import { cutPlanResponseSchema } from '../../shared/schemas/cutplan.js'
import { api, bearer, signUp, type SignedUpUser } from './helpers.js'

// Direct database access to arrange a job (the jobs API is another feature's) and to read what an API answer hides.
const database = connectDatabase(loadConfig().databaseUrl, 2)
afterAll(() => database.close())

export async function insertJob(input: { workspaceId: string; number: number; title: string; layoutId: string; stockItemId: string; quantity: number; customerName?: string }) {
  const [row] = await database.db
    .insert(cutJobs)
    .values({ workspaceId: input.workspaceId, number: input.number, title: input.title, layoutId: input.layoutId, stockItemId: input.stockItemId, quantity: input.quantity, customerName: input.customerName ?? '' })
    .returning({ id: cutJobs.id })
  return row!.id
}

export async function storedQuote(quoteId: string) {
  const [row] = await database.db.select().from(quotes).where(eq(quotes.id, quoteId))
  return row!
}

/** Moves a quote's expiry into the past, as if its valid days had run out. */
export async function backdateExpiry(quoteId: string) {
  await database.db
    .update(quotes)
    .set({ expiresAt: new Date(Date.now() - 60_000) })
    .where(eq(quotes.id, quoteId))
}

const svg = (body: string) => `<svg xmlns="http://www.w3.org/2000/svg" width="100mm" height="100mm" viewBox="0 0 100 100">${body}</svg>`

async function uploadSquare(owner: SignedUpUser): Promise<string> {
  const response = await api()
    .post(`/api/workspaces/${owner.workspace.id}/designs`)
    .set(bearer(owner.accessToken))
    .attach('files', Buffer.from(svg('<rect x="0" y="0" width="50" height="50"/>')), { filename: 'square.svg', contentType: 'image/svg+xml' })
    .expect(201)
  return response.body.designs[0].id
}

const placement = (designId: string, xMm: number, yMm: number) => ({ id: randomUUID(), designId, pieceIndex: 0, sheet: 0, xMm, yMm, angleDeg: 0 })

// Pricing of the worked example (round numbers so every line is exact in cents).
export const pricing = {
  currency: 'eur',
  machineRatePerHourMinor: 2400,
  labourRatePerHourMinor: 1800,
  setupFeeMinor: 1000,
  weedingMinutesPerPiece: 1.5,
  materialMarkupPercent: 40,
  minimumOrderMinor: 2000,
  taxRatePercent: 20,
  quoteValidDays: 14,
}

/** A workspace with pricing, a priced sheet stock, a layout of two squares and a job cutting it three times. */
export async function studioWithJob(label: string) {
  const owner = await signUp(label)
  const ws = owner.workspace.id
  await api().put(`/api/workspaces/${ws}/pricing`).set(bearer(owner.accessToken)).send(pricing).expect(200)
  const stock = await api()
    .post(`/api/workspaces/${ws}/stock`)
    .set(bearer(owner.accessToken))
    .send({ kind: 'sheet', name: 'Kraft card 300 × 300', widthMm: 300, heightMm: 300, price: 4.5 })
    .expect(201)
  const squareId = await uploadSquare(owner)
  const layout = await api()
    .post(`/api/workspaces/${ws}/layouts`)
    .set(bearer(owner.accessToken))
    .send({
      name: 'Two coasters',
      stock: { kind: 'sheets', widthMm: 300, heightMm: 300, sheetCount: 1 },
      items: [{ designId: squareId, quantity: 2 }],
      placements: [placement(squareId, 10, 10), placement(squareId, 100, 10)],
      options: { spacingMm: 0, marginMm: 0 },
    })
    .expect(201)
  const jobId = await insertJob({ workspaceId: ws, number: 1, title: 'Coasters for the market', layoutId: layout.body.id, stockItemId: stock.body.id, quantity: 3, customerName: 'Rowan Pell' })
  const plan = cutPlanResponseSchema.parse((await api().get(`/api/workspaces/${ws}/layouts/${layout.body.id}/cut-plan`).set(bearer(owner.accessToken)).expect(200)).body)
  return { owner, ws, jobId, cutTimePerRunS: plan.totals.totalTimeS, quotesUrl: `/api/workspaces/${ws}/quotes` }
}

