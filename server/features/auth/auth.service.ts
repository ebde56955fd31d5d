import { randomUUID } from 'node:crypto'
import type { SessionResponse, User } from '../../../shared/schemas/auth.js'
import type { AppContext } from '../../context.js'
import { AppError, invalidField, unauthenticated } from '../../errors.js'
import { passwordResetMail } from '../mail/mail.templates.js'
import { insertMembership, insertWorkspace } from '../workspaces/workspaces.repo.js'
import * as repo from './auth.repo.js'
import { hashPassword, verifyDecoy, verifyPassword } from './passwords.js'
import { createOpaqueToken, hashToken, signAccessToken } from './tokens.js'

const passwordResetTtlMs = 60 * 60 * 1000

export function toUser(row: repo.UserRow): User {
  return { id: row.id, email: row.email, name: row.name, unitSystem: row.unitSystem, createdAt: row.createdAt.toISOString() }
}

/** A session = a signed access token (returned) + a new refresh token (for the httpOnly cookie). */
export interface IssuedSession {
  response: SessionResponse
  refreshToken: string
  refreshExpiresAt: Date
}

async function issueSession(context: AppContext, db: Parameters<typeof repo.insertRefreshSession>[0], user: repo.UserRow, familyId: string): Promise<IssuedSession> {
  const refreshToken = createOpaqueToken()
  const refreshExpiresAt = new Date(Date.now() + context.config.refreshTokenTtlDays * 24 * 3600 * 1000)
  await repo.insertRefreshSession(db, { userId: user.id, familyId, tokenHash: hashToken(refreshToken), expiresAt: refreshExpiresAt })
  const accessToken = signAccessToken(user.id, context.config.jwtSecret, context.config.accessTokenTtlSeconds)
  return { response: { accessToken, expiresInSeconds: context.config.accessTokenTtlSeconds, user: toUser(user) }, refreshToken, refreshExpiresAt }
}

/** Creates the account and its first workspace (the new user is its owner), then signs in. */
export async function signUp(
  context: AppContext,
  input: { name: string; email: string; password: string; workspaceName?: string },
): Promise<IssuedSession> {
  const passwordHash = await hashPassword(input.password)
  return context.db.transaction(async (tx) => {
    if (await repo.findUserByEmail(tx, input.email)) {
      throw new AppError('conflict', 409, 'An account with this e-mail already exists. Sign in, or reset the password.', {
        'body.email': ['An account with this e-mail already exists'],
      })
    }
    const user = await repo.insertUser(tx, { email: input.email, name: input.name, passwordHash })
    const workspace = await insertWorkspace(tx, input.workspaceName ?? `${input.name}'s studio`)
    await insertMembership(tx, { workspaceId: workspace.id, userId: user.id, role: 'owner' })
    return issueSession(context, tx, user, randomUUID())
  })
}

const badCredentials = () => unauthenticated('That e-mail and password do not match an account.')

export async function signIn(context: AppContext, input: { email: string; password: string }): Promise<IssuedSession> {
  const user = await repo.findUserByEmail(context.db, input.email)
  const valid = user ? await verifyPassword(user.passwordHash, input.password) : await verifyDecoy(input.password)
  if (!user || !valid) throw badCredentials()
  return issueSession(context, context.db, user, randomUUID())
}

/** How long after its rotation a refresh token still counts as a concurrent use rather than a replay. */
export const refreshReuseGraceMs = 10_000

/**
 * Rotates a refresh token: the presented one is retired and a new one issued in the same family.
 * Presenting a retired token means it was copied: the whole family is revoked.
 */
