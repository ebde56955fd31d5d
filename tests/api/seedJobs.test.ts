import { execFile } from 'node:child_process'
import { promisify } from 'node:util'
import { afterAll, describe, expect, it } from 'vitest'
import { and, eq } from 'drizzle-orm'
import { loadConfig } from '../../server/config.js'
import { connectDatabase } from '../../server/db/client.js'
import { cutJobs, memberships, stockItems, users } from '../../server/db/schema/index.js'
import { demoJobs } from '../../fixtures/demo-jobs.js'

// The demo seed runs on every start: the whole script is run twice against the test database, as `npm start` would.
const run = promisify(execFile)
const database = connectDatabase(loadConfig().databaseUrl, 2)
afterAll(() => database.close())

const seed = () => run('node_modules/.bin/tsx', ['scripts/seed.ts'], { env: process.env, timeout: 120_000 })

describe('demo jobs seed', () => {
  it('tells the studio’s job story once: done jobs over past months, one cutting, planned ones due soon, one scrapped', { timeout: 240_000 }, async () => {
    const first = await seed()
    expect(first.stdout).toContain(`demo jobs: ${demoJobs.length} added`)
    const second = await seed()
    expect(second.stdout).toContain('demo jobs: 0 added')

    const db = database.db
    const [owner] = await db.select({ id: users.id }).from(users).where(eq(users.email, 'owner@thistle-tack.example'))
    const [membership] = await db.select({ workspaceId: memberships.workspaceId }).from(memberships).where(and(eq(memberships.userId, owner!.id), eq(memberships.role, 'owner')))
    const jobs = await db.select().from(cutJobs).where(eq(cutJobs.workspaceId, membership!.workspaceId))
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
    const remnants = await db.select().from(stockItems).where(and(eq(stockItems.workspaceId, membership!.workspaceId), eq(stockItems.isRemnant, true)))
    expect(remnants).toHaveLength(1)
    expect(remnants[0]!.name).toMatch(/^Remnant of Job 3 — Kraft cardstock/)
    expect(remnants[0]!.outline!.length).toBeGreaterThanOrEqual(1)
  })
})
