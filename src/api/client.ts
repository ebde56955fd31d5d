import type { ZodType } from 'zod'
import { apiErrorSchema, sessionResponseSchema, type SessionResponse } from '../../shared/schemas/index'
import { ApiError, type ApiErrorCode } from './ApiError'

type HttpMethod = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE'

export interface RequestOptions<T> {
  method?: HttpMethod
  /** JSON-encoded, except FormData, which goes as multipart with the boundary the browser picks. */
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
  return parsePayload(await response.text())
}

function parsePayload(text: string): unknown {
  if (text === '') return undefined
  try {
    return JSON.parse(text)
  } catch {
    return text
  }
}

/** A failed answer as an ApiError: our error shape when the server sent one, else wording for the status. */
function errorFromAnswer(status: number, payload: unknown): ApiError {
  const parsed = apiErrorSchema.safeParse(payload)
  if (parsed.success) {
    const { code, message, fields } = parsed.data.error
    // The contract lists the codes; an unknown one still carries a readable message.
    return new ApiError(code as ApiErrorCode, status, message, fields ?? {})
  }
  return new ApiError(codeForStatus(status), status, messageForStatus(status))
}

/** A successful payload, checked against the schema when there is one. */
function checkedPayload<T>(payload: unknown, status: number, options: RequestOptions<T>, path: string): T {
  if (!options.schema) return payload as T
  const checked = options.schema.safeParse(payload)
  if (!checked.success) {
    console.error(`Unexpected answer from ${options.method ?? 'GET'} ${path}`, checked.error.issues)
    throw new ApiError('bad_response', status, BAD_RESPONSE_MESSAGE)
  }
  return checked.data
}

function requestHeaders(body: unknown, accessToken: string | null): Record<string, string> {
  const headers: Record<string, string> = { Accept: 'application/json' }
  // FormData gets no Content-Type from us: the browser writes it, boundary included.
  if (body !== undefined && !(body instanceof FormData)) headers['Content-Type'] = 'application/json'
  if (accessToken) headers.Authorization = `Bearer ${accessToken}`
  return headers
}

function encodeBody(body: unknown): BodyInit | undefined {
  if (body === undefined) return undefined
  return body instanceof FormData ? body : JSON.stringify(body)
}

