import { describe, expect, it } from 'vitest'
import SignInView from '../../src/views/SignInView.vue'
import { errorResponse, isolateClientState, jsonResponse, sessionFixture, stubFetch } from './fetch-stub'
import { mountAt, settle } from './mount-app'

const signedOut = () => errorResponse(401, 'unauthenticated', 'Sign in first.')

async function fillAndSubmit(wrapper: Awaited<ReturnType<typeof mountAt>>['wrapper'], email: string, password: string) {
  await wrapper.get('[data-testid="sign-in-email"] input').setValue(email)
  await wrapper.get('[data-testid="sign-in-password"] input').setValue(password)
  await wrapper.get('form').trigger('submit')
  await settle()
}

isolateClientState()

describe('SignInView', () => {
  it('shows the server sentence when the credentials are wrong', async () => {
    const { calls } = stubFetch({
      'GET /api/v1/auth/me': signedOut,
      'POST /api/v1/auth/login': () =>
        errorResponse(401, 'invalid_credentials', 'The e-mail address or the password is wrong.'),
    })
    const { wrapper, router } = await mountAt(SignInView, '/sign-in')
    expect(wrapper.find('[data-testid="sign-in-error"]').exists()).toBe(false)

    await fillAndSubmit(wrapper, 'ines.ortega@harbour.test', 'wrong-guess')

    const error = wrapper.get('[data-testid="sign-in-error"]')
    expect(error.text()).toContain('The e-mail address or the password is wrong.')
    expect(error.attributes('role')).toBe('alert')
    expect(calls.filter((call) => call.pathname === '/api/v1/auth/login')).toHaveLength(1)
    expect(router.currentRoute.value.name).toBe('sign-in')
  })

  it('says when to try again after too many attempts', async () => {
    stubFetch({
      'GET /api/v1/auth/me': signedOut,
      'POST /api/v1/auth/login': () =>
        errorResponse(429, 'rate_limited', 'Too many sign-in attempts.', { 'Retry-After': '600' }),
    })
    const { wrapper } = await mountAt(SignInView, '/sign-in')
    await fillAndSubmit(wrapper, 'ines.ortega@harbour.test', 'pier-lantern-93')
    expect(wrapper.get('[data-testid="sign-in-error"]').text()).toContain(
      'Too many sign-in attempts. You can try again in about 10 minutes.',
    )
  })

  it('does not send a form with an invalid e-mail address', async () => {
    const { calls } = stubFetch({ 'GET /api/v1/auth/me': signedOut })
    const { wrapper } = await mountAt(SignInView, '/sign-in')
    await fillAndSubmit(wrapper, 'not-an-address', 'pier-lantern-93')
    expect(calls.some((call) => call.pathname === '/api/v1/auth/login')).toBe(false)
    expect(wrapper.text()).toContain('Enter a valid e-mail address.')
  })

  it('goes back to the page that asked for sign-in', async () => {
    stubFetch({
      'GET /api/v1/auth/me': signedOut,
      'POST /api/v1/auth/login': () => jsonResponse(200, sessionFixture()),
    })
    const { wrapper, router } = await mountAt(SignInView, '/sign-in?redirect=/projects/42/canvas')
    // The target's view is loaded lazily, so wait for the navigation itself rather than for ticks.
    const arrived = new Promise<string>((resolve) => router.afterEach((to) => resolve(to.fullPath)))
    await fillAndSubmit(wrapper, 'ines.ortega@harbour.test', 'pier-lantern-93')
    expect(await arrived).toBe('/projects/42/canvas')
    expect(router.currentRoute.value.name).toBe('project-canvas')
  })

  it('shows nothing of the demo accounts or their password', async () => {
    stubFetch({ 'GET /api/v1/auth/me': signedOut })
    const { wrapper } = await mountAt(SignInView, '/sign-in')
    const html = wrapper.html()
    expect(html).not.toContain('rootcast-demo')
    expect(html).not.toContain('example.com')
  })
})
