import { Router, type RequestHandler } from 'express'
import { cutPlanExportQuerySchema, cutPlanQuerySchema } from '../../../shared/schemas/cutplan.js'
import { layoutParamsSchema } from '../../../shared/schemas/layouts.js'
import type { AppContext } from '../../context.js'
import { parseRequest } from '../../middleware/parseRequest.js'
import { requireWorkspaceRole } from '../../middleware/workspaceAccess.js'
import * as cutPlanService from './cutplan.service.js'

/**
 * `/api/workspaces/:workspaceId/layouts/:layoutId/cut-plan` (figures) and `…/export` (SVG, HP-GL, job sheet PDF).
 * Reading and exporting change nothing, so viewers may do both.
 */
export function cutPlanRoutes(context: AppContext, requireAuth: RequestHandler): Router {
  const router = Router({ mergeParams: true })
  const asViewer = requireWorkspaceRole(context.db, 'viewer')

  router.get('/:layoutId/cut-plan', requireAuth, asViewer, async (request, response) => {
    const { params, query } = parseRequest(request, { params: layoutParamsSchema, query: cutPlanQuerySchema })
    response.json(await cutPlanService.getCutPlan(context, params.workspaceId, params.layoutId, query))
  })

  router.get('/:layoutId/export', requireAuth, asViewer, async (request, response) => {
    const { params, query } = parseRequest(request, { params: layoutParamsSchema, query: cutPlanExportQuerySchema })
    const file = await cutPlanService.exportCutPlan(context, params.workspaceId, params.layoutId, query)
    // attachment() guesses a type from the file name (.plt is unknown to it), so the real type is set after it.
    response.attachment(file.filename).set('Content-Type', file.contentType).send(file.body)
  })

  return router
}
