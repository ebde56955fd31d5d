import { Router, type RequestHandler } from 'express'
import { copyLayoutRequestSchema, createLayoutRequestSchema, layoutListQuerySchema, layoutParamsSchema, updateLayoutRequestSchema } from '../../../shared/schemas/layouts.js'
import type { AppContext } from '../../context.js'
import { parseRequest } from '../../middleware/parseRequest.js'
import { requireWorkspaceRole } from '../../middleware/workspaceAccess.js'
import * as layoutsService from './layouts.service.js'

/** Layouts with their many placements are larger than other bodies: the contract allows 5000 placed pieces. */
export const maxLayoutBodyBytes = 4 * 1024 * 1024

/** `/api/workspaces/:workspaceId/layouts`: list, create, read, save (with version check), delete, copy and templates. */
export function layoutsRoutes(context: AppContext, requireAuth: RequestHandler): Router {
  const router = Router({ mergeParams: true })
  router.use(requireAuth)
  const asViewer = requireWorkspaceRole(context.db, 'viewer')
  const asMaker = requireWorkspaceRole(context.db, 'maker')

  router.get('/', asViewer, async (request, response) => {
    const { query } = parseRequest(request, { query: layoutListQuerySchema })
    response.json(await layoutsService.listLayouts(context, request.workspaceAccess!.workspaceId, query))
  })

  router.post('/', asMaker, async (request, response) => {
    const { body } = parseRequest(request, { body: createLayoutRequestSchema })
    const layout = await layoutsService.createLayout(context, request.workspaceAccess!.workspaceId, request.user!.id, body)
    response.status(201).location(`${request.baseUrl}/${layout.id}`).json(layout)
  })

  router.get('/:layoutId', asViewer, async (request, response) => {
    const { params } = parseRequest(request, { params: layoutParamsSchema })
    response.json(await layoutsService.getLayout(context, params.workspaceId, params.layoutId))
  })

  router.put('/:layoutId', asMaker, async (request, response) => {
    const { params, body } = parseRequest(request, { params: layoutParamsSchema, body: updateLayoutRequestSchema })
    response.json(await layoutsService.updateLayout(context, params.workspaceId, params.layoutId, request.user!.id, body))
  })

  router.delete('/:layoutId', asMaker, async (request, response) => {
    const { params } = parseRequest(request, { params: layoutParamsSchema })
    await layoutsService.deleteLayout(context, params.workspaceId, params.layoutId)
    response.status(204).end()
  })

  router.post('/:layoutId/copy', asMaker, async (request, response) => {
    const { params, body } = parseRequest(request, { params: layoutParamsSchema, body: copyLayoutRequestSchema })
    const layout = await layoutsService.copyLayout(context, params.workspaceId, params.layoutId, request.user!.id, body)
    response.status(201).location(`${request.baseUrl}/${layout.id}`).json(layout)
  })

  return router
}
