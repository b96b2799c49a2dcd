import { describe, expect, it } from 'vitest'
import ForgotPasswordView from '../../src/views/ForgotPasswordView.vue'
import ResetPasswordView from '../../src/views/ResetPasswordView.vue'
import { errorResponse, isolateClientState, jsonResponse, noContent, stubFetch } from './fetch-stub'
import { mountAt, settle } from './mount-app'

const signedOut = () => errorResponse(401, 'unauthenticated', 'Sign in first.')
/** The server's one answer, whatever the address (invented wording for the stub). */
const NEUTRAL = 'If an account uses that address, a link is on its way.'

isolateClientState()

describe('ForgotPasswordView', () => {
  it('sends the trimmed address and shows the server’s neutral answer', async () => {
    const { calls } = stubFetch({
      'GET /api/v1/auth/me': signedOut,
      'POST /api/v1/auth/password-reset': () => jsonResponse(202, { message: NEUTRAL }),
    })
    const { wrapper } = await mountAt(ForgotPasswordView, '/forgot-password')
    await wrapper.get('[data-testid="forgot-email"] input').setValue('  ines.ortega@harbour.test ')
    await wrapper.get('form').trigger('submit')
    await settle()
    const sent = calls.filter((c) => c.pathname === '/api/v1/auth/password-reset')
    expect(sent).toHaveLength(1)
    expect(sent[0].body).toEqual({ email: 'ines.ortega@harbour.test' })
    expect(wrapper.get('[data-testid="forgot-answer"]').text()).toContain(NEUTRAL)
  })

  it('does not send an invalid address', async () => {
    const { calls } = stubFetch({ 'GET /api/v1/auth/me': signedOut })
    const { wrapper } = await mountAt(ForgotPasswordView, '/forgot-password')
    await wrapper.get('[data-testid="forgot-email"] input').setValue('not-an-address')
    await wrapper.get('form').trigger('submit')
    await settle()
    expect(calls.some((c) => c.pathname === '/api/v1/auth/password-reset')).toBe(false)
    expect(wrapper.text()).toContain('Enter a valid e-mail address.')
  })
})

describe('ResetPasswordView', () => {
  async function fill(wrapper: Awaited<ReturnType<typeof mountAt>>['wrapper'], password: string, repeat: string) {
    await wrapper.get('[data-testid="reset-password"] input').setValue(password)
    await wrapper.get('[data-testid="reset-repeat"] input').setValue(repeat)
    await wrapper.get('form').trigger('submit')
    await settle()
  }

  it('refuses two different passwords before asking the server', async () => {
    const { calls } = stubFetch({ 'GET /api/v1/auth/me': signedOut })
    const { wrapper } = await mountAt(ResetPasswordView, '/reset-password?token=abc123')
    await fill(wrapper, 'quay-crane-lantern-41', 'quay-crane-lantern-42')
    expect(calls.some((c) => c.pathname === '/api/v1/auth/password-reset/confirm')).toBe(false)
    expect(wrapper.text()).toContain('The two new passwords differ.')
  })

  it('sends the token of the link with the new password, then offers sign-in', async () => {
    const { calls } = stubFetch({
      'GET /api/v1/auth/me': signedOut,
      'POST /api/v1/auth/password-reset/confirm': () => noContent(),
    })
    const { wrapper } = await mountAt(ResetPasswordView, '/reset-password?token=abc123')
    await fill(wrapper, 'quay-crane-lantern-41', 'quay-crane-lantern-41')
    const sent = calls.filter((c) => c.pathname === '/api/v1/auth/password-reset/confirm')
    expect(sent.map((c) => c.body)).toEqual([{ token: 'abc123', password: 'quay-crane-lantern-41' }])
    expect(wrapper.find('[data-testid="reset-done"]').exists()).toBe(true)
    expect(wrapper.find('[data-testid="reset-sign-in"]').exists()).toBe(true)
  })

  it('shows the server’s sentence for a used or expired link', async () => {
    stubFetch({
      'GET /api/v1/auth/me': signedOut,
      'POST /api/v1/auth/password-reset/confirm': () => errorResponse(400, 'invalid_token', 'This reset link is not valid.'),
    })
    const { wrapper } = await mountAt(ResetPasswordView, '/reset-password?token=abc123')
    await fill(wrapper, 'quay-crane-lantern-41', 'quay-crane-lantern-41')
    expect(wrapper.get('[data-testid="reset-error"]').text()).toContain('This reset link is not valid.')
    expect(wrapper.find('[data-testid="reset-done"]').exists()).toBe(false)
  })

  it('says so when the link carries no token', async () => {
    stubFetch({ 'GET /api/v1/auth/me': signedOut })
    const { wrapper } = await mountAt(ResetPasswordView, '/reset-password')
    expect(wrapper.find('[data-testid="reset-no-token"]').exists()).toBe(true)
    expect(wrapper.find('form').exists()).toBe(false)
  })
})
