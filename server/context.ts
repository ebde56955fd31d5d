import type { AppConfig } from './config.js'
import type { Database } from './db/client.js'
import type { Logger } from './logger.js'
import type { MailService } from './features/mail/mail.service.js'
import type { PaymentProvider } from './features/payments/payments.client.js'

/** Background work the API can start; absent in a server that runs without the job queue. */
export interface JobSender {
  sendNestRun: (runId: string, timeBudgetSeconds: number) => Promise<void>
}

/** What services need from the running app; built once in createApp's caller and passed down. */
export interface AppContext {
  config: AppConfig
  db: Database
  mail: MailService
  logger: Logger
  jobs?: JobSender
  /** Pay links; absent when payments are off (no keys in production). */
  payments?: PaymentProvider
}
