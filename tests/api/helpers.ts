import { randomUUID } from 'node:crypto'
import { inject } from 'vitest'
import request from 'supertest'
import type { OutboxMessage, SessionResponse, WorkspaceSummary } from '../../shared/schemas/index.js'

export const baseUrl = inject('baseUrl')
export const api = () => request(baseUrl)

export const testPassword = 'correct-horse-staple-42'

/** A fresh address per call, so tests never depend on each other's accounts. */
export function uniqueEmail(label = 'person'): string {
  return `${label}-${randomUUID().slice(0, 8)}@studio.example`
}

export interface SignedUpUser {
  email: string
  password: string
  accessToken: string
  refreshCookie: string
  user: SessionResponse['user']
  workspace: WorkspaceSummary
}

export function refreshCookieFrom(response: request.Response): string {
  const cookies = ([] as string[]).concat(response.headers['set-cookie'] ?? [])
  const cookie = cookies.find((entry) => entry.startsWith('sheetsmith_refresh='))
  if (!cookie) throw new Error('no refresh cookie in the answer')
  return cookie.split(';')[0]!
}

export async function signUp(label = 'owner', password = testPassword): Promise<SignedUpUser> {
  const email = uniqueEmail(label)
  const response = await api().post('/api/auth/signup').send({ name: `Test ${label}`, email, password, workspaceName: `${label} bench` })
  if (response.status !== 201) throw new Error(`sign-up failed: ${response.status} ${JSON.stringify(response.body)}`)
  const body = response.body as SessionResponse
  const workspaces = await api().get('/api/workspaces').set('Authorization', `Bearer ${body.accessToken}`)
  return { email, password, accessToken: body.accessToken, refreshCookie: refreshCookieFrom(response), user: body.user, workspace: workspaces.body[0] }
}

export async function signIn(email: string, password = testPassword): Promise<{ accessToken: string; refreshCookie: string }> {
  const response = await api().post('/api/auth/signin').send({ email, password })
  if (response.status !== 200) throw new Error(`sign-in failed: ${response.status} ${JSON.stringify(response.body)}`)
  return { accessToken: response.body.accessToken, refreshCookie: refreshCookieFrom(response) }
}

export const bearer = (token: string) => ({ Authorization: `Bearer ${token}` })

/** Waits for the mail catcher to hold a message to `to` whose subject contains `subjectPart` (mail goes through a job). */
export async function waitForMail(to: string, subjectPart: string, timeoutMs = 15_000): Promise<OutboxMessage> {
  const deadline = Date.now() + timeoutMs
  while (Date.now() < deadline) {
    const response = await api().get('/api/dev/outbox')
    const found = (response.body as OutboxMessage[]).find((message) => message.to.includes(to) && message.subject.includes(subjectPart))
    if (found) return found
    await new Promise((resolve) => setTimeout(resolve, 250))
  }
  throw new Error(`no mail to ${to} about "${subjectPart}" within ${timeoutMs} ms`)
}

/** The token at the end of an e-mailed link such as …/invite/<token> or …/reset-password?token=<token>. */
export function tokenFromLink(link: string): string {
  const url = new URL(link)
  return url.searchParams.get('token') ?? decodeURIComponent(url.pathname.split('/').pop()!)
}

/** Invites `email` into the owner's workspace and accepts as a new account; returns the member's session. */
export async function addMember(owner: SignedUpUser, role: 'owner' | 'maker' | 'viewer', label: string = role) {
  const email = uniqueEmail(label)
  const invite = await api().post(`/api/workspaces/${owner.workspace.id}/invites`).set(bearer(owner.accessToken)).send({ email, role })
  if (invite.status !== 201) throw new Error(`invite failed: ${invite.status} ${JSON.stringify(invite.body)}`)
  const mail = await waitForMail(email, 'invited you')
  const token = tokenFromLink(mail.links[0]!)
  const accepted = await api().post(`/api/invites/${token}/accept`).send({ name: `Test ${label}`, password: testPassword })
  if (accepted.status !== 200) throw new Error(`accept failed: ${accepted.status} ${JSON.stringify(accepted.body)}`)
  const session = await signIn(email)
  const me = await api().get('/api/me').set(bearer(session.accessToken))
  return { email, userId: me.body.id as string, ...session }
}
