import { SMTPServer } from 'smtp-server'
import { simpleParser, type AddressObject } from 'mailparser'
import type { Database } from '../../db/client.js'
import type { Logger } from '../../logger.js'
import { insertCaughtMail } from './mail.repo.js'

// Room for a printed quote or job sheet attached as PDF.
const maxMessageBytes = 10 * 1024 * 1024

function addressText(address: AddressObject | AddressObject[] | undefined): string {
  if (!address) return ''
  return (Array.isArray(address) ? address : [address]).map((entry) => entry.text).join(', ')
}

export interface MailCatcher {
  close: () => Promise<void>
}

/**
 * A local SMTP server for development and tests: it accepts every message on loopback and stores it,
 * so the Outbox page can show invite and reset links without a real mail account.
 */
export async function startMailCatcher(db: Database, port: number, logger: Logger): Promise<MailCatcher> {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    size: maxMessageBytes,
    logger: false,
    onData(stream, _session, callback) {
      simpleParser(stream)
        .then(async (parsed) => {
          await insertCaughtMail(db, {
            to: addressText(parsed.to),
            from: addressText(parsed.from),
            subject: parsed.subject ?? '',
            text: parsed.text ?? '',
            attachments: parsed.attachments.map((attachment) => ({
              filename: attachment.filename ?? 'attachment',
              contentType: attachment.contentType,
              sizeBytes: attachment.size,
            })),
          })
          callback()
        })
        .catch((error: Error) => {
          logger.error({ err: error }, 'mail catcher could not store a message')
          callback(error)
        })
    },
  })
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject)
    server.listen(port, '127.0.0.1', () => {
      server.off('error', reject)
      resolve()
    })
  })
  server.on('error', (error) => logger.error({ err: error }, 'mail catcher error'))
  logger.info({ port }, 'mail catcher listening')
  return { close: () => new Promise<void>((resolve) => server.close(() => resolve())) }
}
