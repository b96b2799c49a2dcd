import { afterEach, describe, expect, it, onTestFinished, vi } from 'vitest'
import type { CreatedToken, Token } from '../../shared/api'
import TokenPanel from '../../src/components/TokenPanel.vue'
import TeamView from '../../src/views/TeamView.vue'
import { errorResponse, isolateClientState, jsonResponse, noContent, sessionFixture, stubFetch, type StubHandler } from './fetch-stub'
import { mountInAppAt, settle } from './mount-app'

// Invented tokens; the times are fixed far from the test machine's clock on purpose:
// the first expires in 2099 (active), the second is revoked, the third expired in 2020.
const pipeline: Token = {
  id: 31,
  name: 'Nightly glyph checks',
  prefix: 'rcp_Q7xk2f',
  createdAt: '2026-11-02T09:15:00.000Z',
  expiresAt: '2099-01-31T09:15:00.000Z',
  lastUsedAt: '2026-11-20T03:00:00.000Z',
  revokedAt: null,
}
const oldLaptop: Token = {
  id: 12,
  name: 'Old laptop script',
  prefix: 'rcp_m0Zr8a',
  createdAt: '2026-03-01T10:00:00.000Z',
  expiresAt: '2099-03-01T10:00:00.000Z',
  lastUsedAt: null,
  revokedAt: '2026-06-01T10:00:00.000Z',
}
const lapsed: Token = { ...oldLaptop, id: 5, name: 'Spring proofing', prefix: 'rcp_Lp5aVd', revokedAt: null, expiresAt: '2020-05-01T00:00:00.000Z' }
// Not a real secret: 'rcp_' and 43 base64url characters, as the server makes them.
const SECRET = 'rcp_Hx3mQ9vTz0Lk7sWcYb2NfR5pGd8JaUeK1oVi4nMqXyE'
const made: CreatedToken = {
  id: 40,
  name: 'Release pipeline',
  prefix: SECRET.slice(0, 10),
  createdAt: '2026-11-21T08:00:00.000Z',
  expiresAt: '2027-01-05T08:00:00.000Z',
  lastUsedAt: null,
  revokedAt: null,
  secret: SECRET,
}

function stubTokens(list: () => Token[], extra: Record<string, StubHandler> = {}) {
  return stubFetch({
    'GET /api/v1/auth/me': () => jsonResponse(200, sessionFixture()),
    'GET /api/v1/tokens': () => jsonResponse(200, { items: list() }),
    ...extra,
  })
}

const byTestId = (id: string) => document.querySelector<HTMLElement>(`[data-testid="${id}"]`)
async function click(id: string): Promise<void> {
  const el = byTestId(id)
  expect(el, `no element with data-testid ${id}`).not.toBeNull()
  el!.click()
  await settle()
}
async function type(id: string, value: string): Promise<void> {
  const input = document.querySelector<HTMLInputElement>(`[data-testid="${id}"] input`)
  expect(input, `no input in ${id}`).not.toBeNull()
  input!.value = value
  input!.dispatchEvent(new Event('input'))
  await settle()
}

isolateClientState()
afterEach(() => {
  document.body.innerHTML = ''
})

