import { readFileSync } from 'node:fs'
import { createServer, type Server } from 'node:http'
import type { AddressInfo } from 'node:net'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { apiErrorSchema } from '../../shared/schemas/error.js'
import { designDetailSchema, designListResponseSchema, uploadDesignsResponseSchema, type DesignSummary } from '../../shared/schemas/designs.js'
import { addMember, api, bearer, signUp, type SignedUpUser } from './helpers.js'

interface UploadFile {
  filename: string
  content: string | Buffer
  contentType?: string
}

const designsUrl = (workspaceId: string) => `/api/workspaces/${workspaceId}/designs`

/** POST of a multipart upload: text fields first, then every file in the field `files`. */
function upload(token: string, workspaceId: string, files: UploadFile[], fields: Record<string, string> = {}) {
  const call = api().post(designsUrl(workspaceId)).set(bearer(token))
  for (const [name, value] of Object.entries(fields)) call.field(name, value)
  for (const file of files) {
    call.attach('files', Buffer.isBuffer(file.content) ? file.content : Buffer.from(file.content), { filename: file.filename, contentType: file.contentType ?? 'image/svg+xml' })
  }
  return call
}

/** The downloaded original as text, whatever its content type. */
function downloadOriginal(token: string, workspaceId: string, designId: string) {
  return api()
    .get(`${designsUrl(workspaceId)}/${designId}/original`)
    .set(bearer(token))
    .buffer(true)
    .parse((response, done) => {
      let text = ''
      response.setEncoding('utf8')
      response.on('data', (chunk: string) => (text += chunk))
      response.on('end', () => done(null, text))
    })
}

async function listTotal(token: string, workspaceId: string): Promise<number> {
  const response = await api().get(designsUrl(workspaceId)).set(bearer(token)).expect(200)
  return designListResponseSchema.parse(response.body).total
}

const svgDocument = (body: string, size = 'width="50mm" height="50mm" viewBox="0 0 50 50"') => `<svg xmlns="http://www.w3.org/2000/svg" ${size}>${body}</svg>`

/** A 40 mm disc with a 10 mm hole in its centre, on a 50 mm square page (1 user unit = 1 mm). */
const ringSvg = svgDocument('<circle cx="25" cy="25" r="20"/><circle cx="25" cy="25" r="5"/>')
const fixture = (name: string) => readFileSync(new URL(`../../fixtures/designs/${name}`, import.meta.url))

const relativeError = (actual: number, expected: number) => Math.abs(actual - expected) / Math.abs(expected)

