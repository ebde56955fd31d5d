import { Router, type RequestHandler } from 'express'
import { pricingSettingsBodySchema } from '../../../shared/schemas/pricing.js'
import type { AppContext } from '../../context.js'
import { parseRequest } from '../../middleware/parseRequest.js'
import { requireWorkspaceRole } from '../../middleware/workspaceAccess.js'
import * as pricingService from './pricing.service.js'

/** `/api/workspaces/:workspaceId/pricing`: the workspace's rates for quotes. Every member reads; the owner writes. */
export function pricingRoutes(context: AppContext, requireAuth: RequestHandler): Router {
  const router = Router({ mergeParams: true })
  router.use(requireAuth)

  router.get('/', requireWorkspaceRole(context.db, 'viewer'), async (request, response) => {
    response.json(await pricingService.getPricing(context, request.workspaceAccess!.workspaceId))
  })

  router.put('/', requireWorkspaceRole(context.db, 'owner'), async (request, response) => {
    const { body } = parseRequest(request, { body: pricingSettingsBodySchema })
    response.json(await pricingService.savePricing(context, request.workspaceAccess!.workspaceId, request.user!.id, body))
  })

  return router
}
