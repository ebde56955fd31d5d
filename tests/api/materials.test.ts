import { beforeAll, describe, expect, it } from 'vitest'
import { apiErrorSchema } from '../../shared/schemas/error.js'
import {
  applySuggestionResponseSchema,
  favouritesResponseSchema,
  materialDetailSchema,
  materialListResponseSchema,
  materialSettingsSchema,
  recipeHistoryResponseSchema,
  recipeSchema,
  testCutListResponseSchema,
  testCutSchema,
  type MaterialSummary,
} from '../../shared/schemas/materials.js'
import { catalogue } from '../../shared/materials/catalogue.js'
import { addMember, api, bearer, signUp, type SignedUpUser } from './helpers.js'
import { jpegStart, solidPng, webpStart } from './imageFixtures.js'

const materialsUrl = (workspaceId: string) => `/api/workspaces/${workspaceId}/materials`
const favouritesUrl = (workspaceId: string) => `/api/workspaces/${workspaceId}/favourites`

async function listMaterials(token: string, workspaceId: string, query: Record<string, string | number> = {}) {
  const response = await api().get(materialsUrl(workspaceId)).query(query).set(bearer(token)).expect(200)
  return materialListResponseSchema.parse(response.body)
}

async function materialByKey(owner: SignedUpUser, key: string): Promise<MaterialSummary> {
  const list = await listMaterials(owner.accessToken, owner.workspace.id, { pageSize: 100 })
  const found = list.items.find((material) => material.catalogueKey === key)
  if (!found) throw new Error(`no catalogue material ${key}`)
  return found
}

describe('the material catalogue', () => {
  let owner: SignedUpUser

  beforeAll(async () => {
    owner = await signUp('materials-catalogue')
  })

  it('gives a new workspace every catalogue material with a starting blade recipe', async () => {
    const list = await listMaterials(owner.accessToken, owner.workspace.id, { pageSize: 100 })
    expect(list.total).toBe(catalogue.length)
    for (const material of list.items) {
      const blade = material.recipes.find((recipe) => recipe.toolKind === 'blade')
      expect(blade, material.name).toBeDefined()
      const { bladeType, bladeAngleDeg, force, passes, speedMmS, powerPercent } = blade!
      expect(blade!.catalogue).toEqual({ bladeType, bladeAngleDeg, force, passes, speedMmS, powerPercent })
      expect(blade!.tuned).toBe(false)
    }
  })

  it('shows cardstock grammage from the US basis-weight definition', async () => {
    // ../shared/REFERENCES.md "Paper weights": 65 lb cover ≈ 176 g/m², 80 lb ≈ 216 g/m², 110 lb ≈ 297 g/m²
    // (500 sheets of 20 × 26 in weigh the basis weight in lb; common practice of the US paper trade).
    for (const [key, gsm] of [
      ['cardstock-65lb-cover', 176],
      ['cardstock-80lb-cover', 216],
      ['cardstock-110lb-cover', 297],
    ] as const) {
      const material = await materialByKey(owner, key)
      expect(Math.round(material.grammageGsm!)).toBe(gsm)
      expect(material.basisWeight).toEqual({ pounds: Number(key.match(/\d+/)![0]), kind: 'cover' })
    }
  })

  it('marks vinyl unsafe to laser and gives it no laser recipe', async () => {
    // ../shared/REFERENCES.md "Cutting practice": never laser-cut PVC or vinyl (hydrogen chloride gas).
    const vinyl = await materialByKey(owner, 'vinyl-adhesive-permanent')
    expect(vinyl.laserSafe).toBe(false)
    expect(vinyl.recipes.map((recipe) => recipe.toolKind)).toEqual(['blade'])
    const refused = await api()
      .post(`${materialsUrl(owner.workspace.id)}/${vinyl.id}/recipes`)
      .set(bearer(owner.accessToken))
      .send({ toolKind: 'laser', powerPercent: 20, speedMmS: 100 })
      .expect(400)
    expect(refused.body.error.fields).toHaveProperty(['body.toolKind'])
    expect(refused.body.error.message).toMatch(/chlorine/)
  })

  it('searches and filters by category', async () => {
    const cardstock = await listMaterials(owner.accessToken, owner.workspace.id, { category: 'cardstock' })
    expect(cardstock.items.map((material) => material.name)).toEqual(['Cardstock, 110 lb cover', 'Cardstock, 65 lb cover', 'Cardstock, 80 lb cover'])
    const felt = await listMaterials(owner.accessToken, owner.workspace.id, { search: 'felt' })
    expect(felt.items.map((material) => material.catalogueKey)).toEqual(['felt'])
    const paged = await listMaterials(owner.accessToken, owner.workspace.id, { pageSize: 5, page: 3 })
    expect(paged.items).toHaveLength(catalogue.length - 10)
  })

  it('copies the catalogue once even when a workspace opens its materials twice at the same time', async () => {
    const fresh = await signUp('materials-race')
    const [first, second] = await Promise.all([listMaterials(fresh.accessToken, fresh.workspace.id), listMaterials(fresh.accessToken, fresh.workspace.id)])
    expect(first.total).toBe(catalogue.length)
    expect(second.total).toBe(catalogue.length)
  })
})

