import { afterEach, describe, expect, it } from 'vitest'
import type { InvitationLookup, Member } from '../../shared/api'
import TeamMembersPanel from '../../src/components/TeamMembersPanel.vue'
import AcceptInvitationView from '../../src/views/AcceptInvitationView.vue'
import { errorResponse, isolateClientState, jsonResponse, noContent, sessionFixture, stubFetch, type StubHandler } from './fetch-stub'
import { byTestId, click, type } from './dom-actions'
import { mountInAppAt, settle } from './mount-app'

// Invented people; the session's user (id 7) owns team 3 here.
const ownerSession = sessionFixture({ teams: [{ id: 3, name: 'Harbour Type Workshop', role: 'owner' }, { id: 11, name: 'Signage Lab', role: 'viewer' }] })
const me: Member = { userId: 7, displayName: 'Ines Ortega', email: 'ines.ortega@harbour.test', role: 'owner', joinedAt: '2026-01-05T09:00:00.000Z', lastActiveAt: '2026-11-20T10:00:00.000Z' }
const tobias: Member = { userId: 9, displayName: 'Tobias Slipway', email: 'tobias@harbour.test', role: 'editor', joinedAt: '2026-02-01T09:00:00.000Z', lastActiveAt: null }
const invitation: InvitationLookup = {
  teamId: 3, teamName: 'Harbour Type Workshop', email: 'nell.capstan@harbour.test', role: 'viewer', invitedBy: 'Ines Ortega', accountExists: false, expiresAt: '2099-01-08T09:00:00.000Z',
}
const TOKEN = 'Q7xk2fHx3mQ9vTz0Lk7sWcYb2NfR5pGd8JaUeK1oVi4'

isolateClientState()
afterEach(() => {
  document.body.innerHTML = ''
})

describe('TeamMembersPanel', () => {
  function stubMembers(session = ownerSession, extra: Record<string, StubHandler> = {}) {
    return stubFetch({
      'GET /api/v1/auth/me': () => jsonResponse(200, session),
      'GET /api/v1/teams/3/members': () => jsonResponse(200, { items: [me, tobias] }),
      ...extra,
    })
  }

  it('marks the signed-in person, shows last activity, and gives owners role selects and remove buttons', async () => {
    stubMembers()
    const { wrapper } = await mountInAppAt(TeamMembersPanel, '/team')
    const table = wrapper.get('[data-testid="members-table"]')
    expect(table.text()).toContain('Tobias Slipway')
    expect(table.text()).toContain('Never')
    expect(wrapper.findAll('[data-testid="member-you"]')).toHaveLength(1)
    expect(wrapper.get(`[data-testid="member-name-${me.userId}"]`).element.parentElement?.textContent).toContain('you')
    expect(wrapper.find(`[data-testid="member-role-${tobias.userId}"] input`).exists()).toBe(true)
    expect(wrapper.find(`[data-testid="member-remove-${tobias.userId}"]`).exists()).toBe(true)
    // One's own row offers leaving, not removing.
    expect(wrapper.find(`[data-testid="member-remove-${me.userId}"]`).exists()).toBe(false)
    expect(wrapper.find('[data-testid="member-leave"]').exists()).toBe(true)
  })

  it('shows roles as text to a non-owner, with no remove buttons', async () => {
    stubMembers(sessionFixture())
    const { wrapper } = await mountInAppAt(TeamMembersPanel, '/team')
    expect(wrapper.get(`[data-testid="member-role-${tobias.userId}"]`).text()).toBe('editor')
    expect(wrapper.find(`[data-testid="member-role-${tobias.userId}"] input`).exists()).toBe(false)
    expect(wrapper.find(`[data-testid="member-remove-${tobias.userId}"]`).exists()).toBe(false)
  })

  it('removes a member after the confirm, and shows the server’s last-owner refusal in the dialog', async () => {
    let members = [me, tobias]
    const { calls } = stubMembers(ownerSession, {
      'GET /api/v1/teams/3/members': () => jsonResponse(200, { items: members }),
      'DELETE /api/v1/teams/3/members/9': () => {
        members = [me]
        return noContent()
      },
      'DELETE /api/v1/teams/3/members/7': () => errorResponse(409, 'last_owner', 'A team always keeps at least one owner: make someone else an owner first.'),
    })
    const { wrapper } = await mountInAppAt(TeamMembersPanel, '/team')
    await click(`member-remove-${tobias.userId}`)
    expect(document.body.textContent).toContain('Tobias Slipway loses access to Harbour Type Workshop’s projects')
    await click('confirm-dialog-confirm')
    const deletion = calls.find((c) => c.method === 'DELETE')
    expect(deletion?.pathname).toBe('/api/v1/teams/3/members/9')
    expect(deletion?.headers['x-csrf-token']).toBe(ownerSession.csrfToken)
    expect(wrapper.get('[data-testid="members-table"]').text()).not.toContain('Tobias Slipway')

    await click('member-leave')
    await click('confirm-dialog-confirm')
    expect(byTestId('confirm-dialog-error')?.textContent).toContain('at least one owner')
  })
})

