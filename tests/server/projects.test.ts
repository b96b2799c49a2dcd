import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RootcastApp } from '../../server/app'
import { ProjectEntity } from '../../server/entities/project.entity'
import { buildTestApp, OUTSIDER, seedTestData, signIn, type SignedIn } from '../helpers/test-app'
import { createTestDatabase, type TestDatabase } from '../helpers/test-db'

let db: TestDatabase
let rc: RootcastApp
let teamId: number
const as: Record<'viewer' | 'editor' | 'owner' | 'outsider', SignedIn> = {} as never

beforeAll(async () => {
  db = await createTestDatabase()
  teamId = (await seedTestData(db.ds)).demoTeamId
  rc = buildTestApp(db.ds)
  as.viewer = await signIn(rc.app, 'viewer@example.com')
  as.editor = await signIn(rc.app, 'editor@example.com')
  as.owner = await signIn(rc.app, 'owner@example.com')
  as.outsider = await signIn(rc.app, OUTSIDER.email)
})
afterAll(async () => {
  await rc?.close()
  await db?.drop()
})

type Who = 'anonymous' | keyof typeof as

async function call(who: Who, method: 'get' | 'post' | 'patch' | 'delete', url: string, body?: object) {
  const client = who === 'anonymous' ? request(rc.app) : as[who].agent
  let req = client[method](url)
  if (who !== 'anonymous') req = req.set('X-CSRF-Token', as[who].csrf)
  return body ? req.send(body) : req
}

async function freshProject(name: string): Promise<number> {
  const res = await call('owner', 'post', `/api/v1/teams/${teamId}/projects`, { name })
  expect(res.status).toBe(201)
  return res.body.id as number
}

describe('role matrix on every projects route', () => {
  const whos: Who[] = ['anonymous', 'viewer', 'editor', 'owner', 'outsider']
  // Expected statuses per caller, in the order of `whos`. A member of another team gets
  // 404, as if the resource did not exist (common practice: do not reveal other teams' ids).
  const matrix: Array<{ route: string; method: 'get' | 'post' | 'patch' | 'delete'; url: (id: number) => string; body?: object; expect: number[] }> = [
    { route: 'list', method: 'get', url: () => `/api/v1/teams/${teamId}/projects`, expect: [401, 200, 200, 200, 404] },
    { route: 'create', method: 'post', url: () => `/api/v1/teams/${teamId}/projects`, body: { name: 'Matrix create' }, expect: [401, 403, 201, 201, 404] },
    { route: 'read', method: 'get', url: (id) => `/api/v1/projects/${id}`, expect: [401, 200, 200, 200, 404] },
    { route: 'rename', method: 'patch', url: (id) => `/api/v1/projects/${id}`, body: { name: 'Matrix renamed' }, expect: [401, 403, 200, 200, 404] },
    { route: 'paths', method: 'get', url: (id) => `/api/v1/projects/${id}/paths`, expect: [401, 200, 200, 200, 404] },
    { route: 'delete', method: 'delete', url: (id) => `/api/v1/projects/${id}`, expect: [401, 403, 403, 204, 404] },
  ]
  for (const row of matrix) {
    it(`${row.route}: ${whos.map((w, i) => `${w} ${row.expect[i]}`).join(', ')}`, async () => {
      const got: number[] = []
      for (const who of whos) {
        const id = await freshProject(`Matrix ${row.route} ${who}`)
        const res = await call(who, row.method, row.url(id), row.body)
        got.push(res.status)
        if (res.status >= 400) expect(res.body.error.code).toBe({ 401: 'unauthenticated', 403: 'forbidden', 404: 'not_found' }[res.status as 401])
      }
      expect(got).toEqual(row.expect)
    })
  }

  it('writes what was allowed and nothing that was refused', async () => {
    const id = await freshProject('Kept as it was')
    expect((await call('viewer', 'patch', `/api/v1/projects/${id}`, { name: 'Viewer was here' })).status).toBe(403)
    expect((await call('editor', 'delete', `/api/v1/projects/${id}`)).status).toBe(403)
    const row = await db.ds.getRepository(ProjectEntity).findOneByOrFail({ id })
    expect(row.name).toBe('Kept as it was')
    expect((await call('owner', 'delete', `/api/v1/projects/${id}`)).status).toBe(204)
    expect(await db.ds.getRepository(ProjectEntity).findOneBy({ id })).toBeNull()
  })
})

