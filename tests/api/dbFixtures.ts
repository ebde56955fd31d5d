import { afterAll } from 'vitest'
import { and, eq, isNotNull, sql } from 'drizzle-orm'
import { loadConfig } from '../../server/config.js'
import { connectDatabase } from '../../server/db/client.js'
import { memberships, refreshSessions, users } from '../../server/db/schema/index.js'
import { uniqueEmail } from './helpers.js'

// Direct database access for arranging many members quickly; behaviour is always checked through the API.
const database = connectDatabase(loadConfig().databaseUrl, 2)
afterAll(() => database.close())

/** A member who never signs in: inserted straight into the workspace with a placeholder password hash. */
export async function insertBystander(workspaceId: string, role: 'owner' | 'maker' | 'viewer') {
  const [user] = await database.db
    .insert(users)
    .values({ email: uniqueEmail(`bystander-${role}`), name: `Bystander ${role}`, passwordHash: 'not-a-usable-hash' })
    .returning()
  await database.db.insert(memberships).values({ workspaceId, userId: user!.id, role })
  return user!
}

/** Moves a user's refresh-token rotations back by `seconds`, so a later replay is past the concurrent-use grace. */
export async function ageRefreshRotations(userId: string, seconds: number) {
  await database.db
    .update(refreshSessions)
    .set({ replacedAt: sql`replaced_at - make_interval(secs => ${seconds})` })
    .where(and(eq(refreshSessions.userId, userId), isNotNull(refreshSessions.replacedAt)))
}
