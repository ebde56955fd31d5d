import { afterAll, describe, expect, it } from 'vitest'
import { eq } from 'drizzle-orm'
import { loadConfig } from '../../server/config.js'
import type { AppContext } from '../../server/context.js'
import { connectDatabase } from '../../server/db/client.js'
import { memberships, users, workspaces } from '../../server/db/schema/index.js'
import { ensureCatalogue } from '../../server/features/materials/materials.service.js'
import * as cuttersService from '../../server/features/cutters/cutters.service.js'
import { createLogger } from '../../server/logger.js'
import { seedCutters } from '../../scripts/seedCutters.js'

// The demo seed runs on every start, so it must tell its story once and leave a second run alone.
const database = connectDatabase(loadConfig().databaseUrl, 2)
afterAll(() => database.close())

describe('demo cutters seed', () => {
  it('seeds two cutters with blades, wear and care once, with one blade near its limit and a reminder overdue', async () => {
    const db = database.db
    const [workspace] = await db.insert(workspaces).values({ name: 'Seed check studio' }).returning()
    for (const [email, role] of [
      ['owner@thistle-tack.example', 'owner'],
      ['maker@thistle-tack.example', 'maker'],
    ] as const) {
      const [user] = await db.insert(users).values({ email, name: email.split('@')[0]!, passwordHash: 'not-a-usable-hash' }).onConflictDoNothing().returning()
      const userId = user?.id ?? (await db.select({ id: users.id }).from(users).where(eq(users.email, email)))[0]!.id
      await db.insert(memberships).values({ workspaceId: workspace!.id, userId, role })
    }
    await ensureCatalogue(db, workspace!.id)
    const context = { db, config: loadConfig(), logger: createLogger('silent') } as unknown as AppContext

    expect(await seedCutters(context, workspace!.id)).toEqual({ cuttersAdded: 2, kept: 0 })
    expect(await seedCutters(context, workspace!.id)).toEqual({ cuttersAdded: 0, kept: 2 })

    const { items } = await cuttersService.listCutters(context, workspace!.id, { status: 'active', page: 1, pageSize: 10 })
    expect(items.map((cutter) => cutter.name)).toEqual(['Bench cutter A', 'Wide-format cutter B'])
    const [bench, wide] = items as [(typeof items)[0], (typeof items)[0]]
    // 880 + 640 + 180 = 1700 m of a 2000 m standard limit = 85 % (worked example by hand).
    expect(bench.currentBlade).toMatchObject({ bladeType: 'standard', wornMm: 1_700_000, wearLevel: 'near' })
    expect(bench.careDue.find((due) => due.kind === 'roller_checked')!.overdue).toBe(true)
    // 300 m of a 1200 m deep-cut limit = 25 %.
    expect(wide.currentBlade).toMatchObject({ bladeType: 'deep-cut', wornMm: 300_000, wearLevel: 'ok' })

    const history = await cuttersService.listBlades(context, workspace!.id, bench.id, { page: 1, pageSize: 10 })
    expect(history.items.map((blade) => blade.current)).toEqual([true, false])
    expect(history.items[1]).toMatchObject({ retireReason: 'Tearing the fine points of the paper snowflakes', wornMm: 2_150_000, wearLevel: 'over' })
    const care = await cuttersService.listCareEvents(context, workspace!.id, bench.id, { page: 1, pageSize: 20 })
    expect(care.items.filter((event) => event.kind === 'blade_swap')).toHaveLength(2)
    expect(care.total).toBe(6)
  })
})
