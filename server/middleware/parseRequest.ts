import type { Request } from 'express'
import { z } from 'zod'
import { AppError } from '../errors.js'

interface RequestSchemas<B extends z.ZodType, P extends z.ZodType, Q extends z.ZodType> {
  body?: B
  params?: P
  query?: Q
}

/** Field messages keyed by dotted path with the request part first (`body.email`). */
export function zodFieldMessages(error: z.ZodError, part: string): Record<string, string[]> {
  const fields: Record<string, string[]> = {}
  for (const issue of error.issues) {
    const key = [part, ...issue.path.map(String)].join('.')
    ;(fields[key] ??= []).push(issue.message)
  }
  return fields
}

/**
 * Validates the parts of a request against zod schemas and returns the parsed values.
 * All parts are checked before failing, so one answer names every bad field.
 */
export function parseRequest<B extends z.ZodType = z.ZodUnknown, P extends z.ZodType = z.ZodUnknown, Q extends z.ZodType = z.ZodUnknown>(
  request: Request,
  schemas: RequestSchemas<B, P, Q>,
): { body: z.output<B>; params: z.output<P>; query: z.output<Q> } {
  const fields: Record<string, string[]> = {}
  const result: Record<string, unknown> = {}
  for (const part of ['body', 'params', 'query'] as const) {
    const schema = schemas[part]
    if (!schema) continue
    const input = part === 'body' ? (request.body ?? {}) : request[part]
    const parsed = schema.safeParse(input)
    if (parsed.success) result[part] = parsed.data
    else Object.assign(fields, zodFieldMessages(parsed.error, part))
  }
  const names = Object.keys(fields)
  if (names.length > 0) {
    const first = fields[names[0]!]![0]
    throw new AppError('validation_failed', 400, `Check ${names.join(', ')}: ${first}`, fields)
  }
  return result as { body: z.output<B>; params: z.output<P>; query: z.output<Q> }
}
