import { createPinia, setActivePinia } from 'pinia'
import { describe, expect, it } from 'vitest'
import type { Role } from '../../shared/api'
import { roleCanEdit, roleIsOwner, TEAM_STORAGE_KEY, useAuthStore } from '../../src/stores/auth'
import { errorResponse, isolateClientState, jsonResponse, noContent, sessionFixture, stubFetch } from './fetch-stub'

function freshStore() {
  setActivePinia(createPinia())
  return useAuthStore()
}

isolateClientState()

describe('useAuthStore sign-in flow', () => {
  it('signs in, takes user, teams and token from SessionInfo, and signs out with that token', async () => {
    const session = sessionFixture()
    const { calls } = stubFetch({
      'POST /api/v1/auth/login': () => jsonResponse(200, session),
      'POST /api/v1/auth/logout': () => noContent(),
    })
    const auth = freshStore()

    await expect(auth.signIn('ines.ortega@harbour.test', 'pier-lantern-93')).resolves.toBe(true)
    expect(calls[0].body).toEqual({ email: 'ines.ortega@harbour.test', password: 'pier-lantern-93' })
    expect(calls[0].headers['x-csrf-token']).toBeUndefined()
    expect(auth.isSignedIn).toBe(true)
    expect(auth.user?.displayName).toBe('Ines Ortega')
    expect(auth.csrfToken).toBe('csrf-7f3a9c')
    expect(auth.currentTeam?.name).toBe('Harbour Type Workshop')
    expect(auth.error).toBeNull()

    await auth.signOut()
    expect(calls[1].method).toBe('POST')
    expect(calls[1].pathname).toBe('/api/v1/auth/logout')
    expect(calls[1].headers['x-csrf-token']).toBe('csrf-7f3a9c')
    expect(auth.isSignedIn).toBe(false)
    expect(auth.csrfToken).toBeNull()
    expect(auth.teams).toEqual([])
  })

  it('keeps the user signed out with the server sentence on wrong credentials', async () => {
    stubFetch({
      'POST /api/v1/auth/login': () =>
        errorResponse(401, 'invalid_credentials', 'The e-mail address or the password is wrong.'),
    })
    const auth = freshStore()
    await expect(auth.signIn('ines.ortega@harbour.test', 'wrong-guess')).resolves.toBe(false)
    expect(auth.isSignedIn).toBe(false)
    expect(auth.error?.code).toBe('invalid_credentials')
    expect(auth.error?.message).toBe('The e-mail address or the password is wrong.')
    expect(auth.isLoading).toBe(false)
  })

  it('reports rate limiting with its status and code', async () => {
    stubFetch({
      'POST /api/v1/auth/login': () => errorResponse(429, 'rate_limited', 'Too many sign-in attempts.'),
    })
    const auth = freshStore()
    await auth.signIn('ines.ortega@harbour.test', 'pier-lantern-93')
    expect(auth.error?.status).toBe(429)
    expect(auth.error?.code).toBe('rate_limited')
  })

  it('takes a 401 from /auth/me as signed out, without an error', async () => {
    stubFetch({ 'GET /api/v1/auth/me': () => errorResponse(401, 'unauthenticated', 'Sign in first.') })
    const auth = freshStore()
    await auth.loadSession()
    expect(auth.hasCheckedSession).toBe(true)
    expect(auth.isSignedIn).toBe(false)
    expect(auth.error).toBeNull()
  })

  it('keeps a network failure of the session check as a readable error', async () => {
    stubFetch({ 'GET /api/v1/auth/me': () => new TypeError('Failed to fetch') })
    const auth = freshStore()
    await auth.loadSession()
    expect(auth.hasCheckedSession).toBe(true)
    expect(auth.isSignedIn).toBe(false)
    expect(auth.error?.code).toBe('network')
  })
})

describe('useAuthStore current team', () => {
  it('remembers the chosen team in localStorage and restores it in a new page', async () => {
    stubFetch({ 'GET /api/v1/auth/me': () => jsonResponse(200, sessionFixture()) })
    const first = freshStore()
    await first.loadSession()
    first.selectTeam(11)
    expect(first.currentTeamId).toBe(11)
    expect(localStorage.getItem(TEAM_STORAGE_KEY)).toBe('11')

    const second = freshStore()
    await second.loadSession()
    expect(second.currentTeam?.name).toBe('Signage Lab')
  })

  it('ignores a team the user is not in and falls back from a stale stored choice', async () => {
    localStorage.setItem(TEAM_STORAGE_KEY, '999')
    stubFetch({ 'GET /api/v1/auth/me': () => jsonResponse(200, sessionFixture()) })
    const auth = freshStore()
    await auth.loadSession()
    expect(auth.currentTeamId).toBe(3)
    auth.selectTeam(12)
    expect(auth.currentTeamId).toBe(3)
    expect(localStorage.getItem(TEAM_STORAGE_KEY)).toBe('999')
  })
})

describe('role helpers', () => {
  // Roles as issue 2 defines them: viewers read, editors also create and change, owners also delete.
  const matrix: [Role | null, boolean, boolean][] = [
    ['owner', true, true],
    ['editor', true, false],
    ['viewer', false, false],
    [null, false, false],
  ]

  it.each(matrix)('role %s: can edit %s, is owner %s', (role, canEdit, isOwner) => {
    expect(roleCanEdit(role)).toBe(canEdit)
    expect(roleIsOwner(role)).toBe(isOwner)
  })

  it('answers for the current team and for each team by id', async () => {
    const session = sessionFixture({
      teams: [
        { id: 3, name: 'Harbour Type Workshop', role: 'viewer' },
        { id: 11, name: 'Signage Lab', role: 'owner' },
        { id: 19, name: 'Plotter Room', role: 'editor' },
      ],
    })
    stubFetch({ 'GET /api/v1/auth/me': () => jsonResponse(200, session) })
    const auth = freshStore()
    await auth.loadSession()

    expect([auth.role, auth.canEdit, auth.isOwner]).toEqual(['viewer', false, false])
    auth.selectTeam(11)
    expect([auth.role, auth.canEdit, auth.isOwner]).toEqual(['owner', true, true])
    auth.selectTeam(19)
    expect([auth.role, auth.canEdit, auth.isOwner]).toEqual(['editor', true, false])

    expect(auth.canEditIn(3)).toBe(false)
    expect(auth.isOwnerOf(11)).toBe(true)
    expect(auth.isOwnerOf(19)).toBe(false)
    expect(auth.roleIn(404)).toBeNull()
    expect(auth.canEditIn(404)).toBe(false)
  })
})
