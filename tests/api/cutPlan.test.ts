import { randomUUID } from 'node:crypto'
import { inflateSync } from 'node:zlib'
import { beforeAll, describe, expect, it } from 'vitest'
import { cutPlanResponseSchema } from '../../shared/schemas/cutplan.js'
import { addMember, api, bearer, signUp, type SignedUpUser } from './helpers.js'

// Reference values by elementary geometry: a square's perimeter is 4 × its side, a hole adds its perimeter.
// HP-GL/2 plotter units: 40 per mm (HP PCL 5 Printer Language Technical Reference Manual, Part II, ch. 17, Table 17-7).

const svg = (body: string) => `<svg xmlns="http://www.w3.org/2000/svg" width="100mm" height="100mm" viewBox="0 0 100 100">${body}</svg>`

async function uploadDesign(owner: SignedUpUser, filename: string, body: string): Promise<string> {
  const response = await api()
    .post(`/api/workspaces/${owner.workspace.id}/designs`)
    .set(bearer(owner.accessToken))
    .attach('files', Buffer.from(svg(body)), { filename, contentType: 'image/svg+xml' })
    .expect(201)
  return response.body.designs[0].id
}

const placement = (designId: string, xMm: number, yMm: number, sheet = 0) => ({ id: randomUUID(), designId, pieceIndex: 0, sheet, xMm, yMm, angleDeg: 0 })

