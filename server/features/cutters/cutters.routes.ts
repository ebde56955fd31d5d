import { Router, type RequestHandler } from 'express'
import {
  bladeListQuerySchema,
  bladeParamsSchema,
  careEventListQuerySchema,
  careEventParamsSchema,
  createCareEventRequestSchema,
  createCutterRequestSchema,
  cutterListQuerySchema,
  cutterParamsSchema,
  cutterWorkspaceParamsSchema,
  fitBladeRequestSchema,
  retireBladeRequestSchema,
  testCutPromptQuerySchema,
  updateCutterRequestSchema,
  updateStudioSettingsRequestSchema,
} from '../../../shared/schemas/cutters.js'
import type { AppContext } from '../../context.js'
import { parseRequest } from '../../middleware/parseRequest.js'
import { requireWorkspaceRole } from '../../middleware/workspaceAccess.js'
import { testCutPrompt } from './bladeWear.js'
import * as cuttersService from './cutters.service.js'

/**
 * `/api/workspaces/:workspaceId/cutters`: the studio's machines, their blades and care log.
 * Viewers read everything; makers add and edit cutters (profiles included: they are the people at the machine),
 * fit and retire blades and log care; a care entry is deleted by whoever logged it or by an owner.
 */
export function cuttersRoutes(context: AppContext, requireAuth: RequestHandler): Router {
  const router = Router({ mergeParams: true })
  router.use(requireAuth)
  const asViewer = requireWorkspaceRole(context.db, 'viewer')
  const asMaker = requireWorkspaceRole(context.db, 'maker')

  router.get('/', asViewer, async (request, response) => {
    const { query } = parseRequest(request, { params: cutterWorkspaceParamsSchema, query: cutterListQuerySchema })
    response.json(await cuttersService.listCutters(context, request.workspaceAccess!.workspaceId, query))
  })

  router.post('/', asMaker, async (request, response) => {
    const { body } = parseRequest(request, { body: createCutterRequestSchema })
    const cutter = await cuttersService.createCutter(context, request.workspaceAccess!.workspaceId, request.user!.id, body)
    response.status(201).location(`${request.baseUrl}/${cutter.id}`).json(cutter)
  })

  router.get('/:cutterId', asViewer, async (request, response) => {
    const { params } = parseRequest(request, { params: cutterParamsSchema })
    response.json(await cuttersService.getCutter(context, params.workspaceId, params.cutterId))
  })

  router.patch('/:cutterId', asMaker, async (request, response) => {
    const { params, body } = parseRequest(request, { params: cutterParamsSchema, body: updateCutterRequestSchema })
    response.json(await cuttersService.updateCutter(context, params.workspaceId, params.cutterId, body))
  })

  router.delete('/:cutterId', asMaker, async (request, response) => {
    const { params } = parseRequest(request, { params: cutterParamsSchema })
    response.json(await cuttersService.deleteCutter(context, params.workspaceId, params.cutterId))
  })

  router.get('/:cutterId/test-cut-prompt', asViewer, async (request, response) => {
    const { params, query } = parseRequest(request, { params: cutterParamsSchema, query: testCutPromptQuerySchema })
    response.json(await testCutPrompt(context.db, { workspaceId: params.workspaceId, cutterId: params.cutterId, materialId: query.materialId }))
  })

  router.get('/:cutterId/blades', asViewer, async (request, response) => {
    const { params, query } = parseRequest(request, { params: cutterParamsSchema, query: bladeListQuerySchema })
    response.json(await cuttersService.listBlades(context, params.workspaceId, params.cutterId, query))
  })

  router.post('/:cutterId/blades', asMaker, async (request, response) => {
    const { params, body } = parseRequest(request, { params: cutterParamsSchema, body: fitBladeRequestSchema })
    const blade = await cuttersService.fitBlade(context, params.workspaceId, params.cutterId, request.user!.id, body)
    response.status(201).location(`${request.baseUrl}/${params.cutterId}/blades/${blade.id}`).json(blade)
  })

  router.get('/:cutterId/blades/:bladeId', asViewer, async (request, response) => {
    const { params } = parseRequest(request, { params: bladeParamsSchema })
    response.json(await cuttersService.getBlade(context, params.workspaceId, params.cutterId, params.bladeId))
  })

  router.post('/:cutterId/blades/:bladeId/retire', asMaker, async (request, response) => {
    const { params, body } = parseRequest(request, { params: bladeParamsSchema, body: retireBladeRequestSchema })
    response.json(await cuttersService.retireBlade(context, params.workspaceId, params.cutterId, params.bladeId, request.user!.id, body.reason))
  })

  router.get('/:cutterId/care-events', asViewer, async (request, response) => {
    const { params, query } = parseRequest(request, { params: cutterParamsSchema, query: careEventListQuerySchema })
    response.json(await cuttersService.listCareEvents(context, params.workspaceId, params.cutterId, query))
  })

  router.post('/:cutterId/care-events', asMaker, async (request, response) => {
    const { params, body } = parseRequest(request, { params: cutterParamsSchema, body: createCareEventRequestSchema })
    const event = await cuttersService.createCareEvent(context, params.workspaceId, params.cutterId, request.user!.id, body)
    response.status(201).json(event)
  })

  router.delete('/:cutterId/care-events/:careEventId', asMaker, async (request, response) => {
    const { params } = parseRequest(request, { params: careEventParamsSchema })
    await cuttersService.deleteCareEvent(context, params.workspaceId, params.cutterId, params.careEventId, { id: request.user!.id, role: request.workspaceAccess!.role })
    response.status(204).end()
  })

  return router
}

/** `/api/workspaces/:workspaceId/studio-settings`: blade wear limits and due-soon days; owners change them. */
export function studioSettingsRoutes(context: AppContext, requireAuth: RequestHandler): Router {
  const router = Router({ mergeParams: true })
  router.use(requireAuth)

  router.get('/', requireWorkspaceRole(context.db, 'viewer'), async (request, response) => {
    response.json(await cuttersService.getStudioSettings(context, request.workspaceAccess!.workspaceId))
  })

  router.put('/', requireWorkspaceRole(context.db, 'owner'), async (request, response) => {
    const { body } = parseRequest(request, { body: updateStudioSettingsRequestSchema })
    response.json(await cuttersService.updateStudioSettings(context, request.workspaceAccess!.workspaceId, body))
  })

  return router
}
