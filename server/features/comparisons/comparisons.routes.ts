import { Router, type RequestHandler } from 'express'
import { comparisonParamsSchema, createComparisonRequestSchema } from '../../../shared/schemas/comparisons.js'
import type { AppContext } from '../../context.js'
import { parseRequest } from '../../middleware/parseRequest.js'
import { requireWorkspaceRole } from '../../middleware/workspaceAccess.js'
import * as comparisonsService from './comparisons.service.js'

/** `/api/workspaces/:workspaceId/comparisons`: start, list, read, cancel and re-run stock comparisons. */
export function comparisonsRoutes(context: AppContext, requireAuth: RequestHandler): Router {
  const router = Router({ mergeParams: true })
  router.use(requireAuth)
  const asViewer = requireWorkspaceRole(context.db, 'viewer')
  const asMaker = requireWorkspaceRole(context.db, 'maker')

  router.post('/', asMaker, async (request, response) => {
    const { body } = parseRequest(request, { body: createComparisonRequestSchema })
    const comparison = await comparisonsService.createComparison(context, request.workspaceAccess!.workspaceId, request.user!.id, body)
    response.status(202).location(`${request.baseUrl}/${comparison.id}`).json(comparison)
  })

  router.get('/', asViewer, async (request, response) => {
    response.json(await comparisonsService.listComparisons(context, request.workspaceAccess!.workspaceId))
  })

  router.get('/:comparisonId', asViewer, async (request, response) => {
    const { params } = parseRequest(request, { params: comparisonParamsSchema })
    response.json(await comparisonsService.getComparison(context, params.workspaceId, params.comparisonId))
  })

  router.post('/:comparisonId/cancel', asMaker, async (request, response) => {
    const { params } = parseRequest(request, { params: comparisonParamsSchema })
    response.json(await comparisonsService.cancelComparison(context, params.workspaceId, params.comparisonId))
  })

  router.post('/:comparisonId/rerun', asMaker, async (request, response) => {
    const { params } = parseRequest(request, { params: comparisonParamsSchema })
    response.status(202).json(await comparisonsService.rerunComparison(context, params.workspaceId, request.user!.id, params.comparisonId))
  })

  return router
}
