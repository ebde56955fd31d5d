import { Router, type RequestHandler } from 'express'
import type { AppContext } from '../../context.js'
import { requireWorkspaceRole } from '../../middleware/workspaceAccess.js'
import { getDashboard } from './dashboard.service.js'

/** `/api/workspaces/:workspaceId/dashboard`: the workspace home's figures; every member may read them. */
export function dashboardRoutes(context: AppContext, requireAuth: RequestHandler): Router {
  const router = Router({ mergeParams: true })
  router.get('/', requireAuth, requireWorkspaceRole(context.db, 'viewer'), async (request, response) => {
    response.json(await getDashboard(context, request.workspaceAccess!.workspaceId))
  })
  return router
}
