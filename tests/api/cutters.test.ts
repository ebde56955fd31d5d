import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { loadConfig } from '../../server/config.js'
import { connectDatabase } from '../../server/db/client.js'
import { addBladeWear, testCutPrompt } from '../../server/features/cutters/bladeWear.js'
import { cutPlanResponseSchema } from '../../shared/schemas/cutplan.js'
import {
  bladeListResponseSchema,
  bladeSchema,
  careEventListResponseSchema,
  cutterListResponseSchema,
  cutterSchema,
  deleteCutterResponseSchema,
  studioSettingsSchema,
  type CreateCutterRequest,
} from '../../shared/schemas/cutters.js'
import { materialListResponseSchema, type MaterialSummary } from '../../shared/schemas/materials.js'
import { addMember, api, bearer, signUp, type SignedUpUser } from './helpers.js'

// The wear helpers are called straight on the database, as the jobs feature calls them when a job is marked done.
const database = connectDatabase(loadConfig().databaseUrl, 2)
afterAll(() => database.close())

const cuttersUrl = (workspaceId: string) => `/api/workspaces/${workspaceId}/cutters`

// Invented values in the range of small desktop blade cutters (shared/cutplan/profile.ts defaults).
const benchCutter: CreateCutterRequest = {
  name: 'Bench cutter',
  toolKind: 'blade',
  cuttingWidthMm: 330,
  maxLengthMm: 3000,
  cutSpeedMmS: 100,
  travelSpeedMmS: 300,
  accelerationMmS2: 1500,
  liftLowerS: 0.15,
  forceMin: 10,
  forceMax: 400,
  careReminders: [{ kind: 'housing_cleaned', intervalDays: 14 }],
}

async function createCutter(owner: { accessToken: string }, workspaceId: string, body: Partial<CreateCutterRequest> = {}) {
  const response = await api()
    .post(cuttersUrl(workspaceId))
    .set(bearer(owner.accessToken))
    .send({ ...benchCutter, ...body })
    .expect(201)
  return cutterSchema.parse(response.body)
}

async function fitBlade(owner: { accessToken: string }, workspaceId: string, cutterId: string, body: Record<string, unknown> = {}) {
  const response = await api()
    .post(`${cuttersUrl(workspaceId)}/${cutterId}/blades`)
    .set(bearer(owner.accessToken))
    .send({ bladeType: 'standard', angleDeg: 45, ...body })
    .expect(201)
  return bladeSchema.parse(response.body)
}

async function bladeMaterials(owner: SignedUpUser): Promise<MaterialSummary[]> {
  const list = await api().get(`/api/workspaces/${owner.workspace.id}/materials`).query({ pageSize: 100 }).set(bearer(owner.accessToken)).expect(200)
  return materialListResponseSchema.parse(list.body).items.filter((material) => material.recipes.some((recipe) => recipe.toolKind === 'blade'))
}