describe('uploading designs', () => {
  let owner: SignedUpUser

  beforeAll(async () => {
    owner = await signUp('designs-upload')
  })

  it('measures one uploaded file: a 40 mm disc with a 10 mm hole', async () => {
    const response = await upload(owner.accessToken, owner.workspace.id, [{ filename: 'ring-40.svg', content: ringSvg }])

    expect(response.status).toBe(201)
    const body = uploadDesignsResponseSchema.parse(response.body)
    expect(body.rejected).toEqual([])
    const [design] = body.designs
    expect(design).toMatchObject({ name: 'ring-40', originalFilename: 'ring-40.svg', widthMm: 50, heightMm: 50, pieceCount: 1, holeCount: 1, cutLineCount: 0, tags: [] })
    // Area of an annulus π(R² − r²) and the two circumferences 2π(R + r): elementary geometry.
    expect(relativeError(design!.areaMm2, Math.PI * (20 ** 2 - 5 ** 2))).toBeLessThan(1e-6)
    expect(relativeError(design!.cutLengthMm, 2 * Math.PI * (20 + 5))).toBeLessThan(1e-6)
    // The outline is flattened within the default 0.02 mm tolerance, so its box is within that of the true 5…45 mm.
    for (const [actual, expected] of [
      [design!.bbox.minX, 5],
      [design!.bbox.minY, 5],
      [design!.bbox.maxX, 45],
      [design!.bbox.maxY, 45],
    ] as const) {
      expect(Math.abs(actual - expected)).toBeLessThanOrEqual(0.02)
    }
  })

  it('measures several files sent at once, each in its own units', async () => {
    const response = await upload(owner.accessToken, owner.workspace.id, [
      { filename: 'card-30x20.svg', content: svgDocument('<rect width="30" height="20"/>', 'width="30mm" height="20mm" viewBox="0 0 30 20"') },
      { filename: 'inch-square.svg', content: svgDocument('<rect width="96" height="96"/>', 'width="1in" height="1in" viewBox="0 0 96 96"') },
      { filename: 'gift-tag.svg', content: fixture('gift-tag.svg') },
    ])

    expect(response.status).toBe(201)
    const { designs, rejected } = uploadDesignsResponseSchema.parse(response.body)
    expect(rejected).toEqual([])
    const byFile = Object.fromEntries(designs.map((design) => [design.originalFilename, design])) as Record<string, DesignSummary>
    // Rectangle: area w·h and perimeter 2(w + h), elementary geometry.
    expect(relativeError(byFile['card-30x20.svg']!.areaMm2, 30 * 20)).toBeLessThan(1e-9)
    expect(relativeError(byFile['card-30x20.svg']!.cutLengthMm, 2 * (30 + 20))).toBeLessThan(1e-9)
    // 1in = 96px = 25.4mm: W3C CSS Values and Units Level 3, §5.2 absolute lengths.
    expect(relativeError(byFile['inch-square.svg']!.widthMm, 25.4)).toBeLessThan(1e-9)
    expect(relativeError(byFile['inch-square.svg']!.areaMm2, 25.4 ** 2)).toBeLessThan(1e-9)
    // The demo gift tag as drawn: 90 × 50 mm, two string holes and one 42 mm fold line (84 user units of 0.5 mm).
    expect(byFile['gift-tag.svg']).toMatchObject({ widthMm: 90, heightMm: 50, pieceCount: 1, holeCount: 2, cutLineCount: 1 })
  })

  it('applies the tolerance sent with the files', async () => {
    const response = await upload(owner.accessToken, owner.workspace.id, [{ filename: 'coarse-ring.svg', content: ringSvg }], { toleranceMm: '0.5' })
    expect(response.status).toBe(201)
    expect(response.body.designs[0].toleranceMm).toBe(0.5)
  })

  it('rejects an unusable tolerance, naming the field, and stores nothing', async () => {
    const before = await listTotal(owner.accessToken, owner.workspace.id)
    for (const toleranceMm of ['abc', '5', '0']) {
      const response = await upload(owner.accessToken, owner.workspace.id, [{ filename: 'ring.svg', content: ringSvg }], { toleranceMm })
      expect(response.status).toBe(400)
      expect(response.body.error.fields).toHaveProperty(['body.toleranceMm'])
    }
    expect(await listTotal(owner.accessToken, owner.workspace.id)).toBe(before)
  })

  it('stores the good files of a mixed upload and lists the bad one by name', async () => {
    const before = await listTotal(owner.accessToken, owner.workspace.id)
    const response = await upload(owner.accessToken, owner.workspace.id, [
      { filename: 'good.svg', content: ringSvg },
      { filename: 'broken.svg', content: '<svg xmlns="http://www.w3.org/2000/svg"><rect width="5" height="5"></svg>' },
    ])

    expect(response.status).toBe(201)
    const body = uploadDesignsResponseSchema.parse(response.body)
    expect(body.designs.map((design) => design.originalFilename)).toEqual(['good.svg'])
    expect(body.rejected).toEqual([{ filename: 'broken.svg', code: 'malformed_xml', message: expect.stringMatching(/not well-formed XML/) }])
    expect(await listTotal(owner.accessToken, owner.workspace.id)).toBe(before + 1)
  })

  it('accepts a <use> of another file with a warning and fetches nothing', async () => {
    let requestsReceived = 0
    const bait: Server = createServer((_request, response) => {
      requestsReceived += 1
      response.end('<svg xmlns="http://www.w3.org/2000/svg"><rect id="a" width="10" height="10"/></svg>')
    })
    await new Promise<void>((resolve) => bait.listen(0, '127.0.0.1', resolve))
    const externalUrl = `http://127.0.0.1:${(bait.address() as AddressInfo).port}/shapes.svg#a`
    try {
      const response = await upload(owner.accessToken, owner.workspace.id, [
        { filename: 'linked.svg', content: svgDocument(`<use href="${externalUrl}"/><circle cx="25" cy="25" r="10"/>`) },
      ])

      expect(response.status).toBe(201)
      const design = response.body.designs[0] as DesignSummary
      expect(design.warningCount).toBe(1)
      const detail = await api().get(`${designsUrl(owner.workspace.id)}/${design.id}`).set(bearer(owner.accessToken)).expect(200)
      expect(detail.body.warnings).toEqual([expect.objectContaining({ code: 'external_reference', message: expect.stringMatching(/nothing is fetched/) })])
      const original = await downloadOriginal(owner.accessToken, owner.workspace.id, design.id)
      expect(original.body).not.toContain(externalUrl)
      expect(requestsReceived).toBe(0)
    } finally {
      await new Promise<void>((resolve) => bait.close(() => resolve()))
    }
  })
})

