import type { ErrorCode } from '../../shared/schemas/index'

/** Server codes plus the two failures that happen before the server's answer can be read. */
export type ApiErrorCode = ErrorCode | 'network_error' | 'bad_response'

/** Field messages keyed by the field's dotted path as the server sends it (`body.email`). */
export type ApiFieldMessages = Record<string, string[]>

/** Every failed API call in the client surfaces as this one error type. */
export class ApiError extends Error {
  override readonly name = 'ApiError'
  readonly code: ApiErrorCode
  /** HTTP status; 0 when no answer arrived at all. */
  readonly status: number
  readonly fields: ApiFieldMessages

  constructor(code: ApiErrorCode, status: number, message: string, fields: ApiFieldMessages = {}) {
    super(message)
    this.code = code
    this.status = status
    this.fields = fields
  }

  /**
   * The first message of each request-body field, keyed the way forms name their inputs
   * (`body.email` → `email`). Path and query fields stay out: no input can show them.
   */
  bodyFieldMessages(): Record<string, string> {
    const messages: Record<string, string> = {}
    for (const [path, list] of Object.entries(this.fields)) {
      if (!path.startsWith('body.') || list.length === 0) continue
      messages[path.slice('body.'.length)] = list[0] as string
    }
    return messages
  }
}

export function isApiError(value: unknown): value is ApiError {
  return value instanceof ApiError
}