describe('favourites', () => {
  let owner: SignedUpUser
  let maker: { accessToken: string }

  beforeAll(async () => {
    owner = await signUp('materials-favourites')
    maker = await addMember(owner, 'maker')
  })

  it('shows a starred material first, for the person who starred it only', async () => {
    const felt = await materialByKey(owner, 'felt')
    const starred = await api().put(`${favouritesUrl(owner.workspace.id)}/${felt.id}`).set(bearer(owner.accessToken)).expect(200)
    expect(favouritesResponseSchema.parse(starred.body).materialIds).toEqual([felt.id])
    // Starring twice changes nothing.
    await api().put(`${favouritesUrl(owner.workspace.id)}/${felt.id}`).set(bearer(owner.accessToken)).expect(200)

    const mine = await listMaterials(owner.accessToken, owner.workspace.id)
    expect(mine.items[0]).toMatchObject({ id: felt.id, isFavourite: true })
    expect(mine.items.filter((material) => material.isFavourite)).toHaveLength(1)
    const onlyFavourites = await listMaterials(owner.accessToken, owner.workspace.id, { favouritesOnly: 'true' })
    expect(onlyFavourites.items.map((material) => material.id)).toEqual([felt.id])

    const theirs = await listMaterials(maker.accessToken, owner.workspace.id)
    expect(theirs.items[0]!.id).not.toBe(felt.id)
    expect(theirs.items.some((material) => material.isFavourite)).toBe(false)

    const unstarred = await api().delete(`${favouritesUrl(owner.workspace.id)}/${felt.id}`).set(bearer(owner.accessToken)).expect(200)
    expect(unstarred.body.materialIds).toEqual([])
  })

  it("refuses to star another workspace's material", async () => {
    const other = await signUp('materials-favourites-other')
    const foreign = await materialByKey(other, 'felt')
    await api().put(`${favouritesUrl(owner.workspace.id)}/${foreign.id}`).set(bearer(owner.accessToken)).expect(404)
  })
})

describe("the workspace's own materials", () => {
  let owner: SignedUpUser

  beforeAll(async () => {
    owner = await signUp('materials-own')
  })

  it('creates, changes, archives and deletes an own material', async () => {
    const created = await api()
      .post(materialsUrl(owner.workspace.id))
      .set(bearer(owner.accessToken))
      .send({ name: 'Glitter cardstock', category: 'cardstock', basisWeight: { pounds: 80, kind: 'cover' }, description: 'Shed glitter onto the mat' })
      .expect(201)
    const material = materialDetailSchema.parse(created.body)
    expect(material).toMatchObject({ catalogueKey: null, laserSafe: false, recipes: [], stockCount: 0, testCutCount: 0 })
    expect(Math.round(material.grammageGsm!)).toBe(216)
    const url = `${materialsUrl(owner.workspace.id)}/${material.id}`

    const renamed = await api().patch(url).set(bearer(owner.accessToken)).send({ name: 'Glitter cardstock, gold', basisWeight: null, grammageGsm: 250 }).expect(200)
    expect(renamed.body).toMatchObject({ name: 'Glitter cardstock, gold', basisWeight: null, grammageGsm: 250 })

    const archived = await api().patch(url).set(bearer(owner.accessToken)).send({ archived: true }).expect(200)
    expect(archived.body.archived).toBe(true)
    const active = await listMaterials(owner.accessToken, owner.workspace.id, { pageSize: 100 })
    expect(active.items.some((item) => item.id === material.id)).toBe(false)

    await api().delete(url).set(bearer(owner.accessToken)).expect(204)
    await api().get(url).set(bearer(owner.accessToken)).expect(404)
  })

  it('archives rather than deletes a material on the shelf, and never deletes a catalogue one', async () => {
    const created = await api().post(materialsUrl(owner.workspace.id)).set(bearer(owner.accessToken)).send({ name: 'Cork sheet', category: 'other' }).expect(201)
    await api()
      .post(`/api/workspaces/${owner.workspace.id}/stock`)
      .set(bearer(owner.accessToken))
      .send({ kind: 'sheet', name: 'Cork A4', widthMm: 210, heightMm: 297, materialId: created.body.id })
      .expect(201)
    const inUse = await api().delete(`${materialsUrl(owner.workspace.id)}/${created.body.id}`).set(bearer(owner.accessToken)).expect(409)
    expect(inUse.body.error.message).toMatch(/archive it instead/)
    const detail = await api().get(`${materialsUrl(owner.workspace.id)}/${created.body.id}`).set(bearer(owner.accessToken)).expect(200)
    expect(detail.body.stockCount).toBe(1)

    const felt = await materialByKey(owner, 'felt')
    await api().delete(`${materialsUrl(owner.workspace.id)}/${felt.id}`).set(bearer(owner.accessToken)).expect(409)
  })

  it('refuses bad materials with the field named', async () => {
    const cases: [unknown, string][] = [
      [{ name: '', category: 'vinyl' }, 'body.name'],
      [{ name: 'Mystery', category: 'plastic' }, 'body.category'],
      [{ name: 'Thin', category: 'paper', thicknessMm: -0.1 }, 'body.thicknessMm'],
      [{ name: 'Heavy', category: 'cardstock', basisWeight: { pounds: -65, kind: 'cover' } }, 'body.basisWeight.pounds'],
    ]
    for (const [body, field] of cases) {
      const response = await api().post(materialsUrl(owner.workspace.id)).set(bearer(owner.accessToken)).send(body as object).expect(400)
      expect(Object.keys(response.body.error.fields)).toContain(field)
    }
  })
})

