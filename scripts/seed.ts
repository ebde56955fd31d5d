// Seeds the invented demo studio. Idempotent: existing demo accounts and the workspace are left as they are.
import { eq } from 'drizzle-orm'
import { loadConfig } from '../server/config.js'
import { connectDatabase } from '../server/db/client.js'
import { memberships, users, workspaces } from '../server/db/schema/index.js'
import { hashPassword } from '../server/features/auth/passwords.js'
import { demoPassword, demoStudio } from '../fixtures/demo-studio.js'

const config = loadConfig()
const database = connectDatabase(config.databaseUrl, 1)
const { db } = database

try {
  await db.transaction(async (tx) => {
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
  })
  console.log(`==> demo studio "${demoStudio.name}" is ready. Demo sign-ins (password for all: ${demoPassword}):`)
  for (const member of demoStudio.members) console.log(`    ${member.role.padEnd(6)}  ${member.email}`)
} finally {
  await database.close()
}
