import type { AppConfig } from './config.js'
import type { Database } from './db/client.js'
import type { Logger } from './logger.js'
import type { MailService } from './features/mail/mail.service.js'

/** What services need from the running app; built once in createApp's caller and passed down. */
export interface AppContext {
  config: AppConfig
  db: Database
  mail: MailService
  logger: Logger
}
