import { beforeAll, describe, expect, it } from 'vitest'
import { apiErrorSchema } from '../../shared/schemas/error.js'
import { stockItemSchema, stockListResponseSchema, type CreateStockRequest } from '../../shared/schemas/stock.js'
import { materialListResponseSchema } from '../../shared/schemas/materials.js'
import { addMember, api, bearer, signUp, type SignedUpUser } from './helpers.js'

const stockUrl = (workspaceId: string) => `/api/workspaces/${workspaceId}/stock`

// ISO 216 A4 = 210 × 297 mm; 12 in = 304.8 mm through 1 in = 25.4 mm (W3C CSS Values and Units Level 3).
const a4Sheets: CreateStockRequest = { kind: 'sheet', name: 'White cardstock A4', widthMm: 210, heightMm: 297, quantityOnHand: 40, price: 0.35, margins: { topMm: 5, rightMm: 5, bottomMm: 5, leftMm: 5 } }
const vinylRoll: CreateStockRequest = { kind: 'roll', name: 'Matte black vinyl 12 in', widthMm: 304.8, lengthMm: 4572, quantityOnHand: 2, price: 4.2, supplierNote: 'Order by the 5 yd roll' }

async function firstMaterialId(token: string, workspaceId: string): Promise<string> {
  const response = await api().get(`/api/workspaces/${workspaceId}/materials`).set(bearer(token)).expect(200)
  return materialListResponseSchema.parse(response.body).items[0]!.id
}

