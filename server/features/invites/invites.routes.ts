import { Router, type RequestHandler } from 'express'
import { acceptInviteRequestSchema, inviteTokenParamsSchema } from '../../../shared/schemas/workspaces.js'
import type { AppContext } from '../../context.js'
import { parseRequest } from '../../middleware/parseRequest.js'
import * as invitesService from './invites.service.js'

/** `/api/invites/:token`: public preview, and acceptance (signed in, or creating the account). */
export function invitesRoutes(context: AppContext, optionalAuth: RequestHandler): Router {
  const router = Router()

  router.get('/:token', async (request, response) => {
    const { params } = parseRequest(request, { params: inviteTokenParamsSchema })
    response.json(await invitesService.previewInvite(context, params.token))
  })

  router.post('/:token/accept', optionalAuth, async (request, response) => {
    const { params, body } = parseRequest(request, { params: inviteTokenParamsSchema, body: acceptInviteRequestSchema })
    const accepted = await invitesService.acceptInvite(context, params.token, request.user?.id, body)
    response.json(accepted)
  })

  return router
}
