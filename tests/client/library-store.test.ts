import { createPinia, setActivePinia } from 'pinia'
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { setCsrfToken } from '../../src/api/http'
import { useLibraryStore } from '../../src/stores/library'
import { errorResponse, isolateClientState, jsonResponse, noContent, stubFetch, type RecordedCall } from './fetch-stub'
import { PROJECT_ID, pathItem, pathPage, TEAM_ID, wayfindingProject } from './library-fixtures'

const listRoute = `GET /api/v1/projects/${PROJECT_ID}/paths`
const bulkRoute = `POST /api/v1/projects/${PROJECT_ID}/paths/bulk`
const listCalls = (calls: RecordedCall[]) => calls.filter((call) => `${call.method} ${call.pathname}` === listRoute)

function freshStore() {
  setActivePinia(createPinia())
  const library = useLibraryStore()
  library.setProject(PROJECT_ID)
  return library
}

isolateClientState()
beforeEach(() => setCsrfToken('csrf-90e1'))

describe('useLibraryStore queries', () => {
  it('asks for the first page sorted by name, leaving empty filters and the trash flag out', async () => {
    const { calls } = stubFetch({ [listRoute]: () => jsonResponse(200, pathPage([pathItem(5, 'Map pin')])) })
    const library = freshStore()
    await library.load()
    expect(calls[0].url).toBe(`/api/v1/projects/${PROJECT_ID}/paths?page=1&pageSize=25&sort=name&order=asc`)
    expect(library.items.map((item) => item.name)).toEqual(['Map pin'])
    expect(library.tags).toEqual(['arrows', 'ferry'])
    expect(library.total).toBe(1)
  })

  it('sends paging, sort and every filter, and goes back to page 1 when a filter changes', async () => {
    const { calls } = stubFetch({ [listRoute]: () => jsonResponse(200, pathPage([], { total: 0 })) })
    const library = freshStore()
    library.setTableOptions({ page: 3, pageSize: 50, sort: 'segments', order: 'desc' })
    expect(library.page).toBe(3)
    library.setFilters({ text: '  pin ', tag: 'arrows', origin: 'svg', warnings: 'with' })
    expect(library.page).toBe(1)
    expect(library.hasFilters).toBe(true)
    await library.load()
    expect(calls[0].url).toBe(
      `/api/v1/projects/${PROJECT_ID}/paths?page=1&pageSize=50&sort=segments&order=desc&q=pin&tag=arrows&origin=svg&warnings=with`,
    )
  })

  it('lists the trash with trash=1, from the first page', async () => {
    const { calls } = stubFetch({ [listRoute]: () => jsonResponse(200, pathPage([])) })
    const library = freshStore()
    library.setTableOptions({ page: 2, pageSize: 10, sort: 'updatedAt', order: 'desc' })
    library.setTrash(true)
    await library.load()
    expect(calls[0].query.get('trash')).toBe('1')
    expect(calls[0].query.get('page')).toBe('1')
    expect(calls[0].query.get('sort')).toBe('updatedAt')
  })

  it('forgets filters and trash when another project opens', () => {
    const library = freshStore()
    library.setFilters({ tag: 'ferry', origin: 'font' })
    library.setTrash(true)
    library.setProject(77)
    expect(library.filters).toEqual({ text: '', tag: null, origin: null, warnings: null })
    expect(library.isTrash).toBe(false)
    expect(library.query).toEqual({ page: 1, pageSize: 25, sort: 'name', order: 'asc' })
  })

  it('shows only the latest answer when answers arrive out of order', async () => {
    let releaseFirst: (() => void) | null = null
    const first = new Promise<void>((resolve) => {
      releaseFirst = resolve
    })
    stubFetch({
      [listRoute]: async (call) => {
        if (call.query.get('q') === 'fe') {
          await first
          return jsonResponse(200, pathPage([pathItem(1, 'Fence')]))
        }
        return jsonResponse(200, pathPage([pathItem(2, 'Ferry')]))
      },
    })
    const library = freshStore()
    library.setFilters({ text: 'fe' })
    const slow = library.load()
    library.setFilters({ text: 'ferry' })
    await library.load()
    releaseFirst!()
    await slow
    expect(library.items.map((item) => item.name)).toEqual(['Ferry'])
  })

  it('steps back to the last page when a trash empties the current one', async () => {
    stubFetch({
      [listRoute]: (call) =>
        call.query.get('page') === '3'
          ? jsonResponse(200, pathPage([], { total: 20, page: 3, pageSize: 10 }))
          : jsonResponse(200, pathPage([pathItem(20, 'Stair')], { total: 20, page: 2, pageSize: 10 })),
      [bulkRoute]: () => jsonResponse(200, { affected: 1 }),
    })
    const library = freshStore()
    library.setTableOptions({ page: 3, pageSize: 10, sort: 'name', order: 'asc' })
    await library.trashPaths([21])
    expect(library.page).toBe(2)
  })
})