describe('cut recipes and their history', () => {
  let owner: SignedUpUser
  let vinyl: MaterialSummary
  let recipesUrl: string

  beforeAll(async () => {
    owner = await signUp('materials-recipes')
    vinyl = await materialByKey(owner, 'vinyl-adhesive-permanent')
    recipesUrl = `${materialsUrl(owner.workspace.id)}/${vinyl.id}/recipes`
  })

  it('raises force by one step and keeps who, when, from → to and why', async () => {
    const before = vinyl.recipes.find((recipe) => recipe.toolKind === 'blade')!
    // One step of 15 force units: ../shared/REFERENCES.md "Cutting practice" (common practice).
    const tuned = await api()
      .patch(`${recipesUrl}/blade`)
      .set(bearer(owner.accessToken))
      .send({ force: before.force! + 15, reason: 'Corners not through on the new roll' })
      .expect(200)
    expect(recipeSchema.parse(tuned.body)).toMatchObject({ force: before.force! + 15, tuned: true, updatedByName: 'Test materials-recipes' })

    const history = recipeHistoryResponseSchema.parse((await api().get(`${recipesUrl}/history`).set(bearer(owner.accessToken)).expect(200)).body)
    expect(history.total).toBe(1)
    expect(history.items[0]).toMatchObject({
      toolKind: 'blade',
      field: 'force',
      from: before.force,
      to: before.force! + 15,
      reason: 'Corners not through on the new roll',
      source: 'tuned',
      changedByName: 'Test materials-recipes',
    })
    expect(Date.now() - Date.parse(history.items[0]!.changedAt)).toBeLessThan(60_000)
  })

  it('records one entry per changed field and none for values that stay', async () => {
    const current = recipeSchema.array().parse((await api().get(recipesUrl).set(bearer(owner.accessToken)).expect(200)).body)[0]!
    await api()
      .patch(`${recipesUrl}/blade`)
      .set(bearer(owner.accessToken))
      .send({ force: current.force, passes: 2, speedMmS: 150, reason: 'Slower, two passes' })
      .expect(200)
    const history = await api().get(`${recipesUrl}/history`).query({ pageSize: 10 }).set(bearer(owner.accessToken)).expect(200)
    expect(history.body.total).toBe(3)
    expect(history.body.items.slice(0, 2).map((change: { field: string }) => change.field)).toEqual(['passes', 'speedMmS'])
  })

  it('resets to the catalogue value, recorded as a reset', async () => {
    const reset = await api().post(`${recipesUrl}/blade/reset`).set(bearer(owner.accessToken)).send({}).expect(200)
    const startingPoint = catalogue.find((entry) => entry.key === 'vinyl-adhesive-permanent')!.blade
    expect(reset.body).toMatchObject({ force: startingPoint.force, passes: startingPoint.passes, speedMmS: startingPoint.speedMmS, tuned: false })
    const history = await api().get(`${recipesUrl}/history`).query({ pageSize: 3 }).set(bearer(owner.accessToken)).expect(200)
    expect(history.body.items.every((change: { source: string }) => change.source === 'reset')).toBe(true)
  })

  it('refuses a force outside the force range, a missing reason and a laser value on a blade recipe', async () => {
    const tooHigh = await api().patch(`${recipesUrl}/blade`).set(bearer(owner.accessToken)).send({ force: 401, reason: 'More!' }).expect(400)
    expect(tooHigh.body.error.fields['body.force'][0]).toMatch(/1–400/)
    const zero = await api().patch(`${recipesUrl}/blade`).set(bearer(owner.accessToken)).send({ force: 0, reason: 'Less' }).expect(400)
    expect(zero.body.error.fields).toHaveProperty(['body.force'])
    const noReason = await api().patch(`${recipesUrl}/blade`).set(bearer(owner.accessToken)).send({ force: 100 }).expect(400)
    expect(noReason.body.error.fields).toHaveProperty(['body.reason'])
    const laserValue = await api().patch(`${recipesUrl}/blade`).set(bearer(owner.accessToken)).send({ powerPercent: 20, reason: 'Oops' }).expect(400)
    expect(laserValue.body.error.fields).toHaveProperty(['body.powerPercent'])
    await api().patch(`${recipesUrl}/laser`).set(bearer(owner.accessToken)).send({ powerPercent: 20, reason: 'None' }).expect(404)
  })

  it('follows the workspace force step and range set by an owner', async () => {
    const settingsUrl = `${materialsUrl(owner.workspace.id)}/settings`
    // Default step of 15 units: ../shared/REFERENCES.md "Cutting practice" (common practice).
    expect(materialSettingsSchema.parse((await api().get(settingsUrl).set(bearer(owner.accessToken)).expect(200)).body)).toEqual({ forceStep: 15, forceMin: 1, forceMax: 400, powerStepPercent: 5 })
    const changed = await api().patch(settingsUrl).set(bearer(owner.accessToken)).send({ forceStep: 10, forceMax: 600 }).expect(200)
    expect(changed.body).toMatchObject({ forceStep: 10, forceMax: 600 })
    await api().patch(`${recipesUrl}/blade`).set(bearer(owner.accessToken)).send({ force: 550, reason: 'Within the wider range' }).expect(200)
    const inverted = await api().patch(settingsUrl).set(bearer(owner.accessToken)).send({ forceMin: 700 }).expect(400)
    expect(inverted.body.error.fields).toHaveProperty(['body.forceMin'])
    await api().patch(settingsUrl).set(bearer(owner.accessToken)).send({ forceStep: 15, forceMax: 400 }).expect(200)
    await api().post(`${recipesUrl}/blade/reset`).set(bearer(owner.accessToken)).send({ reason: 'Back to the start' }).expect(200)
  })

  it("adds and deletes a recipe of an own material, which has no catalogue value to reset to", async () => {
    const own = await api().post(materialsUrl(owner.workspace.id)).set(bearer(owner.accessToken)).send({ name: 'Balsa 1 mm', category: 'board', laserSafe: true }).expect(201)
    const ownRecipes = `${materialsUrl(owner.workspace.id)}/${own.body.id}/recipes`
    const created = await api().post(ownRecipes).set(bearer(owner.accessToken)).send({ toolKind: 'laser', powerPercent: 30, speedMmS: 40 }).expect(201)
    expect(created.body).toMatchObject({ toolKind: 'laser', powerPercent: 30, passes: 1, force: null, catalogue: null, tuned: false })
    await api().post(ownRecipes).set(bearer(owner.accessToken)).send({ toolKind: 'laser', powerPercent: 30, speedMmS: 40 }).expect(409)
    await api().post(`${ownRecipes}/laser/reset`).set(bearer(owner.accessToken)).send({}).expect(409)
    const history = await api().get(`${ownRecipes}/history`).set(bearer(owner.accessToken)).expect(200)
    expect(history.body.items.map((change: { field: string; source: string }) => `${change.source}:${change.field}`).sort()).toEqual(['created:passes', 'created:powerPercent', 'created:speedMmS'])
    // Unsafe to laser only once the laser recipe is gone.
    await api().patch(`${materialsUrl(owner.workspace.id)}/${own.body.id}`).set(bearer(owner.accessToken)).send({ laserSafe: false }).expect(400)
    await api().delete(`${ownRecipes}/laser`).set(bearer(owner.accessToken)).expect(204)
    await api().patch(`${materialsUrl(owner.workspace.id)}/${own.body.id}`).set(bearer(owner.accessToken)).send({ laserSafe: false }).expect(200)
  })
})

