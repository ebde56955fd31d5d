import { request } from '../../api/client'
import { sessionResponseSchema, userSchema, type SessionResponse, type UpdateMeRequest, type User } from '../../../shared/schemas/index'

export function fetchMe(): Promise<User> {
  return request('/api/me', { schema: userSchema })
}

export function updateMe(changes: UpdateMeRequest): Promise<User> {
  return request('/api/me', { method: 'PATCH', body: changes, schema: userSchema })
}

/** Changing the password ends every session; the answer is a fresh one for this browser. */
export function changePassword(currentPassword: string, newPassword: string): Promise<SessionResponse> {
  return request('/api/me/password', { method: 'POST', body: { currentPassword, newPassword }, schema: sessionResponseSchema })
}