describe('cutters', () => {
  let owner: SignedUpUser

  beforeAll(async () => {
    owner = await signUp('cutters-crud')
  })

  it('creates, lists, reads, changes and deletes a cutter', async () => {
    const created = await api().post(cuttersUrl(owner.workspace.id)).set(bearer(owner.accessToken)).send(benchCutter).expect(201)
    const cutter = cutterSchema.parse(created.body)
    expect(created.headers.location).toBe(`${cuttersUrl(owner.workspace.id)}/${cutter.id}`)
    expect(cutter).toMatchObject({ name: 'Bench cutter', toolKind: 'blade', cornerAngleDeg: 30, origin: 'bottom-left', swapAxes: false, archived: false, currentBlade: null })
    // Never cleaned: due 14 days after the cutter was added, so not overdue yet.
    expect(cutter.careDue).toEqual([expect.objectContaining({ kind: 'housing_cleaned', intervalDays: 14, lastDoneAt: null, overdue: false })])

    await createCutter(owner, owner.workspace.id, { name: 'Art pen plotter', toolKind: 'pen', forceMin: 10, forceMax: 50 })
    const list = cutterListResponseSchema.parse((await api().get(cuttersUrl(owner.workspace.id)).set(bearer(owner.accessToken)).expect(200)).body)
    expect(list.items.map((item) => item.name)).toEqual(['Art pen plotter', 'Bench cutter'])
    expect(list).toMatchObject({ total: 2, page: 1, pageSize: 50 })
    // A pen has no cutting force: the range is not kept.
    expect(list.items[0]).toMatchObject({ toolKind: 'pen', forceMin: null, forceMax: null })
    const pens = await api().get(cuttersUrl(owner.workspace.id)).query({ toolKind: 'pen', pageSize: 1 }).set(bearer(owner.accessToken)).expect(200)
    expect(pens.body.total).toBe(1)

    const changed = await api()
      .patch(`${cuttersUrl(owner.workspace.id)}/${cutter.id}`)
      .set(bearer(owner.accessToken))
      .send({ name: 'Bench cutter A', cutSpeedMmS: 120, origin: 'top-left', swapAxes: true })
      .expect(200)
    expect(changed.body).toMatchObject({ name: 'Bench cutter A', cutSpeedMmS: 120, origin: 'top-left', swapAxes: true, forceMax: 400 })
    const read = await api().get(`${cuttersUrl(owner.workspace.id)}/${cutter.id}`).set(bearer(owner.accessToken)).expect(200)
    expect(read.body.name).toBe('Bench cutter A')

    const removed = await api().delete(`${cuttersUrl(owner.workspace.id)}/${cutter.id}`).set(bearer(owner.accessToken)).expect(200)
    expect(deleteCutterResponseSchema.parse(removed.body)).toEqual({ result: 'deleted', cutter: null })
    await api().get(`${cuttersUrl(owner.workspace.id)}/${cutter.id}`).set(bearer(owner.accessToken)).expect(404)
  })

  it('archives instead of deleting a cutter with history, and lists it under archived', async () => {
    const cutter = await createCutter(owner, owner.workspace.id, { name: 'Cutter with a past' })
    await fitBlade(owner, owner.workspace.id, cutter.id)
    const answer = deleteCutterResponseSchema.parse((await api().delete(`${cuttersUrl(owner.workspace.id)}/${cutter.id}`).set(bearer(owner.accessToken)).expect(200)).body)
    expect(answer.result).toBe('archived')
    expect(answer.cutter).toMatchObject({ id: cutter.id, archived: true })
    const active = await api().get(cuttersUrl(owner.workspace.id)).set(bearer(owner.accessToken)).expect(200)
    expect(active.body.items.map((item: { id: string }) => item.id)).not.toContain(cutter.id)
    const archived = await api().get(cuttersUrl(owner.workspace.id)).query({ status: 'archived' }).set(bearer(owner.accessToken)).expect(200)
    expect(archived.body.items.map((item: { id: string }) => item.id)).toEqual([cutter.id])
    // Its blades and care log are still there.
    const blades = await api().get(`${cuttersUrl(owner.workspace.id)}/${cutter.id}/blades`).set(bearer(owner.accessToken)).expect(200)
    expect(blades.body.total).toBe(1)
    const restored = await api().patch(`${cuttersUrl(owner.workspace.id)}/${cutter.id}`).set(bearer(owner.accessToken)).send({ archived: false }).expect(200)
    expect(restored.body.archived).toBe(false)
  })

  it('answers 400 naming the field for bad input', async () => {
    const url = cuttersUrl(owner.workspace.id)
    const slow = await api().post(url).set(bearer(owner.accessToken)).send({ ...benchCutter, cutSpeedMmS: -5 }).expect(400)
    expect(slow.body.error.fields['body.cutSpeedMmS']).toEqual(['Cut speed must be above 0'])
    const corner = await api().post(url).set(bearer(owner.accessToken)).send({ ...benchCutter, origin: 'centre' }).expect(400)
    expect(corner.body.error.fields['body.origin'][0]).toMatch(/Origin must be one of bottom-left/)
    const flipped = await api().post(url).set(bearer(owner.accessToken)).send({ ...benchCutter, forceMin: 500, forceMax: 100 }).expect(400)
    expect(flipped.body.error.fields['body.forceMin']).toEqual(['Lowest force must not be above the highest force'])
    const kind = await api().post(url).set(bearer(owner.accessToken)).send({ ...benchCutter, toolKind: 'waterjet' }).expect(400)
    expect(kind.body.error.fields['body.toolKind']).toEqual(['Tool kind must be blade, pen or laser'])

    // A change is checked against the stored cutter: a lowest force above the stored highest (400) is refused.
    const cutter = await createCutter(owner, owner.workspace.id, { name: 'Range check' })
    const merged = await api().patch(`${url}/${cutter.id}`).set(bearer(owner.accessToken)).send({ forceMin: 450 }).expect(400)
    expect(merged.body.error.fields['body.forceMin']).toEqual(['Lowest force must not be above the highest force'])
    const empty = await api().patch(`${url}/${cutter.id}`).set(bearer(owner.accessToken)).send({}).expect(400)
    expect(empty.body.error.message).toMatch(/Send at least one field/)

    const badType = await api().post(`${url}/${cutter.id}/blades`).set(bearer(owner.accessToken)).send({ bladeType: 'diamond', angleDeg: 45 }).expect(400)
    expect(badType.body.error.fields['body.bladeType'][0]).toMatch(/Blade type must be one of standard, deep-cut/)
    const badAngle = await api().post(`${url}/${cutter.id}/blades`).set(bearer(owner.accessToken)).send({ bladeType: 'standard', angleDeg: 5 }).expect(400)
    expect(badAngle.body.error.fields['body.angleDeg']).toEqual(['Blade angle must be at least 20°'])
    const future = new Date(Date.now() + 3 * 24 * 3600 * 1000).toISOString()
    const later = await api().post(`${url}/${cutter.id}/care-events`).set(bearer(owner.accessToken)).send({ kind: 'spring_checked', doneAt: future }).expect(400)
    expect(later.body.error.fields['body.doneAt']).toEqual(['The done date cannot be in the future'])
    const oiled = await api().post(`${url}/${cutter.id}/care-events`).set(bearer(owner.accessToken)).send({ kind: 'oiled' }).expect(400)
    expect(Object.keys(oiled.body.error.fields)).toEqual(['body.kind'])
    const notId = await api().get(`${url}/not-a-uuid`).set(bearer(owner.accessToken)).expect(400)
    expect(Object.keys(notId.body.error.fields)).toEqual(['params.cutterId'])
  })

  it('refuses a blade on a pen or laser cutter', async () => {
    const laser = await createCutter(owner, owner.workspace.id, { name: 'Desk laser', toolKind: 'laser' })
    const refused = await api().post(`${cuttersUrl(owner.workspace.id)}/${laser.id}/blades`).set(bearer(owner.accessToken)).send({ bladeType: 'standard', angleDeg: 45 }).expect(409)
    expect(refused.body.error.message).toMatch(/only blade cutters take blades/)
  })
})

