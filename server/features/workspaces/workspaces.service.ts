import type { Member, Role, WorkspaceSummary } from '../../../shared/schemas/workspaces.js'
import type { AppContext } from '../../context.js'
import { conflict, forbidden, notFound } from '../../errors.js'
import * as repo from './workspaces.repo.js'

function toSummary(row: Awaited<ReturnType<typeof repo.listWorkspacesOfUser>>[number]): WorkspaceSummary {
  return { id: row.id, name: row.name, role: row.role, memberCount: Number(row.memberCount), createdAt: row.createdAt.toISOString() }
}

export async function listWorkspaces(context: AppContext, userId: string): Promise<WorkspaceSummary[]> {
  return (await repo.listWorkspacesOfUser(context.db, userId)).map(toSummary)
}

export async function getWorkspace(context: AppContext, userId: string, workspaceId: string): Promise<WorkspaceSummary> {
  const found = (await repo.listWorkspacesOfUser(context.db, userId)).find((row) => row.id === workspaceId)
  if (!found) throw notFound('Workspace')
  return toSummary(found)
}

export async function createWorkspace(context: AppContext, userId: string, name: string): Promise<WorkspaceSummary> {
  const workspaceId = await context.db.transaction(async (tx) => {
    const workspace = await repo.insertWorkspace(tx, name)
    await repo.insertMembership(tx, { workspaceId: workspace.id, userId, role: 'owner' })
    return workspace.id
  })
  return getWorkspace(context, userId, workspaceId)
}

export async function renameWorkspace(context: AppContext, userId: string, workspaceId: string, name: string): Promise<WorkspaceSummary> {
  await repo.updateWorkspaceName(context.db, workspaceId, name)
  return getWorkspace(context, userId, workspaceId)
}

function toMember(row: Awaited<ReturnType<typeof repo.listMembers>>[number]): Member {
  return { userId: row.userId, name: row.name, email: row.email, role: row.role, joinedAt: row.joinedAt.toISOString() }
}

export async function listMembers(context: AppContext, workspaceId: string): Promise<Member[]> {
  return (await repo.listMembers(context.db, workspaceId)).map(toMember)
}

const lastOwnerMessage = 'A workspace needs at least one owner. Make another member an owner first.'

/** Changes a member's role; the last owner cannot be demoted. Runs under a lock on the workspace's memberships. */
export async function changeMemberRole(context: AppContext, workspaceId: string, userId: string, role: Role): Promise<Member> {
  await context.db.transaction(async (tx) => {
    const members = await repo.lockMemberships(tx, workspaceId)
    const target = members.find((member) => member.userId === userId)
    if (!target) throw notFound('Member')
    const owners = members.filter((member) => member.role === 'owner')
    if (target.role === 'owner' && role !== 'owner' && owners.length === 1) throw conflict(lastOwnerMessage)
    await repo.updateMembershipRole(tx, workspaceId, userId, role)
  })
  const member = (await listMembers(context, workspaceId)).find((entry) => entry.userId === userId)
  return member!
}

/** Owners remove anyone; any member may remove themselves (leave). The last owner can do neither. */
export async function removeMember(context: AppContext, actor: { userId: string; role: Role }, workspaceId: string, userId: string): Promise<void> {
  if (actor.role !== 'owner' && actor.userId !== userId) throw forbidden('Only an owner can remove other members')
  await context.db.transaction(async (tx) => {
    const members = await repo.lockMemberships(tx, workspaceId)
    const target = members.find((member) => member.userId === userId)
    if (!target) throw notFound('Member')
    const owners = members.filter((member) => member.role === 'owner')
    if (target.role === 'owner' && owners.length === 1) throw conflict(lastOwnerMessage)
    await repo.deleteMembership(tx, workspaceId, userId)
  })
}
