import { z } from 'zod'
import { request, segment } from '../../api/client'
import {
  inviteSchema,
  memberSchema,
  type CreateInviteRequest,
  type Invite,
  type Member,
  type Role,
} from '../../../shared/schemas/index'

const workspacePath = (workspaceId: string) => `/api/workspaces/${segment(workspaceId)}`

export function listMembers(workspaceId: string): Promise<Member[]> {
  return request(`${workspacePath(workspaceId)}/members`, { schema: z.array(memberSchema) })
}

export function changeMemberRole(workspaceId: string, userId: string, role: Role): Promise<Member> {
  return request(`${workspacePath(workspaceId)}/members/${segment(userId)}`, { method: 'PATCH', body: { role }, schema: memberSchema })
}

/** Removes a member; a member removing themselves is how they leave. */
export function removeMember(workspaceId: string, userId: string): Promise<void> {
  return request(`${workspacePath(workspaceId)}/members/${segment(userId)}`, { method: 'DELETE' })
}

export function listInvites(workspaceId: string): Promise<Invite[]> {
  return request(`${workspacePath(workspaceId)}/invites`, { schema: z.array(inviteSchema) })
}

export function createInvite(workspaceId: string, invite: CreateInviteRequest): Promise<Invite> {
  return request(`${workspacePath(workspaceId)}/invites`, { method: 'POST', body: invite, schema: inviteSchema })
}

export function revokeInvite(workspaceId: string, inviteId: string): Promise<void> {
  return request(`${workspacePath(workspaceId)}/invites/${segment(inviteId)}`, { method: 'DELETE' })
}