describe('reading, changing and removing designs', () => {
  let owner: SignedUpUser
  let workspaceId: string
  const ids: Record<string, string> = {}

  beforeAll(async () => {
    owner = await signUp('designs-library')
    workspaceId = owner.workspace.id
    // One request per file, so each design has its own creation time and the list order is fixed (newest first).
    for (const [file, tags] of [
      ['thistle-sticker.svg', ['sticker', 'vinyl']],
      ['felt-coaster.svg', ['felt']],
      ['keyring-fob.svg', ['leather']],
    ] as const) {
      const response = await upload(owner.accessToken, workspaceId, [{ filename: file, content: fixture(file) }]).expect(201)
      const id = response.body.designs[0].id as string
      await api().patch(`${designsUrl(workspaceId)}/${id}`).set(bearer(owner.accessToken)).send({ tags }).expect(200)
      ids[file] = id
    }
  })

  const list = (query: Record<string, string | number>) => api().get(designsUrl(workspaceId)).query(query).set(bearer(owner.accessToken))

  it('lists designs newest first with every tag of the workspace', async () => {
    const response = await list({})
    expect(response.status).toBe(200)
    const body = designListResponseSchema.parse(response.body)
    expect(body.total).toBe(3)
    expect(body.items.map((item) => item.originalFilename)).toEqual(['keyring-fob.svg', 'felt-coaster.svg', 'thistle-sticker.svg'])
    expect(body.tags).toEqual(['felt', 'leather', 'sticker', 'vinyl'])
  })

  it('finds designs by part of the name or of a tag, and by exact tag', async () => {
    const byName = await list({ search: 'COAST' })
    expect(byName.body.items.map((item: DesignSummary) => item.id)).toEqual([ids['felt-coaster.svg']])
    const byTagText = await list({ search: 'viny' })
    expect(byTagText.body.items.map((item: DesignSummary) => item.id)).toEqual([ids['thistle-sticker.svg']])
    const byTag = await list({ tag: 'leather' })
    expect(byTag.body).toMatchObject({ total: 1, items: [expect.objectContaining({ id: ids['keyring-fob.svg'] })] })
    // LIKE wildcards in the search text are taken literally.
    expect((await list({ search: '%' })).body.total).toBe(0)
    expect((await list({ tag: 'felt', search: 'thistle' })).body.total).toBe(0)
  })

  it('pages through the list without repeating a design', async () => {
    const first = await list({ page: 1, pageSize: 2 })
    const second = await list({ page: 2, pageSize: 2 })
    const third = await list({ page: 3, pageSize: 2 })
    expect(first.body).toMatchObject({ total: 3, page: 1, pageSize: 2 })
    expect(first.body.items).toHaveLength(2)
    expect(second.body.items).toHaveLength(1)
    expect(third.body.items).toHaveLength(0)
    const seen = [...first.body.items, ...second.body.items].map((item: DesignSummary) => item.id)
    expect(new Set(seen).size).toBe(3)
    const badPage = await list({ page: 0, pageSize: 500 })
    expect(badPage.status).toBe(400)
    expect(Object.keys(badPage.body.error.fields).sort()).toEqual(['query.page', 'query.pageSize'])
  })

  it('reads one design with its geometry and warnings', async () => {
    const response = await api().get(`${designsUrl(workspaceId)}/${ids['felt-coaster.svg']}`).set(bearer(owner.accessToken))
    expect(response.status).toBe(200)
    const detail = designDetailSchema.parse(response.body)
    // The coaster as drawn: one disc with 1 + 6 + 12 + 12 holes.
    expect(detail.geometry.pieces).toHaveLength(1)
    expect(detail.geometry.pieces[0]!.holes).toHaveLength(31)
    expect(detail.geometry.pieces[0]!.outline.length).toBeGreaterThan(100)
    expect(detail.createdByName).toBe('Test designs-library')
    expect(detail.warnings).toEqual([])
    // 4in = 101.6mm: W3C CSS Values and Units Level 3, §5.2 absolute lengths.
    expect(relativeError(detail.widthMm, 101.6)).toBeLessThan(1e-9)
  })

  it('renames and tags a design; duplicate tags are kept once', async () => {
    const url = `${designsUrl(workspaceId)}/${ids['thistle-sticker.svg']}`
    const response = await api().patch(url).set(bearer(owner.accessToken)).send({ name: 'Thistle, small', tags: ['sticker', 'gift', 'sticker'], keepTogether: false })
    expect(response.status).toBe(200)
    expect(response.body).toMatchObject({ name: 'Thistle, small', tags: ['sticker', 'gift'], keepTogether: false })
    const reread = await api().get(url).set(bearer(owner.accessToken))
    expect(reread.body).toMatchObject({ name: 'Thistle, small', tags: ['sticker', 'gift'] })

    const nothing = await api().patch(url).set(bearer(owner.accessToken)).send({})
    expect(nothing.status).toBe(400)
    const blank = await api().patch(url).set(bearer(owner.accessToken)).send({ name: '   ', tags: [''] })
    expect(blank.status).toBe(400)
    expect(Object.keys(blank.body.error.fields).sort()).toEqual(['body.name', 'body.tags.0'])
  })

  it('deletes a design, after which it is not found', async () => {
    const url = `${designsUrl(workspaceId)}/${ids['keyring-fob.svg']}`
    await api().delete(url).set(bearer(owner.accessToken)).expect(204)
    await api().get(url).set(bearer(owner.accessToken)).expect(404)
    await api().get(`${url}/original`).set(bearer(owner.accessToken)).expect(404)
    await api().patch(url).set(bearer(owner.accessToken)).send({ name: 'Back again' }).expect(404)
    await api().delete(url).set(bearer(owner.accessToken)).expect(404)
    expect((await list({})).body.total).toBe(2)
  })

  it('answers 404 for an unknown design and 400 for an id that is not one', async () => {
    await api().get(`${designsUrl(workspaceId)}/00000000-0000-4000-8000-000000000000`).set(bearer(owner.accessToken)).expect(404)
    const malformed = await api().get(`${designsUrl(workspaceId)}/not-a-uuid`).set(bearer(owner.accessToken))
    expect(malformed.status).toBe(400)
    expect(malformed.body.error.fields).toHaveProperty(['params.designId'])
  })
})