describe('stock items', () => {
  let owner: SignedUpUser

  beforeAll(async () => {
    owner = await signUp('stock-crud')
  })

  it('creates a sheet and a roll and lists them by name', async () => {
    const sheet = await api().post(stockUrl(owner.workspace.id)).set(bearer(owner.accessToken)).send(a4Sheets).expect(201)
    expect(stockItemSchema.parse(sheet.body)).toMatchObject({ kind: 'sheet', widthMm: 210, heightMm: 297, lengthMm: null, priceUnit: 'sheet', price: 0.35, quantityOnHand: 40, archived: false })
    expect(sheet.headers.location).toBe(`${stockUrl(owner.workspace.id)}/${sheet.body.id}`)

    const roll = await api().post(stockUrl(owner.workspace.id)).set(bearer(owner.accessToken)).send(vinylRoll).expect(201)
    expect(roll.body).toMatchObject({ kind: 'roll', widthMm: 304.8, heightMm: null, lengthMm: 4572, priceUnit: 'metre', margins: { topMm: 0, rightMm: 0, bottomMm: 0, leftMm: 0 } })

    const list = stockListResponseSchema.parse((await api().get(stockUrl(owner.workspace.id)).set(bearer(owner.accessToken)).expect(200)).body)
    expect(list.items.map((item) => item.name)).toEqual(['Matte black vinyl 12 in', 'White cardstock A4'])
    expect(list).toMatchObject({ total: 2, page: 1, pageSize: 50 })
  })

  it('pages, searches and filters by kind', async () => {
    const workspace = await signUp('stock-pages')
    for (let index = 1; index <= 5; index++) {
      await api()
        .post(stockUrl(workspace.workspace.id))
        .set(bearer(workspace.accessToken))
        .send({ ...a4Sheets, name: `Sheet ${index}` })
        .expect(201)
    }
    await api().post(stockUrl(workspace.workspace.id)).set(bearer(workspace.accessToken)).send(vinylRoll).expect(201)

    const page = await api().get(stockUrl(workspace.workspace.id)).query({ pageSize: 2, page: 2 }).set(bearer(workspace.accessToken)).expect(200)
    expect(page.body.items.map((item: { name: string }) => item.name)).toEqual(['Sheet 2', 'Sheet 3'])
    expect(page.body.total).toBe(6)
    const rolls = await api().get(stockUrl(workspace.workspace.id)).query({ kind: 'roll' }).set(bearer(workspace.accessToken)).expect(200)
    expect(rolls.body.total).toBe(1)
    const found = await api().get(stockUrl(workspace.workspace.id)).query({ search: '5 yd' }).set(bearer(workspace.accessToken)).expect(200)
    expect(found.body.items.map((item: { name: string }) => item.name)).toEqual(['Matte black vinyl 12 in'])
  })

  it('links a material of the workspace and refuses one from elsewhere', async () => {
    const materialId = await firstMaterialId(owner.accessToken, owner.workspace.id)
    const linked = await api()
      .post(stockUrl(owner.workspace.id))
      .set(bearer(owner.accessToken))
      .send({ ...a4Sheets, name: 'Linked', materialId })
      .expect(201)
    expect(linked.body.material).toMatchObject({ id: materialId })

    const other = await signUp('stock-other')
    const foreignMaterial = await firstMaterialId(other.accessToken, other.workspace.id)
    const refused = await api()
      .post(stockUrl(owner.workspace.id))
      .set(bearer(owner.accessToken))
      .send({ ...a4Sheets, name: 'Foreign', materialId: foreignMaterial })
      .expect(400)
    expect(refused.body.error.fields).toHaveProperty(['body.materialId'])
  })

  it('changes a size, checks the whole item again, and archives', async () => {
    const created = await api()
      .post(stockUrl(owner.workspace.id))
      .set(bearer(owner.accessToken))
      .send({ ...a4Sheets, name: 'To change' })
      .expect(201)
    const url = `${stockUrl(owner.workspace.id)}/${created.body.id}`

    const turned = await api().patch(url).set(bearer(owner.accessToken)).send({ widthMm: 297, heightMm: 420, quantityOnHand: 12 }).expect(200)
    expect(turned.body).toMatchObject({ widthMm: 297, heightMm: 420, quantityOnHand: 12, name: 'To change' })

    // 5 mm margins each side leave nothing of an 8 mm wide sheet.
    const tooNarrow = await api().patch(url).set(bearer(owner.accessToken)).send({ widthMm: 8 }).expect(400)
    expect(tooNarrow.body.error.fields).toHaveProperty(['body.margins.leftMm'])

    // A sheet turned into a roll needs a length.
    const noLength = await api().patch(url).set(bearer(owner.accessToken)).send({ kind: 'roll' }).expect(400)
    expect(noLength.body.error.fields).toHaveProperty(['body.lengthMm'])

    const archived = await api().patch(url).set(bearer(owner.accessToken)).send({ archived: true }).expect(200)
    expect(archived.body.archived).toBe(true)
    const active = await api().get(stockUrl(owner.workspace.id)).set(bearer(owner.accessToken)).expect(200)
    expect(active.body.items.some((item: { id: string }) => item.id === created.body.id)).toBe(false)
    const archivedList = await api().get(stockUrl(owner.workspace.id)).query({ status: 'archived' }).set(bearer(owner.accessToken)).expect(200)
    expect(archivedList.body.items.map((item: { id: string }) => item.id)).toEqual([created.body.id])
    await api().patch(url).set(bearer(owner.accessToken)).send({ archived: false }).expect(200)
  })

  it('deletes an unused item', async () => {
    const created = await api()
      .post(stockUrl(owner.workspace.id))
      .set(bearer(owner.accessToken))
      .send({ ...vinylRoll, name: 'Gone soon' })
      .expect(201)
    const url = `${stockUrl(owner.workspace.id)}/${created.body.id}`
    await api().delete(url).set(bearer(owner.accessToken)).expect(204)
    await api().get(url).set(bearer(owner.accessToken)).expect(404)
    await api().delete(url).set(bearer(owner.accessToken)).expect(404)
  })
})

