import { Router, type Response } from 'express'
import { rateLimit } from 'express-rate-limit'
import {
  changePasswordRequestSchema,
  passwordResetConfirmSchema,
  passwordResetRequestSchema,
  signInRequestSchema,
  signUpRequestSchema,
  updateMeRequestSchema,
} from '../../../shared/schemas/auth.js'
import type { AppContext } from '../../context.js'
import { AppError } from '../../errors.js'
import { parseRequest } from '../../middleware/parseRequest.js'
import type { RequestHandler } from 'express'
import * as authService from './auth.service.js'

export const refreshCookieName = 'sheetsmith_refresh'
const refreshCookiePath = '/api/auth'

function setRefreshCookie(context: AppContext, response: Response, issued: authService.IssuedSession) {
  response.cookie(refreshCookieName, issued.refreshToken, {
    httpOnly: true,
    sameSite: 'strict',
    secure: context.config.appUrl.startsWith('https://'),
    path: refreshCookiePath,
    expires: issued.refreshExpiresAt,
  })
}

function clearRefreshCookie(response: Response) {
  response.clearCookie(refreshCookieName, { path: refreshCookiePath, httpOnly: true, sameSite: 'strict' })
}

/** Sign-in, sign-up and reset are limited per address so passwords cannot be guessed at speed. */
function authLimiter(context: AppContext) {
  return rateLimit({
    windowMs: 15 * 60 * 1000,
    limit: context.config.authRateLimit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_request, _response, next) => next(new AppError('rate_limited', 429, 'Too many attempts. Wait a few minutes and try again.')),
  })
}

export function authRoutes(context: AppContext): Router {
  const router = Router()
  const limiter = authLimiter(context)

  router.post('/signup', limiter, async (request, response) => {
    const { body } = parseRequest(request, { body: signUpRequestSchema })
    const issued = await authService.signUp(context, body)
    setRefreshCookie(context, response, issued)
    response.status(201).json(issued.response)
  })

  router.post('/signin', limiter, async (request, response) => {
    const { body } = parseRequest(request, { body: signInRequestSchema })
    const issued = await authService.signIn(context, body)
    setRefreshCookie(context, response, issued)
    response.json(issued.response)
  })

  router.post('/refresh', async (request, response) => {
    // No cookie at all is not an error: there is simply no session to resume.
    if (!request.cookies?.[refreshCookieName]) return void response.status(204).end()
    try {
      const issued = await authService.refresh(context, request.cookies?.[refreshCookieName])
      setRefreshCookie(context, response, issued)
      response.json(issued.response)
    } catch (error) {
      clearRefreshCookie(response)
      throw error
    }
  })

  router.post('/signout', async (request, response) => {
    await authService.signOut(context, request.cookies?.[refreshCookieName])
    clearRefreshCookie(response)
    response.status(204).end()
  })

  router.post('/password-reset', limiter, async (request, response) => {
    const { body } = parseRequest(request, { body: passwordResetRequestSchema })
    await authService.requestPasswordReset(context, body.email)
    response.status(202).json({ message: 'If an account uses this e-mail, a reset link is on its way.' })
  })

  router.post('/password-reset/confirm', limiter, async (request, response) => {
    const { body } = parseRequest(request, { body: passwordResetConfirmSchema })
    await authService.confirmPasswordReset(context, body)
    clearRefreshCookie(response)
    response.status(204).end()
  })

  return router
}

export function meRoutes(context: AppContext, requireAuth: RequestHandler): Router {
  const router = Router()
  router.use(requireAuth)

  router.get('/', async (request, response) => {
    response.json(await authService.getMe(context, request.user!.id))
  })

  router.patch('/', async (request, response) => {
    const { body } = parseRequest(request, { body: updateMeRequestSchema })
    response.json(await authService.updateMe(context, request.user!.id, body))
  })

  router.post('/password', async (request, response) => {
    const { body } = parseRequest(request, { body: changePasswordRequestSchema })
    const issued = await authService.changePassword(context, request.user!.id, body)
    setRefreshCookie(context, response, issued)
    response.json(issued.response)
  })

  return router
}
