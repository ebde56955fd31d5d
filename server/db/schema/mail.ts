import { customType, integer, jsonb, pgEnum, pgTable, text, timestamp, uuid, index } from 'drizzle-orm/pg-core'

const bytea = customType<{ data: Buffer; driverData: Buffer }>({ dataType: () => 'bytea' })

export const mailStatus = pgEnum('mail_status', ['queued', 'sent', 'failed'])

/** Every message the product sends, with its delivery state. A pg-boss job delivers it. */
export const outboundMail = pgTable(
  'outbound_mail',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    kind: text('kind').notNull(),
    toAddress: text('to_address').notNull(),
    subject: text('subject').notNull(),
    textBody: text('text_body').notNull(),
    htmlBody: text('html_body'),
    status: mailStatus('status').notNull().default('queued'),
    attempts: integer('attempts').notNull().default(0),
    lastError: text('last_error'),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    sentAt: timestamp('sent_at', { withTimezone: true }),
  },
  (table) => [index('outbound_mail_status_idx').on(table.status)],
)

/** Files sent with a message (a quote's PDF), stored with it so a retried delivery sends the same bytes. */
export const outboundMailAttachments = pgTable(
  'outbound_mail_attachments',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    mailId: uuid('mail_id')
      .notNull()
      .references(() => outboundMail.id, { onDelete: 'cascade' }),
    filename: text('filename').notNull(),
    contentType: text('content_type').notNull(),
    content: bytea('content').notNull(),
  },
  (table) => [index('outbound_mail_attachments_mail_idx').on(table.mailId)],
)

/** What the development mail catcher received over SMTP: the Outbox page lists it. */
export const caughtMail = pgTable('caught_mail', {
  id: uuid('id').primaryKey().defaultRandom(),
  toAddress: text('to_address').notNull(),
  fromAddress: text('from_address').notNull(),
  subject: text('subject').notNull(),
  textBody: text('text_body').notNull(),
  /** Names, types and sizes of attached files (the bytes are not kept). */
  attachments: jsonb('attachments').$type<{ filename: string; contentType: string; sizeBytes: number }[]>().notNull().default([]),
  receivedAt: timestamp('received_at', { withTimezone: true }).notNull().defaultNow(),
})
