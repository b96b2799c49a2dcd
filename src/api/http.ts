import type { ZodType } from 'zod'
import { apiErrorSchema } from '../../shared/api'

/** Base path of every API route (see the API contract). */
export const API_BASE = '/api/v1'

/** Status used on an `ApiRequestError` when no HTTP answer arrived at all. */
export const NO_RESPONSE_STATUS = 0

/**
 * Any failed API call: an error answer from the server, an answer this client cannot read,
 * or no answer at all (status 0, code `network`). `message` is always a sentence for people.
 */
export class ApiRequestError extends Error {
  readonly status: number
  readonly code: string
  readonly details: readonly unknown[] | undefined
  /** From a `Retry-After` header, in whole seconds; null when the server sent none. */
  readonly retryAfterSeconds: number | null

  constructor(
    status: number,
    code: string,
    message: string,
    extra: { details?: readonly unknown[]; retryAfterSeconds?: number | null } = {},
  ) {
    super(message)
    this.name = 'ApiRequestError'
    this.status = status
    this.code = code
    this.details = extra.details
    this.retryAfterSeconds = extra.retryAfterSeconds ?? null
  }
}

export type HttpMethod = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE'

export interface RequestOptions<T> {
  method?: HttpMethod
  /** Sent as JSON. */
  body?: unknown
  /**
   * Sent as multipart/form-data (file uploads). No Content-Type header is set, so the
   * browser writes it with the boundary; the CSRF header is sent as on any write.
   */
  form?: FormData
  /** Appended as a query string; undefined and empty values are left out. */
  query?: Record<string, string | number | undefined>
  /** Checks and types the JSON answer; leave out for answers without a body (204). */
  schema?: ZodType<T>
  /** False for the routes that work without a session token (sign-in). */
  withCsrf?: boolean
  /** False where a 401 is an expected answer (session check, sign-in). */
  reportUnauthenticated?: boolean
  signal?: AbortSignal
}

let csrfToken: string | null = null
let unauthenticatedHandler: (() => void) | null = null

/** Token from the latest SessionInfo; sent as X-CSRF-Token on every state-changing request. */
export function setCsrfToken(token: string | null): void {
  csrfToken = token
}

/** Called when a request that needs a session is answered 401 (the session ended). */
export function setUnauthenticatedHandler(handler: (() => void) | null): void {
  unauthenticatedHandler = handler
}

/** Makes any thrown value an ApiRequestError, so stores keep one error type. */
export function toApiRequestError(cause: unknown): ApiRequestError {
  if (cause instanceof ApiRequestError) return cause
  const message = cause instanceof Error && cause.message ? cause.message : 'Something went wrong.'
  return new ApiRequestError(NO_RESPONSE_STATUS, 'client', message)
}

function buildUrl(path: string, query: RequestOptions<unknown>['query']): string {
  const params = new URLSearchParams()
  for (const [key, value] of Object.entries(query ?? {})) {
    if (value !== undefined && value !== '') params.set(key, String(value))
  }
  const search = params.toString()
  return `${API_BASE}${path}${search ? `?${search}` : ''}`
}

function parseRetryAfter(response: Response): number | null {
  const header = response.headers.get('Retry-After')
  if (header === null) return null
  const seconds = Number(header)
  if (Number.isFinite(seconds) && seconds >= 0) return Math.ceil(seconds)
  const date = Date.parse(header)
  return Number.isNaN(date) ? null : Math.max(0, Math.ceil((date - Date.now()) / 1000))
}

function describeStatus(status: number): string {
  if (status >= 502 && status <= 504) {
    return `The Rootcast server is not answering right now (HTTP ${status}). Try again in a moment.`
  }
  if (status === 401) return 'Your session has ended. Sign in again.'
  if (status === 403) return 'Your role in this team does not allow this.'
  if (status === 404) return 'This item does not exist, or you have no access to it.'
  if (status === 429) return 'Too many requests. Wait a moment and try again.'
  return `The server answered with HTTP ${status} and no readable explanation.`
}

async function readJson(response: Response): Promise<{ ok: true; value: unknown } | { ok: false }> {
  try {
    const text = await response.text()
    return { ok: true, value: JSON.parse(text) as unknown }
  } catch {
    return { ok: false }
  }
}

async function errorFrom(response: Response): Promise<ApiRequestError> {
  const retryAfterSeconds = parseRetryAfter(response)
  const json = await readJson(response)
  const parsed = json.ok ? apiErrorSchema.safeParse(json.value) : null
  if (parsed?.success) {
    const { code, message, details } = parsed.data.error
    return new ApiRequestError(response.status, code, message.trim() || describeStatus(response.status), {
      details,
      retryAfterSeconds,
    })
  }
  return new ApiRequestError(response.status, 'bad_response', describeStatus(response.status), {
    retryAfterSeconds,
  })
}

