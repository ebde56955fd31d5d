import { Router, type RequestHandler } from 'express'
import multer from 'multer'
import {
  createMaterialRequestSchema,
  createRecipeRequestSchema,
  createTestCutRequestSchema,
  favouriteParamsSchema,
  historyListQuerySchema,
  materialListQuerySchema,
  materialParamsSchema,
  recipeParamsSchema,
  resetRecipeRequestSchema,
  testCutListQuerySchema,
  testCutParamsSchema,
  updateMaterialRequestSchema,
  updateMaterialSettingsRequestSchema,
  updateRecipeRequestSchema,
} from '../../../shared/schemas/materials.js'
import type { AppContext } from '../../context.js'
import { AppError } from '../../errors.js'
import { parseRequest } from '../../middleware/parseRequest.js'
import { requireWorkspaceRole } from '../../middleware/workspaceAccess.js'
import * as materialsService from './materials.service.js'
import * as recipesService from './recipes.service.js'
import * as testCutsService from './testCuts.service.js'

export const maxPhotoBytes = 5 * 1024 * 1024

const upload = multer({
  storage: multer.memoryStorage(),
  defParamCharset: 'utf8',
  limits: { fileSize: maxPhotoBytes, files: 1, fields: 20, fieldSize: 8 * 1024, parts: 21 },
})

/** An optional photo in the field `photo`; a JSON body passes straight through. multer's errors name the field. */
const receivePhoto: RequestHandler = (request, response, next) => {
  upload.single('photo')(request, response, (error: unknown) => {
    if (!error) return next()
    if (error instanceof multer.MulterError) {
      const field = `body.${error.field ?? 'photo'}`
      switch (error.code) {
        case 'LIMIT_FILE_SIZE':
          return next(new AppError('payload_too_large', 413, `The photo is larger than ${maxPhotoBytes / 1024 / 1024} MB`, { [field]: ['Larger than 5 MB'] }))
        case 'LIMIT_FILE_COUNT':
        case 'LIMIT_UNEXPECTED_FILE':
          return next(new AppError('validation_failed', 400, 'Send one photo, in the field "photo"', { [field]: ['One photo, in the field "photo"'] }))
        default:
          return next(new AppError('validation_failed', 400, `The upload could not be read (${error.message})`, { [field]: [error.message] }))
      }
    }
    next(error)
  })
}

/**
 * `/api/workspaces/:workspaceId/materials`: materials (the catalogue's copies and the workspace's own), tuning
 * settings, cut recipes with their history, and test cuts with photos and suggestions.
 */
