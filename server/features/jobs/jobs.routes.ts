import { Router, type RequestHandler } from 'express'
import { createJobRequestSchema, jobListQuerySchema, jobParamsSchema, jobStatusRequestSchema, remnantListQuerySchema, updateJobRequestSchema } from '../../../shared/schemas/jobs.js'
import type { AppContext } from '../../context.js'
import { parseRequest } from '../../middleware/parseRequest.js'
import { requireWorkspaceRole } from '../../middleware/workspaceAccess.js'
import * as stockService from '../stock/stock.service.js'
import * as jobsService from './jobs.service.js'

/** `/api/workspaces/:workspaceId/jobs`: production runs of layouts; viewers read, makers and owners change. */
export function jobsRoutes(context: AppContext, requireAuth: RequestHandler): Router {
  const router = Router({ mergeParams: true })
  router.use(requireAuth)
  const asViewer = requireWorkspaceRole(context.db, 'viewer')
  const asMaker = requireWorkspaceRole(context.db, 'maker')

  router.get('/', asViewer, async (request, response) => {
    const { query } = parseRequest(request, { query: jobListQuerySchema })
    response.json(await jobsService.listJobs(context, request.workspaceAccess!.workspaceId, query))
  })

  router.post('/', asMaker, async (request, response) => {
    const { body } = parseRequest(request, { body: createJobRequestSchema })
    const job = await jobsService.createJob(context, request.workspaceAccess!.workspaceId, request.user!.id, body)
    response.status(201).location(`${request.baseUrl}/${job.id}`).json(job)
  })

  router.get('/:jobId', asViewer, async (request, response) => {
    const { params } = parseRequest(request, { params: jobParamsSchema })
    response.json(await jobsService.getJob(context, params.workspaceId, params.jobId))
  })

  router.patch('/:jobId', asMaker, async (request, response) => {
    const { params, body } = parseRequest(request, { params: jobParamsSchema, body: updateJobRequestSchema })
    response.json(await jobsService.updateJob(context, params.workspaceId, params.jobId, body))
  })

  router.post('/:jobId/status', asMaker, async (request, response) => {
    const { params, body } = parseRequest(request, { params: jobParamsSchema, body: jobStatusRequestSchema })
    response.json(await jobsService.changeStatus(context, params.workspaceId, params.jobId, request.user!.id, body))
  })

  router.delete('/:jobId', asMaker, async (request, response) => {
    const { params } = parseRequest(request, { params: jobParamsSchema })
    await jobsService.deleteJob(context, params.workspaceId, params.jobId)
    response.status(204).end()
  })

  return router
}

/** `/api/workspaces/:workspaceId/remnants`: stock items kept from jobs (the stock list's shape, remnants only). */
export function remnantsRoutes(context: AppContext, requireAuth: RequestHandler): Router {
  const router = Router({ mergeParams: true })
  router.use(requireAuth)
  router.get('/', requireWorkspaceRole(context.db, 'viewer'), async (request, response) => {
    const { query } = parseRequest(request, { query: remnantListQuerySchema })
    response.json(await stockService.listStock(context, request.workspaceAccess!.workspaceId, { ...query, remnants: 'only' }))
  })
  return router
}
