import { existsSync } from 'node:fs'
import path from 'node:path'
import express, { type Express } from 'express'
import cookieParser from 'cookie-parser'
import helmet from 'helmet'
import { pinoHttp } from 'pino-http'
import { randomUUID } from 'node:crypto'
import type { AppContext } from './context.js'
import { apiNotFoundHandler, errorHandler } from './middleware/errorHandler.js'
import { createPassport, optionalAuth, requireAuth } from './middleware/authenticate.js'
import { authRoutes, meRoutes } from './features/auth/auth.routes.js'
import { workspacesRoutes } from './features/workspaces/workspaces.routes.js'
import { designsRoutes } from './features/designs/designs.routes.js'
import { nestingRoutes } from './features/nesting/nesting.routes.js'
import { stockRoutes } from './features/stock/stock.routes.js'
import { favouritesRoutes, materialsRoutes } from './features/materials/materials.routes.js'
import { layoutsRoutes, maxLayoutBodyBytes } from './features/layouts/layouts.routes.js'
import { cutPlanRoutes } from './features/cutplan/cutplan.routes.js'
import { comparisonsRoutes } from './features/comparisons/comparisons.routes.js'
import { cuttersRoutes, studioSettingsRoutes } from './features/cutters/cutters.routes.js'
import { jobsRoutes, remnantsRoutes } from './features/jobs/jobs.routes.js'
import { dashboardRoutes } from './features/dashboard/dashboard.routes.js'
import { invitesRoutes } from './features/invites/invites.routes.js'
import { devOutboxRoutes, systemRoutes } from './features/system/system.routes.js'
import { pricingRoutes } from './features/pricing/pricing.routes.js'
import { publicQuotesRoutes, quotesRoutes } from './features/quotes/quotes.routes.js'
import { paymentWebhookRoutes } from './features/payments/payments.routes.js'

/** Builds the HTTP app (API + built client) without listening, so tests can run it in-process. */
export function createApp(context: AppContext): Express {
  const app = express()
  app.disable('x-powered-by')
  app.set('trust proxy', 'loopback')

  app.use(
    pinoHttp({
      logger: context.logger,
      genReqId: (request, response) => {
        const incoming = request.headers['x-request-id']
        const id = typeof incoming === 'string' && incoming.length <= 100 ? incoming : randomUUID()
        response.setHeader('x-request-id', id)
        return id
      },
      autoLogging: { ignore: (request) => !request.url?.startsWith('/api/') },
      // One compact line per request; headers (tokens, cookies) are never logged.
      serializers: {
        req: (request: { id: unknown; method: string; url: string }) => ({ id: request.id, method: request.method, url: request.url }),
        res: (response: { statusCode: number }) => ({ statusCode: response.statusCode }),
      },
    }),
  )
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          defaultSrc: ["'self'"],
          // Quasar sets inline style attributes; scripts stay self-only.
          styleSrc: ["'self'", "'unsafe-inline'"],
          imgSrc: ["'self'", 'data:', 'blob:'],
          fontSrc: ["'self'", 'data:'],
          upgradeInsecureRequests: null,
        },
      },
      strictTransportSecurity: context.config.appUrl.startsWith('https://'),
    }),
  )
  // The provider's signature covers the raw bytes: this route reads its body itself, before any parser.
  app.use('/api/payments', paymentWebhookRoutes(context))
  // Read first with its own limit (the general parser then finds the body read and passes).
  app.use('/api/workspaces/:workspaceId/layouts', express.json({ limit: maxLayoutBodyBytes }))
  app.use(express.json({ limit: '1mb' }))
  app.use(cookieParser())

  const passport = createPassport(context.db, context.config.jwtSecret)
  const signedIn = requireAuth(passport)

  const api = express.Router()
  api.use(systemRoutes(context))
  api.use('/auth', authRoutes(context))
  api.use('/me', meRoutes(context, signedIn))
  api.use('/workspaces/:workspaceId/designs', designsRoutes(context, signedIn))
  api.use('/workspaces/:workspaceId/nest-runs', nestingRoutes(context, signedIn))
  api.use('/workspaces/:workspaceId/stock', stockRoutes(context, signedIn))
  api.use('/workspaces/:workspaceId/materials', materialsRoutes(context, signedIn))
  api.use('/workspaces/:workspaceId/favourites', favouritesRoutes(context, signedIn))
  api.use('/workspaces/:workspaceId/layouts', cutPlanRoutes(context, signedIn))
  api.use('/workspaces/:workspaceId/layouts', layoutsRoutes(context, signedIn))
  api.use('/workspaces/:workspaceId/comparisons', comparisonsRoutes(context, signedIn))
  api.use('/workspaces/:workspaceId/cutters', cuttersRoutes(context, signedIn))
  api.use('/workspaces/:workspaceId/studio-settings', studioSettingsRoutes(context, signedIn))
  api.use('/workspaces/:workspaceId/jobs', jobsRoutes(context, signedIn))
  api.use('/workspaces/:workspaceId/remnants', remnantsRoutes(context, signedIn))
  api.use('/workspaces/:workspaceId/dashboard', dashboardRoutes(context, signedIn))
  api.use('/workspaces/:workspaceId/pricing', pricingRoutes(context, signedIn))
  // The same settings under the pricing prefix, for clients that address settings by area first.
  api.use('/pricing/:workspaceId', pricingRoutes(context, signedIn))
  api.use('/workspaces/:workspaceId/quotes', quotesRoutes(context, signedIn))
  api.use('/public/quotes', publicQuotesRoutes(context))
  api.use('/workspaces', workspacesRoutes(context, signedIn))
  api.use('/invites', invitesRoutes(context, optionalAuth(passport)))
  api.use('/dev', devOutboxRoutes(context))
  api.use(apiNotFoundHandler)
  app.use('/api', api)

  const clientDist = path.resolve(context.config.clientDist)
  if (existsSync(path.join(clientDist, 'index.html'))) {
    app.use(express.static(clientDist, { index: false, maxAge: '1h' }))
    // Client-side routes (/w/…, /invite/…) all load the single page.
    app.get('/{*path}', (_request, response) => response.sendFile(path.join(clientDist, 'index.html')))
  }

  app.use(errorHandler)
  return app
}
