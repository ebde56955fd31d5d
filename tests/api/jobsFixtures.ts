import { randomUUID } from 'node:crypto'
import { api, bearer, type SignedUpUser } from './helpers.js'

// Arranging a studio for job tests through the API: a design, a layout, stock, a material with a recipe, a cutter.

const svg = (body: string) => `<svg xmlns="http://www.w3.org/2000/svg" width="100mm" height="100mm" viewBox="0 0 100 100">${body}</svg>`

export const workspaceUrl = (owner: SignedUpUser) => `/api/workspaces/${owner.workspace.id}`

export async function uploadSquare(owner: SignedUpUser, sideMm = 50): Promise<string> {
  const response = await api()
    .post(`${workspaceUrl(owner)}/designs`)
    .set(bearer(owner.accessToken))
    .attach('files', Buffer.from(svg(`<rect x="0" y="0" width="${sideMm}" height="${sideMm}"/>`)), { filename: `square-${sideMm}.svg`, contentType: 'image/svg+xml' })
    .expect(201)
  return response.body.designs[0].id
}

/** One square at the top-left corner of a 100 × 100 mm sheet (or a 100 mm wide roll), margin and spacing 0. */
export async function cornerLayout(owner: SignedUpUser, designId: string, kind: 'sheets' | 'roll' = 'sheets'): Promise<string> {
  const response = await api()
    .post(`${workspaceUrl(owner)}/layouts`)
    .set(bearer(owner.accessToken))
    .send({
      name: kind === 'sheets' ? 'Corner square' : 'Corner square on a roll',
      stock: kind === 'sheets' ? { kind: 'sheets', widthMm: 100, heightMm: 100, sheetCount: 1 } : { kind: 'roll', widthMm: 100, lengthMm: 1000 },
      items: [{ designId, quantity: 1 }],
      placements: [{ id: randomUUID(), designId, pieceIndex: 0, sheet: 0, xMm: 0, yMm: 0, angleDeg: 0 }],
      options: { spacingMm: 0, marginMm: 0 },
    })
    .expect(201)
  return response.body.id
}

export async function createMaterial(owner: SignedUpUser, name: string, passes: number): Promise<string> {
  const material = await api().post(`${workspaceUrl(owner)}/materials`).set(bearer(owner.accessToken)).send({ name, category: 'paper' }).expect(201)
  await api()
    .post(`${workspaceUrl(owner)}/materials/${material.body.id}/recipes`)
    .set(bearer(owner.accessToken))
    .send({ toolKind: 'blade', bladeType: 'standard', force: 20, passes, speedMmS: 100 })
    .expect(201)
  return material.body.id
}

export async function createStock(owner: SignedUpUser, body: Record<string, unknown>): Promise<string> {
  const response = await api().post(`${workspaceUrl(owner)}/stock`).set(bearer(owner.accessToken)).send(body).expect(201)
  return response.body.id
}

export async function createBladeCutter(owner: SignedUpUser, name: string, careReminders: { kind: string; intervalDays: number }[] = []): Promise<string> {
  const response = await api()
    .post(`${workspaceUrl(owner)}/cutters`)
    .set(bearer(owner.accessToken))
    .send({ name, toolKind: 'blade', cuttingWidthMm: 300, maxLengthMm: 3000, cutSpeedMmS: 100, travelSpeedMmS: 300, accelerationMmS2: 1500, liftLowerS: 0.15, careReminders })
    .expect(201)
  return response.body.id
}

export async function fitBlade(owner: SignedUpUser, cutterId: string): Promise<string> {
  const response = await api().post(`${workspaceUrl(owner)}/cutters/${cutterId}/blades`).set(bearer(owner.accessToken)).send({ bladeType: 'standard', angleDeg: 45 }).expect(201)
  return response.body.id ?? response.body.blade?.id
}

export async function createJob(owner: SignedUpUser, body: Record<string, unknown>) {
  const response = await api().post(`${workspaceUrl(owner)}/jobs`).set(bearer(owner.accessToken)).send(body)
  if (response.status !== 201) throw new Error(`job create failed: ${response.status} ${JSON.stringify(response.body)}`)
  return response.body as { id: string; version: number; number: number }
}

export function moveJob(owner: SignedUpUser, jobId: string, body: Record<string, unknown>, token = owner.accessToken) {
  return api().post(`${workspaceUrl(owner)}/jobs/${jobId}/status`).set(bearer(token)).send(body)
}

/** planned → cutting → done, with the versions each answer gives. */
export async function completeJob(owner: SignedUpUser, job: { id: string; version: number }, done: Record<string, unknown> = {}) {
  const cutting = await moveJob(owner, job.id, { status: 'cutting', version: job.version })
  if (cutting.status !== 200) throw new Error(`start cutting failed: ${cutting.status} ${JSON.stringify(cutting.body)}`)
  return moveJob(owner, job.id, { status: 'done', version: cutting.body.version, ...done })
}
