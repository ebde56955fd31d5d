import { beforeAll, describe, expect, it } from 'vitest'
import { dashboardSchema } from '../../shared/schemas/jobs.js'
import { addMember, api, bearer, signUp, type SignedUpUser } from './helpers.js'
import { completeJob, cornerLayout, createBladeCutter, createJob, createMaterial, createStock, fitBlade, uploadSquare, workspaceUrl } from './jobsFixtures.js'

// Worked example by hand: one 100 × 100 mm sheet per run = 0.01 m²; the corner square leaves 7 500 mm² = 0.0075 m²
// of waste per run; a 50 × 50 mm square cuts 200 mm per pass.

const dayFromToday = (days: number) => {
  const now = new Date()
  return new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), now.getUTCDate() + days)).toISOString().slice(0, 10)
}

describe('dashboard', () => {
  let owner: SignedUpUser
  let dashboardUrl: string
  let cutterId: string
  let dueJobId: string

  beforeAll(async () => {
    owner = await signUp('dashboard-owner')
    dashboardUrl = `${workspaceUrl(owner)}/dashboard`
    const squareId = await uploadSquare(owner)
    const layoutId = await cornerLayout(owner, squareId)
    const cardId = await createMaterial(owner, 'Dashboard card', 1)
    const stockId = await createStock(owner, { kind: 'sheet', name: 'Dashboard sheet', widthMm: 100, heightMm: 100, materialId: cardId, quantityOnHand: 20 })
    cutterId = await createBladeCutter(owner, 'Dashboard cutter', [{ kind: 'housing_cleaned', intervalDays: 3 }])
    const bladeId = await fitBlade(owner, cutterId)
    await api().post(`${workspaceUrl(owner)}/materials/${cardId}/test-cuts`).set(bearer(owner.accessToken)).send({ outcome: 'clean', cutterId, bladeId }).expect(201)
    const job = await createJob(owner, { layoutId, stockItemId: stockId, cutterId, quantity: 2 })
    expect((await completeJob(owner, job)).status).toBe(200)
    dueJobId = (await createJob(owner, { layoutId, stockItemId: stockId, dueDate: dayFromToday(1) })).id
    await createJob(owner, { layoutId, stockItemId: stockId, dueDate: dayFromToday(30) })
  })

  it('shows due jobs, blade wear, test cuts, care due and material per month', async () => {
    const dashboard = dashboardSchema.parse((await api().get(dashboardUrl).set(bearer(owner.accessToken)).expect(200)).body)
    expect(dashboard.dueJobs.map((job) => job.id)).toEqual([dueJobId])
    expect(dashboard.blades).toHaveLength(1)
    // 2 runs × 200 mm × 1 pass.
    expect(dashboard.blades[0]!.wornMm).toBeCloseTo(400, 6)
    expect(dashboard.blades[0]!.cutter.id).toBe(cutterId)
    expect(dashboard.recentTestCuts[0]).toMatchObject({ outcome: 'clean', material: { name: 'Dashboard card' }, cutterName: 'Dashboard cutter' })
    // Never cleaned: due 3 days after the cutter was added, inside the 7-day window, not yet overdue.
    expect(dashboard.careReminders).toHaveLength(1)
    expect(dashboard.careReminders[0]).toMatchObject({ kind: 'housing_cleaned', lastDoneAt: null, overdue: false })

    expect(dashboard.materialByMonth).toHaveLength(6)
    const thisMonth = dashboard.materialByMonth[5]!
    expect(thisMonth.month).toBe(new Date().toISOString().slice(0, 7))
    expect(thisMonth.jobs).toBe(1)
    expect(thisMonth.usedM2).toBeCloseTo(0.02, 9)
    expect(thisMonth.wastedM2).toBeCloseTo(0.015, 9)
    expect(dashboard.materialByMonth.slice(0, 5).every((month) => month.usedM2 === 0)).toBe(true)
  })

  it('drops care from the list once it is logged', async () => {
    await api().post(`${workspaceUrl(owner)}/cutters/${cutterId}/care-events`).set(bearer(owner.accessToken)).send({ kind: 'housing_cleaned' }).expect(201)
    // Done now: next due in 3 days, still inside the 7-day window, with the date it was done.
    const dashboard = dashboardSchema.parse((await api().get(dashboardUrl).set(bearer(owner.accessToken)).expect(200)).body)
    expect(dashboard.careReminders[0]!.lastDoneAt).not.toBeNull()
  })

  it('is readable by every member and hidden from others', async () => {
    const viewer = await addMember(owner, 'viewer', 'dashboard-viewer')
    await api().get(dashboardUrl).set(bearer(viewer.accessToken)).expect(200)
    const outsider = await signUp('dashboard-outsider')
    await api().get(dashboardUrl).set(bearer(outsider.accessToken)).expect(404)
    const empty = dashboardSchema.parse((await api().get(`${workspaceUrl(outsider)}/dashboard`).set(bearer(outsider.accessToken)).expect(200)).body)
    expect(empty).toMatchObject({ dueJobs: [], blades: [], recentTestCuts: [], careReminders: [] })
    expect(empty.materialByMonth.every((month) => month.jobs === 0)).toBe(true)
  })
})
