import { execFile } from 'node:child_process'
import { promisify } from 'node:util'
import { afterAll, describe, expect, it } from 'vitest'
import { and, eq } from 'drizzle-orm'
import { loadConfig } from '../../server/config.js'
import { connectDatabase } from '../../server/db/client.js'
import { cutJobs, memberships, pricingSettings, quotes, stockItems, users, workspaces } from '../../server/db/schema/index.js'
import { demoJobs } from '../../fixtures/demo-jobs.js'
import { demoQuotes } from '../../fixtures/demo-quotes.js'
import { demoStudio } from '../../fixtures/demo-studio.js'

// The demo seed runs on every start: the whole script is run twice against the test database, as `npm start` would.
// One file runs it, so no two seeds race each other; other tests may share the demo addresses, so the studio is found
// by its name as well as its owner.
const run = promisify(execFile)
const database = connectDatabase(loadConfig().databaseUrl, 2)
afterAll(() => database.close())

const seed = () => run('node_modules/.bin/tsx', ['scripts/seed.ts'], { env: process.env, timeout: 120_000 })

async function demoWorkspaceId(): Promise<string> {
  const db = database.db
  const [owner] = await db.select({ id: users.id }).from(users).where(eq(users.email, demoStudio.members[0]!.email))
  const [row] = await db
    .select({ id: workspaces.id })
    .from(workspaces)
    .innerJoin(memberships, eq(memberships.workspaceId, workspaces.id))
    .where(and(eq(memberships.userId, owner!.id), eq(memberships.role, 'owner'), eq(workspaces.name, demoStudio.name)))
  return row!.id
}

describe('demo studio seed', () => {
  it('tells the studio’s job and quote story once, and a second run adds nothing', { timeout: 300_000 }, async () => {
    // Act: seed twice, as two starts would.
    await seed()
    const second = await seed()

    // Assert: the second run found everything in place.
    expect(second.stdout).toContain('demo jobs: 0 added')
    expect(second.stdout).toContain(`demo pricing and quotes: 0 quotes added, ${demoQuotes.length} already present`)

    const db = database.db
    const workspaceId = await demoWorkspaceId()

    // Jobs: done jobs over past months, one cutting, planned ones due soon, one scrapped.
    const jobs = await db.select().from(cutJobs).where(eq(cutJobs.workspaceId, workspaceId))
    expect(jobs).toHaveLength(demoJobs.length)
    const byStatus = (status: string) => jobs.filter((job) => job.status === status)
    expect(byStatus('done')).toHaveLength(6)
    expect(byStatus('cutting')).toHaveLength(1)
    expect(byStatus('scrapped')).toHaveLength(1)
    expect(byStatus('planned')).toHaveLength(3)
    // Done jobs carry what they used and are spread over at least four different months.
    expect(byStatus('done').every((job) => job.usage !== null && job.usage.stockAreaMm2 > 0 && job.doneAt !== null)).toBe(true)
    expect(new Set(byStatus('done').map((job) => job.doneAt!.toISOString().slice(0, 7))).size).toBeGreaterThanOrEqual(4)
    // The wedding coasters kept their offcut as a remnant.
    const remnants = await db.select().from(stockItems).where(and(eq(stockItems.workspaceId, workspaceId), eq(stockItems.isRemnant, true)))
    expect(remnants).toHaveLength(1)
    expect(remnants[0]!.name).toMatch(/^Remnant of Job 3 — Kraft cardstock/)
    expect(remnants[0]!.outline!.length).toBeGreaterThanOrEqual(1)

    // Quotes and pricing: one quote priced from a demo job.
    const rows = await db.select().from(quotes).where(eq(quotes.workspaceId, workspaceId))
    expect(rows.map((row) => row.title).sort()).toEqual(demoQuotes.map((quote) => quote.title).sort())
    expect(rows.find((row) => row.title === 'Wedding table coasters')!.source.kind).toBe('job')
    const [pricing] = await db.select().from(pricingSettings).where(eq(pricingSettings.workspaceId, workspaceId))
    expect(pricing).toMatchObject({ currency: 'EUR', machineRatePerHourMinor: 2400 })
  })
})
