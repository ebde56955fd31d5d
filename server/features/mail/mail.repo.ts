import { and, desc, eq, sql } from 'drizzle-orm'
import type { Database, DatabaseOrTransaction } from '../../db/client.js'
import { caughtMail, outboundMail, outboundMailAttachments } from '../../db/schema/index.js'

export interface MailMessage {
  kind: string
  to: string
  subject: string
  text: string
  html?: string
  attachments?: MailAttachment[]
}

export interface MailAttachment {
  filename: string
  contentType: string
  content: Buffer
}

export interface CaughtAttachment {
  filename: string
  contentType: string
  sizeBytes: number
}

export async function insertOutboundMail(db: DatabaseOrTransaction, message: MailMessage): Promise<string> {
  const [row] = await db
    .insert(outboundMail)
    .values({ kind: message.kind, toAddress: message.to, subject: message.subject, textBody: message.text, htmlBody: message.html })
    .returning({ id: outboundMail.id })
  if (message.attachments?.length) {
    await db.insert(outboundMailAttachments).values(message.attachments.map((attachment) => ({ mailId: row!.id, ...attachment })))
  }
  return row!.id
}

export async function findMailAttachments(db: Database, mailId: string): Promise<MailAttachment[]> {
  return db
    .select({ filename: outboundMailAttachments.filename, contentType: outboundMailAttachments.contentType, content: outboundMailAttachments.content })
    .from(outboundMailAttachments)
    .where(eq(outboundMailAttachments.mailId, mailId))
    .orderBy(outboundMailAttachments.filename)
}

export async function findOutboundMail(db: Database, mailId: string) {
  const [row] = await db.select().from(outboundMail).where(eq(outboundMail.id, mailId))
  return row
}

export async function markMailSent(db: Database, mailId: string) {
  await db
    .update(outboundMail)
    .set({ status: 'sent', sentAt: new Date(), attempts: sql`${outboundMail.attempts} + 1`, lastError: null })
    .where(eq(outboundMail.id, mailId))
}

export async function markMailAttemptFailed(db: Database, mailId: string, error: string, final: boolean) {
  await db
    .update(outboundMail)
    .set({ status: final ? 'failed' : 'queued', attempts: sql`${outboundMail.attempts} + 1`, lastError: error.slice(0, 500) })
    .where(eq(outboundMail.id, mailId))
}

/** Mail still queued a while after it was written: its job may have been lost with a crashed process. */
export async function findStaleQueuedMail(db: Database, olderThanSeconds: number) {
  return db
    .select({ id: outboundMail.id })
    .from(outboundMail)
    .where(and(eq(outboundMail.status, 'queued'), sql`${outboundMail.createdAt} < now() - make_interval(secs => ${olderThanSeconds})`))
}

export async function insertCaughtMail(
  db: Database,
  message: { to: string; from: string; subject: string; text: string; attachments?: CaughtAttachment[] },
) {
  await db
    .insert(caughtMail)
    .values({ toAddress: message.to, fromAddress: message.from, subject: message.subject, textBody: message.text, attachments: message.attachments ?? [] })
}

export async function listCaughtMail(db: Database, limit = 200) {
  return db.select().from(caughtMail).orderBy(desc(caughtMail.receivedAt)).limit(limit)
}

export async function deleteAllCaughtMail(db: Database) {
  await db.delete(caughtMail)
}
