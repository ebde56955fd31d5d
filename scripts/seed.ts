// Seeds the invented demo studio. Idempotent: existing demo accounts, the workspace and designs of the same name
// are left as they are.
import { readFileSync } from 'node:fs'
import path from 'node:path'
import { and, eq, inArray } from 'drizzle-orm'
import { loadConfig } from '../server/config.js'
import type { AppContext } from '../server/context.js'
import { designs, layouts, memberships, users, workspaces } from '../server/db/schema/index.js'
import { hashPassword } from '../server/features/auth/passwords.js'
import { updateDesign, uploadDesigns } from '../server/features/designs/designs.service.js'
import { createLayout } from '../server/features/layouts/layouts.service.js'
import { createLayoutRequestSchema } from '../shared/schemas/layouts.js'
import { startRuntime } from '../server/runtime.js'
import { demoDesigns, demoDesignsDirectory } from '../fixtures/demo-designs.js'
import { demoPassword, demoStudio } from '../fixtures/demo-studio.js'
import { seedStockAndMaterials } from './seedStock.js'
import { seedQuotes } from './seedQuotes.js'
import { seedCutters } from './seedCutters.js'
import { seedJobs } from './seedJobs.js'
import { demoLayoutRequest, demoLayouts, type DemoDesignForLayout } from '../fixtures/demo-layouts.js'

const config = loadConfig()
// The same context the server builds, without the job queue or the mail catcher: seeding sends no mail.
const runtime = await startRuntime(config, { withQueue: false, withMailCatcher: false })
const { context } = runtime
const { db } = context

/** The demo accounts, the workspace and the memberships; returns the workspace and its owner. */
async function seedStudio(): Promise<{ workspaceId: string; ownerId: string }> {
  return db.transaction(async (tx) => {
    const passwordHash = await hashPassword(demoPassword)
    const userIds: Record<string, string> = {}
    for (const member of demoStudio.members) {
      await tx.insert(users).values({ email: member.email, name: member.name, passwordHash, unitSystem: member.unitSystem }).onConflictDoNothing()
      const [row] = await tx.select({ id: users.id }).from(users).where(eq(users.email, member.email))
      userIds[member.email] = row!.id
    }
    const ownerId = userIds[demoStudio.members[0]!.email]!
    const [existing] = await tx
      .select({ id: workspaces.id })
      .from(workspaces)
      .innerJoin(memberships, eq(memberships.workspaceId, workspaces.id))
      // By name too: the demo owner may also own other workspaces (made by hand, or by a test).
      .where(and(eq(memberships.userId, ownerId), eq(memberships.role, 'owner'), eq(workspaces.name, demoStudio.name)))
    const workspaceId = existing?.id ?? (await tx.insert(workspaces).values({ name: demoStudio.name }).returning())[0]!.id
    for (const member of demoStudio.members) {
      await tx.insert(memberships).values({ workspaceId, userId: userIds[member.email]!, role: member.role }).onConflictDoNothing()
    }
    return { workspaceId, ownerId }
  })
}

/**
 * Imports each demo design the workspace does not yet hold (by name) through the designs service, the same
 * path as an upload, then names and tags it. Upload and naming share one transaction, so a failure never leaves
 * a design under its file name that a second run would import again.
 */
async function seedDesigns(workspaceId: string, ownerId: string): Promise<{ added: string[]; kept: string[] }> {
  const names = demoDesigns.map((design) => design.name)
  const present = await db
    .select({ name: designs.name })
    .from(designs)
    .where(and(eq(designs.workspaceId, workspaceId), inArray(designs.name, names)))
  const existingNames = new Set(present.map((row) => row.name))
  const added: string[] = []
  for (const design of demoDesigns) {
    if (existingNames.has(design.name)) continue
    const buffer = readFileSync(path.join(demoDesignsDirectory, design.file))
    await db.transaction(async (tx) => {
      // A transaction handle has the database's query API; the service's own transaction becomes a savepoint.
      const inTransaction: AppContext = { ...context, db: tx as unknown as AppContext['db'] }
      const result = await uploadDesigns(inTransaction, workspaceId, ownerId, [{ originalname: design.file, mimetype: 'image/svg+xml', buffer }], {})
      const uploaded = result.designs[0]
      if (!uploaded) throw new Error(`demo design ${design.file} was rejected: ${result.rejected.map((rejection) => rejection.message).join('; ')}`)
      await updateDesign(inTransaction, workspaceId, uploaded.id, { name: design.name, tags: design.tags })
    })
    added.push(design.name)
  }
  return { added, kept: [...existingNames] }
}

