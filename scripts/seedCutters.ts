// Seeds the demo studio's cutters, their blades with wear, and the care log through the same services as the API.
// Idempotent: a cutter is matched by name, and a cutter already present is left as it is (its story is not re-told).
import { and, eq, inArray } from 'drizzle-orm'
import type { AppContext } from '../server/context.js'
import { cutters, materials, users } from '../server/db/schema/index.js'
import { addBladeWear } from '../server/features/cutters/bladeWear.js'
import * as cuttersRepo from '../server/features/cutters/cutters.repo.js'
import * as cuttersService from '../server/features/cutters/cutters.service.js'
import { createCutterRequestSchema, createCareEventRequestSchema, fitBladeRequestSchema } from '../shared/schemas/cutters.js'
import { demoCutters } from '../fixtures/demo-cutters.js'
import { demoOwnMaterial } from '../fixtures/demo-stock.js'

const dayMs = 24 * 60 * 60 * 1000
const daysAgo = (days: number, now: number) => new Date(now - days * dayMs)

export async function seedCutters(context: AppContext, workspaceId: string): Promise<{ cuttersAdded: number; kept: number }> {
  const { db } = context
  const now = Date.now()
  const emails = [...new Set(demoCutters.flatMap((entry) => [...entry.blades.map((blade) => blade.email), ...entry.care.map((care) => care.email)]))]
  const people = await db.select({ id: users.id, email: users.email }).from(users).where(inArray(users.email, emails))
  const userId = (email: string) => people.find((person) => person.email === email)!.id
  const materialRows = await db
    .select({ id: materials.id, key: materials.catalogueKey, name: materials.name })
    .from(materials)
    .where(eq(materials.workspaceId, workspaceId))
  const materialId = (key: string | null) => {
    if (key === null) return null
    const found = key === demoOwnMaterial.key ? materialRows.find((row) => row.name === demoOwnMaterial.name) : materialRows.find((row) => row.key === key)
    return found?.id ?? null
  }
  const present = new Set((await db.select({ name: cutters.name }).from(cutters).where(eq(cutters.workspaceId, workspaceId))).map((row) => row.name))

  let cuttersAdded = 0
  for (const entry of demoCutters) {
    if (present.has(entry.cutter.name)) continue
    const ownerId = userId('owner@thistle-tack.example')
    const cutter = await cuttersService.createCutter(context, workspaceId, ownerId, createCutterRequestSchema.parse(entry.cutter))
    // Back-dated so reminders of care never logged count from when the studio started keeping records.
    await db
      .update(cutters)
      .set({ createdAt: daysAgo(entry.addedDaysAgo, now) })
      .where(and(eq(cutters.id, cutter.id), eq(cutters.workspaceId, workspaceId)))
    for (const [index, blade] of entry.blades.entries()) {
      const fitted = await cuttersService.fitBlade(
        context,
        workspaceId,
        cutter.id,
        userId(blade.email),
        fitBladeRequestSchema.parse({ bladeType: blade.bladeType, angleDeg: blade.angleDeg, label: blade.label, fittedAt: daysAgo(blade.fittedDaysAgo, now).toISOString(), note: blade.note ?? '', previousRetireReason: index > 0 ? (entry.blades[index - 1]!.retireReason ?? '') : '' }),
      )
      await db.transaction(async (tx) => {
        for (const wear of blade.wearM) {
          await addBladeWear(tx, { workspaceId, bladeId: fitted.id, jobId: null, materialId: materialId(wear.materialKey), cutLengthMm: wear.metres * 1000, userId: userId(blade.email) })
        }
      })
    }
    for (const care of entry.care) {
      await cuttersService.createCareEvent(context, workspaceId, cutter.id, userId(care.email), createCareEventRequestSchema.parse({ kind: care.kind, note: care.note, doneAt: daysAgo(care.daysAgo, now).toISOString() }))
    }
    await cuttersRepo.updateCutter(db, workspaceId, cutter.id, {})
    cuttersAdded++
  }
  return { cuttersAdded, kept: present.size }
}