type SendOptions = Omit<RequestOptions<unknown>, 'schema'> & { accept?: string }

/** The one place that calls fetch: sends, and turns a failed or missing answer into an ApiRequestError. */
async function send(path: string, options: SendOptions): Promise<Response> {
  const method = options.method ?? 'GET'
  const headers: Record<string, string> = { Accept: options.accept ?? 'application/json' }
  if (options.body !== undefined && options.form === undefined) headers['Content-Type'] = 'application/json'
  if (method !== 'GET' && options.withCsrf !== false && csrfToken !== null) {
    headers['X-CSRF-Token'] = csrfToken
  }

  let response: Response
  try {
    response = await fetch(buildUrl(path, options.query), {
      method,
      headers,
      body: options.form ?? (options.body === undefined ? undefined : JSON.stringify(options.body)),
      credentials: 'same-origin',
      signal: options.signal,
    })
  } catch (cause) {
    // A cancelled request (a newer one replaced it) is not a failure to report.
    if ((cause as { name?: unknown } | null)?.name === 'AbortError') throw cause
    throw new ApiRequestError(
      NO_RESPONSE_STATUS,
      'network',
      'Cannot reach the Rootcast server. Check that it is running and that you are online, then try again.',
    )
  }

  if (!response.ok) {
    const error = await errorFrom(response)
    if (response.status === 401 && options.reportUnauthenticated !== false) unauthenticatedHandler?.()
    throw error
  }
  return response
}

/**
 * Resolves to the checked JSON answer (or undefined when no schema is given); rejects with
 * an ApiRequestError, or with the AbortError of `signal`.
 */
export async function request<T = undefined>(path: string, options: RequestOptions<T> = {}): Promise<T> {
  const { schema, ...sendOptions } = options
  const response = await send(path, sendOptions)
  if (schema === undefined) return undefined as T

  const json = await readJson(response)
  const parsed = json.ok ? schema.safeParse(json.value) : null
  if (!parsed?.success) {
    throw new ApiRequestError(
      response.status,
      'bad_response',
      'The server sent an answer this page cannot read. Reload the page; if it stays, the server and this page may be out of step.',
    )
  }
  return parsed.data
}

/**
 * How long the temporary object URL of a download stays valid after the click: the browser
 * reads it asynchronously, so revoking at once can cancel the download (common practice).
 */
export const DOWNLOAD_URL_LIFETIME_MS = 60_000

/** The file name of a Content-Disposition header (RFC 6266: `filename*` first, then `filename`). */
export function fileNameFromDisposition(header: string | null): string | null {
  if (header === null) return null
  const extended = /filename\*\s*=\s*(?:UTF-8|utf-8)''([^;]+)/.exec(header)
  if (extended) {
    try {
      return decodeURIComponent(extended[1].trim().replace(/^"|"$/g, '')) || null
    } catch {
      // A malformed escape: fall through to the plain parameter.
    }
  }
  const plain = /filename\s*=\s*("([^"]*)"|[^;]+)/.exec(header)
  const name = plain ? (plain[2] ?? plain[1]).trim() : ''
  return name || null
}

/** Hands a file made in the page (or downloaded) to the browser's save flow through a temporary `<a download>`. */
export function saveBlob(blob: Blob, fileName: string): void {
  const url = URL.createObjectURL(blob)
  const link = document.createElement('a')
  link.href = url
  link.download = fileName
  link.rel = 'noopener'
  link.style.display = 'none'
  document.body.append(link)
  try {
    link.click()
  } finally {
    link.remove()
    setTimeout(() => URL.revokeObjectURL(url), DOWNLOAD_URL_LIFETIME_MS)
  }
}

/**
 * Downloads a file answer (an export) and hands it to the browser's save flow through a
 * temporary `<a download>`. Resolves to the file name used; errors as for `request`.
 */
export async function download(
  path: string,
  options: { query?: RequestOptions<unknown>['query']; fallbackName: string; signal?: AbortSignal },
): Promise<string> {
  const response = await send(path, { query: options.query, signal: options.signal, accept: '*/*' })
  const blob = await response.blob()
  const fileName = fileNameFromDisposition(response.headers.get('Content-Disposition')) ?? options.fallbackName
  saveBlob(blob, fileName)
  return fileName
}
