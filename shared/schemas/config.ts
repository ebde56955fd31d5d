import { z } from 'zod'

/** What the client needs to know about the server it talks to (public, no secrets). */
export const clientConfigSchema = z.object({
  /** The development mail catcher is on: the Outbox page can list caught messages. */
  outboxEnabled: z.boolean(),
  version: z.string(),
})
export type ClientConfig = z.infer<typeof clientConfigSchema>