describe('CSRF', () => {
  it('refuses a state-changing cookie request without the token, and changes nothing', async () => {
    const before = await db.ds.getRepository(ProjectEntity).count()
    const res = await as.editor.agent.post(`/api/v1/teams/${teamId}/projects`).send({ name: 'No token' })
    expect(res.status).toBe(403)
    expect(res.body.error.code).toBe('csrf')
    const wrong = await as.editor.agent.post(`/api/v1/teams/${teamId}/projects`).set('X-CSRF-Token', as.owner.csrf).send({ name: 'Wrong token' })
    expect(wrong.status).toBe(403)
    expect(await db.ds.getRepository(ProjectEntity).count()).toBe(before)
  })
})

describe('create, rename, validation', () => {
  it('creates a project, stores it with its creator and returns it', async () => {
    const res = await call('editor', 'post', `/api/v1/teams/${teamId}/projects`, { name: '  Quay lettering  ', description: 'Cast-iron letters' })
    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({ teamId, name: 'Quay lettering', description: 'Cast-iron letters', pathCount: 0, createdBy: 'Tobias Slipway' })
    const row = await db.ds.getRepository(ProjectEntity).findOneByOrFail({ id: res.body.id })
    expect(row.name).toBe('Quay lettering')
    expect(row.createdById).not.toBeNull()
  })

  it('answers bad input with 400 and the error shape', async () => {
    const cases: Array<[object, RegExp]> = [
      [{ name: '' }, /needs a name/],
      [{ name: 'x'.repeat(121) }, /at most 120/],
      [{ name: 42 }, /string/i],
      [{ name: 'Fine', colour: 'teal' }, /unrecognized|colour/i],
    ]
    for (const [body, message] of cases) {
      const res = await call('editor', 'post', `/api/v1/teams/${teamId}/projects`, body)
      expect(res.status, JSON.stringify(body)).toBe(400)
      expect(res.body.error.code).toBe('validation')
      expect(res.body.error.message).toMatch(message)
    }
    const empty = await call('editor', 'patch', `/api/v1/projects/${await freshProject('Patch me')}`, {})
    expect(empty.status).toBe(400)
    const badId = await call('editor', 'get', '/api/v1/projects/not-a-number')
    expect(badId.status).toBe(404)
    const badQuery = await call('viewer', 'get', `/api/v1/teams/${teamId}/projects?pageSize=100000&sort=colour`)
    expect(badQuery.status).toBe(400)
    expect(badQuery.body.error.details.map((d: { path: string }) => d.path).sort()).toEqual(['query.pageSize', 'query.sort'])
  })

  it('renames a project', async () => {
    const id = await freshProject('Old name')
    const res = await call('editor', 'patch', `/api/v1/projects/${id}`, { name: 'New name' })
    expect(res.status).toBe(200)
    expect(res.body.name).toBe('New name')
    expect((await db.ds.getRepository(ProjectEntity).findOneByOrFail({ id })).name).toBe('New name')
  })
})

describe('paging, sorting and filtering on the server', () => {
  it('pages, sorts and filters', async () => {
    for (const n of ['Pier alpha', 'Pier bravo', 'Pier charlie', 'Pier delta', 'Pier echo']) await freshProject(n)
    const page1 = await call('viewer', 'get', `/api/v1/teams/${teamId}/projects?q=pier&sort=name&order=desc&page=1&pageSize=2`)
    expect(page1.status).toBe(200)
    expect(page1.body.total).toBe(5)
    expect(page1.body.items.map((p: { name: string }) => p.name)).toEqual(['Pier echo', 'Pier delta'])
    const page3 = await call('viewer', 'get', `/api/v1/teams/${teamId}/projects?q=pier&sort=name&order=desc&page=3&pageSize=2`)
    expect(page3.body.items.map((p: { name: string }) => p.name)).toEqual(['Pier alpha'])
    const byPaths = await call('viewer', 'get', `/api/v1/teams/${teamId}/projects?sort=pathCount&order=desc&pageSize=1`)
    expect(byPaths.body.items[0]).toMatchObject({ name: 'Wayfinding icons', pathCount: 12 })
    const literal = await call('viewer', 'get', `/api/v1/teams/${teamId}/projects?q=${encodeURIComponent('%')}`)
    expect(literal.body.total).toBe(0)
  })

  it('lists the demo project paths with their current data', async () => {
    const list = await call('viewer', 'get', `/api/v1/teams/${teamId}/projects?q=Wayfinding`)
    const paths = await call('viewer', 'get', `/api/v1/projects/${list.body.items[0].id}/paths`)
    expect(paths.status).toBe(200)
    expect(paths.body.items.map((p: { name: string }) => p.name)).toContain('Map pin')
    const pin = paths.body.items.find((p: { name: string }) => p.name === 'Map pin')
    expect(pin).toMatchObject({ fillRule: 'evenodd', revisions: 1 })
    expect(pin.data).toMatch(/^M12 2C/)
  })
})
