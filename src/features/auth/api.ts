import { request } from '../../api/client'
import { sessionResponseSchema, type SessionResponse, type SignInRequest, type SignUpRequest } from '../../../shared/schemas/index'

// Auth endpoints answer 401 for wrong credentials; that must not start a session refresh.
export function signIn(body: SignInRequest): Promise<SessionResponse> {
  return request('/api/auth/signin', { method: 'POST', body, schema: sessionResponseSchema, withoutSession: true })
}

export function signUp(body: SignUpRequest): Promise<SessionResponse> {
  return request('/api/auth/signup', { method: 'POST', body, schema: sessionResponseSchema, withoutSession: true })
}

export function signOut(): Promise<void> {
  return request('/api/auth/signout', { method: 'POST', withoutSession: true })
}

/** Always accepted, whether or not the address has an account, so nobody can probe for accounts. */
export function requestPasswordReset(email: string): Promise<void> {
  return request('/api/auth/password-reset', { method: 'POST', body: { email }, withoutSession: true })
}

export function confirmPasswordReset(token: string, password: string): Promise<void> {
  return request('/api/auth/password-reset/confirm', { method: 'POST', body: { token, password }, withoutSession: true })
}