export function materialsRoutes(context: AppContext, requireAuth: RequestHandler): Router {
  const router = Router({ mergeParams: true })
  router.use(requireAuth)
  const asViewer = requireWorkspaceRole(context.db, 'viewer')
  const asMaker = requireWorkspaceRole(context.db, 'maker')
  const asOwner = requireWorkspaceRole(context.db, 'owner')
  const workspaceOf = (request: Express.Request) => request.workspaceAccess!.workspaceId

  router.get('/', asViewer, async (request, response) => {
    const { query } = parseRequest(request, { query: materialListQuerySchema })
    response.json(await materialsService.listMaterials(context, workspaceOf(request), request.user!.id, query))
  })

  router.post('/', asMaker, async (request, response) => {
    const { body } = parseRequest(request, { body: createMaterialRequestSchema })
    const material = await materialsService.createMaterial(context, workspaceOf(request), request.user!.id, body)
    response.status(201).location(`${request.baseUrl}/${material.id}`).json(material)
  })

  // Before `/:materialId`, which would read "settings" as an id.
  router.get('/settings', asViewer, async (request, response) => {
    response.json(await materialsService.getSettings(context, workspaceOf(request)))
  })

  router.patch('/settings', asOwner, async (request, response) => {
    const { body } = parseRequest(request, { body: updateMaterialSettingsRequestSchema })
    response.json(await materialsService.updateSettings(context, workspaceOf(request), body))
  })

  router.get('/:materialId', asViewer, async (request, response) => {
    const { params } = parseRequest(request, { params: materialParamsSchema })
    response.json(await materialsService.getMaterial(context, params.workspaceId, params.materialId, request.user!.id))
  })

  router.patch('/:materialId', asMaker, async (request, response) => {
    const { params, body } = parseRequest(request, { params: materialParamsSchema, body: updateMaterialRequestSchema })
    response.json(await materialsService.updateMaterial(context, params.workspaceId, params.materialId, request.user!.id, body))
  })

  router.delete('/:materialId', asMaker, async (request, response) => {
    const { params } = parseRequest(request, { params: materialParamsSchema })
    await materialsService.deleteMaterial(context, params.workspaceId, params.materialId, request.user!.id)
    response.status(204).end()
  })

  // Recipes: one per tool kind, addressed by it (`/recipes/blade`).

  router.get('/:materialId/recipes', asViewer, async (request, response) => {
    const { params } = parseRequest(request, { params: materialParamsSchema })
    response.json(await recipesService.listRecipes(context, params.workspaceId, params.materialId, request.user!.id))
  })

  router.post('/:materialId/recipes', asMaker, async (request, response) => {
    const { params, body } = parseRequest(request, { params: materialParamsSchema, body: createRecipeRequestSchema })
    const recipe = await recipesService.createRecipe(context, params.workspaceId, params.materialId, request.user!.id, body)
    response.status(201).location(`${request.baseUrl}/${params.materialId}/recipes/${recipe.toolKind}`).json(recipe)
  })

  router.get('/:materialId/recipes/history', asViewer, async (request, response) => {
    const { params, query } = parseRequest(request, { params: materialParamsSchema, query: historyListQuerySchema })
    response.json(await recipesService.listHistory(context, params.workspaceId, params.materialId, request.user!.id, query))
  })

  router.patch('/:materialId/recipes/:toolKind', asMaker, async (request, response) => {
    const { params, body } = parseRequest(request, { params: recipeParamsSchema, body: updateRecipeRequestSchema })
    response.json(await recipesService.updateRecipe(context, params.workspaceId, params.materialId, params.toolKind, request.user!.id, body))
  })

  router.post('/:materialId/recipes/:toolKind/reset', asMaker, async (request, response) => {
    const { params, body } = parseRequest(request, { params: recipeParamsSchema, body: resetRecipeRequestSchema })
    response.json(await recipesService.resetRecipe(context, params.workspaceId, params.materialId, params.toolKind, request.user!.id, body.reason))
  })

  router.delete('/:materialId/recipes/:toolKind', asMaker, async (request, response) => {
    const { params } = parseRequest(request, { params: recipeParamsSchema })
    await recipesService.deleteRecipe(context, params.workspaceId, params.materialId, params.toolKind, request.user!.id)
    response.status(204).end()
  })

  // Test cuts.

  router.get('/:materialId/test-cuts', asViewer, async (request, response) => {
    const { params, query } = parseRequest(request, { params: materialParamsSchema, query: testCutListQuerySchema })
    response.json(await testCutsService.listTestCuts(context, params.workspaceId, params.materialId, request.user!.id, query))
  })

  router.post('/:materialId/test-cuts', asMaker, receivePhoto, async (request, response) => {
    const { params, body } = parseRequest(request, { params: materialParamsSchema, body: createTestCutRequestSchema })
    const testCut = await testCutsService.createTestCut(context, params.workspaceId, params.materialId, request.user!.id, body, request.file)
    response.status(201).location(`${request.baseUrl}/${params.materialId}/test-cuts/${testCut.id}`).json(testCut)
  })

  router.get('/:materialId/test-cuts/:testCutId', asViewer, async (request, response) => {
    const { params } = parseRequest(request, { params: testCutParamsSchema })
    response.json(await testCutsService.getTestCut(context, params.workspaceId, params.materialId, params.testCutId))
  })

  router.get('/:materialId/test-cuts/:testCutId/photo', asViewer, async (request, response) => {
    const { params } = parseRequest(request, { params: testCutParamsSchema })
    const photo = await testCutsService.getPhoto(context, params.workspaceId, params.materialId, params.testCutId)
    response
      .status(200)
      .set({
        'Content-Type': photo.contentType,
        // Members only: never kept by shared caches.
        'Cache-Control': 'private, max-age=3600',
        'Content-Disposition': 'inline',
        'Content-Security-Policy': "default-src 'none'; sandbox",
      })
      .send(photo.data)
  })

  router.post('/:materialId/test-cuts/:testCutId/apply-suggestion', asMaker, async (request, response) => {
    const { params } = parseRequest(request, { params: testCutParamsSchema })
    response.json(await testCutsService.applySuggestion(context, params.workspaceId, params.materialId, params.testCutId, request.user!.id))
  })

  router.delete('/:materialId/test-cuts/:testCutId', asMaker, async (request, response) => {
    const { params } = parseRequest(request, { params: testCutParamsSchema })
    await testCutsService.deleteTestCut(context, params.workspaceId, params.materialId, params.testCutId)
    response.status(204).end()
  })

  return router
}

/**
 * `/api/workspaces/:workspaceId/favourites`: the signed-in person's starred materials. Personal, so a viewer may
 * star too: it changes nothing anyone else sees.
 */
export function favouritesRoutes(context: AppContext, requireAuth: RequestHandler): Router {
  const router = Router({ mergeParams: true })
  router.use(requireAuth)
  const asViewer = requireWorkspaceRole(context.db, 'viewer')

  router.get('/', asViewer, async (request, response) => {
    response.json(await materialsService.listFavourites(context, request.workspaceAccess!.workspaceId, request.user!.id))
  })

  router.put('/:materialId', asViewer, async (request, response) => {
    const { params } = parseRequest(request, { params: favouriteParamsSchema })
    response.json(await materialsService.addFavourite(context, params.workspaceId, request.user!.id, params.materialId))
  })

  router.delete('/:materialId', asViewer, async (request, response) => {
    const { params } = parseRequest(request, { params: favouriteParamsSchema })
    response.json(await materialsService.removeFavourite(context, params.workspaceId, request.user!.id, params.materialId))
  })

  return router
}
