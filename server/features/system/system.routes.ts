import { Router } from 'express'
import { sql } from 'drizzle-orm'
import type { ClientConfig } from '../../../shared/schemas/config.js'
import type { OutboxMessage } from '../../../shared/schemas/outbox.js'
import type { AppContext } from '../../context.js'
import { notFound } from '../../errors.js'
import { deleteAllCaughtMail, listCaughtMail } from '../mail/mail.repo.js'

export const appVersion = '0.1.0'

const linkPattern = /https?:\/\/[^\s<>"')]+/g

export function systemRoutes(context: AppContext): Router {
  const router = Router()

  router.get('/health', async (_request, response) => {
    const databaseUp = await context.db
      .execute(sql`select 1`)
      .then(() => true)
      .catch(() => false)
    response.status(databaseUp ? 200 : 503).json({ status: databaseUp ? 'ok' : 'degraded', database: databaseUp ? 'up' : 'down', version: appVersion })
  })

  router.get('/config', (_request, response) => {
    const config: ClientConfig = { outboxEnabled: context.config.mailCatcherEnabled, version: appVersion }
    response.json(config)
  })

  return router
}

/** The development Outbox: what the local mail catcher received. Absent (404) when real SMTP is configured or in production. */
export function devOutboxRoutes(context: AppContext): Router {
  const router = Router()
  router.use((_request, _response, next) => {
    if (!context.config.mailCatcherEnabled) throw notFound('Outbox')
    next()
  })
  router.get('/outbox', async (_request, response) => {
    const rows = await listCaughtMail(context.db)
    const messages: OutboxMessage[] = rows.map((row) => ({
      id: row.id,
      to: row.toAddress,
      from: row.fromAddress,
      subject: row.subject,
      text: row.textBody,
      links: [...new Set(row.textBody.match(linkPattern) ?? [])],
      attachments: row.attachments,
      receivedAt: row.receivedAt.toISOString(),
    }))
    response.json(messages)
  })
  router.delete('/outbox', async (_request, response) => {
    await deleteAllCaughtMail(context.db)
    response.status(204).end()
  })
  return router
}