describe('test cuts and suggestions', () => {
  let owner: SignedUpUser
  let cardstock: MaterialSummary
  let testCutsUrl: string
  let recipesUrl: string

  beforeAll(async () => {
    owner = await signUp('materials-test-cuts')
    cardstock = await materialByKey(owner, 'cardstock-80lb-cover')
    testCutsUrl = `${materialsUrl(owner.workspace.id)}/${cardstock.id}/test-cuts`
    recipesUrl = `${materialsUrl(owner.workspace.id)}/${cardstock.id}/recipes`
  })

  it('suggests one more force step after a cut that did not go through, and applies it in one call', async () => {
    const startForce = cardstock.recipes.find((recipe) => recipe.toolKind === 'blade')!.force!
    const logged = await api().post(testCutsUrl).set(bearer(owner.accessToken)).send({ outcome: 'not_through', note: 'Star points still attached' }).expect(201)
    const testCut = testCutSchema.parse(logged.body)
    expect(testCut).toMatchObject({ toolKind: 'blade', outcome: 'not_through', cutterId: null, bladeId: null, photoUrl: null, applyBlockedReason: null, suggestionAppliedAt: null })
    expect(testCut.recipe.force).toBe(startForce)
    // +1 step of 15 units: ../shared/REFERENCES.md "Cutting practice" (common practice).
    expect(testCut.suggestion).toMatchObject({ action: 'raise-force', changes: [{ field: 'force', from: startForce, to: startForce + 15 }] })

    const applied = applySuggestionResponseSchema.parse((await api().post(`${testCutsUrl}/${testCut.id}/apply-suggestion`).set(bearer(owner.accessToken)).expect(200)).body)
    expect(applied.recipe.force).toBe(startForce + 15)
    expect(applied.testCut.suggestionAppliedAt).not.toBeNull()
    expect(applied.testCut.applyBlockedReason).toBe('Already applied')
    expect(applied.changes).toEqual([expect.objectContaining({ field: 'force', from: startForce, to: startForce + 15, source: 'suggestion', testCutId: testCut.id })])

    const history = await api().get(`${recipesUrl}/history`).set(bearer(owner.accessToken)).expect(200)
    expect(history.body.items[0]).toMatchObject({ source: 'suggestion', testCutId: testCut.id, reason: expect.stringMatching(/not through/) })

    const again = await api().post(`${testCutsUrl}/${testCut.id}/apply-suggestion`).set(bearer(owner.accessToken)).expect(409)
    expect(again.body.error.message).toBe('Already applied')
  })

  it('refuses a suggestion made from a recipe that has changed since', async () => {
    const logged = await api().post(testCutsUrl).set(bearer(owner.accessToken)).send({ outcome: 'too_deep' }).expect(201)
    await api().patch(`${recipesUrl}/blade`).set(bearer(owner.accessToken)).send({ speedMmS: 90, reason: 'Slower for the detail' }).expect(200)
    const stale = await api().post(`${testCutsUrl}/${logged.body.id}/apply-suggestion`).set(bearer(owner.accessToken)).expect(409)
    expect(stale.body.error.message).toMatch(/changed since this test cut/)
    const read = await api().get(`${testCutsUrl}/${logged.body.id}`).set(bearer(owner.accessToken)).expect(200)
    expect(read.body.applyBlockedReason).toMatch(/changed since/)
  })

  it('keeps a clean recipe and has nothing to apply', async () => {
    const logged = await api().post(testCutsUrl).set(bearer(owner.accessToken)).send({ outcome: 'clean' }).expect(201)
    expect(logged.body.suggestion.action).toBe('keep')
    expect(logged.body.applyBlockedReason).toBe('Nothing to change')
    await api().post(`${testCutsUrl}/${logged.body.id}/apply-suggestion`).set(bearer(owner.accessToken)).expect(409)
  })

  it("adds a pass instead of force at the cutter's maximum force", async () => {
    // A cutter of the workspace: test cuts only name cutters that exist here (tests/api/cutters.test.ts).
    const cutter = await api()
      .post(`/api/workspaces/${owner.workspace.id}/cutters`)
      .set(bearer(owner.accessToken))
      .send({ name: 'Test bench', toolKind: 'blade', cuttingWidthMm: 330, maxLengthMm: 3000, cutSpeedMmS: 100, travelSpeedMmS: 300, accelerationMmS2: 1500, liftLowerS: 0.15 })
      .expect(201)
    const logged = await api()
      .post(testCutsUrl)
      .set(bearer(owner.accessToken))
      .send({ outcome: 'not_through', force: 250, cutterMaxForce: 250, cutterId: cutter.body.id })
      .expect(201)
    expect(logged.body).toMatchObject({ cutterMaxForce: 250, cutterId: cutter.body.id, bladeId: null, cutterName: 'Test bench', bladeText: null, recipe: { force: 250 } })
    expect(logged.body.suggestion).toMatchObject({ action: 'add-pass', changes: [{ field: 'passes', from: 1, to: 2 }] })

    // With a blade fitted, a test cut on that cutter records the blade too and says which it was.
    const blade = await api()
      .post(`/api/workspaces/${owner.workspace.id}/cutters/${cutter.body.id}/blades`)
      .set(bearer(owner.accessToken))
      .send({ bladeType: 'standard', angleDeg: 45 })
      .expect(201)
    const withBlade = await api().post(testCutsUrl).set(bearer(owner.accessToken)).send({ outcome: 'clean', cutterId: cutter.body.id }).expect(201)
    expect(withBlade.body).toMatchObject({ cutterId: cutter.body.id, bladeId: blade.body.id, cutterName: 'Test bench', bladeText: 'standard blade 45°' })
  })

  it("refuses a force outside the cutter's range and other bad test cuts", async () => {
    const beyondCutter = await api().post(testCutsUrl).set(bearer(owner.accessToken)).send({ outcome: 'clean', force: 260, cutterMaxForce: 250 }).expect(400)
    expect(beyondCutter.body.error.fields['body.force'][0]).toMatch(/cutter's range/)
    const beyondWorkspace = await api().post(testCutsUrl).set(bearer(owner.accessToken)).send({ outcome: 'clean', force: 999 }).expect(400)
    expect(beyondWorkspace.body.error.fields).toHaveProperty(['body.force'])
    const badOutcome = await api().post(testCutsUrl).set(bearer(owner.accessToken)).send({ outcome: 'perfect' }).expect(400)
    expect(badOutcome.body.error.fields).toHaveProperty(['body.outcome'])
    const laserValue = await api().post(testCutsUrl).set(bearer(owner.accessToken)).send({ outcome: 'clean', powerPercent: 20 }).expect(400)
    expect(laserValue.body.error.fields).toHaveProperty(['body.powerPercent'])
    const badCutter = await api().post(testCutsUrl).set(bearer(owner.accessToken)).send({ outcome: 'clean', cutterId: 'cutter-1' }).expect(400)
    expect(badCutter.body.error.fields).toHaveProperty(['body.cutterId'])
  })

  it('lists test cuts newest first, paged', async () => {
    const list = testCutListResponseSchema.parse((await api().get(testCutsUrl).query({ pageSize: 2 }).set(bearer(owner.accessToken)).expect(200)).body)
    expect(list.total).toBe(5)
    expect(list.items).toHaveLength(2)
    // The newest: the clean cut with a fitted blade logged above.
    expect(list.items[0]!.outcome).toBe('clean')
    expect(list.items[0]!.bladeText).toBe('standard blade 45°')
    expect(Date.parse(list.items[0]!.createdAt)).toBeGreaterThanOrEqual(Date.parse(list.items[1]!.createdAt))
  })
})

describe('test cut photos', () => {
  let owner: SignedUpUser
  let viewerToken: string
  let outsiderToken: string
  let testCutsUrl: string
  const png = solidPng(24, 16, [200, 80, 60])

  beforeAll(async () => {
    owner = await signUp('materials-photos')
    viewerToken = (await addMember(owner, 'viewer')).accessToken
    outsiderToken = (await signUp('materials-photos-outsider')).accessToken
    const felt = await materialByKey(owner, 'felt')
    testCutsUrl = `${materialsUrl(owner.workspace.id)}/${felt.id}/test-cuts`
  })

  const post = (fields: Record<string, string>, file?: { content: Buffer; filename: string; contentType: string }, token = owner.accessToken) => {
    const call = api().post(testCutsUrl).set(bearer(token))
    for (const [name, value] of Object.entries(fields)) call.field(name, value)
    if (file) call.attach('photo', file.content, { filename: file.filename, contentType: file.contentType })
    return call
  }

  it('stores a PNG photo and serves it back to members only', async () => {
    const logged = await post({ outcome: 'torn', note: 'Fibres pulled on the small circles', force: '' }, { content: png, filename: 'felt test.png', contentType: 'image/png' }).expect(201)
    expect(logged.body.photoUrl).toBe(`${testCutsUrl}/${logged.body.id}/photo`)
    expect(logged.body.note).toBe('Fibres pulled on the small circles')

    const served = await getBytes(logged.body.photoUrl, viewerToken).expect(200)
    expect(served.headers['content-type']).toBe('image/png')
    expect(served.headers['cache-control']).toContain('private')
    expect(Buffer.compare(served.body as Buffer, png)).toBe(0)

    await api().get(logged.body.photoUrl).set(bearer(outsiderToken)).expect(404)
    await api().get(logged.body.photoUrl).expect(401)
  })

  it('accepts JPEG and WebP by their bytes', async () => {
    const jpeg = await post({ outcome: 'clean' }, { content: Buffer.concat([jpegStart, Buffer.alloc(64)]), filename: 'cut.jpg', contentType: 'image/jpeg' }).expect(201)
    const jpegServed = await getBytes(jpeg.body.photoUrl, owner.accessToken).expect(200)
    expect(jpegServed.headers['content-type']).toBe('image/jpeg')
    await post({ outcome: 'clean' }, { content: Buffer.concat([webpStart, Buffer.alloc(64)]), filename: 'cut.webp', contentType: 'image/webp' }).expect(201)
  })

  const refused: { name: string; file: { content: Buffer; filename: string; contentType: string } }[] = [
    { name: 'a text file declared as PNG', file: { content: Buffer.from('not a picture'), filename: 'notes.png', contentType: 'image/png' } },
    { name: 'an SVG image', file: { content: Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"/>'), filename: 'cut.svg', contentType: 'image/svg+xml' } },
    { name: 'PNG bytes declared as text', file: { content: png, filename: 'cut.txt', contentType: 'text/plain' } },
    { name: 'a GIF', file: { content: Buffer.from('GIF89a\x01\x00\x01\x00', 'latin1'), filename: 'cut.gif', contentType: 'image/gif' } },
  ]
  for (const { name, file } of refused) {
    it(`refuses ${name} with 400 naming the photo, and stores nothing`, async () => {
      const before = (await api().get(testCutsUrl).set(bearer(owner.accessToken)).expect(200)).body.total
      const response = await post({ outcome: 'clean' }, file)
      expect(response.status).toBe(400)
      const { error } = apiErrorSchema.parse(response.body)
      expect(error.fields?.['body.photo']?.[0]).toMatch(/not a PNG, JPEG or WebP image/)
      expect((await api().get(testCutsUrl).set(bearer(owner.accessToken)).expect(200)).body.total).toBe(before)
    })
  }

  it('refuses a photo over 5 MB naming the field', async () => {
    const large = Buffer.concat([png, Buffer.alloc(5 * 1024 * 1024)])
    const response = await post({ outcome: 'clean' }, { content: large, filename: 'huge.png', contentType: 'image/png' })
    expect(response.status).toBe(413)
    expect(response.body.error.fields).toHaveProperty(['body.photo'])
    await api().get('/api/health').expect(200)
  })

  it('refuses a file in another field', async () => {
    const response = await api().post(testCutsUrl).set(bearer(owner.accessToken)).field('outcome', 'clean').attach('picture', png, { filename: 'a.png', contentType: 'image/png' })
    expect(response.status).toBe(400)
    expect(response.body.error.fields).toHaveProperty(['body.picture'])
  })
})

/** GET of a file, its body read as bytes whatever its content type. */
function getBytes(url: string, token?: string) {
  const call = api().get(url)
  if (token) call.set(bearer(token))
  return call.buffer(true).parse((response, done) => {
    const chunks: Buffer[] = []
    response.on('data', (chunk: Buffer) => chunks.push(chunk))
    response.on('end', () => done(null, Buffer.concat(chunks)))
  })
}

describe('who may do what with materials', () => {
  let owner: SignedUpUser
  let makerToken: string
  let viewerToken: string
  let outsiderToken: string
  let material: MaterialSummary
  let materialUrl: string
  let testCutId: string

  beforeAll(async () => {
    owner = await signUp('materials-roles')
    ;[makerToken, viewerToken, outsiderToken] = await Promise.all([
      addMember(owner, 'maker').then((member) => member.accessToken),
      addMember(owner, 'viewer').then((member) => member.accessToken),
      signUp('materials-outsider').then((outsider) => outsider.accessToken),
    ])
    material = await materialByKey(owner, 'copy-paper')
    materialUrl = `${materialsUrl(owner.workspace.id)}/${material.id}`
    testCutId = (await api().post(`${materialUrl}/test-cuts`).set(bearer(owner.accessToken)).send({ outcome: 'not_through' }).expect(201)).body.id
  })

  it('lets a maker tune, log test cuts and apply suggestions, but not change the workspace settings', async () => {
    await api().post(materialsUrl(owner.workspace.id)).set(bearer(makerToken)).send({ name: 'Maker paper', category: 'paper' }).expect(201)
    await api().patch(`${materialUrl}/recipes/blade`).set(bearer(makerToken)).send({ speedMmS: 120, reason: 'Tearing at speed' }).expect(200)
    const logged = await api().post(`${materialUrl}/test-cuts`).set(bearer(makerToken)).send({ outcome: 'not_through' }).expect(201)
    await api().post(`${materialUrl}/test-cuts/${logged.body.id}/apply-suggestion`).set(bearer(makerToken)).expect(200)
    await api().patch(`${materialsUrl(owner.workspace.id)}/settings`).set(bearer(makerToken)).send({ forceStep: 5 }).expect(403)
  })

  it('lets a viewer read everything and star materials, but change nothing shared', async () => {
    await api().get(materialsUrl(owner.workspace.id)).set(bearer(viewerToken)).expect(200)
    await api().get(materialUrl).set(bearer(viewerToken)).expect(200)
    await api().get(`${materialUrl}/recipes`).set(bearer(viewerToken)).expect(200)
    await api().get(`${materialUrl}/recipes/history`).set(bearer(viewerToken)).expect(200)
    await api().get(`${materialUrl}/test-cuts`).set(bearer(viewerToken)).expect(200)
    await api().get(`${materialUrl}/test-cuts/${testCutId}`).set(bearer(viewerToken)).expect(200)
    await api().get(`${materialsUrl(owner.workspace.id)}/settings`).set(bearer(viewerToken)).expect(200)
    await api().put(`${favouritesUrl(owner.workspace.id)}/${material.id}`).set(bearer(viewerToken)).expect(200)
    await api().get(favouritesUrl(owner.workspace.id)).set(bearer(viewerToken)).expect(200)

    await api().post(materialsUrl(owner.workspace.id)).set(bearer(viewerToken)).send({ name: 'Viewer paper', category: 'paper' }).expect(403)
    await api().patch(materialUrl).set(bearer(viewerToken)).send({ name: 'Renamed' }).expect(403)
    await api().delete(materialUrl).set(bearer(viewerToken)).expect(403)
    await api().post(`${materialUrl}/recipes`).set(bearer(viewerToken)).send({ toolKind: 'laser', powerPercent: 10, speedMmS: 100 }).expect(403)
    await api().patch(`${materialUrl}/recipes/blade`).set(bearer(viewerToken)).send({ force: 80, reason: 'Viewer' }).expect(403)
    await api().post(`${materialUrl}/recipes/blade/reset`).set(bearer(viewerToken)).send({}).expect(403)
    await api().delete(`${materialUrl}/recipes/laser`).set(bearer(viewerToken)).expect(403)
    await api().post(`${materialUrl}/test-cuts`).set(bearer(viewerToken)).send({ outcome: 'clean' }).expect(403)
    await api().post(`${materialUrl}/test-cuts/${testCutId}/apply-suggestion`).set(bearer(viewerToken)).expect(403)
    await api().delete(`${materialUrl}/test-cuts/${testCutId}`).set(bearer(viewerToken)).expect(403)
    await api().patch(`${materialsUrl(owner.workspace.id)}/settings`).set(bearer(viewerToken)).send({ forceStep: 5 }).expect(403)
  })

  it("hides another workspace's materials from a non-member (404 everywhere)", async () => {
    const calls = [
      api().get(materialsUrl(owner.workspace.id)),
      api().get(materialUrl),
      api().patch(materialUrl).send({ name: 'Taken' }),
      api().get(`${materialUrl}/recipes`),
      api().patch(`${materialUrl}/recipes/blade`).send({ force: 80, reason: 'Outsider' }),
      api().get(`${materialUrl}/recipes/history`),
      api().get(`${materialUrl}/test-cuts`),
      api().post(`${materialUrl}/test-cuts`).send({ outcome: 'clean' }),
      api().post(`${materialUrl}/test-cuts/${testCutId}/apply-suggestion`),
      api().get(`${materialsUrl(owner.workspace.id)}/settings`),
      api().get(favouritesUrl(owner.workspace.id)),
      api().put(`${favouritesUrl(owner.workspace.id)}/${material.id}`),
    ]
    for (const call of calls) expect((await call.set(bearer(outsiderToken))).status).toBe(404)
  })

  it('lets the owner delete a test cut', async () => {
    const logged = await api().post(`${materialUrl}/test-cuts`).set(bearer(owner.accessToken)).send({ outcome: 'clean' }).expect(201)
    await api().delete(`${materialUrl}/test-cuts/${logged.body.id}`).set(bearer(owner.accessToken)).expect(204)
    await api().get(`${materialUrl}/test-cuts/${logged.body.id}`).set(bearer(owner.accessToken)).expect(404)
  })
})