export async function refresh(context: AppContext, refreshToken: string | undefined): Promise<IssuedSession> {
  if (!refreshToken) throw unauthenticated('No session to resume. Sign in.')
  const outcome = await context.db.transaction(async (tx) => {
    const session = await repo.findRefreshSession(tx, hashToken(refreshToken))
    if (!session || session.revokedAt || session.expiresAt <= new Date()) return { kind: 'invalid' as const }
    // Two tabs (or two quick reloads) may present the same token before either sees the new cookie: within a few
    // seconds of its rotation a retired token is answered with another token of the family instead of being
    // treated as stolen (common practice for rotating refresh tokens).
    const concurrent = session.replacedAt !== null && Date.now() - session.replacedAt.getTime() < refreshReuseGraceMs
    if (session.replacedAt && !concurrent) {
      await repo.revokeRefreshFamily(tx, session.familyId)
      return { kind: 'reused' as const }
    }
    const user = await repo.findUserById(tx, session.userId)
    if (!user) return { kind: 'invalid' as const }
    if (!concurrent) await repo.markRefreshSessionReplaced(tx, session.id)
    return { kind: 'ok' as const, issued: await issueSession(context, tx, user, session.familyId) }
  })
  if (outcome.kind === 'reused') context.logger.warn('a retired refresh token was presented; its session family is revoked')
  if (outcome.kind !== 'ok') throw unauthenticated('Your session has ended. Sign in again.')
  return outcome.issued
}

export async function signOut(context: AppContext, refreshToken: string | undefined): Promise<void> {
  if (!refreshToken) return
  await context.db.transaction(async (tx) => {
    const session = await repo.findRefreshSession(tx, hashToken(refreshToken))
    if (session) await repo.revokeRefreshFamily(tx, session.familyId)
  })
}

/** Always succeeds from the caller's view, so the answer does not reveal whether the e-mail has an account. */
export async function requestPasswordReset(context: AppContext, email: string): Promise<void> {
  const user = await repo.findUserByEmail(context.db, email)
  if (!user) return
  const token = createOpaqueToken()
  const expiresAt = new Date(Date.now() + passwordResetTtlMs)
  const mailId = await context.db.transaction(async (tx) => {
    await repo.insertPasswordReset(tx, { userId: user.id, tokenHash: hashToken(token), expiresAt })
    const link = `${context.config.appUrl}/reset-password?token=${encodeURIComponent(token)}`
    return context.mail.write(tx, passwordResetMail({ to: user.email, name: user.name, link, expiresAt }))
  })
  await context.mail.dispatch(mailId)
}

export async function confirmPasswordReset(context: AppContext, input: { token: string; password: string }): Promise<void> {
  const passwordHash = await hashPassword(input.password)
  await context.db.transaction(async (tx) => {
    const reset = await repo.findUsablePasswordReset(tx, hashToken(input.token))
    if (!reset) throw invalidField('body.token', 'This reset link is not valid or has expired. Ask for a new one.')
    await repo.markPasswordResetUsed(tx, reset.id)
    await repo.updatePasswordHash(tx, reset.userId, passwordHash)
    await repo.revokeAllRefreshSessions(tx, reset.userId)
  })
}

export async function getMe(context: AppContext, userId: string): Promise<User> {
  const user = await repo.findUserById(context.db, userId)
  if (!user) throw unauthenticated()
  return toUser(user)
}

export async function updateMe(context: AppContext, userId: string, changes: { name?: string; unitSystem?: 'mm' | 'in' }): Promise<User> {
  const user = await repo.updateUser(context.db, userId, changes)
  if (!user) throw unauthenticated()
  return toUser(user)
}

/**
 * Changing the password ends every session: refresh tokens are revoked and older access tokens refused.
 * The caller gets a fresh session so this browser stays signed in.
 */
export async function changePassword(
  context: AppContext,
  userId: string,
  input: { currentPassword: string; newPassword: string },
): Promise<IssuedSession> {
  const user = await repo.findUserById(context.db, userId)
  if (!user) throw unauthenticated()
  if (!(await verifyPassword(user.passwordHash, input.currentPassword))) {
    throw invalidField('body.currentPassword', 'The current password is not right')
  }
  const passwordHash = await hashPassword(input.newPassword)
  return context.db.transaction(async (tx) => {
    await repo.updatePasswordHash(tx, userId, passwordHash)
    await repo.revokeAllRefreshSessions(tx, userId)
    return issueSession(context, tx, user, randomUUID())
  })
}
