import type { AcceptInviteRequest, Invite, InvitePreview, Role } from '../../../shared/schemas/workspaces.js'
import type { AppContext } from '../../context.js'
import { AppError, conflict, forbidden, notFound, unauthenticated } from '../../errors.js'
import { findUserByEmail, findUserById, insertUser } from '../auth/auth.repo.js'
import { hashPassword } from '../auth/passwords.js'
import { createOpaqueToken, hashToken } from '../auth/tokens.js'
import { inviteMail } from '../mail/mail.templates.js'
import { findMembership, findWorkspace, insertMembership } from '../workspaces/workspaces.repo.js'
import * as repo from './invites.repo.js'

const inviteTtlMs = 7 * 24 * 3600 * 1000

function toInvite(row: { id: string; email: string; role: Role; invitedByName: string; createdAt: Date; expiresAt: Date }): Invite {
  return { id: row.id, email: row.email, role: row.role, invitedByName: row.invitedByName, createdAt: row.createdAt.toISOString(), expiresAt: row.expiresAt.toISOString() }
}

export async function listInvites(context: AppContext, workspaceId: string): Promise<Invite[]> {
  return (await repo.listOpenInvites(context.db, workspaceId)).map(toInvite)
}

/** Invites a person by e-mail with a role. A newer invite to the same address replaces the open one. */
export async function createInvite(
  context: AppContext,
  inviter: { id: string; name: string },
  workspaceId: string,
  input: { email: string; role: Role },
): Promise<Invite> {
  const token = createOpaqueToken()
  const expiresAt = new Date(Date.now() + inviteTtlMs)
  const { invite, mailId } = await context.db.transaction(async (tx) => {
    const workspace = await findWorkspace(tx, workspaceId)
    if (!workspace) throw notFound('Workspace')
    const existingUser = await findUserByEmail(tx, input.email)
    if (existingUser && (await findMembership(tx, workspaceId, existingUser.id))) {
      throw new AppError('conflict', 409, `${input.email} is already a member of this workspace`, { 'body.email': ['Already a member'] })
    }
    await repo.revokeOpenInvitesFor(tx, workspaceId, input.email)
    const row = await repo.insertInvite(tx, { workspaceId, email: input.email, role: input.role, tokenHash: hashToken(token), invitedBy: inviter.id, expiresAt })
    const link = `${context.config.appUrl}/invite/${encodeURIComponent(token)}`
    const mailId = await context.mail.write(
      tx,
      inviteMail({ to: input.email, workspaceName: workspace.name, invitedByName: inviter.name, role: input.role, link, expiresAt }),
    )
    return { invite: toInvite({ ...row, invitedByName: inviter.name }), mailId }
  })
  await context.mail.dispatch(mailId)
  return invite
}

export async function revokeInvite(context: AppContext, workspaceId: string, inviteId: string): Promise<void> {
  const invite = await repo.findOpenInvite(context.db, workspaceId, inviteId)
  if (!invite) throw notFound('Invite')
  await repo.revokeInvite(context.db, inviteId)
}

const unusableInvite = () => notFound('Invite (the link may have expired, been used or been withdrawn)')

export async function previewInvite(context: AppContext, token: string): Promise<InvitePreview> {
  const invite = await repo.findUsableInviteByTokenHash(context.db, hashToken(token))
  if (!invite) throw unusableInvite()
  const account = await findUserByEmail(context.db, invite.email)
  return {
    workspaceName: invite.workspaceName,
    email: invite.email,
    role: invite.role,
    invitedByName: invite.invitedByName,
    expiresAt: invite.expiresAt.toISOString(),
    accountExists: Boolean(account),
  }
}

/**
 * Accepts an invite. A person with an account must be signed in as the invited e-mail;
 * a new person sends a name and password and the account is created with the membership.
 */
export async function acceptInvite(
  context: AppContext,
  token: string,
  signedInUserId: string | undefined,
  input: AcceptInviteRequest,
): Promise<{ workspaceId: string; role: Role; accountCreated: boolean }> {
  const passwordHash = input.password ? await hashPassword(input.password) : undefined
  return context.db.transaction(async (tx) => {
    const invite = await repo.findUsableInviteByTokenHash(tx, hashToken(token), true)
    if (!invite) throw unusableInvite()
    const account = await findUserByEmail(tx, invite.email)
    let userId: string
    let accountCreated = false
    if (account) {
      if (!signedInUserId) throw unauthenticated(`Sign in as ${invite.email} to accept this invite`)
      const signedIn = await findUserById(tx, signedInUserId)
      if (signedIn?.id !== account.id) throw forbidden(`This invite is for ${invite.email}. Sign in with that account to accept it.`)
      userId = account.id
    } else {
      const fields: Record<string, string[]> = {}
      if (!input.name) fields['body.name'] = ['Enter your name']
      if (!passwordHash) fields['body.password'] = ['Choose a password']
      if (Object.keys(fields).length > 0) throw new AppError('validation_failed', 400, 'Enter your name and choose a password to create your account', fields)
      userId = (await insertUser(tx, { email: invite.email, name: input.name!, passwordHash: passwordHash! })).id
      accountCreated = true
    }
    if (await findMembership(tx, invite.workspaceId, userId)) throw conflict('You are already a member of this workspace')
    await insertMembership(tx, { workspaceId: invite.workspaceId, userId, role: invite.role })
    await repo.markInviteAccepted(tx, invite.id, userId)
    return { workspaceId: invite.workspaceId, role: invite.role, accountCreated }
  })
}