describe('downloading the original', () => {
  const hostileSvg = [
    '<?xml version="1.0" encoding="UTF-8"?>',
    '<svg xmlns="http://www.w3.org/2000/svg" xmlns:xlink="http://www.w3.org/1999/xlink" width="40mm" height="40mm" viewBox="0 0 40 40" onload="alert(1)">',
    '<script>alert(2)</script>',
    '<rect x="5" y="5" width="30" height="30" onclick="alert(3)" onMouseOver="alert(4)"/>',
    '<a xlink:href="javascript:alert(5)"><circle cx="20" cy="20" r="5"/></a>',
    '<image href="http://example.com/track.png" width="1" height="1"/>',
    '<foreignObject width="10" height="10"><div xmlns="http://www.w3.org/1999/xhtml" onclick="alert(6)">hi</div></foreignObject>',
    '</svg>',
  ].join('\n')

  it('serves the upload without scripts, event attributes or outside references, as an attachment', async () => {
    const owner = await signUp('designs-download')
    const uploaded = await upload(owner.accessToken, owner.workspace.id, [{ filename: 'hostile tag.svg', content: hostileSvg }]).expect(201)
    const response = await downloadOriginal(owner.accessToken, owner.workspace.id, uploaded.body.designs[0].id)

    expect(response.status).toBe(200)
    expect(response.headers['content-type']).toMatch(/^image\/svg\+xml/)
    expect(response.headers['content-disposition']).toMatch(/^attachment; filename="hostile_tag\.svg"/)
    expect(response.headers['content-security-policy']).toContain('sandbox')
    const text = response.body as string
    expect(text).not.toMatch(/<script/i)
    expect(text).not.toMatch(/\son[a-z]+\s*=/i)
    expect(text).not.toMatch(/javascript:/i)
    expect(text).not.toContain('http://example.com')
    expect(text).not.toMatch(/<foreignObject/i)
    // What can be cut is still there.
    expect(text).toContain('<rect x="5" y="5" width="30" height="30"')
  })

  // Markup hidden in a CDATA section must stay text: written back as CDATA, never as live elements.
  it('does not turn a CDATA section into live markup in the download', async () => {
    const owner = await signUp('designs-cdata')
    const svg = svgDocument('<rect width="10" height="10"/><text><![CDATA[</text><script>alert(1)</script><text>]]></text>')
    const uploaded = await upload(owner.accessToken, owner.workspace.id, [{ filename: 'cdata.svg', content: svg }]).expect(201)
    const response = await downloadOriginal(owner.accessToken, owner.workspace.id, uploaded.body.designs[0].id)
    const text = response.body as string
    expect(text).toContain('<![CDATA[')
    expect(text.replace(/<!\[CDATA\[[\s\S]*?\]\]>/g, '')).not.toMatch(/<script/i)
  })

  it('reads an outline drawn twice (a filled and a stroked copy) as one piece', async () => {
    const owner = await signUp('designs-twice')
    const svg = svgDocument('<circle cx="25" cy="25" r="20"/><circle cx="25" cy="25" r="20" fill="none" stroke="#000"/>')
    const uploaded = await upload(owner.accessToken, owner.workspace.id, [{ filename: 'twice.svg', content: svg }]).expect(201)
    expect(uploaded.body.designs[0].pieceCount).toBe(1)
    // Elementary geometry: π·20² mm².
    expect(uploaded.body.designs[0].areaMm2).toBeCloseTo(Math.PI * 400, 6)
  })

  it('refuses a small file that would take the reader too long, while the API keeps answering', async () => {
    const owner = await signUp('designs-heavy')
    // 200 nearly identical stacked squares: tiny as a file, very costly for the boolean step.
    const rects = Array.from({ length: 200 }, (_, index) => `<rect x="${10 + index * 0.001}" y="10" width="20" height="20"/>`).join('')
    const pending = upload(owner.accessToken, owner.workspace.id, [{ filename: 'stack.svg', content: svgDocument(rects) }])
    const health = await api().get('/api/health')
    expect(health.status).toBe(200)
    const response = await pending
    expect(response.status).toBe(400)
    expect(response.body.error.message).toMatch(/too complex/)
    expect(await listTotal(owner.accessToken, owner.workspace.id)).toBe(0)
  })

  it('keeps a file name with letters beyond ASCII', async () => {
    const owner = await signUp('designs-utf8')
    const uploaded = await upload(owner.accessToken, owner.workspace.id, [{ filename: 'Distel ü — Aufkleber.svg', content: ringSvg }]).expect(201)
    expect(uploaded.body.designs[0].originalFilename).toBe('Distel ü — Aufkleber.svg')
  })
})

