import { createPinia, setActivePinia } from 'pinia'
import { beforeEach, describe, expect, it } from 'vitest'
import type { Project } from '../../shared/api'
import { setCsrfToken } from '../../src/api/http'
import { useProjectsStore } from '../../src/stores/projects'
import { errorResponse, isolateClientState, jsonResponse, noContent, stubFetch, type RecordedCall } from './fetch-stub'

function projectNamed(id: number, name: string): Project {
  return {
    id,
    teamId: 3,
    name,
    description: '',
    pathCount: id % 7,
    createdAt: '2026-10-01T08:00:00.000Z',
    updatedAt: '2026-11-15T12:30:00.000Z',
    createdBy: 'Ines Ortega',
  }
}

function freshStore() {
  setActivePinia(createPinia())
  return useProjectsStore()
}

const listRoute = 'GET /api/v1/teams/3/projects'
const listCalls = (calls: RecordedCall[]) => calls.filter((call) => `${call.method} ${call.pathname}` === listRoute)

isolateClientState()
beforeEach(() => setCsrfToken('csrf-2b64'))

describe('useProjectsStore', () => {
  it('asks the server for the page, sort and filter the table shows', async () => {
    const { calls } = stubFetch({
      [listRoute]: () => jsonResponse(200, { items: [projectNamed(8, 'Stair signs')], total: 27, page: 3, pageSize: 10 }),
    })
    const projects = freshStore()
    projects.setTeam(3)
    projects.setTableOptions({ page: 3, pageSize: 10, sort: 'pathCount', order: 'desc' })
    await projects.load()
    projects.setFilter('stair')
    expect(projects.page).toBe(1)

    expect(calls[0].url).toBe('/api/v1/teams/3/projects?page=3&pageSize=10&sort=pathCount&order=desc')
    expect(projects.items.map((item) => item.name)).toEqual(['Stair signs'])
    expect(projects.total).toBe(27)
    expect(projects.isLoading).toBe(false)
    expect(projects.query).toEqual({ page: 1, pageSize: 10, sort: 'pathCount', order: 'desc', q: 'stair' })
  })

  it('shows only the answer to the latest request when answers arrive out of order', async () => {
    let releaseFirst: (() => void) | null = null
    const first = new Promise<void>((resolve) => {
      releaseFirst = resolve
    })
    stubFetch({
      [listRoute]: async (call) => {
        if (call.query.get('q') === 'fe') {
          await first
          return jsonResponse(200, { items: [projectNamed(1, 'Fence')], total: 1, page: 1, pageSize: 10 })
        }
        return jsonResponse(200, { items: [projectNamed(2, 'Ferry')], total: 1, page: 1, pageSize: 10 })
      },
    })
    const projects = freshStore()
    projects.setTeam(3)
    projects.setFilter('fe')
    const slow = projects.load()
    projects.setFilter('ferry')
    await projects.load()
    releaseFirst!()
    await slow
    expect(projects.items.map((item) => item.name)).toEqual(['Ferry'])
  })

  it('creates with the CSRF token and reloads the list', async () => {
    const { calls } = stubFetch({
      [listRoute]: () => jsonResponse(200, { items: [projectNamed(5, 'Lift icons')], total: 1, page: 1, pageSize: 10 }),
      'POST /api/v1/teams/3/projects': () => jsonResponse(201, projectNamed(5, 'Lift icons')),
    })
    const projects = freshStore()
    projects.setTeam(3)
    const created = await projects.create({ name: 'Lift icons', description: 'Car and shaft' })
    expect(created.id).toBe(5)
    const post = calls.find((call) => call.method === 'POST')
    expect(post?.headers['x-csrf-token']).toBe('csrf-2b64')
    expect(post?.body).toEqual({ name: 'Lift icons', description: 'Car and shaft' })
    expect(listCalls(calls)).toHaveLength(1)
    expect(projects.items[0].name).toBe('Lift icons')
  })

  it('passes a refusal to the caller and leaves the list as it was', async () => {
    const { calls } = stubFetch({
      'POST /api/v1/teams/3/projects': () => errorResponse(403, 'forbidden', 'Viewers cannot create projects.'),
    })
    const projects = freshStore()
    projects.setTeam(3)
    await expect(projects.create({ name: 'Map pin', description: '' })).rejects.toMatchObject({
      status: 403,
      code: 'forbidden',
      message: 'Viewers cannot create projects.',
    })
    expect(listCalls(calls)).toHaveLength(0)
  })

  it('steps back to the last page when a delete empties the current one', async () => {
    stubFetch({
      [listRoute]: (call) =>
        call.query.get('page') === '4'
          ? jsonResponse(200, { items: [], total: 30, page: 4, pageSize: 10 })
          : jsonResponse(200, { items: [projectNamed(30, 'Knot')], total: 30, page: 3, pageSize: 10 }),
      'DELETE /api/v1/projects/31': () => noContent(),
    })
    const projects = freshStore()
    projects.setTeam(3)
    projects.setTableOptions({ page: 4, pageSize: 10, sort: 'name', order: 'asc' })
    await projects.remove(31)
    expect(projects.page).toBe(3)
  })

  it('keeps a list failure as a readable error', async () => {
    stubFetch({ [listRoute]: () => new TypeError('Failed to fetch') })
    const projects = freshStore()
    projects.setTeam(3)
    await projects.load()
    expect(projects.error?.code).toBe('network')
    expect(projects.items).toEqual([])
  })
})
