import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RootcastApp } from '../../server/app'
import { openApiPath } from '../../server/openapi'
import { buildTestApp } from '../helpers/test-app'
import { createTestDatabase, type TestDatabase } from '../helpers/test-db'

let db: TestDatabase
let rc: RootcastApp

beforeAll(async () => {
  db = await createTestDatabase()
  rc = buildTestApp(db.ds)
})
afterAll(async () => {
  await rc?.close()
  await db?.drop()
})

interface RouteLayer {
  route?: { path: string; methods: Record<string, boolean> }
}

/** Every route actually mounted on the Express API router, as "METHOD /api/v1/path". */
function mountedRoutes(): string[] {
  const stack = (rc.apiRouter as unknown as { stack: RouteLayer[] }).stack
  const out: string[] = []
  for (const layer of stack) {
    if (!layer.route) continue
    for (const [m, on] of Object.entries(layer.route.methods)) if (on && m !== '_all') out.push(`${m.toUpperCase()} /api/v1${openApiPath(layer.route.path)}`)
  }
  return out.sort()
}

describe('OpenAPI document', () => {
  it('is served publicly as OpenAPI 3 JSON', async () => {
    const res = await request(rc.app).get('/api/v1/openapi.json')
    expect(res.status).toBe(200)
    expect(res.body.openapi).toBe('3.0.3')
    expect(res.body.components.schemas.ApiError.properties.error.required).toEqual(expect.arrayContaining(['code', 'message']))
  })

  it('describes every mounted Express route, and nothing that is not mounted', async () => {
    const doc = (await request(rc.app).get('/api/v1/openapi.json')).body as { paths: Record<string, Record<string, unknown>> }
    const documented = Object.entries(doc.paths).flatMap(([p, ops]) => Object.keys(ops).map((m) => `${m.toUpperCase()} ${p}`)).sort()
    const mounted = mountedRoutes()
    expect(mounted.length).toBeGreaterThanOrEqual(10)
    expect(mounted).toContain('POST /api/v1/auth/login')
    expect(documented).toEqual(mounted)
  })

  it('uses the same zod schemas as validation: limits and enums appear in the document', async () => {
    const doc = (await request(rc.app).get('/api/v1/openapi.json')).body
    const create = doc.components.schemas.CreateProject
    expect(create.properties.name.maxLength).toBe(120)
    expect(create.additionalProperties).toBe(false)
    const list = doc.paths['/api/v1/teams/{teamId}/projects'].get
    const sort = list.parameters.find((p: { name: string }) => p.name === 'sort')
    expect(sort.schema.enum).toEqual(['name', 'createdAt', 'updatedAt', 'pathCount'])
    expect(list.parameters.find((p: { name: string }) => p.name === 'teamId').in).toBe('path')
    expect(doc.paths['/api/v1/projects/{projectId}'].delete['x-rootcast-permission']).toBe('project.delete')
  })

  it('serves the browsable reference page with its assets from our own server', async () => {
    const page = await request(rc.app).get('/api/docs')
    expect(page.status).toBe(200)
    expect(page.text).toContain('/api/docs/assets/swagger-ui-bundle.js')
    expect(page.text).not.toMatch(/https?:\/\//)
    const asset = await request(rc.app).get('/api/docs/assets/swagger-ui-bundle.js')
    expect(asset.status).toBe(200)
  })
})
