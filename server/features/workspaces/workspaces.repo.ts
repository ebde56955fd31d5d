import { and, asc, count, eq } from 'drizzle-orm'
import type { DatabaseOrTransaction } from '../../db/client.js'
import { memberships, users, workspaces } from '../../db/schema/index.js'
import type { Role } from '../../../shared/schemas/workspaces.js'

export async function insertWorkspace(db: DatabaseOrTransaction, name: string) {
  const [row] = await db.insert(workspaces).values({ name }).returning()
  return row!
}

export async function updateWorkspaceName(db: DatabaseOrTransaction, workspaceId: string, name: string) {
  await db.update(workspaces).set({ name }).where(eq(workspaces.id, workspaceId))
}

export async function findWorkspace(db: DatabaseOrTransaction, workspaceId: string) {
  const [row] = await db.select().from(workspaces).where(eq(workspaces.id, workspaceId))
  return row
}

export async function insertMembership(db: DatabaseOrTransaction, values: { workspaceId: string; userId: string; role: Role }) {
  await db.insert(memberships).values(values).onConflictDoNothing()
}

export async function findMembership(db: DatabaseOrTransaction, workspaceId: string, userId: string) {
  const [row] = await db
    .select()
    .from(memberships)
    .where(and(eq(memberships.workspaceId, workspaceId), eq(memberships.userId, userId)))
  return row
}

/** Locks the workspace's membership rows so concurrent role changes cannot both remove the last owner. */
export async function lockMemberships(db: DatabaseOrTransaction, workspaceId: string) {
  return db.select().from(memberships).where(eq(memberships.workspaceId, workspaceId)).for('update')
}

export async function updateMembershipRole(db: DatabaseOrTransaction, workspaceId: string, userId: string, role: Role) {
  await db
    .update(memberships)
    .set({ role })
    .where(and(eq(memberships.workspaceId, workspaceId), eq(memberships.userId, userId)))
}

export async function deleteMembership(db: DatabaseOrTransaction, workspaceId: string, userId: string) {
  await db.delete(memberships).where(and(eq(memberships.workspaceId, workspaceId), eq(memberships.userId, userId)))
}

export async function listWorkspacesOfUser(db: DatabaseOrTransaction, userId: string) {
  const memberCounts = db
    .select({ workspaceId: memberships.workspaceId, memberCount: count().as('member_count') })
    .from(memberships)
    .groupBy(memberships.workspaceId)
    .as('member_counts')
  return db
    .select({
      id: workspaces.id,
      name: workspaces.name,
      role: memberships.role,
      createdAt: workspaces.createdAt,
      memberCount: memberCounts.memberCount,
    })
    .from(memberships)
    .innerJoin(workspaces, eq(workspaces.id, memberships.workspaceId))
    .innerJoin(memberCounts, eq(memberCounts.workspaceId, workspaces.id))
    .where(eq(memberships.userId, userId))
    .orderBy(asc(workspaces.name))
}

export async function listMembers(db: DatabaseOrTransaction, workspaceId: string) {
  return db
    .select({ userId: users.id, name: users.name, email: users.email, role: memberships.role, joinedAt: memberships.createdAt })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.workspaceId, workspaceId))
    .orderBy(asc(users.name))
}