describe('TokenPanel', () => {
  it('lists tokens with prefix, times and a status in words; only active ones can be revoked', async () => {
    stubTokens(() => [pipeline, oldLaptop, lapsed])
    const { wrapper } = await mountInAppAt(TokenPanel, '/team')
    const table = wrapper.get('[data-testid="tokens-table"]')
    expect(table.text()).toContain('Nightly glyph checks')
    expect(table.text()).toContain('rcp_Q7xk2f…')
    expect(table.text()).toContain('Never')
    expect(wrapper.get(`[data-testid="token-status-${pipeline.id}"]`).text()).toBe('Active')
    expect(wrapper.get(`[data-testid="token-status-${oldLaptop.id}"]`).text()).toBe('Revoked')
    expect(wrapper.get(`[data-testid="token-status-${lapsed.id}"]`).text()).toBe('Expired')
    expect(wrapper.find(`[data-testid="revoke-token-${pipeline.id}"]`).exists()).toBe(true)
    expect(wrapper.find(`[data-testid="revoke-token-${oldLaptop.id}"]`).exists()).toBe(false)
    expect(wrapper.find(`[data-testid="revoke-token-${lapsed.id}"]`).exists()).toBe(false)
  })

  it('shows the new secret once, with a copy button and a warning, and drops it on closing', async () => {
    let list = [pipeline]
    const writeText = vi.fn(() => Promise.resolve())
    const before = Object.getOwnPropertyDescriptor(navigator, 'clipboard')
    Object.defineProperty(navigator, 'clipboard', { value: { writeText }, configurable: true })
    onTestFinished(() => {
      if (before) Object.defineProperty(navigator, 'clipboard', before)
      else delete (navigator as { clipboard?: unknown }).clipboard
    })
    const { calls } = stubTokens(() => list, {
      'POST /api/v1/tokens': () => {
        const { secret: _, ...listed } = made
        list = [listed, pipeline]
        return jsonResponse(201, made)
      },
    })
    const { wrapper } = await mountInAppAt(TokenPanel, '/team')
    await click('new-token-button')
    await type('token-name-input', '  Release pipeline ')
    await type('token-days-input', '45')
    await click('token-create-confirm')

    const post = calls.find((c) => c.method === 'POST')
    expect(post?.body).toEqual({ name: 'Release pipeline', expiresInDays: 45 })
    expect(post?.headers['x-csrf-token']).toBe(sessionFixture().csrfToken)
    const secretInput = document.querySelector<HTMLInputElement>('[data-testid="token-secret"] input')
    expect(secretInput?.value).toBe(SECRET)
    expect(byTestId('token-secret-warning')?.textContent).toContain('will not be shown again')
    // The list shows the new token by its prefix, never its secret.
    expect(wrapper.get('[data-testid="tokens-table"]').text()).toContain(`${SECRET.slice(0, 10)}…`)
    expect(wrapper.get('[data-testid="tokens-table"]').text()).not.toContain(SECRET)

    await click('token-copy')
    expect(writeText).toHaveBeenCalledWith(SECRET)

    await click('token-secret-done')
    expect(byTestId('token-secret')).toBeNull()
    expect(document.body.innerHTML).not.toContain(SECRET)
    // Opening the dialog again offers a new token, not the old secret.
    await click('new-token-button')
    expect(byTestId('token-secret')).toBeNull()
    expect(byTestId('token-name-input')).not.toBeNull()
  })

  it('refuses bad input before sending and shows the server’s refusal in the dialog', async () => {
    const { calls } = stubTokens(() => [], {
      'POST /api/v1/tokens': () => errorResponse(403, 'session_required', 'Tokens are created and revoked from a signed-in browser session, not with a token.'),
    })
    await mountInAppAt(TokenPanel, '/team')
    await click('new-token-button')
    await type('token-name-input', 'Proof bot')
    await type('token-days-input', '400')
    expect(byTestId('token-days-input')?.textContent).toContain('at most 365 days')
    expect(byTestId('token-create-confirm')?.hasAttribute('disabled')).toBe(true)
    await type('token-days-input', '7')
    await click('token-create-confirm')
    expect(calls.filter((c) => c.method === 'POST')).toHaveLength(1)
    expect(byTestId('token-create-error')?.textContent).toContain('signed-in browser session')
    expect(byTestId('token-secret')).toBeNull()
  })

  it('revokes after confirming: DELETE with the CSRF token, then the list shows it revoked', async () => {
    let list = [pipeline]
    const { calls } = stubTokens(() => list, {
      [`DELETE /api/v1/tokens/${pipeline.id}`]: () => {
        list = [{ ...pipeline, revokedAt: '2026-11-21T09:00:00.000Z' }]
        return noContent()
      },
    })
    const { wrapper } = await mountInAppAt(TokenPanel, '/team')
    await click(`revoke-token-${pipeline.id}`)
    expect(calls.some((c) => c.method === 'DELETE')).toBe(false)
    expect(document.body.textContent).toContain('“Nightly glyph checks” stops working at once')
    await click('confirm-dialog-confirm')
    const del = calls.filter((c) => c.method === 'DELETE')
    expect(del.map((c) => c.pathname)).toEqual([`/api/v1/tokens/${pipeline.id}`])
    expect(del[0].headers['x-csrf-token']).toBe(sessionFixture().csrfToken)
    expect(wrapper.get(`[data-testid="token-status-${pipeline.id}"]`).text()).toBe('Revoked')
    expect(wrapper.find(`[data-testid="revoke-token-${pipeline.id}"]`).exists()).toBe(false)
  })
})

describe('TeamView', () => {
  it('has Members, Invitations and Tokens tabs; ?tab=tokens opens the token list', async () => {
    const { calls } = stubTokens(() => [pipeline])
    const { wrapper, router } = await mountInAppAt(TeamView, '/team?tab=tokens')
    expect(['members', 'invitations', 'tokens'].map((t) => wrapper.find(`[data-testid="team-tab-${t}"]`).exists())).toEqual([true, true, true])
    expect(wrapper.get('[data-testid="tokens-table"]').text()).toContain('Nightly glyph checks')
    expect(calls.filter((c) => c.pathname === '/api/v1/tokens')).toHaveLength(1)
    // The tab is kept in the address; the navigation resolves the route's lazy view, so wait for it.
    const navigated = new Promise<void>((resolve) => {
      const stop = router.afterEach(() => {
        stop()
        resolve()
      })
    })
    await click('team-tab-invitations')
    await navigated
    await settle()
    expect(router.currentRoute.value.query.tab).toBe('invitations')
    // The session's user is an editor of the current team: invitations are for owners.
    expect(wrapper.text()).toContain('Only owners of Harbour Type Workshop invite people')
  })
})
