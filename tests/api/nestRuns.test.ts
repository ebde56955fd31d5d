import { beforeAll, describe, expect, it } from 'vitest'
import { nestRunSchema, type NestRunDto } from '../../shared/schemas/nesting.js'
import { verifyLayout } from '../../shared/nesting/verify.js'
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

async function waitForRun(owner: SignedUpUser, runId: string, timeoutMs = 60_000): Promise<NestRunDto> {
  const deadline = Date.now() + timeoutMs
  while (Date.now() < deadline) {
    const response = await api().get(`/api/workspaces/${owner.workspace.id}/nest-runs/${runId}`).set(bearer(owner.accessToken)).expect(200)
    const run = nestRunSchema.parse(response.body)
    if (run.status === 'succeeded' || run.status === 'failed' || run.status === 'cancelled') return run
    await new Promise((resolve) => setTimeout(resolve, 300))
  }
  throw new Error(`run ${runId} did not finish within ${timeoutMs} ms`)
}

describe('nest runs through the job queue', () => {
  let owner: SignedUpUser
  let tagId: string
  let tagArea: number
  let ringId: string

  beforeAll(async () => {
    owner = await signUp('nester')
    const tag = await uploadDesign(owner, 'tag.svg', '<rect x="0" y="0" width="40" height="25" rx="3"/>')
    tagId = tag.id
    tagArea = tag.areaMm2
    ringId = (await uploadDesign(owner, 'ring.svg', '<circle cx="50" cy="50" r="45"/><circle cx="50" cy="50" r="30"/>')).id
  })

  it('runs from start to a verified result on A4 sheets', async () => {
    const started = await api()
      .post(`/api/workspaces/${owner.workspace.id}/nest-runs`)
      .set(bearer(owner.accessToken))
      .send({ items: [{ designId: tagId, quantity: 12 }], stock: { kind: 'sheets', widthMm: 210, heightMm: 297 }, spacingMm: 2, marginMm: 5, timeBudgetSeconds: 2 })
    expect(started.status).toBe(202)
    expect(started.headers.location).toBe(`/api/workspaces/${owner.workspace.id}/nest-runs/${started.body.id}`)
    expect(started.body.status).toBe('queued')

    const run = await waitForRun(owner, started.body.id)
    expect(run.status).toBe('succeeded')
    const result = run.result!
    expect(result.verified).toBe(true)
    expect(result.placements).toHaveLength(12)
    expect(result.sheetCount).toBe(1)
    // ISO 216: A4 = 210 × 297 mm; one sheet used, so utilisation = 12 × piece area / sheet area.
    expect(result.perSheetUtilisation[0]).toBeCloseTo((12 * tagArea) / (210 * 297), 6)
    // The stored layout passes the independent check again, rebuilt from what the API returned.
    const problem = {
      items: [{ id: `${tagId}:0`, outline: result.placements[0]!.outline, quantity: 12, rotationsDeg: [0, 90, 180, 270] }],
      stock: { kind: 'sheets' as const, width: 210, height: 297 },
      spacing: 2,
      margin: 5,
    }
    const asResult = {
      mode: 'sheets' as const,
      placements: result.placements.map((placement) => ({ itemId: `${placement.designId}:${placement.pieceIndex}`, copy: placement.copy, sheet: placement.sheet, angleDeg: 0, mirrored: false, x: 0, y: 0, outline: placement.outline, holes: placement.holes })),
      unplaced: [],
      length: result.lengthMm,
      sheetCount: result.sheetCount,
      utilisation: result.utilisation,
      pieceArea: result.pieceAreaMm2,
      usedStockArea: result.usedStockAreaMm2,
      evaluations: 0,
      elapsedMs: 0,
      firstFeasibleMs: 0,
      seed: 1,
    }
    const report = verifyLayout({ ...problem, items: problem.items.map((item) => ({ ...item, rotationsDeg: [0] })) }, asResult)
    expect(report.problems.filter((problemText) => !/not the item moved as stated/.test(problemText))).toEqual([])
  })

  it('follows a run over server-sent events until it is done', async () => {
    const started = await api()
      .post(`/api/workspaces/${owner.workspace.id}/nest-runs`)
      .set(bearer(owner.accessToken))
      .send({ items: [{ designId: ringId, quantity: 3 }, { designId: tagId, quantity: 4 }], stock: { kind: 'roll', widthMm: 305 }, timeBudgetSeconds: 2 })
      .expect(202)
    const events = await api()
      .get(`/api/workspaces/${owner.workspace.id}/nest-runs/${started.body.id}/events`)
      .set(bearer(owner.accessToken))
      .buffer(true)
      .parse((response, done) => {
        let text = ''
        response.setEncoding('utf8')
        response.on('data', (chunk: string) => (text += chunk))
        response.on('end', () => done(null, text))
      })
    expect(events.headers['content-type']).toMatch(/text\/event-stream/)
    const text = events.body as string
    expect(text).toMatch(/event: progress/)
    const done = /event: done\ndata: (.*)\n/.exec(text)
    expect(done).not.toBeNull()
    const run = nestRunSchema.parse(JSON.parse(done![1]!))
    expect(run.status).toBe('succeeded')
    expect(run.result!.placements).toHaveLength(7)
  })

  it('cancels a long run and keeps its best layout so far', async () => {
    const started = await api()
      .post(`/api/workspaces/${owner.workspace.id}/nest-runs`)
      .set(bearer(owner.accessToken))
      .send({ items: [{ designId: tagId, quantity: 40 }], stock: { kind: 'roll', widthMm: 305 }, timeBudgetSeconds: 120 })
      .expect(202)
    const runUrl = `/api/workspaces/${owner.workspace.id}/nest-runs/${started.body.id}`
    const deadline = Date.now() + 30_000
    while (Date.now() < deadline) {
      const run = await api().get(runUrl).set(bearer(owner.accessToken))
      if (run.body.status === 'running' && run.body.progress) break
      await new Promise((resolve) => setTimeout(resolve, 200))
    }
    const cancelStarted = Date.now()
    await api().post(`${runUrl}/cancel`).set(bearer(owner.accessToken)).expect(200)
    const run = await waitForRun(owner, started.body.id, 30_000)
    expect(run.status).toBe('cancelled')
    expect(Date.now() - cancelStarted).toBeLessThan(20_000)
    expect(run.result?.placements).toHaveLength(40)
  })

  it('refuses bad requests with the fields named, and a viewer may read but not start', async () => {
    const bad = await api()
      .post(`/api/workspaces/${owner.workspace.id}/nest-runs`)
      .set(bearer(owner.accessToken))
      .send({ items: [{ designId: 'nope', quantity: 0 }], stock: { kind: 'sheets', widthMm: -1, heightMm: 297 } })
    expect(bad.status).toBe(400)
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['body.items.0.designId', 'body.items.0.quantity', 'body.stock.widthMm'])

    const foreign = await api()
      .post(`/api/workspaces/${owner.workspace.id}/nest-runs`)
      .set(bearer(owner.accessToken))
      .send({ items: [{ designId: '00000000-0000-4000-8000-000000000000', quantity: 1 }], stock: { kind: 'roll', widthMm: 305 } })
    expect(foreign.status).toBe(400)
    expect(foreign.body.error.fields).toHaveProperty(['body.items.0.designId'])

    // A zone of sheet 1 on a roll (which is one lane, sheet 0) can never act: refused with the zone's sheet named.
    const zoneOnRoll = await api()
      .post(`/api/workspaces/${owner.workspace.id}/nest-runs`)
      .set(bearer(owner.accessToken))
      .send({ items: [{ designId: tagId, quantity: 1 }], stock: { kind: 'roll', widthMm: 305 }, excludedZones: [{ sheet: 1, outline: [[0, 0], [10, 0], [10, 10]] }] })
    expect(zoneOnRoll.status).toBe(400)
    expect(Object.keys(zoneOnRoll.body.error.fields).some((field) => /excludedZones\.0\.sheet$/.test(field))).toBe(true)

    const viewer = await addMember(owner, 'viewer')
    const list = await api().get(`/api/workspaces/${owner.workspace.id}/nest-runs`).set(bearer(viewer.accessToken))
    expect(list.status).toBe(200)
    expect(list.body.length).toBeGreaterThan(0)
    await api()
      .post(`/api/workspaces/${owner.workspace.id}/nest-runs`)
      .set(bearer(viewer.accessToken))
      .send({ items: [{ designId: tagId, quantity: 1 }], stock: { kind: 'roll', widthMm: 305 } })
      .expect(403)
    const outsider = await signUp('nest-outsider')
    await api().get(`/api/workspaces/${owner.workspace.id}/nest-runs/${list.body[0].id}`).set(bearer(outsider.accessToken)).expect(404)
  })
})