describe('blades, wear and the care log', () => {
  let owner: SignedUpUser
  let cutterId: string
  let bladesUrl: string
  let materials: MaterialSummary[]

  beforeAll(async () => {
    owner = await signUp('cutters-blades')
    cutterId = (await createCutter(owner, owner.workspace.id)).id
    bladesUrl = `${cuttersUrl(owner.workspace.id)}/${cutterId}/blades`
    materials = await bladeMaterials(owner)
  })

  it('fitting a blade retires the previous one and writes a blade swap to the care log', async () => {
    const first = await fitBlade(owner, owner.workspace.id, cutterId, { label: 'Box of five, #1' })
    expect(first).toMatchObject({ current: true, retiredAt: null, wornMm: 0, wearLevel: 'ok', fittedByName: 'Test cutters-blades' })
    const second = await fitBlade(owner, owner.workspace.id, cutterId, { bladeType: 'deep-cut', angleDeg: 60, previousRetireReason: 'Tearing thin vinyl' })

    const history = bladeListResponseSchema.parse((await api().get(bladesUrl).set(bearer(owner.accessToken)).expect(200)).body)
    expect(history.items.map((blade) => [blade.id, blade.current])).toEqual([
      [second.id, true],
      [first.id, false],
    ])
    expect(history.items[1]).toMatchObject({ retireReason: 'Tearing thin vinyl', retiredByName: 'Test cutters-blades' })
    expect(history.items[1]!.retiredAt).toBe(second.fittedAt)

    const cutter = cutterSchema.parse((await api().get(`${cuttersUrl(owner.workspace.id)}/${cutterId}`).set(bearer(owner.accessToken)).expect(200)).body)
    expect(cutter.currentBlade).toMatchObject({ id: second.id, bladeType: 'deep-cut', angleDeg: 60 })
    // deep-cut starting point 1200 m (shared/cutters/wear.ts).
    expect(cutter.currentBlade!.limitMm).toBe(1_200_000)

    const care = careEventListResponseSchema.parse((await api().get(`${cuttersUrl(owner.workspace.id)}/${cutterId}/care-events`).set(bearer(owner.accessToken)).expect(200)).body)
    expect(care.items.map((event) => event.kind)).toEqual(['blade_swap', 'blade_swap'])
    expect(care.items[0]!.note).toMatch(/Fitted a deep-cut 60° blade; the previous standard blade was retired/)
  })

  it('adds wear from done jobs once per job, with a breakdown per material', async () => {
    const cutter = await createCutter(owner, owner.workspace.id, { name: 'Wear counter' })
    const blade = await fitBlade(owner, owner.workspace.id, cutter.id)
    const [vinyl, card] = [materials[0]!, materials[1]!]
    const jobOne = randomUUID()
    const jobTwo = randomUUID()
    // Job one: 250 m of cut × 2 passes = 500 m; job two: 300 m × 1 pass (worked example by hand).
    expect(await addBladeWear(database.db, { workspaceId: owner.workspace.id, bladeId: blade.id, jobId: jobOne, materialId: vinyl.id, cutLengthMm: 500_000, userId: owner.user.id })).toEqual({ added: true })
    expect(await addBladeWear(database.db, { workspaceId: owner.workspace.id, bladeId: blade.id, jobId: jobTwo, materialId: card.id, cutLengthMm: 300_000, userId: owner.user.id })).toEqual({ added: true })
    // Marking job one done again adds nothing.
    expect(await addBladeWear(database.db, { workspaceId: owner.workspace.id, bladeId: blade.id, jobId: jobOne, materialId: vinyl.id, cutLengthMm: 500_000, userId: owner.user.id })).toEqual({ added: false })

    const read = bladeSchema.parse((await api().get(`${cuttersUrl(owner.workspace.id)}/${cutter.id}/blades/${blade.id}`).set(bearer(owner.accessToken)).expect(200)).body)
    expect(read.wornMm).toBe(800_000)
    expect(read.wearByMaterial).toEqual([
      { materialId: vinyl.id, materialName: vinyl.name, cutLengthMm: 500_000 },
      { materialId: card.id, materialName: card.name, cutLengthMm: 300_000 },
    ])
    // 800 m of a 2000 m standard blade = 40 % (worked example by hand).
    expect(read).toMatchObject({ limitMm: 2_000_000, wearRatio: 0.4, wearLevel: 'ok' })
  })

  it('warns gently from 80 % and fully from 100 % of the limit, on the cutter and the blade', async () => {
    const cutter = await createCutter(owner, owner.workspace.id, { name: 'Warning lights' })
    // A used blade: 1500 m carried over of a 2000 m limit = 75 % (worked example by hand).
    const blade = await fitBlade(owner, owner.workspace.id, cutter.id, { carriedOverWearM: 1500 })
    expect(blade).toMatchObject({ wornMm: 1_500_000, wearLevel: 'ok' })
    expect(blade.wearByMaterial).toEqual([{ materialId: null, materialName: 'Carried over or unknown material', cutLengthMm: 1_500_000 }])
    const readCutter = async () => cutterSchema.parse((await api().get(`${cuttersUrl(owner.workspace.id)}/${cutter.id}`).set(bearer(owner.accessToken)).expect(200)).body).currentBlade!

    // + 100 m → 1600 m = 80 %: near.
    await addBladeWear(database.db, { workspaceId: owner.workspace.id, bladeId: blade.id, jobId: randomUUID(), materialId: materials[0]!.id, cutLengthMm: 100_000, userId: null })
    expect(await readCutter()).toMatchObject({ wornMm: 1_600_000, wearRatio: 0.8, wearLevel: 'near' })
    // + 399.999 m → 1999.999 m: still near.
    await addBladeWear(database.db, { workspaceId: owner.workspace.id, bladeId: blade.id, jobId: randomUUID(), materialId: materials[0]!.id, cutLengthMm: 399_999, userId: null })
    expect((await readCutter()).wearLevel).toBe('near')
    // + 1 mm → 2000 m = 100 %: over.
    await addBladeWear(database.db, { workspaceId: owner.workspace.id, bladeId: blade.id, jobId: randomUUID(), materialId: materials[0]!.id, cutLengthMm: 1, userId: null })
    expect(await readCutter()).toMatchObject({ wornMm: 2_000_000, wearRatio: 1, wearLevel: 'over' })

    // The studio's own limit moves the levels: 4000 m makes the same wear 50 %.
    const settings = await api().put(`/api/workspaces/${owner.workspace.id}/studio-settings`).set(bearer(owner.accessToken)).send({ bladeWearLimitsM: { standard: 4000 } }).expect(200)
    expect(studioSettingsSchema.parse(settings.body).bladeWearLimitsM).toMatchObject({ standard: 4000, 'deep-cut': 1200 })
    expect(await readCutter()).toMatchObject({ limitMm: 4_000_000, wearRatio: 0.5, wearLevel: 'ok' })
    await api().put(`/api/workspaces/${owner.workspace.id}/studio-settings`).set(bearer(owner.accessToken)).send({ bladeWearLimitsM: {} }).expect(200)
  })

  it('retires a blade with a reason, once', async () => {
    const cutter = await createCutter(owner, owner.workspace.id, { name: 'Retirement' })
    const blade = await fitBlade(owner, owner.workspace.id, cutter.id)
    const url = `${cuttersUrl(owner.workspace.id)}/${cutter.id}/blades/${blade.id}/retire`
    const missing = await api().post(url).set(bearer(owner.accessToken)).send({ reason: ' ' }).expect(400)
    expect(missing.body.error.fields['body.reason']).toEqual(['Enter a reason'])
    const retired = await api().post(url).set(bearer(owner.accessToken)).send({ reason: 'Chipped tip' }).expect(200)
    expect(retired.body).toMatchObject({ current: false, retireReason: 'Chipped tip' })
    await api().post(url).set(bearer(owner.accessToken)).send({ reason: 'Again' }).expect(409)
    const readCutter = await api().get(`${cuttersUrl(owner.workspace.id)}/${cutter.id}`).set(bearer(owner.accessToken)).expect(200)
    expect(readCutter.body.currentBlade).toBeNull()
  })

  it('logs care, shows when a reminder is due and overdue', async () => {
    const cutter = await createCutter(owner, owner.workspace.id, { name: 'Care log', careReminders: [{ kind: 'roller_checked', intervalDays: 7 }, { kind: 'spring_checked', intervalDays: 30 }] })
    const url = `${cuttersUrl(owner.workspace.id)}/${cutter.id}/care-events`
    const tenDaysAgo = new Date(Date.now() - 10 * 24 * 3600 * 1000)
    const logged = await api().post(url).set(bearer(owner.accessToken)).send({ kind: 'roller_checked', note: 'Both rollers over the grit strip', doneAt: tenDaysAgo.toISOString() }).expect(201)
    expect(logged.body).toMatchObject({ kind: 'roller_checked', note: 'Both rollers over the grit strip', doneAt: tenDaysAgo.toISOString(), doneByName: 'Test cutters-blades' })
    await api().post(url).set(bearer(owner.accessToken)).send({ kind: 'spring_checked' }).expect(201)

    const read = cutterSchema.parse((await api().get(`${cuttersUrl(owner.workspace.id)}/${cutter.id}`).set(bearer(owner.accessToken)).expect(200)).body)
    const roller = read.careDue.find((due) => due.kind === 'roller_checked')!
    // Checked 10 days ago, every 7 days: due 3 days ago, overdue (worked example by hand).
    expect(roller).toMatchObject({ lastDoneAt: tenDaysAgo.toISOString(), overdue: true })
    expect(new Date(roller.dueAt).getTime()).toBe(tenDaysAgo.getTime() + 7 * 24 * 3600 * 1000)
    expect(read.careDue.find((due) => due.kind === 'spring_checked')!.overdue).toBe(false)

    const list = careEventListResponseSchema.parse((await api().get(url).query({ pageSize: 1 }).set(bearer(owner.accessToken)).expect(200)).body)
    expect(list).toMatchObject({ total: 2, pageSize: 1 })
    expect(list.items[0]!.kind).toBe('spring_checked')
  })
})

