import { and, eq, isNull, gt } from 'drizzle-orm'
import type { Database, DatabaseOrTransaction } from '../../db/client.js'
import { passwordResets, refreshSessions, users } from '../../db/schema/index.js'

export type UserRow = typeof users.$inferSelect

export async function findUserById(db: DatabaseOrTransaction, userId: string): Promise<UserRow | undefined> {
  const [row] = await db.select().from(users).where(eq(users.id, userId))
  return row
}

export async function findUserByEmail(db: DatabaseOrTransaction, email: string): Promise<UserRow | undefined> {
  const [row] = await db.select().from(users).where(eq(users.email, email))
  return row
}

export async function insertUser(db: DatabaseOrTransaction, values: { email: string; name: string; passwordHash: string }): Promise<UserRow> {
  const [row] = await db.insert(users).values(values).returning()
  return row!
}

export async function updateUser(db: DatabaseOrTransaction, userId: string, values: Partial<Pick<UserRow, 'name' | 'unitSystem'>>) {
  const [row] = await db.update(users).set(values).where(eq(users.id, userId)).returning()
  return row
}

export async function updatePasswordHash(db: DatabaseOrTransaction, userId: string, passwordHash: string) {
  // Whole seconds, as a token's iat: tokens issued before this second are refused, the new session's are not.
  const changedAt = new Date(Math.floor(Date.now() / 1000) * 1000)
  await db.update(users).set({ passwordHash, passwordChangedAt: changedAt }).where(eq(users.id, userId))
}

export async function insertRefreshSession(
  db: DatabaseOrTransaction,
  values: { userId: string; familyId: string; tokenHash: string; expiresAt: Date },
) {
  await db.insert(refreshSessions).values(values)
}

export async function findRefreshSession(db: DatabaseOrTransaction, tokenHash: string) {
  const [row] = await db.select().from(refreshSessions).where(eq(refreshSessions.tokenHash, tokenHash)).for('update')
  return row
}

export async function markRefreshSessionReplaced(db: DatabaseOrTransaction, sessionId: string) {
  await db.update(refreshSessions).set({ replacedAt: new Date() }).where(eq(refreshSessions.id, sessionId))
}

export async function revokeRefreshFamily(db: DatabaseOrTransaction, familyId: string) {
  await db
    .update(refreshSessions)
    .set({ revokedAt: new Date() })
    .where(and(eq(refreshSessions.familyId, familyId), isNull(refreshSessions.revokedAt)))
}

export async function revokeAllRefreshSessions(db: DatabaseOrTransaction, userId: string) {
  await db
    .update(refreshSessions)
    .set({ revokedAt: new Date() })
    .where(and(eq(refreshSessions.userId, userId), isNull(refreshSessions.revokedAt)))
}

export async function insertPasswordReset(db: DatabaseOrTransaction, values: { userId: string; tokenHash: string; expiresAt: Date }) {
  await db.insert(passwordResets).values(values)
}

export async function findUsablePasswordReset(db: DatabaseOrTransaction, tokenHash: string) {
  const [row] = await db
    .select()
    .from(passwordResets)
    .where(and(eq(passwordResets.tokenHash, tokenHash), isNull(passwordResets.usedAt), gt(passwordResets.expiresAt, new Date())))
    .for('update')
  return row
}

export async function markPasswordResetUsed(db: DatabaseOrTransaction, resetId: string) {
  await db.update(passwordResets).set({ usedAt: new Date() }).where(eq(passwordResets.id, resetId))
}
