import { afterEach, describe, expect, it } from 'vitest'
import type { DevMailMessage } from '../../shared/api'
import { splitTextLinks } from '../../src/composables/text-links'
import DevMailView from '../../src/views/DevMailView.vue'
import { errorResponse, isolateClientState, jsonResponse, sessionFixture, stubFetch } from './fetch-stub'
import { mountInAppAt, settle } from './mount-app'

const RUN_LINK = 'http://127.0.0.1:5170/projects/42/suites/7/runs/1913?check=bowl&revision=12'
// Invented messages, newest first as the server lists them.
const failed: DevMailMessage = {
  id: '2',
  from: '"Rootcast" <rootcast@localhost>',
  to: ['ines.ortega@harbour.test'],
  subject: 'Suite “Glyph bowls” failed',
  text: `2 of 9 checks failed <b>on revision 12</b>.\nOpen the run: ${RUN_LINK}.\n`,
  html: null,
  receivedAt: '2026-11-21T08:00:00.000Z',
}
const earlier: DevMailMessage = { ...failed, id: '1', subject: 'Earlier notice', text: 'Nothing to open.', receivedAt: '2026-11-20T08:00:00.000Z' }

isolateClientState()
afterEach(() => {
  document.body.innerHTML = ''
})

describe('splitTextLinks', () => {
  it('cuts http(s) addresses out of text and leaves sentence punctuation outside them', () => {
    expect(splitTextLinks(`See ${RUN_LINK}. Or (https://example.org/a_b)`)).toEqual([
      { kind: 'text', text: 'See ' },
      { kind: 'link', text: RUN_LINK, href: RUN_LINK },
      { kind: 'text', text: '. Or (' },
      { kind: 'link', text: 'https://example.org/a_b', href: 'https://example.org/a_b' },
      { kind: 'text', text: ')' },
    ])
    expect(splitTextLinks('javascript:alert(1) and ftp://x')).toEqual([{ kind: 'text', text: 'javascript:alert(1) and ftp://x' }])
    expect(splitTextLinks('')).toEqual([])
  })
})

describe('DevMailView', () => {
  it('lists the messages and opens one as text with its links clickable, never as HTML', async () => {
    stubFetch({
      'GET /api/v1/auth/me': () => jsonResponse(200, sessionFixture()),
      'GET /api/v1/dev/mail': () => jsonResponse(200, { items: [failed, earlier] }),
    })
    const { wrapper } = await mountInAppAt(DevMailView, '/dev/mail')
    const rows = wrapper.findAll('[data-testid="dev-mail-table"] tbody tr').map((r) => r.text())
    expect(rows).toHaveLength(2)
    expect(rows[0]).toContain('Suite “Glyph bowls” failed')
    expect(rows[0]).toContain('ines.ortega@harbour.test')
    expect(wrapper.find('[data-testid="dev-mail-message"]').exists()).toBe(false)

    await wrapper.get('[data-testid="dev-mail-open-2"]').trigger('click')
    await settle()
    const body = wrapper.get('[data-testid="dev-mail-text"]')
    const links = body.findAll('a')
    expect(links.map((a) => a.attributes('href'))).toEqual([RUN_LINK])
    expect(body.find('b').exists()).toBe(false)
    expect(body.text()).toContain('<b>on revision 12</b>')
  })

  it('says there is no local mailbox when the server mails for real (404)', async () => {
    stubFetch({
      'GET /api/v1/auth/me': () => jsonResponse(200, sessionFixture()),
      'GET /api/v1/dev/mail': () => errorResponse(404, 'not_found', 'There is no API route GET /api/v1/dev/mail.'),
    })
    const { wrapper } = await mountInAppAt(DevMailView, '/dev/mail')
    expect(wrapper.get('[data-testid="dev-mail-unavailable"]').text()).toContain('No local mailbox')
    expect(wrapper.find('[data-testid="dev-mail-table"]').exists()).toBe(false)
  })
})
