/** An error with an HTTP status and a machine code, rendered in the API's error shape. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown[],
  ) {
    super(message)
    this.name = 'HttpError'
  }
}

export const notFound = (what = 'That resource') => new HttpError(404, 'not_found', `${what} does not exist or is not shared with you.`)
export const forbidden = (message = 'Your role in this team does not allow that.') => new HttpError(403, 'forbidden', message)
export const unauthenticated = () => new HttpError(401, 'unauthenticated', 'Sign in first, or send a valid API token.')