describe('who may do what with designs', () => {
  let owner: SignedUpUser
  let viewerToken: string
  let outsiderToken: string
  let designId: string
  let designUrl: string

  beforeAll(async () => {
    owner = await signUp('designs-roles')
    viewerToken = (await addMember(owner, 'viewer')).accessToken
    outsiderToken = (await signUp('designs-outsider')).accessToken
    const uploaded = await upload(owner.accessToken, owner.workspace.id, [{ filename: 'shared.svg', content: ringSvg }]).expect(201)
    designId = uploaded.body.designs[0].id
    designUrl = `${designsUrl(owner.workspace.id)}/${designId}`
  })

  it('lets a viewer read designs but not upload, change or delete them', async () => {
    await api().get(designsUrl(owner.workspace.id)).set(bearer(viewerToken)).expect(200)
    await api().get(designUrl).set(bearer(viewerToken)).expect(200)
    expect((await downloadOriginal(viewerToken, owner.workspace.id, designId)).status).toBe(200)

    const uploadAttempt = await upload(viewerToken, owner.workspace.id, [{ filename: 'viewer.svg', content: ringSvg }])
    expect(uploadAttempt.status).toBe(403)
    await api().patch(designUrl).set(bearer(viewerToken)).send({ name: 'Mine now' }).expect(403)
    await api().delete(designUrl).set(bearer(viewerToken)).expect(403)
    expect(await listTotal(owner.accessToken, owner.workspace.id)).toBe(1)
    expect((await api().get(designUrl).set(bearer(owner.accessToken))).body.name).toBe('shared')
  })

  it("hides another workspace's designs from a non-member (404 everywhere)", async () => {
    await api().get(designsUrl(owner.workspace.id)).set(bearer(outsiderToken)).expect(404)
    await api().get(designUrl).set(bearer(outsiderToken)).expect(404)
    await api().get(`${designUrl}/original`).set(bearer(outsiderToken)).expect(404)
    expect((await upload(outsiderToken, owner.workspace.id, [{ filename: 'intruder.svg', content: ringSvg }])).status).toBe(404)
    await api().patch(designUrl).set(bearer(outsiderToken)).send({ name: 'Taken' }).expect(404)
    await api().delete(designUrl).set(bearer(outsiderToken)).expect(404)
    expect(await listTotal(owner.accessToken, owner.workspace.id)).toBe(1)
  })

  it('asks for sign-in without a token', async () => {
    await api().get(designsUrl(owner.workspace.id)).expect(401)
  })
})

