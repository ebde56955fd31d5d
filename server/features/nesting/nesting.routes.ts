import { Router, type RequestHandler } from 'express'
import { createNestRunRequestSchema, nestRunParamsSchema } from '../../../shared/schemas/nesting.js'
import type { AppContext } from '../../context.js'
import { parseRequest } from '../../middleware/parseRequest.js'
import { requireWorkspaceRole } from '../../middleware/workspaceAccess.js'
import * as nestingService from './nesting.service.js'

const terminal = new Set(['succeeded', 'failed', 'cancelled'])

/** `/api/workspaces/:workspaceId/nest-runs`: start, read, follow (server-sent events) and cancel nest runs. */
export function nestingRoutes(context: AppContext, requireAuth: RequestHandler): Router {
  const router = Router({ mergeParams: true })
  router.use(requireAuth)
  const asViewer = requireWorkspaceRole(context.db, 'viewer')
  const asMaker = requireWorkspaceRole(context.db, 'maker')

  router.post('/', asMaker, async (request, response) => {
    const { body } = parseRequest(request, { body: createNestRunRequestSchema })
    const run = await nestingService.createNestRun(context, request.workspaceAccess!.workspaceId, request.user!.id, body)
    response.status(202).location(`${request.baseUrl}/${run.id}`).json(run)
  })

  router.get('/', asViewer, async (request, response) => {
    response.json(await nestingService.listNestRuns(context, request.workspaceAccess!.workspaceId))
  })

  router.get('/:runId', asViewer, async (request, response) => {
    const { params } = parseRequest(request, { params: nestRunParamsSchema })
    response.json(await nestingService.getNestRun(context, params.workspaceId, params.runId))
  })

  router.post('/:runId/cancel', asMaker, async (request, response) => {
    const { params } = parseRequest(request, { params: nestRunParamsSchema })
    response.json(await nestingService.cancelNestRun(context, params.workspaceId, params.runId))
  })

  // Server-sent events: `progress` twice a second while the run works, then one `done` with the whole run.
  router.get('/:runId/events', asViewer, async (request, response) => {
    const { params } = parseRequest(request, { params: nestRunParamsSchema })
    let run = await nestingService.getNestRun(context, params.workspaceId, params.runId)
    response.writeHead(200, { 'Content-Type': 'text/event-stream', 'Cache-Control': 'no-cache, no-transform', Connection: 'keep-alive', 'X-Accel-Buffering': 'no' })
    const send = (event: string, data: unknown) => response.write(`event: ${event}\ndata: ${JSON.stringify(data)}\n\n`)
    let closed = false
    request.on('close', () => {
      closed = true
    })
    let lastSent = ''
    while (!closed) {
      if (terminal.has(run.status)) {
        send('done', run)
        break
      }
      const update = JSON.stringify({ status: run.status, progress: run.progress })
      if (update !== lastSent) {
        send('progress', { status: run.status, progress: run.progress })
        lastSent = update
      } else response.write(': waiting\n\n')
      await new Promise((resolve) => setTimeout(resolve, 500))
      run = await nestingService.getNestRun(context, params.workspaceId, params.runId).catch(() => run)
    }
    response.end()
  })

  return router
}
