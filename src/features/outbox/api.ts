import { z } from 'zod'
import { request } from '../../api/client'
import { outboxMessageSchema, type OutboxMessage } from '../../../shared/schemas/index'

/** Newest first, as the server keeps them. */
export function listOutbox(): Promise<OutboxMessage[]> {
  return request('/api/dev/outbox', { schema: z.array(outboxMessageSchema) })
}

export function emptyOutbox(): Promise<void> {
  return request('/api/dev/outbox', { method: 'DELETE' })
}