describe('test cut after a blade swap', () => {
  let owner: SignedUpUser
  let material: MaterialSummary
  let otherMaterial: MaterialSummary

  beforeAll(async () => {
    owner = await signUp('cutters-testcut')
    ;[material, otherMaterial] = (await bladeMaterials(owner)) as [MaterialSummary, MaterialSummary]
  })

  const promptUrl = (cutterId: string, materialId: string) => `${cuttersUrl(owner.workspace.id)}/${cutterId}/test-cut-prompt?materialId=${materialId}`

  it('asks for a test cut after a fit, not after one is logged with that blade, and again after the next fit', async () => {
    const cutter = await createCutter(owner, owner.workspace.id, { name: 'Prompted' })
    const noBlade = await api().get(promptUrl(cutter.id, material.id)).set(bearer(owner.accessToken)).expect(200)
    expect(noBlade.body).toMatchObject({ needed: false, bladeId: null })

    const blade = await fitBlade(owner, owner.workspace.id, cutter.id)
    const afterFit = await api().get(promptUrl(cutter.id, material.id)).set(bearer(owner.accessToken)).expect(200)
    expect(afterFit.body).toMatchObject({ needed: true, bladeId: blade.id, fittedAt: blade.fittedAt })
    expect(afterFit.body.reason).toMatch(/log a test cut of this material/)

    const logged = await api()
      .post(`/api/workspaces/${owner.workspace.id}/materials/${material.id}/test-cuts`)
      .set(bearer(owner.accessToken))
      .send({ outcome: 'clean', cutterId: cutter.id, bladeId: blade.id })
      .expect(201)
    expect(logged.body).toMatchObject({ cutterId: cutter.id, bladeId: blade.id, cutterMaxForce: 400 })
    expect(await testCutPrompt(database.db, { workspaceId: owner.workspace.id, cutterId: cutter.id, materialId: material.id })).toMatchObject({ needed: false, bladeId: blade.id })
    // Another material on the same blade still asks.
    expect((await testCutPrompt(database.db, { workspaceId: owner.workspace.id, cutterId: cutter.id, materialId: otherMaterial.id })).needed).toBe(true)

    const next = await fitBlade(owner, owner.workspace.id, cutter.id)
    expect(await testCutPrompt(database.db, { workspaceId: owner.workspace.id, cutterId: cutter.id, materialId: material.id })).toMatchObject({ needed: true, bladeId: next.id })
  })

  it('counts a test cut logged with only the cutter (its current blade) and a done job of the material', async () => {
    const cutter = await createCutter(owner, owner.workspace.id, { name: 'Cutter only' })
    const blade = await fitBlade(owner, owner.workspace.id, cutter.id)
    const logged = await api()
      .post(`/api/workspaces/${owner.workspace.id}/materials/${material.id}/test-cuts`)
      .set(bearer(owner.accessToken))
      .send({ outcome: 'not_through', cutterId: cutter.id })
      .expect(201)
    expect(logged.body.bladeId).toBe(blade.id)
    expect((await testCutPrompt(database.db, { workspaceId: owner.workspace.id, cutterId: cutter.id, materialId: material.id })).needed).toBe(false)

    await addBladeWear(database.db, { workspaceId: owner.workspace.id, bladeId: blade.id, jobId: randomUUID(), materialId: otherMaterial.id, cutLengthMm: 1000, userId: null })
    expect(await testCutPrompt(database.db, { workspaceId: owner.workspace.id, cutterId: cutter.id, materialId: otherMaterial.id })).toMatchObject({ needed: false, reason: expect.stringMatching(/already cut this material/) })
  })

  it('refuses a test cut naming a cutter or blade that is not this workspace’s or not that cutter’s', async () => {
    const stranger = await signUp('cutters-stranger')
    const foreign = await createCutter(stranger, stranger.workspace.id, { name: 'Not yours' })
    const url = `/api/workspaces/${owner.workspace.id}/materials/${material.id}/test-cuts`
    const wrongCutter = await api().post(url).set(bearer(owner.accessToken)).send({ outcome: 'clean', cutterId: foreign.id }).expect(400)
    expect(wrongCutter.body.error.fields['body.cutterId']).toEqual(['No such cutter in this workspace'])

    const one = await createCutter(owner, owner.workspace.id, { name: 'One' })
    const two = await createCutter(owner, owner.workspace.id, { name: 'Two' })
    const bladeOfTwo = await fitBlade(owner, owner.workspace.id, two.id)
    const mismatch = await api().post(url).set(bearer(owner.accessToken)).send({ outcome: 'clean', cutterId: one.id, bladeId: bladeOfTwo.id }).expect(400)
    expect(mismatch.body.error.fields['body.bladeId']).toEqual(['This blade was not fitted to the chosen cutter'])
  })
})