describe('refusing bad uploads', () => {
  let owner: SignedUpUser

  beforeAll(async () => {
    owner = await signUp('designs-corpus')
  })

  // PNG signature and the start of an IHDR chunk: W3C PNG specification (2nd ed.), §5.2 and §11.2.2.
  const pngBytes = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0x00, 0x00, 0x00, 0x0d, 0x49, 0x48, 0x44, 0x52, 0x00, 0x00, 0x00, 0x10, 0x00, 0x00, 0x00, 0x10, 0x08, 0x06, 0x00, 0x00, 0x00])
  // The classic "billion laughs" entity expansion (XML entity bomb), ten entities per level.
  const laughs = [
    '<?xml version="1.0"?>',
    '<!DOCTYPE svg [',
    '  <!ENTITY lol "lol">',
    ...Array.from({ length: 8 }, (_, level) => `  <!ENTITY lol${level + 2} "${`&lol${level === 0 ? '' : level + 1};`.repeat(10)}">`),
    ']>',
    '<svg xmlns="http://www.w3.org/2000/svg" width="10mm" height="10mm"><text>&lol9;</text><rect width="5" height="5"/></svg>',
  ].join('\n')

  const corpus: { name: string; file: UploadFile; message?: RegExp }[] = [
    { name: "a PNG's bytes named .svg", file: { filename: 'pixels.svg', content: pngBytes }, message: /not SVG text/ },
    { name: 'a text file', file: { filename: 'notes.txt', content: 'cut list: 3 coasters', contentType: 'text/plain' }, message: /Only SVG files/ },
    { name: 'malformed XML', file: { filename: 'unclosed.svg', content: '<svg xmlns="http://www.w3.org/2000/svg"><path d="M0 0 L10 10"></svg>' }, message: /not well-formed XML/ },
    { name: 'an empty file', file: { filename: 'nothing.svg', content: Buffer.alloc(0) }, message: /empty/ },
    { name: 'an empty <svg/>', file: { filename: 'blank.svg', content: '<svg xmlns="http://www.w3.org/2000/svg"/>' }, message: /no outlines/ },
    { name: 'an entity bomb (billion laughs)', file: { filename: 'laughs.svg', content: laughs }, message: /DOCTYPE or ENTITY/ },
    {
      name: 'a DOCTYPE',
      file: {
        filename: 'doctype.svg',
        content: `<?xml version="1.0"?>\n<!DOCTYPE svg PUBLIC "-//W3C//DTD SVG 1.1//EN" "http://www.w3.org/Graphics/SVG/1.1/DTD/svg11.dtd">\n${svgDocument('<rect width="5" height="5"/>')}`,
      },
      message: /DOCTYPE/,
    },
    {
      name: 'an external entity',
      file: { filename: 'xxe.svg', content: `<?xml version="1.0"?>\n<!DOCTYPE svg [<!ENTITY secret SYSTEM "file:///etc/passwd">]>\n${svgDocument('<text>&secret;</text>')}` },
      message: /DOCTYPE or ENTITY/,
    },
    { name: 'an infinite coordinate (1e999)', file: { filename: 'infinite.svg', content: svgDocument('<path d="M0 0 L1e999 0"/>') }, message: /no outlines/ },
    { name: 'a NaN radius', file: { filename: 'nan.svg', content: svgDocument('<circle cx="10" cy="10" r="NaN"/>') }, message: /no outlines/ },
    { name: 'a zero-size viewBox', file: { filename: 'flat.svg', content: svgDocument('<rect width="5" height="5"/>', 'width="50mm" height="50mm" viewBox="0 0 0 0"') }, message: /viewBox/ },
    { name: 'coordinates too large to cut (1e300)', file: { filename: 'huge.svg', content: svgDocument('<rect width="1e300" height="10"/>') }, message: /further than 100 m/ },
  ]

  for (const { name, file, message } of corpus) {
    it(`refuses ${name} with a message naming the file, stores nothing and keeps answering`, async () => {
      const response = await upload(owner.accessToken, owner.workspace.id, [file])

      expect(response.status).toBe(400)
      const { error } = apiErrorSchema.parse(response.body)
      expect(error.message).toContain(file.filename)
      if (message) expect(error.message).toMatch(message)
      expect(error.fields?.['body.files.0']?.[0]).toContain(file.filename)
      expect(await listTotal(owner.accessToken, owner.workspace.id)).toBe(0)
      await api().get('/api/health').expect(200)
    })
  }

  it('names every refused file when none of several can be used', async () => {
    const response = await upload(owner.accessToken, owner.workspace.id, [corpus[0]!.file, corpus[2]!.file])
    expect(response.status).toBe(400)
    expect(response.body.error.message).toMatch(/None of the files/)
    // Keyed by position in the upload (names may repeat or contain dots); each message starts with the file's name.
    expect(response.body.error.fields).toEqual({ 'body.files.0': [expect.stringMatching(/^pixels\.svg: /)], 'body.files.1': [expect.stringMatching(/^unclosed\.svg: /)] })
  })

  it('refuses a file over 10 MB with 413', async () => {
    const padding = `<!--${'x'.repeat(11 * 1024 * 1024)}-->`
    const response = await upload(owner.accessToken, owner.workspace.id, [{ filename: 'large.svg', content: svgDocument(`${padding}<rect width="5" height="5"/>`) }])
    expect(response.status).toBe(413)
    expect(response.body.error.fields).toHaveProperty(['body.files'])
    expect(await listTotal(owner.accessToken, owner.workspace.id)).toBe(0)
    await api().get('/api/health').expect(200)
  })

  it('refuses more than 20 files in one upload', async () => {
    const files = Array.from({ length: 21 }, (_, index) => ({ filename: `copy-${index + 1}.svg`, content: ringSvg }))
    const response = await upload(owner.accessToken, owner.workspace.id, files)
    expect(response.status).toBe(400)
    expect(response.body.error.message).toMatch(/up to 20/i)
    expect(response.body.error.fields).toHaveProperty(['body.files'])
    expect(await listTotal(owner.accessToken, owner.workspace.id)).toBe(0)
  })

  it('refuses a request without files', async () => {
    const fieldsOnly = await upload(owner.accessToken, owner.workspace.id, [], { toleranceMm: '0.02' })
    expect(fieldsOnly.status).toBe(400)
    expect(fieldsOnly.body.error.fields).toHaveProperty(['body.files'])
    const notMultipart = await api().post(designsUrl(owner.workspace.id)).set(bearer(owner.accessToken)).send({ files: [] })
    expect(notMultipart.status).toBe(400)
    expect(notMultipart.body.error.fields).toHaveProperty(['body.files'])
    expect(await listTotal(owner.accessToken, owner.workspace.id)).toBe(0)
  })

  afterAll(async () => {
    // After the whole corpus the server still answers.
    await api().get('/api/health').expect(200)
  })
})
