import { z } from 'zod'
import { emailSchema, personNameSchema, passwordSchema, workspaceNameSchema } from './auth.js'

export const roles = ['owner', 'maker', 'viewer'] as const
export const roleSchema = z.enum(roles, { error: 'Role must be owner, maker or viewer' })
export type Role = z.infer<typeof roleSchema>

export const uuidParam = z.uuid({ error: 'Not a valid id' })
export const workspaceParamsSchema = z.object({ workspaceId: uuidParam })
export const memberParamsSchema = z.object({ workspaceId: uuidParam, userId: uuidParam })
export const inviteParamsSchema = z.object({ workspaceId: uuidParam, inviteId: uuidParam })
export const inviteTokenParamsSchema = z.object({ token: z.string().min(20).max(200) })

export const workspaceSummarySchema = z.object({
  id: z.string(),
  name: z.string(),
  role: roleSchema,
  memberCount: z.number(),
  createdAt: z.string(),
})
export type WorkspaceSummary = z.infer<typeof workspaceSummarySchema>

export const createWorkspaceRequestSchema = z.object({ name: workspaceNameSchema })
export const updateWorkspaceRequestSchema = z.object({ name: workspaceNameSchema })

export const memberSchema = z.object({
  userId: z.string(),
  name: z.string(),
  email: z.string(),
  role: roleSchema,
  joinedAt: z.string(),
})
export type Member = z.infer<typeof memberSchema>

export const updateMemberRequestSchema = z.object({ role: roleSchema })

export const createInviteRequestSchema = z.object({ email: emailSchema, role: roleSchema })
export type CreateInviteRequest = z.input<typeof createInviteRequestSchema>

export const inviteSchema = z.object({
  id: z.string(),
  email: z.string(),
  role: roleSchema,
  invitedByName: z.string(),
  createdAt: z.string(),
  expiresAt: z.string(),
})
export type Invite = z.infer<typeof inviteSchema>

/** What the invite link shows before it is accepted (public, by token). */
export const invitePreviewSchema = z.object({
  workspaceName: z.string(),
  email: z.string(),
  role: roleSchema,
  invitedByName: z.string(),
  expiresAt: z.string(),
  /** True when an account with the invited e-mail exists: the invitee signs in instead of setting a password. */
  accountExists: z.boolean(),
})
export type InvitePreview = z.infer<typeof invitePreviewSchema>

/** Accepting: a signed-in user sends nothing; a new person sends a name and a password to create the account. */
export const acceptInviteRequestSchema = z.object({
  name: personNameSchema.optional(),
  password: passwordSchema.optional(),
})
export type AcceptInviteRequest = z.input<typeof acceptInviteRequestSchema>

export const acceptInviteResponseSchema = z.object({
  workspaceId: z.string(),
  role: roleSchema,
})
