import type { ErrorRequestHandler, RequestHandler } from 'express'
import type { ApiErrorBody } from '../../shared/schemas/error.js'
import { AppError } from '../errors.js'

function send(response: Parameters<RequestHandler>[1], error: AppError) {
  const body: ApiErrorBody = {
    error: { code: error.code, message: error.message, ...(error.fields ? { fields: error.fields } : {}), ...(error.details ? { details: error.details } : {}) },
  }
  response.status(error.status).json(body)
}

/** Body-parser and similar errors carry an HTTP status and a type; translate the ones a client can cause. */
function fromHttpError(error: { status?: number; type?: string; message?: string }): AppError | undefined {
  if (error.type === 'entity.too.large') return new AppError('payload_too_large', 413, 'The request body is too large')
  if (error.type === 'entity.parse.failed') return new AppError('validation_failed', 400, 'The request body is not valid JSON', { body: ['Not valid JSON'] })
  if (typeof error.status === 'number' && error.status >= 400 && error.status < 500) return new AppError('validation_failed', error.status, 'The request could not be read')
  return undefined
}

export const apiNotFoundHandler: RequestHandler = (request) => {
  throw new AppError('not_found', 404, `No API route ${request.method} ${request.path}`)
}

/** The one place errors become answers: known errors keep their message, everything else is a logged 500 with no details. */
export const errorHandler: ErrorRequestHandler = (error, request, response, _next) => {
  if (error instanceof AppError) return send(response, error)
  const translated = typeof error === 'object' && error !== null ? fromHttpError(error) : undefined
  if (translated) return send(response, translated)
  request.log?.error({ err: error }, 'unhandled error')
  send(response, new AppError('internal', 500, 'Something went wrong on our side. Please try again.'))
}
