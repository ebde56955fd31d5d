import { and, asc, eq, gt, isNull } from 'drizzle-orm'
import type { DatabaseOrTransaction } from '../../db/client.js'
import { invites, users, workspaces } from '../../db/schema/index.js'
import type { Role } from '../../../shared/schemas/workspaces.js'

const openInvite = and(isNull(invites.acceptedAt), isNull(invites.revokedAt))

export async function revokeOpenInvitesFor(db: DatabaseOrTransaction, workspaceId: string, email: string) {
  await db
    .update(invites)
    .set({ revokedAt: new Date() })
    .where(and(eq(invites.workspaceId, workspaceId), eq(invites.email, email), openInvite))
}

export async function insertInvite(
  db: DatabaseOrTransaction,
  values: { workspaceId: string; email: string; role: Role; tokenHash: string; invitedBy: string; expiresAt: Date },
) {
  const [row] = await db.insert(invites).values(values).returning()
  return row!
}

const inviteColumns = {
  id: invites.id,
  workspaceId: invites.workspaceId,
  email: invites.email,
  role: invites.role,
  createdAt: invites.createdAt,
  expiresAt: invites.expiresAt,
  invitedByName: users.name,
}

export async function listOpenInvites(db: DatabaseOrTransaction, workspaceId: string) {
  return db
    .select(inviteColumns)
    .from(invites)
    .innerJoin(users, eq(users.id, invites.invitedBy))
    .where(and(eq(invites.workspaceId, workspaceId), openInvite, gt(invites.expiresAt, new Date())))
    .orderBy(asc(invites.createdAt))
}

export async function findOpenInvite(db: DatabaseOrTransaction, workspaceId: string, inviteId: string) {
  const [row] = await db
    .select(inviteColumns)
    .from(invites)
    .innerJoin(users, eq(users.id, invites.invitedBy))
    .where(and(eq(invites.workspaceId, workspaceId), eq(invites.id, inviteId), openInvite))
  return row
}

export async function revokeInvite(db: DatabaseOrTransaction, inviteId: string) {
  await db.update(invites).set({ revokedAt: new Date() }).where(eq(invites.id, inviteId))
}

/** An invite that can still be accepted, with what its page shows. */
export async function findUsableInviteByTokenHash(db: DatabaseOrTransaction, tokenHash: string, lock = false) {
  const query = db
    .select({ ...inviteColumns, workspaceName: workspaces.name })
    .from(invites)
    .innerJoin(users, eq(users.id, invites.invitedBy))
    .innerJoin(workspaces, eq(workspaces.id, invites.workspaceId))
    .where(and(eq(invites.tokenHash, tokenHash), openInvite, gt(invites.expiresAt, new Date())))
  const [row] = lock ? await query.for('update', { of: invites }) : await query
  return row
}

export async function markInviteAccepted(db: DatabaseOrTransaction, inviteId: string, userId: string) {
  await db.update(invites).set({ acceptedAt: new Date(), acceptedBy: userId }).where(eq(invites.id, inviteId))
}