describe('AcceptInvitationView', () => {
  it('creates the account with name and password, then opens the team’s projects', async () => {
    let session: typeof ownerSession | null = null
    const { calls } = stubFetch({
      'GET /api/v1/auth/me': () => (session ? jsonResponse(200, session) : errorResponse(401, 'unauthenticated', 'Sign in first.')),
      'GET /api/v1/invitations/lookup': () => jsonResponse(200, invitation),
      'POST /api/v1/invitations/accept': () => {
        session = sessionFixture({ user: { id: 40, email: invitation.email, displayName: 'Nell Capstan' }, teams: [{ id: 3, name: 'Harbour Type Workshop', role: 'viewer' }], csrfToken: 'csrf-new' })
        return jsonResponse(200, session)
      },
      'GET /api/v1/teams/3/projects': () => jsonResponse(200, { items: [], total: 0, page: 1, pageSize: 10 }),
    })
    const { router } = await mountInAppAt(AcceptInvitationView, `/invitations/accept?token=${TOKEN}`)
    expect(calls.find((c) => c.pathname === '/api/v1/invitations/lookup')?.query.get('token')).toBe(TOKEN)
    expect(byTestId('accept-team')?.textContent).toBe('Join Harbour Type Workshop')
    expect(byTestId('accept-role')?.textContent).toBe('viewer')
    await type('accept-display-name', 'Nell Capstan')
    await type('accept-password', 'too-short')
    expect(byTestId('accept-password')?.textContent).toContain('at least 10 characters')
    expect(byTestId('accept-create')?.hasAttribute('disabled')).toBe(true)
    await type('accept-password', 'bollard-lamp-42')
    // The projects route's view loads lazily: wait for the navigation itself.
    const navigated = new Promise<void>((resolve) => {
      const stop = router.afterEach(() => {
        stop()
        resolve()
      })
    })
    await click('accept-create')
    expect(calls.find((c) => c.method === 'POST')?.body).toEqual({ token: TOKEN, displayName: 'Nell Capstan', password: 'bollard-lamp-42' })
    await navigated
    expect(router.currentRoute.value.name).toBe('projects')
  })

  it('asks an existing account to sign in first, and says plainly when a link does not work', async () => {
    stubFetch({
      'GET /api/v1/auth/me': () => errorResponse(401, 'unauthenticated', 'Sign in first.'),
      'GET /api/v1/invitations/lookup': (call) =>
        call.query.get('token') === TOKEN
          ? jsonResponse(200, { ...invitation, accountExists: true })
          : errorResponse(404, 'invalid_invitation', 'This invitation link does not work: it is unknown, already used, revoked or expired.'),
    })
    const { router } = await mountInAppAt(AcceptInvitationView, `/invitations/accept?token=${TOKEN}`)
    expect(byTestId('accept-sign-in-needed')?.textContent).toContain('nell.capstan@harbour.test already has a Rootcast account')
    const target = router.resolve(byTestId('accept-sign-in')?.getAttribute('href') ?? '')
    expect(target.name).toBe('sign-in')
    expect(target.query.redirect).toBe(`/invitations/accept?token=${TOKEN}`)
    expect(byTestId('accept-display-name')).toBeNull()

    document.body.innerHTML = ''
    await mountInAppAt(AcceptInvitationView, '/invitations/accept?token=used-one')
    expect(byTestId('accept-invalid')?.textContent).toContain('already used, revoked or expired')
  })
})
