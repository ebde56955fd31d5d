import { Router, type RequestHandler } from 'express'
import multer from 'multer'
import { designListQuerySchema, designParamsSchema, updateDesignRequestSchema, uploadDesignOptionsSchema } from '../../../shared/schemas/designs.js'
import type { AppContext } from '../../context.js'
import { AppError } from '../../errors.js'
import { parseRequest } from '../../middleware/parseRequest.js'
import { requireWorkspaceRole } from '../../middleware/workspaceAccess.js'
import * as designsService from './designs.service.js'

export const maxUploadBytes = 10 * 1024 * 1024
export const maxUploadFiles = 20

const upload = multer({
  storage: multer.memoryStorage(),
  // Browsers send file names as UTF-8; multer's default would read them as latin1.
  defParamCharset: 'utf8',
  limits: { fileSize: maxUploadBytes, files: maxUploadFiles, fields: 10, fieldSize: 1024, parts: maxUploadFiles + 10 },
})

/** multer's own errors, in our error shape with the field named. */
const receiveFiles: RequestHandler = (request, response, next) => {
  upload.array('files', maxUploadFiles)(request, response, (error: unknown) => {
    if (!error) return next()
    if (error instanceof multer.MulterError) {
      const field = `body.${error.field ?? 'files'}`
      switch (error.code) {
        case 'LIMIT_FILE_SIZE':
          return next(new AppError('payload_too_large', 413, `A file is larger than ${maxUploadBytes / 1024 / 1024} MB`, { [field]: ['Larger than 10 MB'] }))
        case 'LIMIT_FILE_COUNT':
        case 'LIMIT_UNEXPECTED_FILE':
          return next(
            new AppError('validation_failed', 400, `Send up to ${maxUploadFiles} SVG files in the field "files"`, {
              [field]: [`Up to ${maxUploadFiles} files, in the field "files"`],
            }),
          )
        default:
          return next(new AppError('validation_failed', 400, `The upload could not be read (${error.message})`, { [field]: [error.message] }))
      }
    }
    next(error)
  })
}

/** `/api/workspaces/:workspaceId/designs`: upload, list, read, rename/tag, delete, download the original. */
export function designsRoutes(context: AppContext, requireAuth: RequestHandler): Router {
  const router = Router({ mergeParams: true })
  router.use(requireAuth)
  const asViewer = requireWorkspaceRole(context.db, 'viewer')
  const asMaker = requireWorkspaceRole(context.db, 'maker')

  router.post('/', asMaker, receiveFiles, async (request, response) => {
    const { body } = parseRequest(request, { body: uploadDesignOptionsSchema })
    const files = (request.files as Express.Multer.File[] | undefined) ?? []
    if (files.length === 0) throw new AppError('validation_failed', 400, 'Choose at least one SVG file to upload', { 'body.files': ['No file was sent'] })
    const result = await designsService.uploadDesigns(context, request.workspaceAccess!.workspaceId, request.user!.id, files, body)
    if (result.designs.length === 0) {
      // Keyed by position: two files may share a name, and names may contain dots.
      const fields = Object.fromEntries(result.rejected.map((rejection, index) => [`body.files.${index}`, [`${rejection.filename}: ${rejection.message}`]]))
      const message = result.rejected.length === 1 ? `${result.rejected[0]!.filename}: ${result.rejected[0]!.message}` : 'None of the files could be used as designs'
      throw new AppError('validation_failed', 400, message, fields)
    }
    response.status(201).json(result)
  })

  router.get('/', asViewer, async (request, response) => {
    const { query } = parseRequest(request, { query: designListQuerySchema })
    response.json(await designsService.listDesigns(context, request.workspaceAccess!.workspaceId, query))
  })

  router.get('/:designId', asViewer, async (request, response) => {
    const { params } = parseRequest(request, { params: designParamsSchema })
    response.json(await designsService.getDesign(context, params.workspaceId, params.designId))
  })

  router.get('/:designId/original', asViewer, async (request, response) => {
    const { params } = parseRequest(request, { params: designParamsSchema })
    const original = await designsService.getOriginal(context, params.workspaceId, params.designId)
    const asciiName = original.filename.replace(/[^\w.-]+/g, '_')
    response
      .status(200)
      .set({
        'Content-Type': 'image/svg+xml; charset=utf-8',
        'Content-Disposition': `attachment; filename="${asciiName}"; filename*=UTF-8''${encodeURIComponent(original.filename)}`,
        // Even if opened directly, the file runs nothing and loads nothing.
        'Content-Security-Policy': "default-src 'none'; style-src 'unsafe-inline'; sandbox",
      })
      .send(original.svg)
  })

  router.patch('/:designId', asMaker, async (request, response) => {
    const { params, body } = parseRequest(request, { params: designParamsSchema, body: updateDesignRequestSchema })
    response.json(await designsService.updateDesign(context, params.workspaceId, params.designId, body))
  })

  router.delete('/:designId', asMaker, async (request, response) => {
    const { params } = parseRequest(request, { params: designParamsSchema })
    await designsService.deleteDesign(context, params.workspaceId, params.designId)
    response.status(204).end()
  })

  return router
}