/** One HTTP exchange, no retries: JSON (or multipart) in, JSON out, every failure as an ApiError. */
async function send<T>(path: string, options: RequestOptions<T>, accessToken: string | null): Promise<T> {
  let response: Response
  try {
    response = await fetch(buildUrl(path, options.query), {
      method: options.method ?? 'GET',
      headers: requestHeaders(options.body, accessToken),
      body: encodeBody(options.body),
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

  if (!response.ok) throw errorFromAnswer(response.status, payload)
  return checkedPayload(payload, response.status, options, path)
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

/** Runs one exchange with the current access token; on a 401 refreshes the session once and runs it again. */
async function withSession<T>(exchange: (accessToken: string | null) => Promise<T>): Promise<T> {
  const tokenSent = session.accessToken()
  try {
    return await exchange(tokenSent)
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
  return exchange(token)
}

/** Calls the API with the current access token; on a 401 refreshes the session once and retries. */
export async function request<T = void>(path: string, options: RequestOptions<T> = {}): Promise<T> {
  if (options.withoutSession) return send(path, options, null)
  return withSession((token) => send(path, options, token))
}

export interface UploadOptions<T> {
  /** Defaults to POST. */
  method?: HttpMethod
  schema?: ZodType<T>
  /** Bytes of the request body sent so far, and the total; called as the upload goes. */
  onProgress?: (sentBytes: number, totalBytes: number) => void
  /** Aborting rejects with a DOMException named AbortError (see isAbortError). */
  signal?: AbortSignal
}

/**
 * A multipart upload through XMLHttpRequest, because fetch cannot report upload progress.
 * Same session handling and error shape as `request`; a retry after a refresh sends the form again.
 */
export function upload<T>(path: string, form: FormData, options: UploadOptions<T> = {}): Promise<T> {
  const requestOptions: RequestOptions<T> = { method: options.method ?? 'POST', schema: options.schema }
  return withSession(
    (token) =>
      new Promise<T>((resolve, reject) => {
        if (options.signal?.aborted) return reject(new DOMException('The upload was cancelled', 'AbortError'))
        const xhr = new XMLHttpRequest()
        xhr.open(requestOptions.method ?? 'POST', path)
        for (const [name, value] of Object.entries(requestHeaders(form, token))) xhr.setRequestHeader(name, value)
        xhr.responseType = 'text'
        const abort = () => xhr.abort()
        options.signal?.addEventListener('abort', abort, { once: true })
        const settle = () => options.signal?.removeEventListener('abort', abort)
        xhr.upload.onprogress = (event) => {
          if (event.lengthComputable) options.onProgress?.(event.loaded, event.total)
        }
        xhr.onerror = () => {
          settle()
          reject(new ApiError('network_error', 0, NETWORK_MESSAGE))
        }
        xhr.onabort = () => {
          settle()
          reject(new DOMException('The upload was cancelled', 'AbortError'))
        }
        xhr.onload = () => {
          settle()
          const payload = xhr.status === 204 ? undefined : parsePayload(xhr.responseText)
          if (xhr.status < 200 || xhr.status >= 300) return reject(errorFromAnswer(xhr.status, payload))
          try {
            resolve(checkedPayload(payload, xhr.status, requestOptions, path))
          } catch (error) {
            reject(error)
          }
        }
        xhr.send(form)
      }),
  )
}

export function isAbortError(value: unknown): boolean {
  return value instanceof DOMException && value.name === 'AbortError'
}

export interface DownloadedFile {
  blob: Blob
  /** From Content-Disposition (the UTF-8 `filename*` when given), else null. */
  filename: string | null
}

/** The file name a Content-Disposition header offers, preferring the RFC 6266 `filename*` form. */
export function filenameFromDisposition(header: string | null): string | null {
  if (!header) return null
  const extended = /filename\*\s*=\s*utf-8''([^;]+)/i.exec(header)
  if (extended?.[1]) {
    try {
      return decodeURIComponent(extended[1].trim())
    } catch {
      // A malformed escape falls through to the plain name.
    }
  }
  const plain = /filename\s*=\s*"?([^";]+)"?/.exec(header)
  return plain?.[1]?.trim() || null
}

/** A file from the API (an attachment, not JSON), with the same session and error handling as `request`. */
export function download(path: string): Promise<DownloadedFile> {
  return withSession(async (token) => {
    let response: Response
    try {
      response = await fetch(path, { headers: token ? { Authorization: `Bearer ${token}` } : {}, credentials: 'same-origin' })
    } catch {
      throw new ApiError('network_error', 0, NETWORK_MESSAGE)
    }
    if (!response.ok) {
      let payload: unknown
      try {
        payload = await readBody(response)
      } catch {
        payload = undefined
      }
      throw errorFromAnswer(response.status, payload)
    }
    try {
      return { blob: await response.blob(), filename: filenameFromDisposition(response.headers.get('Content-Disposition')) }
    } catch {
      throw new ApiError('network_error', 0, NETWORK_MESSAGE)
    }
  })
}

/**
 * An open server-sent event stream, read with fetch because EventSource cannot send the Authorization header.
 * Same session handling as `request`; a failed answer is an ApiError, aborting rejects with an AbortError.
 */
export function openEventStream(path: string, signal?: AbortSignal): Promise<ReadableStream<Uint8Array>> {
  return withSession(async (token) => {
    const headers: Record<string, string> = { Accept: 'text/event-stream' }
    if (token) headers.Authorization = `Bearer ${token}`
    let response: Response
    try {
      response = await fetch(path, { headers, credentials: 'same-origin', cache: 'no-store', signal })
    } catch (error) {
      if (isAbortError(error)) throw error
      throw new ApiError('network_error', 0, NETWORK_MESSAGE)
    }
    if (!response.ok) {
      let payload: unknown
      try {
        payload = await readBody(response)
      } catch {
        payload = undefined
      }
      throw errorFromAnswer(response.status, payload)
    }
    if (!response.body) throw new ApiError('bad_response', response.status, BAD_RESPONSE_MESSAGE)
    return response.body
  })
}

/** Path segments come from routes and e-mailed links: never let them change the path's shape. */
export function segment(value: string): string {
  return encodeURIComponent(value)
}
