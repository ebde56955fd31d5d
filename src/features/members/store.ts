import { ref } from 'vue'
import { defineStore } from 'pinia'
import type { CreateInviteRequest, Invite, Member, Role } from '../../../shared/schemas/index'
import * as membersApi from './api'

/** Members and pending invites of the workspace the Members page shows. */
export const useMembersStore = defineStore('members', () => {
  const workspaceId = ref<string | null>(null)
  const members = ref<Member[]>([])
  const invites = ref<Invite[]>([])
  const loading = ref(false)

  /** Invites are owner-only on the server, so other roles don't ask for them. */
  async function load(forWorkspaceId: string, includeInvites: boolean): Promise<void> {
    if (workspaceId.value !== forWorkspaceId) {
      members.value = []
      invites.value = []
    }
    workspaceId.value = forWorkspaceId
    loading.value = true
    try {
      const [memberList, inviteList] = await Promise.all([
        membersApi.listMembers(forWorkspaceId),
        includeInvites ? membersApi.listInvites(forWorkspaceId) : Promise.resolve([]),
      ])
      // A slow answer for a workspace the person has already left must not overwrite the new one.
      if (workspaceId.value !== forWorkspaceId) return
      members.value = memberList
      invites.value = inviteList
    } finally {
      if (workspaceId.value === forWorkspaceId) loading.value = false
    }
  }

  function requireWorkspace(): string {
    if (!workspaceId.value) throw new Error('Members are not loaded for any workspace')
    return workspaceId.value
  }

  async function changeRole(userId: string, role: Role): Promise<Member> {
    const updated = await membersApi.changeMemberRole(requireWorkspace(), userId, role)
    members.value = members.value.map((member) => (member.userId === updated.userId ? updated : member))
    return updated
  }

  async function remove(userId: string): Promise<void> {
    await membersApi.removeMember(requireWorkspace(), userId)
    members.value = members.value.filter((member) => member.userId !== userId)
  }

  async function invite(request: CreateInviteRequest): Promise<Invite> {
    const created = await membersApi.createInvite(requireWorkspace(), request)
    // Re-inviting an address may replace its earlier invite on the server.
    invites.value = [created, ...invites.value.filter((existing) => existing.id !== created.id && existing.email !== created.email)]
    return created
  }

  async function revokeInvite(inviteId: string): Promise<void> {
    await membersApi.revokeInvite(requireWorkspace(), inviteId)
    invites.value = invites.value.filter((existing) => existing.id !== inviteId)
  }

  return { workspaceId, members, invites, loading, load, changeRole, remove, invite, revokeInvite }
})
