import type { ErrorCode } from '../shared/schemas/error.js'

/** The one error class of the server: the central handler turns it into the shared JSON error shape. */
export class AppError extends Error {
  constructor(
    readonly code: ErrorCode,
    readonly status: number,
    message: string,
    readonly fields?: Record<string, string[]>,
    readonly details?: Record<string, unknown>,
  ) {
    super(message)
    this.name = 'AppError'
  }
}

export const notFound = (what: string) => new AppError('not_found', 404, `${what} not found`)
export const forbidden = (message = 'Your role in this workspace does not allow this') => new AppError('forbidden', 403, message)
export const unauthenticated = (message = 'Sign in to continue') => new AppError('unauthenticated', 401, message)
export const conflict = (message: string) => new AppError('conflict', 409, message)
export const invalidField = (field: string, message: string) =>
  new AppError('validation_failed', 400, message, { [field]: [message] })
