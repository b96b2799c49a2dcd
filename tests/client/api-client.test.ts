import { describe, expect, it, vi } from 'vitest'
import { getSession } from '../../src/api/auth'
import { ApiRequestError, NO_RESPONSE_STATUS, setCsrfToken, setUnauthenticatedHandler } from '../../src/api/http'
import { createProject, deleteProject, getProject, listProjects } from '../../src/api/projects'
import { errorResponse, isolateClientState, jsonResponse, noContent, stubFetch } from './fetch-stub'

const project = {
  id: 42,
  teamId: 3,
  name: 'Ferry pictograms',
  description: 'Deck outline and waves',
  pathCount: 5,
  createdAt: '2026-11-02T09:15:00.000Z',
  updatedAt: '2026-11-20T16:40:00.000Z',
  createdBy: 'Ines Ortega',
}

async function rejectionOf(promise: Promise<unknown>): Promise<ApiRequestError> {
  const outcome = await promise.then(
    () => null,
    (error: unknown) => error,
  )
  expect(outcome).toBeInstanceOf(ApiRequestError)
  return outcome as ApiRequestError
}

isolateClientState()

describe('API client error translation', () => {
  it('turns the API error shape into status, code and the server sentence', async () => {
    stubFetch({ 'GET /api/v1/projects/42': () => errorResponse(403, 'forbidden', 'Viewers cannot change projects.') })
    const error = await rejectionOf(getProject(42))
    expect(error.status).toBe(403)
    expect(error.code).toBe('forbidden')
    expect(error.message).toBe('Viewers cannot change projects.')
  })

  it('keeps the details of a validation error', async () => {
    const details = [{ path: ['name'], message: 'A project needs a name.' }]
    stubFetch({
      'POST /api/v1/teams/3/projects': () =>
        jsonResponse(400, { error: { code: 'validation', message: 'Check the highlighted fields.', details } }),
    })
    const error = await rejectionOf(createProject(3, { name: ' ' }))
    expect(error.code).toBe('validation')
    expect(error.details).toEqual(details)
  })

  it('explains an HTML gateway page instead of failing to parse it', async () => {
    stubFetch({
      'GET /api/v1/projects/42': () =>
        new Response('<html><body>Bad Gateway</body></html>', { status: 502, headers: { 'Content-Type': 'text/html' } }),
    })
    const error = await rejectionOf(getProject(42))
    expect(error.status).toBe(502)
    expect(error.code).toBe('bad_response')
    expect(error.message).toBe('The Rootcast server is not answering right now (HTTP 502). Try again in a moment.')
  })

  it('treats JSON that is not the error shape as unreadable', async () => {
    stubFetch({ 'GET /api/v1/projects/42': () => jsonResponse(500, { message: 'boom' }) })
    const error = await rejectionOf(getProject(42))
    expect(error.status).toBe(500)
    expect(error.code).toBe('bad_response')
    expect(error.message).toBe('The server answered with HTTP 500 and no readable explanation.')
  })

  it('reports a network failure with status 0 and code network', async () => {
    stubFetch({ 'GET /api/v1/projects/42': () => new TypeError('Failed to fetch') })
    const error = await rejectionOf(getProject(42))
    expect(error.status).toBe(NO_RESPONSE_STATUS)
    expect(error.code).toBe('network')
    expect(error.message).toMatch(/^Cannot reach the Rootcast server\./)
  })

  it('reads Retry-After from a rate-limited answer', async () => {
    stubFetch({
      'GET /api/v1/projects/42': () =>
        errorResponse(429, 'rate_limited', 'Too many sign-in attempts.', { 'Retry-After': '120' }),
    })
    const error = await rejectionOf(getProject(42))
    expect(error.code).toBe('rate_limited')
    expect(error.retryAfterSeconds).toBe(120)
  })

  it('rejects a success answer that does not match the shared schema', async () => {
    stubFetch({ 'GET /api/v1/projects/42': () => jsonResponse(200, { ...project, pathCount: 'five' }) })
    const error = await rejectionOf(getProject(42))
    expect(error.status).toBe(200)
    expect(error.code).toBe('bad_response')
  })

  it('lets a cancelled request reject with its AbortError, not as a network failure', async () => {
    const abort = Object.assign(new Error('The operation was aborted.'), { name: 'AbortError' })
    stubFetch({ 'GET /api/v1/teams/3/projects': () => abort })
    const outcome = await listProjects(3, { page: 1, pageSize: 10, sort: 'name', order: 'asc' }).catch((e) => e)
    expect(outcome).toBe(abort)
  })
})

describe('API client requests', () => {
  it('sends the CSRF token on state-changing requests only, always same-origin', async () => {
    const { calls } = stubFetch({
      'GET /api/v1/teams/3/projects': () => jsonResponse(200, { items: [project], total: 31, page: 2, pageSize: 25 }),
      'POST /api/v1/teams/3/projects': () => jsonResponse(201, project),
    })
    setCsrfToken('csrf-51d0')
    await listProjects(3, { page: 2, pageSize: 25, sort: 'updatedAt', order: 'desc', q: ' ferry ' })
    const created = await createProject(3, { name: 'Ferry pictograms', description: 'Deck outline and waves' })

    expect(created).toEqual(project)
    const [list, create] = calls
    expect(list.url).toBe('/api/v1/teams/3/projects?page=2&pageSize=25&sort=updatedAt&order=desc&q=ferry')
    expect(list.headers['x-csrf-token']).toBeUndefined()
    expect(create.headers['x-csrf-token']).toBe('csrf-51d0')
    expect(create.headers['content-type']).toBe('application/json')
    expect(create.body).toEqual({ name: 'Ferry pictograms', description: 'Deck outline and waves' })
    expect(calls.map((call) => call.credentials)).toEqual(['same-origin', 'same-origin'])
  })

  it('leaves an empty filter out of the query string', async () => {
    const { calls } = stubFetch({
      'GET /api/v1/teams/3/projects': () => jsonResponse(200, { items: [], total: 0, page: 1, pageSize: 50 }),
    })
    await listProjects(3, { page: 1, pageSize: 50, sort: 'pathCount', order: 'asc', q: '   ' })
    expect(calls[0].query.has('q')).toBe(false)
  })

  it('resolves a 204 answer to undefined', async () => {
    stubFetch({ 'DELETE /api/v1/projects/42': () => noContent() })
    await expect(deleteProject(42)).resolves.toBeUndefined()
  })

  it('reports a 401 on a session route, but not the signed-out answer of /auth/me', async () => {
    const onUnauthenticated = vi.fn()
    setUnauthenticatedHandler(onUnauthenticated)
    stubFetch({
      'GET /api/v1/auth/me': () => errorResponse(401, 'unauthenticated', 'Sign in first.'),
      'GET /api/v1/projects/42': () => errorResponse(401, 'unauthenticated', 'Sign in first.'),
    })
    await expect(getSession()).resolves.toBeNull()
    expect(onUnauthenticated).not.toHaveBeenCalled()
    await rejectionOf(getProject(42))
    expect(onUnauthenticated).toHaveBeenCalledTimes(1)
  })
})