/** Saves each demo layout the workspace does not yet hold (by name) through the layouts service, which computes the figures. */
async function seedLayouts(workspaceId: string, ownerId: string): Promise<{ added: number; kept: number }> {
  const present = await db
    .select({ name: layouts.name })
    .from(layouts)
    .where(and(eq(layouts.workspaceId, workspaceId), inArray(layouts.name, demoLayouts.map((layout) => layout.name))))
  const existingNames = new Set(present.map((row) => row.name))
  const rows = await db
    .select({ id: designs.id, name: designs.name, keepTogether: designs.keepTogether, geometry: designs.geometry, minX: designs.bboxMinX, minY: designs.bboxMinY, maxX: designs.bboxMaxX, maxY: designs.bboxMaxY })
    .from(designs)
    .where(eq(designs.workspaceId, workspaceId))
  const designsByName = new Map<string, DemoDesignForLayout>(
    rows.map((row) => [row.name, { id: row.id, keepTogether: row.keepTogether, geometry: row.geometry, bbox: { minX: row.minX, minY: row.minY, maxX: row.maxX, maxY: row.maxY } }]),
  )
  let added = 0
  for (const layout of demoLayouts) {
    if (existingNames.has(layout.name)) continue
    const missing = layout.items.filter((item) => !designsByName.has(item.design)).map((item) => item.design)
    if (missing.length > 0) {
      console.log(`==> demo layout "${layout.name}" skipped: the workspace has no design named ${missing.join(', ')}`)
      continue
    }
    await createLayout(context, workspaceId, ownerId, createLayoutRequestSchema.parse(demoLayoutRequest(layout, designsByName)))
    added += 1
  }
  return { added, kept: existingNames.size }
}

try {
  const { workspaceId, ownerId } = await seedStudio()
  const { added, kept } = await seedDesigns(workspaceId, ownerId)
  const stock = await seedStockAndMaterials(context, workspaceId)
  const cutterCounts = await seedCutters(context, workspaceId)
  const layoutCounts = await seedLayouts(workspaceId, ownerId)
  // Jobs last: they need the layouts, the stock and the cutters (done jobs add wear to a fitted blade).
  const jobCounts = await seedJobs(context, workspaceId)
  // Quotes after jobs: one demo quote prices a demo job.
  const quoteCounts = await seedQuotes(context, workspaceId, ownerId)
  console.log(`==> demo studio "${demoStudio.name}" is ready. Demo sign-ins (password for all: ${demoPassword}):`)
  for (const member of demoStudio.members) console.log(`    ${member.role.padEnd(6)}  ${member.email}`)
  console.log(`==> demo designs: ${added.length} added, ${kept.length} already present`)
  console.log(`==> demo stock: ${stock.stockAdded} items added; test cuts: ${stock.testCutsAdded} added`)
  console.log(`==> demo cutters: ${cutterCounts.cuttersAdded} added, ${cutterCounts.kept} already present`)
  console.log(`==> demo layouts and templates: ${layoutCounts.added} added, ${layoutCounts.kept} already present`)
  console.log(`==> demo jobs: ${jobCounts.jobsAdded} added`)
  console.log(`==> demo pricing and quotes: ${quoteCounts.added} quotes added, ${quoteCounts.kept} already present`)
} finally {
  await runtime.close()
}
