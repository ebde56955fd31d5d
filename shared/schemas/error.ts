import { z } from 'zod'

/** The one error shape every failing API answer carries. */
export const apiErrorSchema = z.object({
  error: z.object({
    /** Stable machine-readable code, e.g. `validation_failed`, `not_found`. */
    code: z.string(),
    /** A sentence a person can read. */
    message: z.string(),
    /** Per-field messages, keyed by the field's dotted path (`body.email`, `params.workspaceId`). */
    fields: z.record(z.string(), z.array(z.string())).optional(),
    /** Facts a client can act on, per code (e.g. `layout_version_conflict` carries the current version). */
    details: z.record(z.string(), z.unknown()).optional(),
  }),
})
export type ApiErrorBody = z.infer<typeof apiErrorSchema>

export const errorCodes = [
  'validation_failed',
  'unauthenticated',
  'forbidden',
  'not_found',
  'conflict',
  'layout_version_conflict',
  'rate_limited',
  'payload_too_large',
  'internal',
] as const
export type ErrorCode = (typeof errorCodes)[number]
