import { Router, type RequestHandler } from 'express'
import { rateLimit } from 'express-rate-limit'
import {
  createQuoteRequestSchema,
  publicQuoteParamsSchema,
  quoteListQuerySchema,
  quoteParamsSchema,
  quoteStatusChangeRequestSchema,
  sendQuoteRequestSchema,
  updateQuoteRequestSchema,
} from '../../../shared/schemas/quotes.js'
import type { AppContext } from '../../context.js'
import { AppError } from '../../errors.js'
import { parseRequest } from '../../middleware/parseRequest.js'
import { requireWorkspaceRole } from '../../middleware/workspaceAccess.js'
import * as quotesService from './quotes.service.js'

/**
 * `/api/workspaces/:workspaceId/quotes`. Quotes hold customers' names and addresses, so makers and owners read them;
 * only owners price, change and send.
 */
export function quotesRoutes(context: AppContext, requireAuth: RequestHandler): Router {
  const router = Router({ mergeParams: true })
  router.use(requireAuth)
  const asMaker = requireWorkspaceRole(context.db, 'maker')
  const asOwner = requireWorkspaceRole(context.db, 'owner')

  router.get('/', asMaker, async (request, response) => {
    const { query } = parseRequest(request, { query: quoteListQuerySchema })
    response.json(await quotesService.listQuotes(context, request.workspaceAccess!.workspaceId, query))
  })

  router.get('/sources', asOwner, async (request, response) => {
    response.json(await quotesService.quoteSources(context, request.workspaceAccess!.workspaceId))
  })

  router.post('/', asOwner, async (request, response) => {
    const { body } = parseRequest(request, { body: createQuoteRequestSchema })
    const quote = await quotesService.createQuote(context, request.workspaceAccess!.workspaceId, request.user!.id, body)
    response.status(201).location(`${request.baseUrl}/${quote.id}`).json(quote)
  })

  router.get('/:quoteId', asMaker, async (request, response) => {
    const { params } = parseRequest(request, { params: quoteParamsSchema })
    response.json(await quotesService.getQuote(context, params.workspaceId, params.quoteId))
  })

  router.patch('/:quoteId', asOwner, async (request, response) => {
    const { params, body } = parseRequest(request, { params: quoteParamsSchema, body: updateQuoteRequestSchema })
    response.json(await quotesService.updateQuote(context, params.workspaceId, request.user!.id, params.quoteId, body))
  })

  router.post('/:quoteId/send', asOwner, async (request, response) => {
    const { params, body } = parseRequest(request, { params: quoteParamsSchema, body: sendQuoteRequestSchema })
    response.json(await quotesService.sendQuote(context, params.workspaceId, request.user!.id, params.quoteId, body))
  })

  router.post('/:quoteId/status', asOwner, async (request, response) => {
    const { params, body } = parseRequest(request, { params: quoteParamsSchema, body: quoteStatusChangeRequestSchema })
    response.json(await quotesService.setQuoteStatus(context, params.workspaceId, request.user!.id, params.quoteId, body))
  })

  router.get('/:quoteId/pdf', asMaker, async (request, response) => {
    const { params } = parseRequest(request, { params: quoteParamsSchema })
    const file = await quotesService.quotePdfFile(context, params.workspaceId, params.quoteId)
    response.attachment(file.filename).set('Content-Type', 'application/pdf').send(file.body)
  })

  return router
}

/**
 * `/api/public/quotes/:token`: the customer's read-only view by the unguessable link, and its answers. Limited per
 * address like sign-in, so links cannot be guessed at speed. Nothing here names another quote or the workspace's id.
 */
export function publicQuotesRoutes(context: AppContext): Router {
  const router = Router()
  router.use(
    rateLimit({
      windowMs: 15 * 60 * 1000,
      limit: context.config.authRateLimit * 5,
      standardHeaders: 'draft-8',
      legacyHeaders: false,
      handler: (_request, _response, next) => next(new AppError('rate_limited', 429, 'Too many requests. Wait a few minutes and try again.')),
    }),
  )

  router.get('/:token', async (request, response) => {
    const { params } = parseRequest(request, { params: publicQuoteParamsSchema })
    response.set('Cache-Control', 'no-store').json(await quotesService.getPublicQuote(context, params.token))
  })

  router.post('/:token/accept', async (request, response) => {
    const { params } = parseRequest(request, { params: publicQuoteParamsSchema })
    response.json(await quotesService.respondToQuote(context, params.token, 'accepted'))
  })

  router.post('/:token/decline', async (request, response) => {
    const { params } = parseRequest(request, { params: publicQuoteParamsSchema })
    response.json(await quotesService.respondToQuote(context, params.token, 'declined'))
  })

  router.post('/:token/pay', async (request, response) => {
    const { params } = parseRequest(request, { params: publicQuoteParamsSchema })
    response.json(await quotesService.payLinkFor(context, params.token))
  })

  router.get('/:token/pdf', async (request, response) => {
    const { params } = parseRequest(request, { params: publicQuoteParamsSchema })
    const file = await quotesService.publicQuotePdf(context, params.token)
    response.attachment(file.filename).set('Content-Type', 'application/pdf').set('Cache-Control', 'no-store').send(file.body)
  })

  return router
}