describe('roles', () => {
  let owner: SignedUpUser
  let viewerToken: string
  let maker: { accessToken: string; userId: string }
  let outsider: SignedUpUser
  let cutterId: string
  let bladeId: string
  let ownersCareId: string

  beforeAll(async () => {
    owner = await signUp('cutters-roles')
    viewerToken = (await addMember(owner, 'viewer', 'cutters-viewer')).accessToken
    maker = await addMember(owner, 'maker', 'cutters-maker')
    outsider = await signUp('cutters-outsider')
    cutterId = (await createCutter(owner, owner.workspace.id)).id
    bladeId = (await fitBlade(owner, owner.workspace.id, cutterId)).id
    ownersCareId = (await api().post(`${cuttersUrl(owner.workspace.id)}/${cutterId}/care-events`).set(bearer(owner.accessToken)).send({ kind: 'spring_checked' }).expect(201)).body.id
  })

  it('lets a viewer read everything and change nothing', async () => {
    const base = cuttersUrl(owner.workspace.id)
    for (const path of [base, `${base}/${cutterId}`, `${base}/${cutterId}/blades`, `${base}/${cutterId}/care-events`, `/api/workspaces/${owner.workspace.id}/studio-settings`]) {
      await api().get(path).set(bearer(viewerToken)).expect(200)
    }
    await api().post(base).set(bearer(viewerToken)).send(benchCutter).expect(403)
    await api().patch(`${base}/${cutterId}`).set(bearer(viewerToken)).send({ name: 'Mine' }).expect(403)
    await api().delete(`${base}/${cutterId}`).set(bearer(viewerToken)).expect(403)
    await api().post(`${base}/${cutterId}/blades`).set(bearer(viewerToken)).send({ bladeType: 'standard', angleDeg: 45 }).expect(403)
    await api().post(`${base}/${cutterId}/blades/${bladeId}/retire`).set(bearer(viewerToken)).send({ reason: 'x' }).expect(403)
    await api().post(`${base}/${cutterId}/care-events`).set(bearer(viewerToken)).send({ kind: 'other' }).expect(403)
    await api().delete(`${base}/${cutterId}/care-events/${ownersCareId}`).set(bearer(viewerToken)).expect(403)
    await api().put(`/api/workspaces/${owner.workspace.id}/studio-settings`).set(bearer(viewerToken)).send({ dueSoonDays: 3 }).expect(403)
  })

  it('lets a maker work the cutters but not change studio settings or delete others’ care entries', async () => {
    const base = cuttersUrl(owner.workspace.id)
    const made = await createCutter(maker, owner.workspace.id, { name: 'Maker made' })
    await api().patch(`${base}/${made.id}`).set(bearer(maker.accessToken)).send({ notes: 'Left bench' }).expect(200)
    await fitBlade(maker, owner.workspace.id, made.id)
    const own = await api().post(`${base}/${made.id}/care-events`).set(bearer(maker.accessToken)).send({ kind: 'housing_cleaned' }).expect(201)
    expect(own.body.doneById).toBe(maker.userId)
    await api().delete(`${base}/${cutterId}/care-events/${ownersCareId}`).set(bearer(maker.accessToken)).expect(403)
    await api().delete(`${base}/${made.id}/care-events/${own.body.id}`).set(bearer(maker.accessToken)).expect(204)
    await api().put(`/api/workspaces/${owner.workspace.id}/studio-settings`).set(bearer(maker.accessToken)).send({ dueSoonDays: 3 }).expect(403)

    // An owner may delete a maker's entry.
    const makers = await api().post(`${base}/${made.id}/care-events`).set(bearer(maker.accessToken)).send({ kind: 'other', note: 'Logged on the wrong cutter' }).expect(201)
    await api().delete(`${base}/${made.id}/care-events/${makers.body.id}`).set(bearer(owner.accessToken)).expect(204)
  })

  it('hides the workspace from a non-member (404)', async () => {
    const base = cuttersUrl(owner.workspace.id)
    await api().get(base).set(bearer(outsider.accessToken)).expect(404)
    await api().get(`${base}/${cutterId}`).set(bearer(outsider.accessToken)).expect(404)
    await api().get(`${base}/${cutterId}/blades`).set(bearer(outsider.accessToken)).expect(404)
    await api().post(`${base}/${cutterId}/care-events`).set(bearer(outsider.accessToken)).send({ kind: 'other' }).expect(404)
    await api().get(`/api/workspaces/${owner.workspace.id}/studio-settings`).set(bearer(outsider.accessToken)).expect(404)
    // And a cutter of another workspace under one's own workspace id is not found either.
    await api().get(`${cuttersUrl(outsider.workspace.id)}/${cutterId}`).set(bearer(outsider.accessToken)).expect(404)
  })

  it('owner changes studio settings; bad values name the field', async () => {
    const url = `/api/workspaces/${owner.workspace.id}/studio-settings`
    const before = studioSettingsSchema.parse((await api().get(url).set(bearer(owner.accessToken)).expect(200)).body)
    expect(before).toMatchObject({ dueSoonDays: 7, updatedAt: null, startingPointLimitsM: { standard: 2000 } })
    const saved = await api().put(url).set(bearer(owner.accessToken)).send({ dueSoonDays: 10, bladeWearLimitsM: { fabric: 1000 } }).expect(200)
    expect(saved.body).toMatchObject({ dueSoonDays: 10, bladeWearLimitsM: { fabric: 1000, standard: 2000 } })
    const bad = await api().put(url).set(bearer(owner.accessToken)).send({ bladeWearLimitsM: { standard: -1 } }).expect(400)
    expect(bad.body.error.fields['body.bladeWearLimitsM.standard']).toEqual(['Wear limit must be above 0 m'])
  })
})

