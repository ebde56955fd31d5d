import { randomUUID } from 'node:crypto'
import { beforeAll, describe, expect, it } from 'vitest'
import { layoutDetailSchema, layoutListResponseSchema, type CreateLayoutRequest, type LayoutDetail } from '../../shared/schemas/layouts.js'
import { addMember, api, bearer, signUp, type SignedUpUser } from './helpers.js'

// Expected figures are worked out by hand (elementary geometry: rectangle area = width × height, a hole subtracts
// its area and adds its perimeter; utilisation = piece area / used stock area, as the layout contract defines it).

const svg = (body: string) => `<svg xmlns="http://www.w3.org/2000/svg" width="100mm" height="100mm" viewBox="0 0 100 100">${body}</svg>`

async function uploadDesign(owner: SignedUpUser, filename: string, body: string): Promise<{ id: string; areaMm2: number; cutLengthMm: number }> {
  const response = await api()
    .post(`/api/workspaces/${owner.workspace.id}/designs`)
    .set(bearer(owner.accessToken))
    .attach('files', Buffer.from(svg(body)), { filename, contentType: 'image/svg+xml' })
    .expect(201)
  return response.body.designs[0]
}

const layoutsUrl = (owner: SignedUpUser) => `/api/workspaces/${owner.workspace.id}/layouts`

const placement = (designId: string, xMm: number, yMm: number, extra: Record<string, unknown> = {}) => ({
  id: randomUUID(),
  designId,
  pieceIndex: 0,
  sheet: 0,
  xMm,
  yMm,
  angleDeg: 0,
  ...extra,
})

/** The worked example of the layout issue: two 50 × 50 mm squares side by side on one 100 × 100 mm sheet, no margin. */
function twoSquares(squareId: string, name = 'Two squares'): CreateLayoutRequest {
  return {
    name,
    stock: { kind: 'sheets', widthMm: 100, heightMm: 100, sheetCount: 1 },
    items: [{ designId: squareId, quantity: 2 }],
    placements: [placement(squareId, 0, 0), placement(squareId, 50, 0)],
    options: { spacingMm: 0, marginMm: 0 },
  }
}

async function createLayout(owner: SignedUpUser, body: object): Promise<LayoutDetail> {
  const response = await api().post(layoutsUrl(owner)).set(bearer(owner.accessToken)).send(body)
  if (response.status !== 201) throw new Error(`create failed: ${response.status} ${JSON.stringify(response.body)}`)
  return layoutDetailSchema.parse(response.body)
}

