import { Router, type RequestHandler } from 'express'
import { createStockRequestSchema, stockListQuerySchema, stockParamsSchema, updateStockRequestSchema } from '../../../shared/schemas/stock.js'
import type { AppContext } from '../../context.js'
import { parseRequest } from '../../middleware/parseRequest.js'
import { requireWorkspaceRole } from '../../middleware/workspaceAccess.js'
import * as stockService from './stock.service.js'

/** `/api/workspaces/:workspaceId/stock`: the sheets and rolls on the studio's shelf. */
export function stockRoutes(context: AppContext, requireAuth: RequestHandler): Router {
  const router = Router({ mergeParams: true })
  router.use(requireAuth)
  const asViewer = requireWorkspaceRole(context.db, 'viewer')
  const asMaker = requireWorkspaceRole(context.db, 'maker')

  router.get('/', asViewer, async (request, response) => {
    const { query } = parseRequest(request, { query: stockListQuerySchema })
    response.json(await stockService.listStock(context, request.workspaceAccess!.workspaceId, query))
  })

  router.post('/', asMaker, async (request, response) => {
    const { body } = parseRequest(request, { body: createStockRequestSchema })
    const item = await stockService.createStock(context, request.workspaceAccess!.workspaceId, request.user!.id, body)
    response.status(201).location(`${request.baseUrl}/${item.id}`).json(item)
  })

  router.get('/:stockId', asViewer, async (request, response) => {
    const { params } = parseRequest(request, { params: stockParamsSchema })
    response.json(await stockService.getStock(context, params.workspaceId, params.stockId))
  })

  router.patch('/:stockId', asMaker, async (request, response) => {
    const { params, body } = parseRequest(request, { params: stockParamsSchema, body: updateStockRequestSchema })
    response.json(await stockService.updateStock(context, params.workspaceId, params.stockId, body))
  })

  router.delete('/:stockId', asMaker, async (request, response) => {
    const { params } = parseRequest(request, { params: stockParamsSchema })
    await stockService.deleteStock(context, params.workspaceId, params.stockId)
    response.status(204).end()
  })

  return router
}
