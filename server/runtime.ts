import type PgBoss from 'pg-boss'
import type { AppConfig } from './config.js'
import type { AppContext } from './context.js'
import { connectDatabase } from './db/client.js'
import { createLogger } from './logger.js'
import { startMailCatcher, type MailCatcher } from './features/mail/mailCatcher.js'
import { createMailService, createInlineMailDispatcher } from './features/mail/mail.service.js'
import { createMailTransport } from './features/mail/mail.transport.js'
import { createPaymentProvider } from './features/payments/payments.client.js'
import { startFakePaymentProvider, type FakePaymentProvider } from './features/payments/fakeProvider.js'
import { createJobSender, createQueuedMailDispatcher, startJobQueue, workJobs, workNestRuns } from './jobs/boss.js'

export interface Runtime {
  context: AppContext
  boss?: PgBoss
  close: () => Promise<void>
}

/**
 * Everything a server process runs besides HTTP: database pool, mail catcher (development), job queue
 * and, when `runJobs`, the job workers. `withQueue: false` gives a small runtime that sends mail inline.
 */
export async function startRuntime(config: AppConfig, options: { withQueue?: boolean; withMailCatcher?: boolean } = {}): Promise<Runtime> {
  const logger = createLogger(config.logLevel)
  const database = connectDatabase(config.databaseUrl)
  const transport = createMailTransport(config)
  let mailCatcher: MailCatcher | undefined
  if (config.mailCatcherEnabled && options.withMailCatcher !== false) {
    mailCatcher = await startMailCatcher(database.db, config.mailCatcherPort, logger)
  }
  // The fake payment provider is a development stand-in like the mail catcher, and starts in the same processes.
  let fakePayments: FakePaymentProvider | undefined
  if (config.payments.runFake && options.withMailCatcher !== false) {
    fakePayments = await startFakePaymentProvider({ port: config.payments.fakePort, webhookUrl: config.payments.webhookUrl, webhookSecret: config.payments.webhookSecret, logger })
  }
  let boss: PgBoss | undefined
  if (options.withQueue !== false) {
    boss = await startJobQueue(config.databaseUrl, logger)
    if (config.runJobs) await workJobs(boss, { db: database.db, transport, mailFrom: config.mailFrom, logger })
  }
  const dispatcher = boss ? createQueuedMailDispatcher(boss) : createInlineMailDispatcher(database.db, transport, config.mailFrom, logger)
  const context: AppContext = { config, db: database.db, mail: createMailService(dispatcher), logger, jobs: boss ? createJobSender(boss) : undefined, payments: createPaymentProvider(config.payments) }
  if (boss && config.runJobs) await workNestRuns(boss, context)
  return {
    context,
    boss,
    close: async () => {
      await boss?.stop({ graceful: true, timeout: 5000 })
      await mailCatcher?.close()
      await fakePayments?.close()
      transport.close()
      await database.close()
    },
  }
}
