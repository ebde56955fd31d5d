import { execFile } from 'node:child_process'
import { promisify } from 'node:util'
import { afterAll, describe, expect, it } from 'vitest'
import { and, eq } from 'drizzle-orm'
import { loadConfig } from '../../server/config.js'
import { connectDatabase } from '../../server/db/client.js'
import { memberships, pricingSettings, quotes, users } from '../../server/db/schema/index.js'
import { demoQuotes } from '../../fixtures/demo-quotes.js'

// The demo seed runs on every start: the whole script is run twice against the test database, as `npm start` would.
const run = promisify(execFile)
const database = connectDatabase(loadConfig().databaseUrl, 2)
afterAll(() => database.close())

const seed = () => run('node_modules/.bin/tsx', ['scripts/seed.ts'], { env: process.env, timeout: 120_000 })

describe('demo pricing and quotes seed', () => {
  it('writes the studio’s pricing and its quotes once, one of them priced from a demo job', { timeout: 240_000 }, async () => {
    await seed()
    const second = await seed()
    expect(second.stdout).toContain(`demo pricing and quotes: 0 quotes added, ${demoQuotes.length} already present`)

    const db = database.db
    const [owner] = await db.select({ id: users.id }).from(users).where(eq(users.email, 'owner@thistle-tack.example'))
    const [membership] = await db.select({ workspaceId: memberships.workspaceId }).from(memberships).where(and(eq(memberships.userId, owner!.id), eq(memberships.role, 'owner')))
    const rows = await db.select().from(quotes).where(eq(quotes.workspaceId, membership!.workspaceId))
    expect(rows.map((row) => row.title).sort()).toEqual(demoQuotes.map((quote) => quote.title).sort())
    expect(rows.find((row) => row.title === 'Wedding table coasters')!.source.kind).toBe('job')
    const [pricing] = await db.select().from(pricingSettings).where(eq(pricingSettings.workspaceId, membership!.workspaceId))
    expect(pricing).toMatchObject({ currency: 'EUR', machineRatePerHourMinor: 2400 })
  })
})
