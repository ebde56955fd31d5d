import { request, segment } from '../../api/client'
import {
  acceptInviteResponseSchema,
  invitePreviewSchema,
  type AcceptInviteRequest,
  type InvitePreview,
} from '../../../shared/schemas/index'
import type { z } from 'zod'

export type AcceptInviteResponse = z.infer<typeof acceptInviteResponseSchema>

export function fetchInvitePreview(token: string): Promise<InvitePreview> {
  return request(`/api/invites/${segment(token)}`, { schema: invitePreviewSchema, withoutSession: true })
}

/** An existing account accepts while signed in as the invited address. */
export function acceptInviteAsSignedIn(token: string): Promise<AcceptInviteResponse> {
  return request(`/api/invites/${segment(token)}/accept`, { method: 'POST', body: {}, schema: acceptInviteResponseSchema })
}

/**
 * A new person creates their account by accepting. Whoever else is signed in on this browser
 * must not be sent along, or the server would treat it as their acceptance.
 */
export function acceptInviteWithNewAccount(token: string, details: Required<AcceptInviteRequest>): Promise<AcceptInviteResponse> {
  return request(`/api/invites/${segment(token)}/accept`, {
    method: 'POST',
    body: details,
    schema: acceptInviteResponseSchema,
    withoutSession: true,
  })
}