describe('saving layouts with server-computed figures', () => {
  let owner: SignedUpUser
  let squareId: string
  let frameId: string

  beforeAll(async () => {
    owner = await signUp('layouter')
    squareId = (await uploadDesign(owner, 'square.svg', '<rect x="0" y="0" width="50" height="50"/>')).id
    // 40 × 40 mm with a 20 × 20 mm window (even-odd): area 1600 − 400 = 1200 mm², cut length 160 + 80 = 240 mm.
    frameId = (await uploadDesign(owner, 'frame.svg', '<path fill-rule="evenodd" d="M0 0H40V40H0Z M10 10H30V30H10Z"/>')).id
  })

  it('creates a layout whose figures the server works out: two 50 × 50 mm squares on a 100 × 100 mm sheet use 50 %', async () => {
    const response = await api().post(layoutsUrl(owner)).set(bearer(owner.accessToken)).send(twoSquares(squareId)).expect(201)
    const created = layoutDetailSchema.parse(response.body)
    expect(response.headers.location).toBe(`${layoutsUrl(owner)}/${created.id}`)
    expect(created.version).toBe(1)
    expect(created.isTemplate).toBe(false)
    expect(created.designIds).toEqual([squareId])
    expect(created.updatedByName).toBe('Test layouter')
    expect(created.figures).toEqual({
      utilisation: 0.5,
      perSheetUtilisation: [0.5],
      pieceAreaMm2: 5000,
      usedStockAreaMm2: 10_000,
      wasteAreaMm2: 5000,
      cutLengthMm: 400,
      sheetsUsed: 1,
      usedLengthMm: 0,
      placedCount: 2,
      wantedCount: 2,
    })

    const read = layoutDetailSchema.parse((await api().get(`${layoutsUrl(owner)}/${created.id}`).set(bearer(owner.accessToken)).expect(200)).body)
    expect(read).toEqual(created)
    expect(read.placements.map((entry) => [entry.xMm, entry.yMm, entry.mirrored, entry.locked])).toEqual([
      [0, 0, false, false],
      [50, 0, false, false],
    ])
  })

  it('ignores figures sent by the client', async () => {
    const forged = { ...twoSquares(squareId, 'Forged figures'), figures: { utilisation: 0.99, pieceAreaMm2: 1, cutLengthMm: 1, placedCount: 99 } }
    const created = await createLayout(owner, forged)
    expect(created.figures.utilisation).toBe(0.5)
    expect(created.figures.pieceAreaMm2).toBe(5000)
    const saved = await api()
      .put(`${layoutsUrl(owner)}/${created.id}`)
      .set(bearer(owner.accessToken))
      .send({ ...forged, version: 1 })
      .expect(200)
    expect(saved.body.figures.utilisation).toBe(0.5)
  })

  it('works out a piece with a hole as outline minus hole and cuts the hole too, turned or mirrored', async () => {
    const created = await createLayout(owner, {
      name: 'Frames',
      stock: { kind: 'sheets', widthMm: 100, heightMm: 100, sheetCount: 1 },
      items: [{ designId: frameId, quantity: 2 }],
      placements: [placement(frameId, 0, 0), placement(frameId, 90, 50, { angleDeg: 90, mirrored: true })],
      options: { marginMm: 0 },
    })
    expect(created.figures.pieceAreaMm2).toBeCloseTo(2400, 6)
    expect(created.figures.utilisation).toBeCloseTo(0.24, 9)
    expect(created.figures.cutLengthMm).toBeCloseTo(480, 6)
  })

  it('measures a roll by the furthest piece plus the margin', async () => {
    // Squares at x = 0 and x = 50 end at 100 mm; with a 5 mm margin 105 mm of a 300 mm wide roll are used.
    const created = await createLayout(owner, {
      name: 'On the roll',
      stock: { kind: 'roll', widthMm: 300, lengthMm: 1000 },
      items: [{ designId: squareId, quantity: 2 }],
      placements: [placement(squareId, 0, 0), placement(squareId, 50, 100)],
      options: { marginMm: 5 },
    })
    expect(created.figures.usedLengthMm).toBe(105)
    expect(created.figures.usedStockAreaMm2).toBe(31_500)
    expect(created.figures.utilisation).toBeCloseTo(5000 / 31_500, 12)
    expect(created.figures.sheetsUsed).toBe(0)
  })

  it('saves with the version it edited, moves the version on and recomputes the figures', async () => {
    const created = await createLayout(owner, twoSquares(squareId, 'To be moved'))
    const moved = {
      ...twoSquares(squareId, 'Moved apart'),
      stock: { kind: 'sheets', widthMm: 100, heightMm: 100, sheetCount: 2 },
      placements: [created.placements[0], { ...created.placements[1], sheet: 1 }],
      version: 1,
    }
    const response = await api().put(`${layoutsUrl(owner)}/${created.id}`).set(bearer(owner.accessToken)).send(moved).expect(200)
    const saved = layoutDetailSchema.parse(response.body)
    expect(saved.version).toBe(2)
    expect(saved.name).toBe('Moved apart')
    // 5000 mm² over two whole sheets of 10 000 mm².
    expect(saved.figures.utilisation).toBe(0.25)
    expect(saved.figures.perSheetUtilisation).toEqual([0.25, 0.25])
    expect(saved.figures.sheetsUsed).toBe(2)
    expect(saved.createdAt).toBe(created.createdAt)
  })

  it('refuses a save based on an older version with 409 and overwrites nothing', async () => {
    const created = await createLayout(owner, twoSquares(squareId, 'Contested'))
    const url = `${layoutsUrl(owner)}/${created.id}`
    await api()
      .put(url)
      .set(bearer(owner.accessToken))
      .send({ ...twoSquares(squareId, 'First save wins'), version: 1 })
      .expect(200)

    const stale = await api()
      .put(url)
      .set(bearer(owner.accessToken))
      .send({ ...twoSquares(squareId, 'Second save loses'), placements: [placement(squareId, 0, 0)], version: 1 })
      .expect(409)
    expect(stale.body.error.code).toBe('layout_version_conflict')
    expect(stale.body.error.details).toMatchObject({ currentVersion: 2, updatedByName: 'Test layouter' })
    expect(typeof stale.body.error.details.updatedAt).toBe('string')
    expect(stale.body.error.message).toMatch(/version 2/)

    const stored = layoutDetailSchema.parse((await api().get(url).set(bearer(owner.accessToken)).expect(200)).body)
    expect(stored.name).toBe('First save wins')
    expect(stored.version).toBe(2)
    expect(stored.placements).toHaveLength(2)
  })

  it('lets exactly one of two saves based on the same version through', async () => {
    const created = await createLayout(owner, twoSquares(squareId, 'Raced'))
    const url = `${layoutsUrl(owner)}/${created.id}`
    const saves = await Promise.all(
      ['Racer A', 'Racer B'].map((name) =>
        api()
          .put(url)
          .set(bearer(owner.accessToken))
          .send({ ...twoSquares(squareId, name), version: 1 }),
      ),
    )
    expect(saves.map((save) => save.status).sort()).toEqual([200, 409])
    const stored = (await api().get(url).set(bearer(owner.accessToken)).expect(200)).body
    expect(stored.version).toBe(2)
    expect(stored.name).toBe(saves.find((save) => save.status === 200)!.body.name)
  })

  it('refuses bad input with 400 naming the fields', async () => {
    const response = await api()
      .post(layoutsUrl(owner))
      .set(bearer(owner.accessToken))
      .send({
        name: ' ',
        stock: { kind: 'sheets', widthMm: -1, heightMm: 100, sheetCount: 0 },
        items: [{ designId: 'not-an-id', quantity: 0 }],
        placements: [{ ...placement(squareId, 0, 0), sheet: -1 }],
        options: { marginMm: -2 },
      })
      .expect(400)
    expect(response.body.error.code).toBe('validation_failed')
    expect(Object.keys(response.body.error.fields)).toEqual(
      expect.arrayContaining([
        'body.name',
        'body.stock.widthMm',
        'body.stock.sheetCount',
        'body.items.0.designId',
        'body.items.0.quantity',
        'body.placements.0.sheet',
        'body.options.marginMm',
      ]),
    )

    const created = await createLayout(owner, twoSquares(squareId, 'Needs a version'))
    const withoutVersion = await api().put(`${layoutsUrl(owner)}/${created.id}`).set(bearer(owner.accessToken)).send(twoSquares(squareId)).expect(400)
    expect(withoutVersion.body.error.fields).toHaveProperty(['body.version'])

    await api().get(`${layoutsUrl(owner)}/not-an-id`).set(bearer(owner.accessToken)).expect(400)
    await api().get(`${layoutsUrl(owner)}?templates=sometimes`).set(bearer(owner.accessToken)).expect(400)
  })

  it('refuses designs that are not in the workspace, naming the item or placement', async () => {
    const outsider = await signUp('other-studio')
    const foreignId = (await uploadDesign(outsider, 'foreign.svg', '<rect width="10" height="10"/>')).id
    for (const designId of [randomUUID(), foreignId]) {
      const response = await api()
        .post(layoutsUrl(owner))
        .set(bearer(owner.accessToken))
        .send({ ...twoSquares(squareId), items: [{ designId: squareId, quantity: 2 }, { designId, quantity: 1 }], placements: [placement(squareId, 0, 0), placement(designId, 50, 50)] })
        .expect(400)
      expect(response.body.error.fields).toEqual({
        'body.items.1.designId': ['No such design in this workspace'],
        'body.placements.1.designId': ['No such design in this workspace'],
      })
    }
  })

  it('refuses placements that do not fit the layout: missing sheet, design not among the items, no such piece, repeated id', async () => {
    const base = twoSquares(squareId)
    const cases: [unknown[], string][] = [
      [[placement(squareId, 0, 0), placement(squareId, 0, 0, { sheet: 1 })], 'body.placements.1.sheet'],
      [[placement(frameId, 0, 0)], 'body.placements.0.designId'],
      [[placement(squareId, 0, 0, { pieceIndex: 1 })], 'body.placements.0.pieceIndex'],
      [[placement(squareId, 0, 0, { id: 'same' }), placement(squareId, 50, 0, { id: 'same' })], 'body.placements.1.id'],
    ]
    for (const [placements, field] of cases) {
      const response = await api()
        .post(layoutsUrl(owner))
        .set(bearer(owner.accessToken))
        .send({ ...base, placements })
        .expect(400)
      expect(Object.keys(response.body.error.fields)).toEqual([field])
      expect(response.body.error.message).toContain(field)
    }
    const roll = await api()
      .post(layoutsUrl(owner))
      .set(bearer(owner.accessToken))
      .send({ ...base, stock: { kind: 'roll', widthMm: 300, lengthMm: 500 }, placements: [placement(squareId, 0, 0, { sheet: 1 })] })
      .expect(400)
    expect(roll.body.error.fields['body.placements.0.sheet']).toEqual(['A roll is one piece of stock: use sheet 0'])
    const zone = await api()
      .post(layoutsUrl(owner))
      .set(bearer(owner.accessToken))
      .send({ ...base, options: { excludedZones: [{ sheet: 3, outline: [[0, 0], [10, 0], [10, 10]] }] } })
      .expect(400)
    expect(Object.keys(zone.body.error.fields)).toEqual(['body.options.excludedZones.0.sheet'])
  })

  it('takes a layout of 5000 placed pieces, larger than other request bodies may be', async () => {
    const placements = Array.from({ length: 5000 }, (_, index) =>
      // As the editor sends them: every flag spelled out, positions from dragging carry many digits.
      placement(squareId, (index % 20) * 50 + 0.123456789012, Math.floor(index / 20) * 50 + 0.987654321098, {
        id: `piece-${String(index).padStart(58, '0')}`,
        sheet: Math.floor(index / 25) % 200,
        mirrored: false,
        locked: false,
      }),
    )
    const body = { name: 'Full house', stock: { kind: 'sheets', widthMm: 1000, heightMm: 1000, sheetCount: 200 }, items: [{ designId: squareId, quantity: 2000 }], placements, options: {} }
    expect(JSON.stringify(body).length).toBeGreaterThan(1024 * 1024)
    const created = await createLayout(owner, body)
    expect(created.figures.placedCount).toBe(5000)
    expect(created.figures.sheetsUsed).toBe(200)
  })

  it('deletes a layout, after which it is not found', async () => {
    const created = await createLayout(owner, twoSquares(squareId, 'Short-lived'))
    await api().delete(`${layoutsUrl(owner)}/${created.id}`).set(bearer(owner.accessToken)).expect(204)
    await api().get(`${layoutsUrl(owner)}/${created.id}`).set(bearer(owner.accessToken)).expect(404)
    await api().delete(`${layoutsUrl(owner)}/${created.id}`).set(bearer(owner.accessToken)).expect(404)
    await api()
      .put(`${layoutsUrl(owner)}/${created.id}`)
      .set(bearer(owner.accessToken))
      .send({ ...twoSquares(squareId), version: 1 })
      .expect(404)
  })
})