describe('refusing bad stock', () => {
  let owner: SignedUpUser

  beforeAll(async () => {
    owner = await signUp('stock-bad')
  })

  const cases: { name: string; body: unknown; field: string }[] = [
    { name: 'a negative width', body: { ...a4Sheets, widthMm: -210 }, field: 'body.widthMm' },
    { name: 'a zero height', body: { ...a4Sheets, heightMm: 0 }, field: 'body.heightMm' },
    { name: 'a negative roll length', body: { ...vinylRoll, lengthMm: -1 }, field: 'body.lengthMm' },
    { name: 'a sheet without a height', body: { kind: 'sheet', name: 'No height', widthMm: 210 }, field: 'body.heightMm' },
    { name: 'an unknown kind', body: { ...a4Sheets, kind: 'stack' }, field: 'body.kind' },
    { name: 'a negative margin', body: { ...a4Sheets, margins: { topMm: -1 } }, field: 'body.margins.topMm' },
    { name: 'a negative price', body: { ...a4Sheets, price: -0.5 }, field: 'body.price' },
    { name: 'a fractional quantity', body: { ...a4Sheets, quantityOnHand: 2.5 }, field: 'body.quantityOnHand' },
    { name: 'an empty name', body: { ...a4Sheets, name: '  ' }, field: 'body.name' },
    { name: 'a width beyond 100 m', body: { ...vinylRoll, widthMm: 200_000 }, field: 'body.widthMm' },
  ]

  for (const { name, body, field } of cases) {
    it(`refuses ${name} with 400 naming ${field}`, async () => {
      const response = await api().post(stockUrl(owner.workspace.id)).set(bearer(owner.accessToken)).send(body as object)
      expect(response.status).toBe(400)
      const { error } = apiErrorSchema.parse(response.body)
      expect(error.code).toBe('validation_failed')
      expect(Object.keys(error.fields ?? {})).toContain(field)
    })
  }

  it('refuses a bad id and a bad page', async () => {
    const badId = await api().get(`${stockUrl(owner.workspace.id)}/not-an-id`).set(bearer(owner.accessToken)).expect(400)
    expect(badId.body.error.fields).toHaveProperty(['params.stockId'])
    const badPage = await api().get(stockUrl(owner.workspace.id)).query({ page: 0 }).set(bearer(owner.accessToken)).expect(400)
    expect(badPage.body.error.fields).toHaveProperty(['query.page'])
  })
})

describe('who may do what with stock', () => {
  let owner: SignedUpUser
  let makerToken: string
  let viewerToken: string
  let outsiderToken: string
  let itemUrl: string

  beforeAll(async () => {
    owner = await signUp('stock-roles')
    ;[makerToken, viewerToken, outsiderToken] = await Promise.all([
      addMember(owner, 'maker').then((member) => member.accessToken),
      addMember(owner, 'viewer').then((member) => member.accessToken),
      signUp('stock-outsider').then((outsider) => outsider.accessToken),
    ])
    const created = await api().post(stockUrl(owner.workspace.id)).set(bearer(owner.accessToken)).send(a4Sheets).expect(201)
    itemUrl = `${stockUrl(owner.workspace.id)}/${created.body.id}`
  })

  it('lets a maker add, change and delete stock', async () => {
    const created = await api().post(stockUrl(owner.workspace.id)).set(bearer(makerToken)).send(vinylRoll).expect(201)
    const url = `${stockUrl(owner.workspace.id)}/${created.body.id}`
    await api().patch(url).set(bearer(makerToken)).send({ quantityOnHand: 3 }).expect(200)
    await api().delete(url).set(bearer(makerToken)).expect(204)
  })

  it('lets a viewer read stock but not change it', async () => {
    await api().get(stockUrl(owner.workspace.id)).set(bearer(viewerToken)).expect(200)
    await api().get(itemUrl).set(bearer(viewerToken)).expect(200)
    await api().post(stockUrl(owner.workspace.id)).set(bearer(viewerToken)).send(vinylRoll).expect(403)
    await api().patch(itemUrl).set(bearer(viewerToken)).send({ quantityOnHand: 0 }).expect(403)
    await api().delete(itemUrl).set(bearer(viewerToken)).expect(403)
  })

  it("hides another workspace's stock from a non-member (404 everywhere)", async () => {
    await api().get(stockUrl(owner.workspace.id)).set(bearer(outsiderToken)).expect(404)
    await api().get(itemUrl).set(bearer(outsiderToken)).expect(404)
    await api().post(stockUrl(owner.workspace.id)).set(bearer(outsiderToken)).send(vinylRoll).expect(404)
    await api().patch(itemUrl).set(bearer(outsiderToken)).send({ quantityOnHand: 0 }).expect(404)
    await api().delete(itemUrl).set(bearer(outsiderToken)).expect(404)
    const stillThere = await api().get(itemUrl).set(bearer(owner.accessToken)).expect(200)
    expect(stillThere.body.quantityOnHand).toBe(40)
  })

  it('asks for sign-in without a token', async () => {
    await api().get(stockUrl(owner.workspace.id)).expect(401)
  })
})
