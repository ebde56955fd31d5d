import type { Transporter } from 'nodemailer'
import type { Database, DatabaseOrTransaction } from '../../db/client.js'
import type { Logger } from '../../logger.js'
import { findMailAttachments, findOutboundMail, insertOutboundMail, markMailAttemptFailed, markMailSent, type MailMessage } from './mail.repo.js'

/** How a written message reaches the transport: a pg-boss job, or at once when no queue runs (unit-sized apps). */
export interface MailDispatcher {
  dispatch: (mailId: string) => Promise<void>
}

export interface MailService {
  /** Writes the message in the caller's transaction; call `dispatch` with the id after the commit. */
  write: (db: DatabaseOrTransaction, message: MailMessage) => Promise<string>
  dispatch: (mailId: string) => Promise<void>
}

export function createMailService(dispatcher: MailDispatcher): MailService {
  return {
    write: (db, message) => insertOutboundMail(db, message),
    dispatch: (mailId) => dispatcher.dispatch(mailId),
  }
}

/** Sends one stored message; throws when the transport fails so the job is retried. */
export async function deliverMail(
  db: Database,
  transport: Transporter,
  mailFrom: string,
  mailId: string,
  options: { finalAttempt: boolean; logger: Logger },
): Promise<void> {
  const mail = await findOutboundMail(db, mailId)
  if (!mail || mail.status === 'sent') return
  try {
    const attachments = await findMailAttachments(db, mailId)
    await transport.sendMail({ from: mailFrom, to: mail.toAddress, subject: mail.subject, text: mail.textBody, html: mail.htmlBody ?? undefined, attachments })
    await markMailSent(db, mailId)
  } catch (error) {
    const reason = error instanceof Error ? error.message : String(error)
    options.logger.warn({ mailId, reason }, 'mail delivery failed')
    await markMailAttemptFailed(db, mailId, reason, options.finalAttempt)
    throw error
  }
}

/** Dispatcher for apps without a job queue: delivers right away and never fails the request. */
export function createInlineMailDispatcher(db: Database, transport: Transporter, mailFrom: string, logger: Logger): MailDispatcher {
  return {
    dispatch: async (mailId) => {
      await deliverMail(db, transport, mailFrom, mailId, { finalAttempt: true, logger }).catch(() => {})
    },
  }
}