describe('listing layouts and templates', () => {
  let owner: SignedUpUser
  let squareId: string
  let frameId: string

  beforeAll(async () => {
    owner = await signUp('templater')
    squareId = (await uploadDesign(owner, 'square.svg', '<rect x="0" y="0" width="50" height="50"/>')).id
    frameId = (await uploadDesign(owner, 'frame.svg', '<path fill-rule="evenodd" d="M0 0H40V40H0Z M10 10H30V30H10Z"/>')).id
  })

  const list = async (query: string) => layoutListResponseSchema.parse((await api().get(`${layoutsUrl(owner)}${query}`).set(bearer(owner.accessToken)).expect(200)).body)

  it('saves a layout as a template, lists templates apart, starts a new layout from one and duplicates', async () => {
    const layout = await createLayout(owner, twoSquares(squareId, 'Coaster sheet'))

    const asTemplate = await api().post(`${layoutsUrl(owner)}/${layout.id}/copy`).set(bearer(owner.accessToken)).send({ isTemplate: true }).expect(201)
    const template = layoutDetailSchema.parse(asTemplate.body)
    expect(asTemplate.headers.location).toBe(`${layoutsUrl(owner)}/${template.id}`)
    expect(template).toMatchObject({ name: 'Coaster sheet', isTemplate: true, version: 1 })
    expect(template.id).not.toBe(layout.id)
    expect(template.placements).toEqual(layout.placements)
    expect(template.figures).toEqual(layout.figures)

    expect((await list('?templates=only')).items.map((entry) => entry.id)).toEqual([template.id])
    expect((await list('')).items.map((entry) => entry.id)).toEqual([layout.id])
    expect((await list('?templates=include')).items.map((entry) => entry.id)).toEqual([template.id, layout.id])

    const fromTemplate = layoutDetailSchema.parse(
      (await api().post(`${layoutsUrl(owner)}/${template.id}/copy`).set(bearer(owner.accessToken)).send({ name: 'Order 1042' }).expect(201)).body,
    )
    expect(fromTemplate).toMatchObject({ name: 'Order 1042', isTemplate: false, version: 1 })
    expect(fromTemplate.figures.utilisation).toBe(0.5)
    expect(fromTemplate.items).toEqual(template.items)

    const duplicate = layoutDetailSchema.parse((await api().post(`${layoutsUrl(owner)}/${layout.id}/copy`).set(bearer(owner.accessToken)).send({}).expect(201)).body)
    expect(duplicate).toMatchObject({ name: 'Coaster sheet (copy)', isTemplate: false, version: 1 })

    // A save that leaves the flag out keeps the layout a template.
    const resaved = await api()
      .put(`${layoutsUrl(owner)}/${template.id}`)
      .set(bearer(owner.accessToken))
      .send({ ...twoSquares(squareId, 'Coaster sheet'), version: 1 })
      .expect(200)
    expect(resaved.body.isTemplate).toBe(true)

    await api().delete(`${layoutsUrl(owner)}/${template.id}`).set(bearer(owner.accessToken)).expect(204)
    expect((await list('?templates=only')).items).toEqual([])
  })

  it('finds layouts by part of the name and pages through them newest first', async () => {
    const names = ['Felt run A', 'Felt run B', 'Felt run C']
    for (const name of names) await createLayout(owner, twoSquares(squareId, name))
    const found = await list('?search=felt%20RUN')
    expect(found.total).toBe(3)
    expect(found.items.map((entry) => entry.name)).toEqual(['Felt run C', 'Felt run B', 'Felt run A'])
    const second = await list('?search=felt&pageSize=2&page=2')
    expect(second).toMatchObject({ total: 3, page: 2, pageSize: 2 })
    expect(second.items.map((entry) => entry.name)).toEqual(['Felt run A'])
    expect((await list('?search=100%25')).items).toEqual([])
  })

  it('leaves designs deleted since out of a copy', async () => {
    const layout = await createLayout(owner, {
      ...twoSquares(squareId, 'Square and frame'),
      items: [
        { designId: squareId, quantity: 1 },
        { designId: frameId, quantity: 1 },
      ],
      placements: [placement(squareId, 0, 0), placement(frameId, 50, 50)],
    })
    await api().delete(`/api/workspaces/${owner.workspace.id}/designs/${frameId}`).set(bearer(owner.accessToken)).expect(204)
    const copy = layoutDetailSchema.parse((await api().post(`${layoutsUrl(owner)}/${layout.id}/copy`).set(bearer(owner.accessToken)).send({}).expect(201)).body)
    expect(copy.designIds).toEqual([squareId])
    expect(copy.placements).toHaveLength(1)
    expect(copy.figures.pieceAreaMm2).toBe(2500)
    // The original still opens with the figures of its last save.
    const original = (await api().get(`${layoutsUrl(owner)}/${layout.id}`).set(bearer(owner.accessToken)).expect(200)).body
    expect(original.figures.pieceAreaMm2).toBeCloseTo(3700, 6)
  })
})

