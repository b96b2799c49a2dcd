import { afterEach, describe, expect, it, onTestFinished, vi } from 'vitest'
import type { Role } from '../../shared/api'
import LibraryView from '../../src/views/LibraryView.vue'
import { isolateClientState, jsonResponse, sessionFixture, stubFetch } from './fetch-stub'
import {
  PROJECT_ID,
  pathDetail,
  pathItem,
  pathPage,
  revisionDetail,
  revisionSummary,
  TEAM_ID,
  wayfindingProject,
} from './library-fixtures'
import { mountInAppAt, settle } from './mount-app'

const pin = pathItem(5, 'Map pin', { warnings: 2, tags: ['arrows', 'ferry'] })
const stair = pathItem(9, 'Stair', { origin: 'font', sourceFile: 'DejaVuSans.ttf', units: 'font units' })
const trashed = pathItem(12, 'Old lift', { deletedAt: '2026-11-25T08:00:00.000Z' })

const listRoute = `GET /api/v1/projects/${PROJECT_ID}/paths`
const pinRevision1 = 'M2 12 L12 4 L22 12 Z'
const pinRevision2 = pin.data

function signedInAs(role: Role, extraRoutes: Parameters<typeof stubFetch>[0] = {}) {
  return stubFetch({
    'GET /api/v1/auth/me': () =>
      jsonResponse(200, sessionFixture({ teams: [{ id: TEAM_ID, name: 'Harbour Type Workshop', role }] })),
    [`GET /api/v1/projects/${PROJECT_ID}`]: () => jsonResponse(200, wayfindingProject),
    [listRoute]: (call) =>
      jsonResponse(200, call.query.get('trash') === '1' ? pathPage([trashed]) : pathPage([pin, stair])),
    'GET /api/v1/paths/5': () =>
      jsonResponse(
        200,
        pathDetail(pin, {
          diagnostics: [
            { kind: 'cusp', segment: 3, subpath: 0, t: 0.5, point: [12, 20], message: 'The curve turns back on itself here.' },
          ],
        }),
      ),
    'GET /api/v1/paths/5/revisions': () => jsonResponse(200, [revisionSummary(1), revisionSummary(2)]),
    'GET /api/v1/paths/5/revisions/1': () => jsonResponse(200, revisionDetail(1, pinRevision1, false)),
    'GET /api/v1/paths/5/revisions/2': () => jsonResponse(200, revisionDetail(2, pinRevision2, true)),
    ...extraRoutes,
  })
}

const byTestId = (id: string) => document.querySelector<HTMLElement>(`[data-testid="${id}"]`)
const has = (id: string) => byTestId(id) !== null

async function click(id: string): Promise<void> {
  const element = byTestId(id)
  expect(element, `element ${id}`).not.toBeNull()
  element!.click()
  await settle()
}

async function selectRow(pathId: number): Promise<void> {
  const checkbox = byTestId(`library-row-${pathId}`)?.querySelector<HTMLInputElement>('input[type="checkbox"]')
  expect(checkbox, `checkbox of row ${pathId}`).not.toBeNull()
  checkbox!.click()
  await settle()
}

isolateClientState()
afterEach(() => {
  document.body.innerHTML = ''
})

