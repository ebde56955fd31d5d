// Seeds the invented demo studio. Idempotent: existing demo accounts, the workspace and designs of the same name
// are left as they are.
import { readFileSync } from 'node:fs'
import path from 'node:path'
import { and, eq, inArray } from 'drizzle-orm'
import { loadConfig } from '../server/config.js'
import type { AppContext } from '../server/context.js'
import { designs, memberships, users, workspaces } from '../server/db/schema/index.js'
import { hashPassword } from '../server/features/auth/passwords.js'
import { updateDesign, uploadDesigns } from '../server/features/designs/designs.service.js'
import { startRuntime } from '../server/runtime.js'
import { demoDesigns, demoDesignsDirectory } from '../fixtures/demo-designs.js'
import { demoPassword, demoStudio } from '../fixtures/demo-studio.js'

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
      .where(eq(memberships.userId, ownerId))
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

try {
  const { workspaceId, ownerId } = await seedStudio()
  const { added, kept } = await seedDesigns(workspaceId, ownerId)
  console.log(`==> demo studio "${demoStudio.name}" is ready. Demo sign-ins (password for all: ${demoPassword}):`)
  for (const member of demoStudio.members) console.log(`    ${member.role.padEnd(6)}  ${member.email}`)
  console.log(`==> demo designs: ${added.length} added, ${kept.length} already present`)
} finally {
  await runtime.close()
}