describe('who may do what with layouts', () => {
  let owner: SignedUpUser
  let squareId: string
  let layout: LayoutDetail
  let viewerToken: string
  let makerToken: string

  beforeAll(async () => {
    owner = await signUp('layout-owner')
    squareId = (await uploadDesign(owner, 'square.svg', '<rect x="0" y="0" width="50" height="50"/>')).id
    layout = await createLayout(owner, twoSquares(squareId, 'Shared sheet'))
    viewerToken = (await addMember(owner, 'viewer')).accessToken
    makerToken = (await addMember(owner, 'maker')).accessToken
  })

  it('lets a viewer read layouts but not create, save, copy or delete them', async () => {
    const listed = await api().get(layoutsUrl(owner)).set(bearer(viewerToken)).expect(200)
    expect(listed.body.items.map((entry: { id: string }) => entry.id)).toContain(layout.id)
    await api().get(`${layoutsUrl(owner)}/${layout.id}`).set(bearer(viewerToken)).expect(200)
    const refused = [
      await api().post(layoutsUrl(owner)).set(bearer(viewerToken)).send(twoSquares(squareId)),
      await api()
        .put(`${layoutsUrl(owner)}/${layout.id}`)
        .set(bearer(viewerToken))
        .send({ ...twoSquares(squareId), version: layout.version }),
      await api().post(`${layoutsUrl(owner)}/${layout.id}/copy`).set(bearer(viewerToken)).send({ isTemplate: true }),
      await api().delete(`${layoutsUrl(owner)}/${layout.id}`).set(bearer(viewerToken)),
    ]
    expect(refused.map((response) => response.status)).toEqual([403, 403, 403, 403])
    expect(refused[0]!.body.error.code).toBe('forbidden')
    const unchanged = (await api().get(`${layoutsUrl(owner)}/${layout.id}`).set(bearer(owner.accessToken)).expect(200)).body
    expect(unchanged.version).toBe(layout.version)
  })

  it('lets a maker create, save and delete layouts; the save records who saved', async () => {
    const created = await createLayout({ ...owner, accessToken: makerToken }, twoSquares(squareId, 'Maker sheet'))
    const saved = await api()
      .put(`${layoutsUrl(owner)}/${layout.id}`)
      .set(bearer(makerToken))
      .send({ ...twoSquares(squareId, 'Shared sheet, tidied'), version: layout.version })
      .expect(200)
    expect(saved.body.updatedByName).toBe('Test maker')
    await api().delete(`${layoutsUrl(owner)}/${created.id}`).set(bearer(makerToken)).expect(204)
  })

  it("hides another workspace's layouts from a non-member (404 everywhere)", async () => {
    const outsider = await signUp('layout-outsider')
    const base = layoutsUrl(owner)
    const answers = [
      await api().get(base).set(bearer(outsider.accessToken)),
      await api().post(base).set(bearer(outsider.accessToken)).send(twoSquares(squareId)),
      await api().get(`${base}/${layout.id}`).set(bearer(outsider.accessToken)),
      await api()
        .put(`${base}/${layout.id}`)
        .set(bearer(outsider.accessToken))
        .send({ ...twoSquares(squareId), version: 1 }),
      await api().post(`${base}/${layout.id}/copy`).set(bearer(outsider.accessToken)).send({}),
      await api().delete(`${base}/${layout.id}`).set(bearer(outsider.accessToken)),
    ]
    expect(answers.map((response) => response.status)).toEqual([404, 404, 404, 404, 404, 404])
    // The layout id under the outsider's own workspace is not found either.
    await api().get(`${layoutsUrl(outsider)}/${layout.id}`).set(bearer(outsider.accessToken)).expect(404)
  })

  it('asks for sign-in without a token', async () => {
    await api().get(layoutsUrl(owner)).expect(401)
  })
})