describe('LibraryView table', () => {
  it('lists the paths with thumbnails, origin, segment counts and warnings in words', async () => {
    signedInAs('viewer')
    await mountInAppAt(LibraryView, `/projects/${PROJECT_ID}/library`)
    const table = byTestId('library-table')!
    expect(byTestId('library-row-5')?.textContent).toContain('Map pin')
    expect(byTestId('library-row-9')?.textContent).toContain('Font glyph')
    expect(byTestId('library-row-9')?.textContent).toContain('DejaVuSans.ttf')
    expect(byTestId('library-warnings-5')?.textContent?.replace(/\s+/g, ' ').trim()).toBe('2 warnings')
    const thumbnail = byTestId('library-row-5')!.querySelector('svg.rc-thumbnail')!
    expect(thumbnail.querySelector('path')?.getAttribute('d')).toBe(pin.data)
    // viewBox from the server's bbox [2, 4, 22, 20] with the thumbnail margin: wider than the box.
    const [x, y, width, height] = thumbnail.getAttribute('viewBox')!.split(' ').map(Number)
    expect(x).toBeLessThan(2)
    expect(y).toBeLessThan(4)
    expect(x + width).toBeGreaterThan(22)
    expect(y + height).toBeGreaterThan(20)
    expect(table.textContent).toContain('ferry')
  })

  // Issue 4 item 7: viewers browse and export, editors import and change, owners empty the trash.
  const actionsByRole: [Role, boolean, boolean][] = [
    ['viewer', false, false],
    ['editor', true, false],
    ['owner', true, true],
  ]
  it.each(actionsByRole)('gives a %s: change actions %s, delete for good %s', async (role, change, purge) => {
    signedInAs(role)
    await mountInAppAt(LibraryView, `/projects/${PROJECT_ID}/library`)
    expect(has('library-upload-svg')).toBe(change)
    expect(has('library-import-font')).toBe(change)
    expect(has('library-import-bundle')).toBe(change)

    await selectRow(5)
    expect(byTestId('library-bulk-bar')?.textContent).toContain('1 path selected')
    expect(has('bulk-export-svg')).toBe(true)
    expect(has('bulk-export-bundle')).toBe(true)
    expect(has('bulk-tag')).toBe(change)
    expect(has('bulk-copy')).toBe(change)
    expect(has('bulk-trash')).toBe(change)

    await click('library-trash-toggle')
    expect(byTestId('library-trash-notice')?.textContent).toContain('The trash keeps paths for 30 days')
    expect(has('library-row-12')).toBe(true)
    expect(has('trash-restore-12')).toBe(change)
    expect(has('trash-purge-12')).toBe(purge)
    expect(has('library-empty-trash')).toBe(purge)
    expect(has('library-upload-svg')).toBe(false)
  })

  it('filters by name only once the typing pauses', async () => {
    vi.useFakeTimers()
    try {
      const { calls } = signedInAs('viewer')
      await mountInAppAt(LibraryView, `/projects/${PROJECT_ID}/library`)
      const input = byTestId('library-filter')!.querySelector('input')!
      input.value = 'pin'
      input.dispatchEvent(new Event('input'))
      await settle()
      const listed = () => calls.filter((call) => `${call.method} ${call.pathname}` === listRoute)
      expect(listed().at(-1)?.query.has('q')).toBe(false)
      await vi.runAllTimersAsync()
      await settle()
      expect(listed().at(-1)?.query.get('q')).toBe('pin')
    } finally {
      vi.useRealTimers()
    }
  })

  it('moves the selection to the trash and says how long it stays there', async () => {
    const { calls } = signedInAs('editor', {
      [`POST /api/v1/projects/${PROJECT_ID}/paths/bulk`]: () => jsonResponse(200, { affected: 2 }),
    })
    await mountInAppAt(LibraryView, `/projects/${PROJECT_ID}/library`)
    await selectRow(5)
    await selectRow(9)
    await click('bulk-trash')
    expect(calls.find((call) => call.method === 'POST')?.body).toEqual({ action: 'trash', ids: [5, 9] })
    expect(document.body.textContent).toContain('Moved 2 paths to the trash, where they are kept for 30 days.')
    expect(has('library-bulk-bar')).toBe(false)
  })
})