describe('useLibraryStore bulk actions', () => {
  it('tags, untags, trashes and copies with one bulk request each, then reloads', async () => {
    const { calls } = stubFetch({
      [listRoute]: () => jsonResponse(200, pathPage([pathItem(5, 'Map pin')])),
      [bulkRoute]: (call) => jsonResponse(200, { affected: (call.body as { ids: number[] }).ids.length }),
    })
    const library = freshStore()
    await expect(library.tagPaths([5, 9], ['signage'])).resolves.toBe(2)
    await expect(library.untagPaths([9], ['arrows'])).resolves.toBe(1)
    await expect(library.trashPaths([5, 9, 12])).resolves.toBe(3)
    await expect(library.copyPaths([5], 77)).resolves.toBe(1)

    const posts = calls.filter((call) => call.method === 'POST')
    expect(posts.map((call) => call.body)).toEqual([
      { action: 'tag', ids: [5, 9], tags: ['signage'] },
      { action: 'untag', ids: [9], tags: ['arrows'] },
      { action: 'trash', ids: [5, 9, 12] },
      { action: 'copy', ids: [5], targetProjectId: 77 },
    ])
    expect(posts.every((call) => call.headers['x-csrf-token'] === 'csrf-90e1')).toBe(true)
    expect(listCalls(calls)).toHaveLength(4)
  })

  it('passes a refusal on and does not reload', async () => {
    const { calls } = stubFetch({
      [bulkRoute]: () => errorResponse(403, 'forbidden', 'Viewers cannot change paths.'),
    })
    const library = freshStore()
    await expect(library.trashPaths([5])).rejects.toMatchObject({ status: 403, message: 'Viewers cannot change paths.' })
    expect(listCalls(calls)).toHaveLength(0)
  })

  it('restores from the trash path by path and reloads even when one fails', async () => {
    const { calls } = stubFetch({
      [listRoute]: () => jsonResponse(200, pathPage([])),
      'POST /api/v1/paths/5/untrash': () => noContent(),
      'POST /api/v1/paths/9/untrash': () => errorResponse(409, 'trash_expired', 'This path left the trash for good.'),
    })
    const library = freshStore()
    await expect(library.untrashPaths([5, 9, 12])).rejects.toMatchObject({ code: 'trash_expired' })
    expect(calls.map((call) => `${call.method} ${call.pathname}`)).toEqual([
      'POST /api/v1/paths/5/untrash',
      'POST /api/v1/paths/9/untrash',
      listRoute,
    ])
  })

  it('empties the trash and deletes one path for good', async () => {
    const { calls } = stubFetch({
      [listRoute]: () => jsonResponse(200, pathPage([])),
      [`POST /api/v1/projects/${PROJECT_ID}/trash/empty`]: () => jsonResponse(200, { purged: 4 }),
      'DELETE /api/v1/paths/9/purge': () => noContent(),
    })
    const library = freshStore()
    await expect(library.emptyProjectTrash()).resolves.toBe(4)
    await expect(library.purgeFromTrash(9)).resolves.toBeUndefined()
    expect(calls.filter((call) => call.method !== 'GET').map((call) => call.headers['x-csrf-token'])).toEqual([
      'csrf-90e1',
      'csrf-90e1',
    ])
  })

  it('lists the other projects of the team as copy targets', async () => {
    const other = { ...wayfindingProject, id: 77, name: 'Headline glyph review' }
    const { calls } = stubFetch({
      [`GET /api/v1/teams/${TEAM_ID}/projects`]: () =>
        jsonResponse(200, { items: [wayfindingProject, other], total: 2, page: 1, pageSize: 200 }),
    })
    const library = freshStore()
    await library.loadCopyTargets(TEAM_ID)
    expect(calls[0].url).toBe(`/api/v1/teams/${TEAM_ID}/projects?page=1&pageSize=200&sort=name&order=asc`)
    expect(library.copyTargets.map((project) => project.name)).toEqual(['Headline glyph review'])
  })
})

describe('useLibraryStore exports', () => {
  let createObjectURL: ReturnType<typeof vi.fn>
  let revokeObjectURL: ReturnType<typeof vi.fn>
  let clicked: { download: string; href: string }[]
  const original = { createObjectURL: URL.createObjectURL, revokeObjectURL: URL.revokeObjectURL }

  beforeEach(() => {
    createObjectURL = vi.fn(() => 'blob:rootcast-test/1')
    revokeObjectURL = vi.fn()
    clicked = []
    Object.assign(URL, { createObjectURL, revokeObjectURL })
    vi.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(function (this: HTMLAnchorElement) {
      clicked.push({ download: this.download, href: this.href })
    })
  })
  afterEach(() => {
    Object.assign(URL, original)
    vi.restoreAllMocks()
  })

  it('downloads the chosen paths as SVG under the server’s file name', async () => {
    const svgText = '<svg xmlns="http://www.w3.org/2000/svg"><path d="M0 0 L1 1"/></svg>'
    const { calls } = stubFetch({
      [`GET /api/v1/projects/${PROJECT_ID}/export.svg`]: () =>
        new Response(svgText, {
          status: 200,
          headers: { 'Content-Type': 'image/svg+xml', 'Content-Disposition': 'attachment; filename="wayfinding-icons.svg"' },
        }),
    })
    const library = freshStore()
    await expect(library.exportPathsSvg([5, 9])).resolves.toBe('wayfinding-icons.svg')
    expect(calls[0].url).toBe(`/api/v1/projects/${PROJECT_ID}/export.svg?ids=5%2C9`)
    expect(clicked).toEqual([{ download: 'wayfinding-icons.svg', href: 'blob:rootcast-test/1' }])
    const blob = createObjectURL.mock.calls[0][0] as Blob
    expect(await blob.text()).toBe(svgText)
    expect(document.querySelector('a[download]')).toBeNull()
  })

  it('names a bundle download itself when the server gives no name, and reports a refusal', async () => {
    stubFetch({
      [`GET /api/v1/projects/${PROJECT_ID}/bundle`]: (call) =>
        call.query.get('ids') === '5'
          ? jsonResponse(200, { format: 'rootcast-bundle' })
          : errorResponse(404, 'not_found', 'Path 404 is not in this project.'),
    })
    const library = freshStore()
    await expect(library.exportPathsBundle([5])).resolves.toBe(`project-${PROJECT_ID}-bundle.json`)
    await expect(library.exportPathsBundle([404])).rejects.toMatchObject({ message: 'Path 404 is not in this project.' })
    expect(clicked).toHaveLength(1)
  })
})