/** Parses a binary answer (PDF) into a Buffer. */
const binary = (response: { on: (event: string, listener: (chunk?: Buffer) => void) => void }, callback: (error: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = []
  response.on('data', (chunk?: Buffer) => chunks.push(chunk!))
  response.on('end', () => callback(null, Buffer.concat(chunks)))
}

/**
 * The text a PDF draws, in order: every deflated content stream's hex strings (how pdfkit writes text in the standard
 * fonts) decoded and joined, so kerning breaks inside a word do not split it.
 */
function pdfText(pdf: Buffer): string {
  const raw = pdf.toString('latin1')
  let text = ''
  for (let start = raw.indexOf('stream\n'); start !== -1; start = raw.indexOf('stream\n', start + 1)) {
    const end = raw.indexOf('endstream', start)
    if (end === -1) break
    let content: string
    try {
      content = inflateSync(pdf.subarray(start + 'stream\n'.length, end)).toString('latin1')
    } catch {
      continue
    }
    for (const match of content.matchAll(/<([0-9a-fA-F]+)>/g)) text += Buffer.from(match[1]!, 'hex').toString('latin1')
    text += '\n'
  }
  return text
}

describe('cut plans and exports of saved layouts', () => {
  let owner: SignedUpUser
  let layoutId: string
  let base: string

  beforeAll(async () => {
    owner = await signUp('cutplanner')
    const squareId = await uploadDesign(owner, 'square.svg', '<rect x="0" y="0" width="50" height="50"/>')
    // 40 × 40 mm with a 20 × 20 mm window: cut length 160 + 80 = 240 mm.
    const frameId = await uploadDesign(owner, 'frame.svg', '<path fill-rule="evenodd" d="M0 0H40V40H0Z M10 10H30V30H10Z"/>')
    const created = await api()
      .post(`/api/workspaces/${owner.workspace.id}/layouts`)
      .set(bearer(owner.accessToken))
      .send({
        name: 'Coasters & tags',
        stock: { kind: 'sheets', widthMm: 200, heightMm: 100, sheetCount: 2 },
        items: [
          { designId: squareId, quantity: 2 },
          { designId: frameId, quantity: 1 },
        ],
        placements: [placement(squareId, 10, 10), placement(frameId, 100, 10), placement(squareId, 10, 10, 1)],
        options: { spacingMm: 0, marginMm: 0 },
      })
      .expect(201)
    layoutId = created.body.id
    base = `/api/workspaces/${owner.workspace.id}/layouts/${layoutId}`
  })

  it('gives cut length, travel, lifts and time per sheet and in total', async () => {
    const response = await api().get(`${base}/cut-plan`).set(bearer(owner.accessToken)).expect(200)
    const plan = cutPlanResponseSchema.parse(response.body)
    expect(plan.layoutName).toBe('Coasters & tags')
    expect(plan.sheets).toHaveLength(2)
    expect(plan.sheets[0]!.cutLengthMm).toBeCloseTo(200 + 240, 6)
    expect(plan.sheets[0]!.contourCount).toBe(3)
    expect(plan.sheets[0]!.lifts).toBe(3)
    expect(plan.sheets[1]!.cutLengthMm).toBeCloseTo(200, 6)
    expect(plan.totals.cutLengthMm).toBeCloseTo(640, 6)
    expect(plan.totals.sheetCount).toBe(2)
    expect(plan.totals.totalTimeS).toBeGreaterThan(0)
    expect(plan.totals.totalTimeS).toBeCloseTo(plan.totals.cutTimeS + plan.totals.travelTimeS + plan.totals.liftTimeS, 9)
  })

  it('takes profile overrides and options from the query', async () => {
    const response = await api().get(`${base}/cut-plan?passes=2&cutSpeedMmS=50&origin=top-left&commonLine=true`).set(bearer(owner.accessToken)).expect(200)
    const plan = cutPlanResponseSchema.parse(response.body)
    expect(plan.profile.cutSpeedMmS).toBe(50)
    expect(plan.profile.origin).toBe('top-left')
    expect(plan.options.passes).toBe(2)
    expect(plan.options.commonLine).toBe(true)
    expect(plan.totals.cutLengthMm).toBeCloseTo(1280, 6)
  })

  it('exports a sheet as SVG in millimetres', async () => {
    const response = await api().get(`${base}/export?sheet=0&format=svg`).set(bearer(owner.accessToken)).expect(200)
    expect(response.headers['content-type']).toMatch(/^image\/svg\+xml/)
    expect(response.headers['content-disposition']).toContain('coasters-tags-sheet-1.svg')
    const text = response.body instanceof Buffer ? response.body.toString('utf8') : String(response.text ?? response.body)
    expect(text).toContain('width="200mm" height="100mm" viewBox="0 0 200 100"')
    expect(text.match(/<path /g)).toHaveLength(3)
  })

  it('exports a sheet as HP-GL in plotter units', async () => {
    const response = await api().get(`${base}/export?sheet=1&format=hpgl&origin=top-left`).set(bearer(owner.accessToken)).expect(200)
    expect(response.headers['content-type']).toMatch(/^application\/vnd\.hp-hpgl/)
    expect(response.headers['content-disposition']).toContain('coasters-tags-sheet-2.plt')
    const text = response.text
    expect(text.startsWith('IN;\nSP1;')).toBe(true)
    // The square's corner at (10, 10) mm from the top-left origin is (400, 400) plotter units.
    expect(text).toContain('PU400,400;')
    expect(text).toContain('PD')
  })

  it('exports the job sheet as a PDF', async () => {
    const response = await api().get(`${base}/export?format=pdf`).set(bearer(owner.accessToken)).buffer(true).parse(binary).expect(200)
    expect(response.headers['content-type']).toBe('application/pdf')
    expect(response.headers['content-disposition']).toContain('coasters-tags-job-sheet.pdf')
    const body = response.body as Buffer
    expect(body.subarray(0, 5).toString('latin1')).toBe('%PDF-')
    expect(body.length).toBeGreaterThan(2000)
  })

  it('names the job’s material and prints its recipe on the job sheet, and leaves lines to fill in without one', async () => {
    // Arrange: a catalogue material of the workspace with its blade recipe.
    const listed = await api().get(`/api/workspaces/${owner.workspace.id}/materials?search=cardstock`).set(bearer(owner.accessToken)).expect(200)
    const material = listed.body.items[0]
    const detail = await api().get(`/api/workspaces/${owner.workspace.id}/materials/${material.id}`).set(bearer(owner.accessToken)).expect(200)
    const blade = detail.body.recipes.find((recipe: { toolKind: string }) => recipe.toolKind === 'blade')

    // Act: the job sheet with and without the material.
    const withMaterial = await api().get(`${base}/export?format=pdf&materialId=${material.id}`).set(bearer(owner.accessToken)).buffer(true).parse(binary).expect(200)
    const without = await api().get(`${base}/export?format=pdf`).set(bearer(owner.accessToken)).buffer(true).parse(binary).expect(200)

    // Assert: the material's name and its recipe in words; blanks otherwise.
    const text = pdfText(withMaterial.body as Buffer)
    expect(text).toContain(`Material: ${material.name}`)
    expect(text).toContain(`force ${blade.force}, ${blade.passes} pass`)
    expect(text).not.toContain('Material: ____')
    expect(pdfText(without.body as Buffer)).toContain('Material: ____')

    // A material of another workspace is not found.
    const stranger = await signUp('cutplan-stranger')
    const theirs = await api().get(`/api/workspaces/${stranger.workspace.id}/materials?search=cardstock`).set(bearer(stranger.accessToken)).expect(200)
    const refused = await api().get(`${base}/export?format=pdf&materialId=${theirs.body.items[0].id}`).set(bearer(owner.accessToken)).expect(400)
    expect(refused.body.error.fields).toHaveProperty(['query.materialId'])
  })

  it('answers 400 naming the field for a bad sheet, format or option', async () => {
    const outOfRange = await api().get(`${base}/export?sheet=2&format=svg`).set(bearer(owner.accessToken)).expect(400)
    expect(outOfRange.body.error.fields).toHaveProperty(['query.sheet'])
    const missing = await api().get(`${base}/export?format=hpgl`).set(bearer(owner.accessToken)).expect(400)
    expect(missing.body.error.fields).toHaveProperty(['query.sheet'])
    const format = await api().get(`${base}/export?sheet=0&format=dxf`).set(bearer(owner.accessToken)).expect(400)
    expect(format.body.error.fields).toHaveProperty(['query.format'])
    const passes = await api().get(`${base}/cut-plan?passes=0`).set(bearer(owner.accessToken)).expect(400)
    expect(passes.body.error.fields).toHaveProperty(['query.passes'])
    const notAnId = await api().get(`/api/workspaces/${owner.workspace.id}/layouts/not-an-id/cut-plan`).set(bearer(owner.accessToken)).expect(400)
    expect(notAnId.body.error.fields).toHaveProperty(['params.layoutId'])
  })

  it('lets a viewer read the cut plan and export', async () => {
    const viewer = await addMember(owner, 'viewer')
    await api().get(`${base}/cut-plan`).set(bearer(viewer.accessToken)).expect(200)
    await api().get(`${base}/export?sheet=0&format=svg`).set(bearer(viewer.accessToken)).expect(200)
  })

  it('answers 404 for a layout of another workspace or an unknown layout, and 401 without sign-in', async () => {
    const stranger = await signUp('stranger')
    await api().get(`${base}/cut-plan`).set(bearer(stranger.accessToken)).expect(404)
    await api().get(`/api/workspaces/${stranger.workspace.id}/layouts/${layoutId}/cut-plan`).set(bearer(stranger.accessToken)).expect(404)
    await api().get(`/api/workspaces/${owner.workspace.id}/layouts/${randomUUID()}/export?sheet=0&format=svg`).set(bearer(owner.accessToken)).expect(404)
    await api().get(`${base}/cut-plan`).expect(401)
  })
})