describe('LibraryView detail drawer', () => {
  it('shows metadata, diagnostics, history and the path data of the opened row', async () => {
    signedInAs('viewer')
    await mountInAppAt(LibraryView, `/projects/${PROJECT_ID}/library`)
    await click('library-open-5')
    const drawer = byTestId('path-drawer')!
    expect(drawer.textContent).toContain('Map pin')
    expect(byTestId('path-facts')?.textContent).toContain('wayfinding.svg')
    expect(byTestId('path-diagnostics')?.textContent).toContain('Cusp')
    expect(byTestId('path-diagnostics')?.textContent).toContain('The curve turns back on itself here.')
    expect(byTestId('path-history')?.textContent).toContain('Revision 1 message')
    expect(byTestId('path-data-text')?.querySelector('textarea')?.value).toBe(pin.data)
    // Viewers browse only: no rename, no restore.
    expect(has('path-edit')).toBe(false)
    expect(has('revision-restore-1')).toBe(false)
  })

  it('restores an older revision as a new one for an editor', async () => {
    const { calls } = signedInAs('editor', {
      'POST /api/v1/paths/5/revisions/1/restore': () =>
        jsonResponse(201, pathDetail({ ...pin, revision: 3, revisions: 3, data: pinRevision1 }, { message: 'Restored revision 1' })),
    })
    await mountInAppAt(LibraryView, `/projects/${PROJECT_ID}/library`)
    await click('library-open-5')
    expect(has('revision-restore-2')).toBe(false)
    await click('revision-restore-1')
    const restore = calls.find((call) => call.pathname === '/api/v1/paths/5/revisions/1/restore')
    expect(restore?.method).toBe('POST')
    expect(restore?.headers['x-csrf-token']).toBe('csrf-7f3a9c')
    expect(byTestId('path-data-text')?.querySelector('textarea')?.value).toBe(pinRevision1)
    expect(document.body.textContent).toContain('Revision 1 restored as revision 3.')
  })

  it('renames and retags a path for an editor with one PATCH', async () => {
    const { calls } = signedInAs('editor', {
      'PATCH /api/v1/paths/5': () => jsonResponse(200, pathDetail({ ...pin, name: 'Map pin, filled', tags: ['arrows'] })),
    })
    await mountInAppAt(LibraryView, `/projects/${PROJECT_ID}/library`)
    await click('library-open-5')
    await click('path-edit')
    const name = byTestId('path-name-input')!.querySelector('input')!
    name.value = 'Map pin, filled'
    name.dispatchEvent(new Event('input'))
    await settle()
    // Remove the "ferry" chip (its close button), keep "arrows".
    const chips = [...byTestId('path-tags-input')!.querySelectorAll('.v-chip')]
    chips.find((chip) => chip.textContent?.includes('ferry'))!.querySelector<HTMLElement>('.v-chip__close')!.click()
    await settle()
    await click('path-save')
    const patch = calls.find((call) => call.method === 'PATCH')
    expect(patch?.body).toEqual({ name: 'Map pin, filled', tags: ['arrows'] })
    expect(byTestId('path-drawer')?.textContent).toContain('Map pin, filled')
  })

  it('compares two revisions from their own data, side by side', async () => {
    const { calls } = signedInAs('viewer')
    await mountInAppAt(LibraryView, `/projects/${PROJECT_ID}/library`)
    await click('library-open-5')
    await click('revision-compare-current-1')
    const panel = byTestId('revision-compare-panel')!
    expect(calls.filter((call) => /\/revisions\/\d$/.test(call.pathname)).map((call) => call.pathname).sort()).toEqual([
      '/api/v1/paths/5/revisions/1',
      '/api/v1/paths/5/revisions/2',
    ])
    const drawn = [...panel.querySelectorAll('svg.rc-thumbnail path')].map((path) => path.getAttribute('d'))
    expect(drawn).toEqual([pinRevision1, pinRevision2])
    // Both drawings share one view box (revision 1: [0,0,10,10], revision 2: [0,0,20,10]).
    const boxes = [...panel.querySelectorAll('svg.rc-thumbnail')].map((svg) => svg.getAttribute('viewBox'))
    expect(boxes[0]).toBe(boxes[1])
    // Segments 4 → 5 (revisionSummary: 3 + number), cubic 1 → 2, max x 10 → 20.
    const rows = [...panel.querySelectorAll('tbody tr')].map((row) =>
      [...row.children].map((cell) => cell.textContent!.trim()).join(' '),
    )
    expect(rows).toContain('Segments 4 5 +1')
    expect(rows).toContain('Cubic segments 1 2 +1')
    expect(rows).toContain('Bounding box max x 10 20 +10')
    expect(rows).toContain('Bounding box min y 0 0 same')
  })

  it('copies the path data, or selects it with a hint where copying is not allowed', async () => {
    signedInAs('viewer')
    const writeText = vi.fn(() => Promise.resolve())
    const before = Object.getOwnPropertyDescriptor(navigator, 'clipboard')
    Object.defineProperty(navigator, 'clipboard', { value: { writeText }, configurable: true })
    onTestFinished(() => {
      if (before) Object.defineProperty(navigator, 'clipboard', before)
      else delete (navigator as { clipboard?: unknown }).clipboard
    })
    await mountInAppAt(LibraryView, `/projects/${PROJECT_ID}/library`)
    await click('library-open-5')
    await click('path-copy-data')
    expect(writeText).toHaveBeenCalledWith(pin.data)
    expect(byTestId('path-copy-message')?.textContent).toContain(`Copied ${pin.data.length} characters`)

    writeText.mockImplementation(() => Promise.reject(new Error('Write permission denied.')))
    await click('path-copy-data')
    expect(byTestId('path-copy-message')?.textContent).toContain('press Ctrl+C')
  })
})
