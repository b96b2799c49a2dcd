import { describe, expect, it } from 'vitest'
import AccountView from '../../src/views/AccountView.vue'
import { errorResponse, isolateClientState, jsonResponse, noContent, sessionFixture, stubFetch } from './fetch-stub'
import { mountAt, settle } from './mount-app'

isolateClientState()

const me = () => jsonResponse(200, sessionFixture())

describe('AccountView', () => {
  it('says how many other sessions were signed out', async () => {
    stubFetch({ 'GET /api/v1/auth/me': me, 'POST /api/v1/auth/sessions/revoke-others': () => jsonResponse(200, { revoked: 2 }) })
    const { wrapper } = await mountAt(AccountView, '/account')
    await wrapper.get('[data-testid="account-revoke-others"]').trigger('click')
    await settle()
    expect(wrapper.get('[data-testid="account-sessions-notice"]').text()).toBe('Signed out 2 other sessions.')
  })

  it('checks the repeat before sending, then sends current and new password and clears the form', async () => {
    const { calls } = stubFetch({ 'GET /api/v1/auth/me': me, 'POST /api/v1/auth/password': () => noContent() })
    const { wrapper } = await mountAt(AccountView, '/account')
    const fill = async (repeat: string) => {
      await wrapper.get('[data-testid="account-current-password"] input').setValue('old-harbour-pass')
      await wrapper.get('[data-testid="account-new-password"] input').setValue('quay-crane-lantern-41')
      await wrapper.get('[data-testid="account-new-repeat"] input').setValue(repeat)
      await wrapper.findAll('form')[1].trigger('submit')
      await settle()
    }
    await fill('quay-crane-lantern-4')
    expect(calls.some((c) => c.pathname === '/api/v1/auth/password')).toBe(false)
    expect(wrapper.text()).toContain('The two new passwords differ.')
    await fill('quay-crane-lantern-41')
    const sent = calls.filter((c) => c.pathname === '/api/v1/auth/password')
    expect(sent.map((c) => c.body)).toEqual([{ currentPassword: 'old-harbour-pass', newPassword: 'quay-crane-lantern-41' }])
    expect(wrapper.get('[data-testid="account-password-notice"]').text()).toContain('Password changed.')
    expect((wrapper.get('[data-testid="account-current-password"] input').element as HTMLInputElement).value).toBe('')
  })

  it('shows the server’s sentence for a wrong current password', async () => {
    stubFetch({
      'GET /api/v1/auth/me': me,
      'POST /api/v1/auth/password': () => errorResponse(400, 'wrong_password', 'That is not your current password.'),
    })
    const { wrapper } = await mountAt(AccountView, '/account')
    await wrapper.get('[data-testid="account-current-password"] input').setValue('a-wrong-guess')
    await wrapper.get('[data-testid="account-new-password"] input').setValue('quay-crane-lantern-41')
    await wrapper.get('[data-testid="account-new-repeat"] input').setValue('quay-crane-lantern-41')
    await wrapper.findAll('form')[1].trigger('submit')
    await settle()
    expect(wrapper.get('[data-testid="account-password-error"]').text()).toContain('That is not your current password.')
  })

  it('saves the display name and shows it as the session now has it', async () => {
    const { calls } = stubFetch({
      'GET /api/v1/auth/me': me,
      'PATCH /api/v1/auth/me': () => jsonResponse(200, sessionFixture({ user: { ...sessionFixture().user, displayName: 'Ines O. Ortega' } })),
    })
    const { wrapper } = await mountAt(AccountView, '/account')
    await wrapper.get('[data-testid="account-display-name"] input').setValue('Ines O. Ortega')
    await wrapper.findAll('form')[0].trigger('submit')
    await settle()
    expect(calls.filter((c) => c.method === 'PATCH').map((c) => c.body)).toEqual([{ displayName: 'Ines O. Ortega' }])
    expect(wrapper.find('[data-testid="account-name-notice"]').exists()).toBe(true)
    expect((wrapper.get('[data-testid="account-display-name"] input').element as HTMLInputElement).value).toBe('Ines O. Ortega')
  })
})
