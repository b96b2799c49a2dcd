import { createPinia, setActivePinia } from 'pinia'
import { describe, expect, it } from 'vitest'
import { createMemoryHistory } from 'vue-router'
import { createAppRouter, safeRedirect } from '../../src/router'
import { errorResponse, isolateClientState, jsonResponse, sessionFixture, stubFetch } from './fetch-stub'

function freshRouter() {
  setActivePinia(createPinia())
  return createAppRouter(createMemoryHistory())
}

isolateClientState()

describe('route guards', () => {
  it('sends a signed-out visitor to sign-in with a way back', async () => {
    stubFetch({ 'GET /api/v1/auth/me': () => errorResponse(401, 'unauthenticated', 'Sign in first.') })
    const router = freshRouter()
    await router.push('/projects/42/suites')
    expect(router.currentRoute.value.name).toBe('sign-in')
    expect(router.currentRoute.value.query.redirect).toBe('/projects/42/suites')
  })

  it('sends a signed-in user away from sign-in to the projects', async () => {
    stubFetch({ 'GET /api/v1/auth/me': () => jsonResponse(200, sessionFixture()) })
    const router = freshRouter()
    await router.push('/sign-in')
    expect(router.currentRoute.value.name).toBe('projects')
  })

  it('opens a project on its Library tab', async () => {
    stubFetch({ 'GET /api/v1/auth/me': () => jsonResponse(200, sessionFixture()) })
    const router = freshRouter()
    await router.push('/projects/42')
    expect(router.currentRoute.value.name).toBe('project-library')
    expect(router.currentRoute.value.params.id).toBe('42')
  })

  it('shows the not-found view for an unknown address, signed in or not', async () => {
    stubFetch({ 'GET /api/v1/auth/me': () => errorResponse(401, 'unauthenticated', 'Sign in first.') })
    const router = freshRouter()
    await router.push('/no/such/page')
    expect(router.currentRoute.value.name).toBe('not-found')
  })

  it('follows only redirects inside this site', () => {
    expect(safeRedirect('/projects/42/library')).toBe('/projects/42/library')
    expect(safeRedirect('//elsewhere.test/phish')).toBeNull()
    expect(safeRedirect('https://elsewhere.test/')).toBeNull()
    expect(safeRedirect('/\\elsewhere.test')).toBeNull()
    expect(safeRedirect(['/projects'])).toBeNull()
  })
})
