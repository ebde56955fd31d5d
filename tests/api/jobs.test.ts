import { beforeAll, describe, expect, it } from 'vitest'
import { jobListResponseSchema, jobSchema } from '../../shared/schemas/jobs.js'
import { stockItemSchema } from '../../shared/schemas/stock.js'
import { addMember, api, bearer, signUp, type SignedUpUser } from './helpers.js'
import { completeJob, cornerLayout, createBladeCutter, createJob, createMaterial, createStock, fitBlade, moveJob, uploadSquare, workspaceUrl } from './jobsFixtures.js'

// Reference values are worked out by hand: a 50 × 50 mm square has area 2 500 mm² and a perimeter (cut length) of
// 200 mm; a 100 × 100 mm sheet has 10 000 mm²; the leftover around a corner square is the L of 10 000 − 2 500 = 7 500 mm².

const dayFromToday = (days: number) => {
  const now = new Date()
  return new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), now.getUTCDate() + days)).toISOString().slice(0, 10)
}

describe('jobs', () => {
  let owner: SignedUpUser
  let squareId: string
  let sheetLayoutId: string
  let rollLayoutId: string
  let cardId: string
  let feltId: string
  let sheetStockId: string
  let cutterId: string
  let jobsUrl: string

  beforeAll(async () => {
    owner = await signUp('jobs-owner')
    jobsUrl = `${workspaceUrl(owner)}/jobs`
    squareId = await uploadSquare(owner)
    sheetLayoutId = await cornerLayout(owner, squareId, 'sheets')
    rollLayoutId = await cornerLayout(owner, squareId, 'roll')
    cardId = await createMaterial(owner, 'Heavy card', 2)
    feltId = await createMaterial(owner, 'Craft felt', 1)
    sheetStockId = await createStock(owner, { kind: 'sheet', name: 'Card 100 square', widthMm: 100, heightMm: 100, materialId: cardId, price: 4, quantityOnHand: 10 })
    cutterId = await createBladeCutter(owner, 'Bench cutter')
  })

  it('creates a job from a layout with the stock material and a planned event', async () => {
    const job = jobSchema.parse(
      (
        await api()
          .post(jobsUrl)
          .set(bearer(owner.accessToken))
          .send({ layoutId: sheetLayoutId, stockItemId: sheetStockId, cutterId, quantity: 3, customerName: 'Fern Hollow Fête', dueDate: dayFromToday(2), notes: 'Bunting tags' })
          .expect(201)
      ).body,
    )
    expect(job).toMatchObject({ status: 'planned', title: 'Corner square', quantity: 3, customerName: 'Fern Hollow Fête', dueState: 'due-soon', version: 1 })
    expect(job.material).toEqual({ id: cardId, name: 'Heavy card' })
    expect(job.stock).toMatchObject({ id: sheetStockId, kind: 'sheet', isRemnant: false })
    expect(job.events).toHaveLength(1)
    expect(job.events[0]).toMatchObject({ fromStatus: null, toStatus: 'planned', byName: owner.user.name })
    // Planned usage: 3 runs × 1 sheet; 2 passes from the card's recipe × 200 mm × 3 = 1 200 mm.
    expect(job.plannedUsage).toMatchObject({ sheetsUsed: 3, stockAreaMm2: 30_000, pieceAreaMm2: 7500, wasteAreaMm2: 22_500, passes: 2 })
    expect(job.plannedUsage!.cutLengthMm).toBeCloseTo(1200, 6)
    expect(job.links!.jobSheetPdf).toContain(`/layouts/${sheetLayoutId}/export?format=pdf&passes=2`)
    expect(job.links!.sheets).toHaveLength(1)
  })

  it('numbers jobs per workspace', async () => {
    const first = await createJob(owner, { layoutId: sheetLayoutId, stockItemId: sheetStockId })
    const second = await createJob(owner, { layoutId: sheetLayoutId, stockItemId: sheetStockId })
    expect(second.number).toBe(first.number + 1)
  })

  it('refuses bad input naming the fields', async () => {
    const empty = await api().post(jobsUrl).set(bearer(owner.accessToken)).send({ quantity: 0, dueDate: '2026-02-30' }).expect(400)
    expect(Object.keys(empty.body.error.fields).sort()).toEqual(['body.dueDate', 'body.layoutId', 'body.quantity', 'body.stockItemId'])
    expect(empty.body.error.fields['body.quantity'][0]).toBe('The quantity must be at least 1')
    const rollStock = await createStock(owner, { kind: 'roll', name: 'Card roll', widthMm: 100, lengthMm: 5000, quantityOnHand: 1 })
    const mismatch = await api().post(jobsUrl).set(bearer(owner.accessToken)).send({ layoutId: sheetLayoutId, stockItemId: rollStock }).expect(400)
    expect(mismatch.body.error.fields['body.stockItemId'][0]).toMatch(/layout is on sheets/)
  })

  it('marks a job done: blade wear = cut-plan cut length × quantity, sheets taken off, remnant with the L-shaped area', async () => {
    const bladeId = await fitBlade(owner, cutterId)
    const job = await createJob(owner, { layoutId: sheetLayoutId, stockItemId: sheetStockId, cutterId, quantity: 3 })

    // Right after the fit the card needs a test cut with the new blade.
    const before = jobSchema.parse((await api().get(`${jobsUrl}/${job.id}`).set(bearer(owner.accessToken)).expect(200)).body)
    expect(before.testCutPrompt).toMatchObject({ needed: true, bladeId })
    expect(before.bladeWear).toMatchObject({ bladeId, wornMm: 0, wearLevel: 'ok' })

    // The test cut with that blade clears the prompt.
    await api().post(`${workspaceUrl(owner)}/materials/${cardId}/test-cuts`).set(bearer(owner.accessToken)).send({ outcome: 'clean', cutterId, bladeId }).expect(201)
    const after = jobSchema.parse((await api().get(`${jobsUrl}/${job.id}`).set(bearer(owner.accessToken)).expect(200)).body)
    expect(after.testCutPrompt).toMatchObject({ needed: false })

    // The cut plan with the recipe's 2 passes, one run.
    const plan = (await api().get(`${workspaceUrl(owner)}/layouts/${sheetLayoutId}/cut-plan?passes=2`).set(bearer(owner.accessToken)).expect(200)).body
    const expectedWearMm = plan.totals.cutLengthMm * 3
    expect(expectedWearMm).toBeCloseTo(1200, 6)

    const doneResponse = await completeJob(owner, job, { keepRemnant: true, note: 'All clean' })
    expect(doneResponse.status).toBe(200)
    const done = jobSchema.parse(doneResponse.body)
    expect(done.status).toBe('done')
    expect(done.usedBladeId).toBe(bladeId)
    expect(done.usage!.cutLengthMm).toBeCloseTo(expectedWearMm, 6)
    expect(done.usage).toMatchObject({ sheetsUsed: 3, stockAreaMm2: 30_000, wasteAreaMm2: 22_500 })
    expect(done.bladeWear!.wornMm).toBeCloseTo(expectedWearMm, 6)
    expect(done.events.map((event) => `${event.fromStatus}→${event.toStatus}`)).toEqual(['null→planned', 'planned→cutting', 'cutting→done'])
    expect(done.events[2]).toMatchObject({ note: 'All clean', byName: owner.user.name })
    expect(done.doneAt).not.toBeNull()

    const cutter = (await api().get(`${workspaceUrl(owner)}/cutters/${cutterId}`).set(bearer(owner.accessToken)).expect(200)).body
    expect(cutter.currentBlade.wornMm).toBeCloseTo(expectedWearMm, 6)

    const stock = stockItemSchema.parse((await api().get(`${workspaceUrl(owner)}/stock/${sheetStockId}`).set(bearer(owner.accessToken)).expect(200)).body)
    expect(stock.quantityOnHand).toBe(10 - 3)

    expect(done.remnant).toMatchObject({ kind: 'sheet', areaMm2: 7500, name: `Remnant of Job ${job.number} — Card 100 square` })
    const remnant = stockItemSchema.parse((await api().get(`${workspaceUrl(owner)}/stock/${done.remnant!.id}`).set(bearer(owner.accessToken)).expect(200)).body)
    expect(remnant).toMatchObject({ isRemnant: true, remnantOfJobId: job.id, widthMm: 100, heightMm: 100, quantityOnHand: 3, material: { id: cardId } })
    // Price pro rata: 4 per sheet × 7 500 / 10 000.
    expect(remnant.price).toBeCloseTo(3, 6)
    expect(remnant.outline![0]).toHaveLength(6)

    const remnants = (await api().get(`${workspaceUrl(owner)}/remnants`).set(bearer(owner.accessToken)).expect(200)).body
    expect(remnants.items.map((item: { id: string }) => item.id)).toContain(remnant.id)
    const shelf = (await api().get(`${workspaceUrl(owner)}/stock?remnants=exclude`).set(bearer(owner.accessToken)).expect(200)).body
    expect(shelf.items.map((item: { id: string }) => item.id)).not.toContain(remnant.id)

    // A done job's material has been cut with this blade: no second prompt for the next card job.
    const next = await createJob(owner, { layoutId: sheetLayoutId, stockItemId: sheetStockId, cutterId })
    const nextJob = jobSchema.parse((await api().get(`${jobsUrl}/${next.id}`).set(bearer(owner.accessToken)).expect(200)).body)
    expect(nextJob.testCutPrompt!.needed).toBe(false)
  })

  it('asks for a test cut for another material after the blade swap', async () => {
    const feltStock = await createStock(owner, { kind: 'sheet', name: 'Felt square', widthMm: 100, heightMm: 100, materialId: feltId, quantityOnHand: 5 })
    const job = await createJob(owner, { layoutId: sheetLayoutId, stockItemId: feltStock, cutterId })
    const detail = jobSchema.parse((await api().get(`${jobsUrl}/${job.id}`).set(bearer(owner.accessToken)).expect(200)).body)
    expect(detail.testCutPrompt!.needed).toBe(true)
    expect(detail.testCutPrompt!.reason).toMatch(/test cut/)
  })

  it('takes roll length off and keeps the rest of the roll as a remnant', async () => {
    // One run uses 50 mm of the roll (the square's extent, margin 0); 2 runs = 100 mm; 1 000 − 100 = 900 mm left.
    const rollId = await createStock(owner, { kind: 'roll', name: 'Card roll 100', widthMm: 100, lengthMm: 1000, materialId: cardId, price: 2, quantityOnHand: 1 })
    const job = await createJob(owner, { layoutId: rollLayoutId, stockItemId: rollId, quantity: 2 })
    const done = jobSchema.parse((await completeJob(owner, job, { keepRemnant: true })).body)
    expect(done.usage).toMatchObject({ sheetsUsed: 0, rollLengthUsedMm: 100, stockAreaMm2: 10_000 })
    expect(done.remnant).toMatchObject({ kind: 'roll', lengthMm: 900, areaMm2: 90_000 })
    const roll = stockItemSchema.parse((await api().get(`${workspaceUrl(owner)}/stock/${rollId}`).set(bearer(owner.accessToken)).expect(200)).body)
    expect(roll.quantityOnHand).toBe(0)

    // Without a remnant the roll itself gets shorter.
    const other = await createStock(owner, { kind: 'roll', name: 'Card roll B', widthMm: 100, lengthMm: 1000, quantityOnHand: 1 })
    const plain = await createJob(owner, { layoutId: rollLayoutId, stockItemId: other, quantity: 2 })
    expect((await completeJob(owner, plain)).status).toBe(200)
    const shorter = stockItemSchema.parse((await api().get(`${workspaceUrl(owner)}/stock/${other}`).set(bearer(owner.accessToken)).expect(200)).body)
    expect(shorter).toMatchObject({ lengthMm: 900, quantityOnHand: 1 })
  })

  it('refuses to take more sheets than are on hand unless told to', async () => {
    const few = await createStock(owner, { kind: 'sheet', name: 'Last card', widthMm: 100, heightMm: 100, quantityOnHand: 1 })
    const job = await createJob(owner, { layoutId: sheetLayoutId, stockItemId: few, quantity: 3 })
    const refused = await completeJob(owner, job)
    expect(refused.status).toBe(409)
    expect(refused.body.error.message).toMatch(/Only 1 sheet on hand; the job uses 3/)
    expect(refused.body.error.details).toMatchObject({ reason: 'short_stock', quantityOnHand: 1, sheetsUsed: 3 })
    // Nothing was written: still cutting, stock unchanged.
    const still = jobSchema.parse((await api().get(`${jobsUrl}/${job.id}`).set(bearer(owner.accessToken)).expect(200)).body)
    expect(still.status).toBe('cutting')
    const forced = await moveJob(owner, job.id, { status: 'done', version: still.version, allowShortStock: true })
    expect(forced.status).toBe(200)
    const stock = (await api().get(`${workspaceUrl(owner)}/stock/${few}`).set(bearer(owner.accessToken)).expect(200)).body
    expect(stock.quantityOnHand).toBe(0)
  })

  it('rejects illegal and stale status changes', async () => {
    const job = await createJob(owner, { layoutId: sheetLayoutId, stockItemId: sheetStockId })
    const skip = await moveJob(owner, job.id, { status: 'done', version: job.version })
    expect(skip.status).toBe(409)
    expect(skip.body.error.message).toBe('Start cutting before marking the job done')

    const done = await completeJob(owner, job)
    expect(done.status).toBe(200)
    const back = await moveJob(owner, job.id, { status: 'planned', version: done.body.version })
    expect(back.status).toBe(409)
    expect(back.body.error.message).toMatch(/done: its stock and blade wear are recorded/)
    expect(back.body.error.details).toMatchObject({ reason: 'illegal_transition', from: 'done', to: 'planned' })

    const other = await createJob(owner, { layoutId: sheetLayoutId, stockItemId: sheetStockId })
    await moveJob(owner, other.id, { status: 'cutting', version: other.version }).expect(200)
    const stale = await moveJob(owner, other.id, { status: 'scrapped', version: other.version })
    expect(stale.status).toBe(409)
    expect(stale.body.error.details).toMatchObject({ reason: 'stale_version', currentVersion: 2 })
    const badStatus = await moveJob(owner, other.id, { status: 'finished', version: 2 })
    expect(badStatus.status).toBe(400)
    expect(badStatus.body.error.fields).toHaveProperty(['body.status'])

    await api().delete(`${jobsUrl}/${job.id}`).set(bearer(owner.accessToken)).expect(409)
  })

  it('lists with filters and the due-soon view', async () => {
    const soon = await createJob(owner, { title: 'Soon job', layoutId: sheetLayoutId, stockItemId: sheetStockId, dueDate: dayFromToday(3) })
    const late = await createJob(owner, { title: 'Late job', layoutId: sheetLayoutId, stockItemId: sheetStockId, dueDate: dayFromToday(-1) })
    const far = await createJob(owner, { title: 'Far job', layoutId: sheetLayoutId, stockItemId: sheetStockId, dueDate: dayFromToday(40) })

    const dueSoon = jobListResponseSchema.parse((await api().get(`${jobsUrl}?dueSoon=true&pageSize=100`).set(bearer(owner.accessToken)).expect(200)).body)
    const ids = dueSoon.items.map((item) => item.id)
    expect(ids).toContain(soon.id)
    expect(ids).toContain(late.id)
    expect(ids).not.toContain(far.id)
    expect(dueSoon.dueSoonDays).toBe(7)
    expect(dueSoon.items.every((item) => item.status === 'planned' || item.status === 'cutting')).toBe(true)
    // Sorted by due date: the overdue one first.
    expect(ids.indexOf(late.id)).toBeLessThan(ids.indexOf(soon.id))
    expect(dueSoon.items.find((item) => item.id === late.id)!.dueState).toBe('overdue')

    const done = jobListResponseSchema.parse((await api().get(`${jobsUrl}?status=done`).set(bearer(owner.accessToken)).expect(200)).body)
    expect(done.items.length).toBeGreaterThan(0)
    expect(done.items.every((item) => item.status === 'done' && item.usage !== null)).toBe(true)

    const felt = jobListResponseSchema.parse((await api().get(`${jobsUrl}?materialId=${feltId}`).set(bearer(owner.accessToken)).expect(200)).body)
    expect(felt.items.every((item) => item.material?.id === feltId)).toBe(true)
    expect(felt.total).toBe(1)

    const before = jobListResponseSchema.parse((await api().get(`${jobsUrl}?dueBefore=${dayFromToday(10)}&dueAfter=${dayFromToday(0)}`).set(bearer(owner.accessToken)).expect(200)).body)
    expect(before.items.map((item) => item.id)).toContain(soon.id)
    expect(before.items.map((item) => item.id)).not.toContain(far.id)

    const paged = jobListResponseSchema.parse((await api().get(`${jobsUrl}?pageSize=2&page=2`).set(bearer(owner.accessToken)).expect(200)).body)
    expect(paged.items).toHaveLength(2)
    expect(paged.page).toBe(2)

    const search = jobListResponseSchema.parse((await api().get(`${jobsUrl}?search=Far%20job`).set(bearer(owner.accessToken)).expect(200)).body)
    expect(search.items.map((item) => item.id)).toEqual([far.id])

    await api().get(`${jobsUrl}?dueSoon=maybe&status=lost`).set(bearer(owner.accessToken)).expect(400)
  })

  it('edits open jobs with a version check', async () => {
    const job = await createJob(owner, { layoutId: sheetLayoutId, stockItemId: sheetStockId })
    const edited = await api().patch(`${jobsUrl}/${job.id}`).set(bearer(owner.accessToken)).send({ version: job.version, quantity: 4, customerName: 'Willow Lane School' }).expect(200)
    expect(edited.body).toMatchObject({ quantity: 4, customerName: 'Willow Lane School', version: 2 })
    await api().patch(`${jobsUrl}/${job.id}`).set(bearer(owner.accessToken)).send({ version: 1, quantity: 5 }).expect(409)
    await api().delete(`${jobsUrl}/${job.id}`).set(bearer(owner.accessToken)).expect(204)
    await api().get(`${jobsUrl}/${job.id}`).set(bearer(owner.accessToken)).expect(404)
  })

  describe('roles', () => {
    let viewerToken: string
    let makerToken: string
    let outsider: SignedUpUser
    let jobId: string

    beforeAll(async () => {
      viewerToken = (await addMember(owner, 'viewer', 'jobs-viewer')).accessToken
      makerToken = (await addMember(owner, 'maker', 'jobs-maker')).accessToken
      outsider = await signUp('jobs-outsider')
      jobId = (await createJob(owner, { layoutId: sheetLayoutId, stockItemId: sheetStockId })).id
    })

    it('lets a viewer read but not change', async () => {
      await api().get(jobsUrl).set(bearer(viewerToken)).expect(200)
      await api().get(`${jobsUrl}/${jobId}`).set(bearer(viewerToken)).expect(200)
      await api().get(`${workspaceUrl(owner)}/remnants`).set(bearer(viewerToken)).expect(200)
      await api().post(jobsUrl).set(bearer(viewerToken)).send({ layoutId: sheetLayoutId, stockItemId: sheetStockId }).expect(403)
      await api().patch(`${jobsUrl}/${jobId}`).set(bearer(viewerToken)).send({ version: 1, quantity: 2 }).expect(403)
      await api().post(`${jobsUrl}/${jobId}/status`).set(bearer(viewerToken)).send({ status: 'cutting', version: 1 }).expect(403)
      await api().delete(`${jobsUrl}/${jobId}`).set(bearer(viewerToken)).expect(403)
    })

    it('lets a maker create and move jobs', async () => {
      const created = await api().post(jobsUrl).set(bearer(makerToken)).send({ layoutId: sheetLayoutId, stockItemId: sheetStockId }).expect(201)
      await api().post(`${jobsUrl}/${created.body.id}/status`).set(bearer(makerToken)).send({ status: 'scrapped', version: 1, note: 'Customer cancelled' }).expect(200)
    })

    it('hides the workspace from non-members', async () => {
      await api().get(jobsUrl).set(bearer(outsider.accessToken)).expect(404)
      await api().get(`${jobsUrl}/${jobId}`).set(bearer(outsider.accessToken)).expect(404)
      await api().post(jobsUrl).set(bearer(outsider.accessToken)).send({ layoutId: sheetLayoutId, stockItemId: sheetStockId }).expect(404)
      await api().post(`${jobsUrl}/${jobId}/status`).set(bearer(outsider.accessToken)).send({ status: 'cutting', version: 1 }).expect(404)
      await api().get(`${workspaceUrl(owner)}/remnants`).set(bearer(outsider.accessToken)).expect(404)
      await api().get(jobsUrl).expect(401)
    })

    it('never finds another workspace’s job or layout', async () => {
      const outsiderJobs = `${workspaceUrl(outsider)}/jobs`
      await api().get(`${outsiderJobs}/${jobId}`).set(bearer(outsider.accessToken)).expect(404)
      const refused = await api().post(outsiderJobs).set(bearer(outsider.accessToken)).send({ layoutId: sheetLayoutId, stockItemId: sheetStockId }).expect(400)
      expect(refused.body.error.fields).toHaveProperty(['body.layoutId'])
    })
  })
})
