import { z } from 'zod'

/** A message caught by the development mail catcher (the Outbox page). */
export const outboxMessageSchema = z.object({
  id: z.string(),
  to: z.string(),
  from: z.string(),
  subject: z.string(),
  text: z.string(),
  /** Every http(s) link in the message body, so a person can follow invite and reset links locally. */
  links: z.array(z.string()),
  /** Attached files by name, type and size (the catcher keeps no bytes). */
  attachments: z.array(z.object({ filename: z.string(), contentType: z.string(), sizeBytes: z.number() })).default([]),
  receivedAt: z.string(),
})
export type OutboxMessage = z.infer<typeof outboxMessageSchema>

export const healthSchema = z.object({
  status: z.enum(['ok', 'degraded']),
  database: z.enum(['up', 'down']),
  version: z.string(),
})
