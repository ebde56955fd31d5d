import type { ZodType } from 'zod'
import { apiErrorSchema, sessionResponseSchema, type SessionResponse } from '../../shared/schemas/index'
import { ApiError, type ApiErrorCode } from './ApiError'

type HttpMethod = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE'

export interface RequestOptions<T> {
  method?: HttpMethod
  body?: unknown
  query?: Record<string, string | number | boolean | undefined>
  /** Checks the successful answer; a mismatch becomes an ApiError instead of a broken page later. */
  schema?: ZodType<T>
  /**
   * Sign-in answers 401 for wrong credentials and must not start a refresh and a redirect;
   * invite acceptance for a new person must not carry whoever is signed in on this browser.
   */
  withoutSession?: boolean
}

/** How the client reaches the session without importing stores (which import the client). */
export interface SessionHooks {
  accessToken(): string | null
  refreshed(session: SessionResponse): void
  /** The refresh cookie is gone or rejected: the person has to sign in again. */
  expired(): void
}

let session: SessionHooks = {
  accessToken: () => null,
  refreshed: () => {},
  expired: () => {},
}

export function connectSession(hooks: SessionHooks): void {
  session = hooks
}

const NETWORK_MESSAGE = "Can't reach Sheetsmith right now. Check your connection and try again."
const BAD_RESPONSE_MESSAGE = 'The server sent an answer this page could not read. Reload the page and try again.'

/** Fallback wording for answers that did not come from our error handler (a proxy, a crash). */
function messageForStatus(status: number): string {
  if (status === 404) return 'That was not found.'
  if (status === 413) return 'That is too large to upload.'
  if (status === 429) return 'Too many attempts. Wait a moment and try again.'
  if (status >= 500) return 'The server ran into a problem. Try again in a moment.'
  return `The request failed (HTTP ${status}).`
}

function codeForStatus(status: number): ApiErrorCode {
  if (status === 400) return 'validation_failed'
  if (status === 401) return 'unauthenticated'
  if (status === 403) return 'forbidden'
  if (status === 404) return 'not_found'
  if (status === 409) return 'conflict'
  if (status === 413) return 'payload_too_large'
  if (status === 429) return 'rate_limited'
  return 'internal'
}

function buildUrl(path: string, query: RequestOptions<unknown>['query']): string {
  if (!query) return path
  const params = new URLSearchParams()
  for (const [key, value] of Object.entries(query)) {
    if (value !== undefined) params.set(key, String(value))
  }
  const search = params.toString()
  return search ? `${path}?${search}` : path
}

async function readBody(response: Response): Promise<unknown> {
  if (response.status === 204) return undefined
  const text = await response.text()
  if (text === '') return undefined
  try {
    return JSON.parse(text)
  } catch {
    return text
  }
}

/** One HTTP exchange, no retries: JSON in and out, every failure as an ApiError. */
async function send<T>(path: string, options: RequestOptions<T>, accessToken: string | null): Promise<T> {
  const headers: Record<string, string> = { Accept: 'application/json' }
  if (options.body !== undefined) headers['Content-Type'] = 'application/json'
  if (accessToken) headers.Authorization = `Bearer ${accessToken}`

  let response: Response
  try {
    response = await fetch(buildUrl(path, options.query), {
      method: options.method ?? 'GET',
      headers,
      body: options.body === undefined ? undefined : JSON.stringify(options.body),
      // The refresh token is an httpOnly cookie scoped to /api/auth on this origin.
      credentials: 'same-origin',
    })
  } catch {
    throw new ApiError('network_error', 0, NETWORK_MESSAGE)
  }

  let payload: unknown
  try {
    payload = await readBody(response)
  } catch {
    throw new ApiError('network_error', 0, NETWORK_MESSAGE)
  }

  if (!response.ok) {
    const parsed = apiErrorSchema.safeParse(payload)
    if (parsed.success) {
      const { code, message, fields } = parsed.data.error
      // The contract lists the codes; an unknown one still carries a readable message.
      throw new ApiError(code as ApiErrorCode, response.status, message, fields ?? {})
    }
    throw new ApiError(codeForStatus(response.status), response.status, messageForStatus(response.status))
  }

  if (!options.schema) return payload as T
  const checked = options.schema.safeParse(payload)
  if (!checked.success) {
    console.error(`Unexpected answer from ${options.method ?? 'GET'} ${path}`, checked.error.issues)
    throw new ApiError('bad_response', response.status, BAD_RESPONSE_MESSAGE)
  }
  return checked.data
}

let refreshInFlight: Promise<SessionResponse | null> | null = null

/**
 * Trades the refresh cookie for a new access token. Concurrent callers share one request,
 * because the server rotates the cookie and a second parallel refresh would be rejected.
 * Resolves to null when there is no usable session; throws only when the server can't be reached.
 */
export function refreshSession(): Promise<SessionResponse | null> {
  refreshInFlight ??= (async () => {
    try {
      // 204: no refresh cookie at all, nothing to resume (a first visit, or after signing out).
      const answer = await send<unknown>('/api/auth/refresh', { method: 'POST' }, null)
      if (answer === undefined) return null
      const fresh = sessionResponseSchema.parse(answer)
      session.refreshed(fresh)
      return fresh
    } catch (error) {
      if (error instanceof ApiError && error.status >= 400 && error.status < 500) return null
      throw error
    } finally {
      refreshInFlight = null
    }
  })()
  return refreshInFlight
}

/** Calls the API with the current access token; on a 401 refreshes the session once and retries. */
export async function request<T = void>(path: string, options: RequestOptions<T> = {}): Promise<T> {
  if (options.withoutSession) return send(path, options, null)

  const tokenSent = session.accessToken()
  try {
    return await send(path, options, tokenSent)
  } catch (error) {
    if (!(error instanceof ApiError) || error.status !== 401) throw error
  }

  // Another call may have refreshed while this one was in flight: use its token rather than rotate again.
  const tokenNow = session.accessToken()
  const token = tokenNow !== null && tokenNow !== tokenSent ? tokenNow : ((await refreshSession())?.accessToken ?? null)
  if (token === null) {
    session.expired()
    throw new ApiError('unauthenticated', 401, 'Your session has ended. Sign in again to continue.')
  }
  return send(path, options, token)
}

/** Path segments come from routes and e-mailed links: never let them change the path's shape. */
export function segment(value: string): string {
  return encodeURIComponent(value)
}
