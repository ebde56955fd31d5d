import { and, desc, eq, sql } from 'drizzle-orm'
import type { Database, DatabaseOrTransaction } from '../../db/client.js'
import { caughtMail, outboundMail } from '../../db/schema/index.js'

export interface MailMessage {
  kind: string
  to: string
  subject: string
  text: string
  html?: string
}

export async function insertOutboundMail(db: DatabaseOrTransaction, message: MailMessage): Promise<string> {
  const [row] = await db
    .insert(outboundMail)
    .values({ kind: message.kind, toAddress: message.to, subject: message.subject, textBody: message.text, htmlBody: message.html })
    .returning({ id: outboundMail.id })
  return row!.id
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
  message: { to: string; from: string; subject: string; text: string },
) {
  await db.insert(caughtMail).values({ toAddress: message.to, fromAddress: message.from, subject: message.subject, textBody: message.text })
}

export async function listCaughtMail(db: Database, limit = 200) {
  return db.select().from(caughtMail).orderBy(desc(caughtMail.receivedAt)).limit(limit)
}

export async function deleteAllCaughtMail(db: Database) {
  await db.delete(caughtMail)
}