describe('a cutter as the cut-plan profile', () => {
  it('times a layout with the cutter’s speed, and the query still overrides it', async () => {
    const owner = await signUp('cutters-plan')
    const design = await api()
      .post(`/api/workspaces/${owner.workspace.id}/designs`)
      .set(bearer(owner.accessToken))
      .attach('files', Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" width="100mm" height="100mm" viewBox="0 0 100 100"><rect x="0" y="0" width="50" height="50"/></svg>'), { filename: 'square.svg', contentType: 'image/svg+xml' })
      .expect(201)
    const designId = design.body.designs[0].id
    const layout = await api()
      .post(`/api/workspaces/${owner.workspace.id}/layouts`)
      .set(bearer(owner.accessToken))
      .send({
        name: 'One square',
        stock: { kind: 'sheets', widthMm: 200, heightMm: 100, sheetCount: 1 },
        items: [{ designId, quantity: 1 }],
        placements: [{ id: randomUUID(), designId, pieceIndex: 0, sheet: 0, xMm: 10, yMm: 10, angleDeg: 0 }],
        options: { spacingMm: 0, marginMm: 0 },
      })
      .expect(201)
    const planUrl = `/api/workspaces/${owner.workspace.id}/layouts/${layout.body.id}/cut-plan`
    // Very high acceleration so corners cost almost nothing: a 200 mm square at 50 mm/s takes 4 s (worked example by hand).
    const cutter = await createCutter(owner, owner.workspace.id, { name: 'Slow and steady', cutSpeedMmS: 50, accelerationMmS2: 100_000, liftLowerS: 0.3, origin: 'top-right' })

    const standard = cutPlanResponseSchema.parse((await api().get(planUrl).set(bearer(owner.accessToken)).expect(200)).body)
    const withCutter = cutPlanResponseSchema.parse((await api().get(planUrl).query({ cutterId: cutter.id }).set(bearer(owner.accessToken)).expect(200)).body)
    expect(withCutter.profile).toMatchObject({ name: 'Slow and steady', cutSpeedMmS: 50, accelerationMmS2: 100_000, liftLowerS: 0.3, origin: 'top-right' })
    expect(withCutter.totals.cutLengthMm).toBeCloseTo(200, 6)
    expect(withCutter.totals.cutTimeS).toBeCloseTo(4, 1)
    expect(withCutter.totals.cutTimeS).toBeGreaterThan(standard.totals.cutTimeS)

    const overridden = cutPlanResponseSchema.parse((await api().get(planUrl).query({ cutterId: cutter.id, cutSpeedMmS: 100 }).set(bearer(owner.accessToken)).expect(200)).body)
    expect(overridden.profile).toMatchObject({ cutSpeedMmS: 100, liftLowerS: 0.3 })
    // 200 mm at 100 mm/s = 2 s (worked example by hand).
    expect(overridden.totals.cutTimeS).toBeCloseTo(2, 1)

    const exported = await api().get(`/api/workspaces/${owner.workspace.id}/layouts/${layout.body.id}/export`).query({ cutterId: cutter.id, format: 'hpgl', sheet: 0 }).set(bearer(owner.accessToken)).expect(200)
    expect(exported.headers['content-type']).toMatch(/hpgl/)

    const stranger = await signUp('cutters-plan-stranger')
    const foreign = await createCutter(stranger, stranger.workspace.id)
    const refused = await api().get(planUrl).query({ cutterId: foreign.id }).set(bearer(owner.accessToken)).expect(400)
    expect(refused.body.error.fields['query.cutterId']).toEqual(['No such cutter in this workspace'])
  })
})
