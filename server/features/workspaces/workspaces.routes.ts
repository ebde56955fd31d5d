import { Router, type RequestHandler } from 'express'
import {
  createInviteRequestSchema,
  createWorkspaceRequestSchema,
  inviteParamsSchema,
  memberParamsSchema,
  updateMemberRequestSchema,
  updateWorkspaceRequestSchema,
} from '../../../shared/schemas/workspaces.js'
import type { AppContext } from '../../context.js'
import { parseRequest } from '../../middleware/parseRequest.js'
import { requireWorkspaceRole } from '../../middleware/workspaceAccess.js'
import * as invitesService from '../invites/invites.service.js'
import * as workspacesService from './workspaces.service.js'

/** `/api/workspaces`: the user's workspaces, and inside one, its members and invites. */
export function workspacesRoutes(context: AppContext, requireAuth: RequestHandler): Router {
  const router = Router()
  router.use(requireAuth)
  const asViewer = requireWorkspaceRole(context.db, 'viewer')
  const asOwner = requireWorkspaceRole(context.db, 'owner')

  router.get('/', async (request, response) => {
    response.json(await workspacesService.listWorkspaces(context, request.user!.id))
  })

  router.post('/', async (request, response) => {
    const { body } = parseRequest(request, { body: createWorkspaceRequestSchema })
    response.status(201).json(await workspacesService.createWorkspace(context, request.user!.id, body.name))
  })

  router.get('/:workspaceId', asViewer, async (request, response) => {
    response.json(await workspacesService.getWorkspace(context, request.user!.id, request.workspaceAccess!.workspaceId))
  })

  router.patch('/:workspaceId', asOwner, async (request, response) => {
    const { body } = parseRequest(request, { body: updateWorkspaceRequestSchema })
    response.json(await workspacesService.renameWorkspace(context, request.user!.id, request.workspaceAccess!.workspaceId, body.name))
  })

  router.get('/:workspaceId/members', asViewer, async (request, response) => {
    response.json(await workspacesService.listMembers(context, request.workspaceAccess!.workspaceId))
  })

  // Adding a member means inviting them: the person accepts from the e-mailed link.
  const invite: RequestHandler = async (request, response) => {
    const { body } = parseRequest(request, { body: createInviteRequestSchema })
    const created = await invitesService.createInvite(context, request.user!, request.workspaceAccess!.workspaceId, body)
    response.status(201).json(created)
  }
  router.post('/:workspaceId/members', asOwner, invite)
  router.post('/:workspaceId/invites', asOwner, invite)

  router.patch('/:workspaceId/members/:userId', asOwner, async (request, response) => {
    const { params, body } = parseRequest(request, { params: memberParamsSchema, body: updateMemberRequestSchema })
    response.json(await workspacesService.changeMemberRole(context, params.workspaceId, params.userId, body.role))
  })

  router.delete('/:workspaceId/members/:userId', asViewer, async (request, response) => {
    const { params } = parseRequest(request, { params: memberParamsSchema })
    const actor = { userId: request.user!.id, role: request.workspaceAccess!.role }
    await workspacesService.removeMember(context, actor, params.workspaceId, params.userId)
    response.status(204).end()
  })

  router.get('/:workspaceId/invites', asOwner, async (request, response) => {
    response.json(await invitesService.listInvites(context, request.workspaceAccess!.workspaceId))
  })

  router.delete('/:workspaceId/invites/:inviteId', asOwner, async (request, response) => {
    const { params } = parseRequest(request, { params: inviteParamsSchema })
    await invitesService.revokeInvite(context, params.workspaceId, params.inviteId)
    response.status(204).end()
  })

  return router
}
