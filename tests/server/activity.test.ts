import express from 'express'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { z } from 'zod'
import type { RootcastApp } from '../../server/app'
import { ActivityEntity } from '../../server/entities/activity.entity'
import { ProjectEntity } from '../../server/entities/project.entity'
import { UserEntity } from '../../server/entities/user.entity'
import type { AuditQueue } from '../../server/jobs/audit-queue'
import { createApiRegistry, type RouteSpec } from '../../server/routes/api-route'
import { buildTestApp, OUTSIDER, seedTestData, signIn, type SignedIn } from '../helpers/test-app'
import { createTestDatabase, type TestDatabase } from '../helpers/test-db'

let db: TestDatabase
let rc: RootcastApp
let demoTeamId: number
let otherTeamId: number
let iconsId: number
const as: Record<'owner' | 'editor' | 'viewer' | 'outsider', SignedIn> = {} as never
const userIds: Record<keyof typeof as, number> = {} as never

/** Audits need a queue to start; this one takes the jobs and runs none (the log is what is tested here). */
const idleQueue: AuditQueue = { chunkSize: 4, enqueue: async () => {}, remove: async () => {}, close: async () => {} }

/** A check's stored tolerance (not an assertion): the suites tests' value, far above double rounding on a 10-unit square. */
const CHECK_TOLERANCE = { point: 1e-6, t: 1e-9 }

type Who = keyof typeof as
function call(who: Who, method: 'get' | 'post' | 'put' | 'patch' | 'delete', url: string, body?: object) {
  const req = as[who].agent[method](`/api/v1${url}`).set('X-CSRF-Token', as[who].csrf)
  return body ? req.send(body) : req
}
async function ok(res: request.Response | Promise<request.Response>, status = 200): Promise<request.Response> {
  const r = await res
  expect(r.status, JSON.stringify(r.body)).toBe(status)
  return r
}

const repo = () => db.ds.getRepository(ActivityEntity)
/** The id of the newest entry: entries written after it are the ones a step added. */
async function mark(): Promise<number> {
  const [row] = (await db.ds.query('SELECT COALESCE(MAX(id), 0) AS id FROM activity')) as Array<{ id: number | string }>
  return Number(row.id)
}
async function entriesAfter(since: number): Promise<ActivityEntity[]> {
  return repo().createQueryBuilder('a').where('a.id > :since', { since }).orderBy('a.id').getMany()
}
/** Runs one write and expects exactly one new entry with these fields. */
async function expectOneEntry(write: () => Promise<unknown>, expected: Partial<ActivityEntity>): Promise<ActivityEntity> {
  const since = await mark()
  await write()
  const rows = await entriesAfter(since)
  expect(rows, JSON.stringify(rows)).toHaveLength(1)
  expect(rows[0]).toMatchObject(expected)
  return rows[0]
}
async function expectNoEntry(write: () => Promise<unknown>): Promise<void> {
  const since = await mark()
  await write()
  expect(await entriesAfter(since)).toEqual([])
}

beforeAll(async () => {
  db = await createTestDatabase()
  ;({ demoTeamId, otherTeamId } = await seedTestData(db.ds))
  rc = buildTestApp(db.ds, { auditQueue: idleQueue })
  const emails = { owner: 'owner@example.com', editor: 'editor@example.com', viewer: 'viewer@example.com', outsider: OUTSIDER.email } as const
  for (const who of Object.keys(emails) as Who[]) {
    as[who] = await signIn(rc.app, emails[who])
    userIds[who] = (await db.ds.getRepository(UserEntity).findOneByOrFail({ email: emails[who] })).id
  }
  iconsId = (await db.ds.getRepository(ProjectEntity).findOneByOrFail({ teamId: demoTeamId, name: 'Wayfinding icons' })).id
})
afterAll(async () => {
  await rc?.close()
  await db?.drop()
})

describe('every write route declares its activity', () => {
  it('walks the registry: each non-GET route records an entry or says why not', () => {
    const writes = rc.registry.routes.filter((r) => r.method !== 'get')
    expect(writes.length).toBeGreaterThanOrEqual(30)
    const missing = writes.filter((r) => {
      const a = r.activity as unknown
      if (typeof a === 'function') return false
      return !(a && typeof a === 'object' && typeof (a as { none?: unknown }).none === 'string' && (a as { none: string }).none.trim().length > 0)
    })
    expect(missing.map((r) => `${r.method.toUpperCase()} ${r.path}`)).toEqual([])
    // The representative routes below are logged, not waved through.
    const logged = new Set(writes.filter((r) => typeof r.activity === 'function').map((r) => `${r.method} ${r.path}`))
    for (const key of ['post /teams/:teamId/projects', 'delete /projects/:projectId', 'post /paths/:pathId/revisions', 'post /suites/:suiteId/runs', 'post /projects/:projectId/audits']) {
      expect(logged.has(key), key).toBe(true)
    }
    const unlogged = writes.filter((r) => typeof r.activity !== 'function').map((r) => r.path)
    expect(unlogged).toEqual(expect.arrayContaining(['/auth/login', '/auth/logout', '/solve/cubic', '/intersect', '/contains']))
  })

  it('refuses at registration a write route without a declaration', () => {
    const registry = createApiRegistry(express.Router(), {
      teamOf: async () => undefined, membership: async () => undefined, describeScoped: async () => undefined, recordActivity: async () => {},
    })
    const spec = { method: 'post', path: '/nothing', tag: 't', summary: 's', access: 'public', body: z.object({}), handler: async () => undefined }
    expect(() => registry.add(spec as unknown as RouteSpec)).toThrow(/POST \/nothing declares no activity/)
    expect(() => registry.add({ ...spec, method: 'get' } as unknown as RouteSpec)).not.toThrow()
  })
})

describe('writes add exactly one entry with the right actor, action and target', () => {
  let projectId: number
  let pathId: number

  it('projects: create, rename', async () => {
    const created = await expectOneEntry(
      async () => {
        const res = await ok(call('editor', 'post', `/teams/${demoTeamId}/projects`, { name: 'Quay signage' }), 201)
        projectId = res.body.id
      },
      { teamId: demoTeamId, actorName: 'Tobias Slipway', via: 'session', action: 'created', targetType: 'project', targetName: 'Quay signage', summary: 'Created project “Quay signage”.' },
    )
    expect(created.actorId).toBe(userIds.editor)
    expect(created.projectId).toBe(projectId)
    expect(created.targetId).toBe(projectId)
    await expectOneEntry(() => ok(call('editor', 'patch', `/projects/${projectId}`, { name: 'Quay signage, phase 2' })), {
      projectId, action: 'changed', targetType: 'project', targetName: 'Quay signage, phase 2', summary: 'Renamed project “Quay signage” to “Quay signage, phase 2”.',
    })
  })

  it('library: add a path, save and restore revisions, trash and untrash', async () => {
    const added = await expectOneEntry(
      async () => {
        pathId = (await ok(call('editor', 'post', `/projects/${projectId}/paths`, { name: 'Berth 4 arrow', data: 'M0 0H10V10H0Z' }), 201)).body.id
      },
      { teamId: demoTeamId, projectId, actorId: userIds.editor, action: 'created', targetType: 'path', targetName: 'Berth 4 arrow' },
    )
    expect(added.targetId).toBe(pathId)
    await expectOneEntry(() => ok(call('editor', 'post', `/paths/${pathId}/revisions`, { data: 'M0 0H12V12H0Z', message: 'wider' }), 201), {
      projectId, action: 'created', targetType: 'revision', targetId: pathId, targetName: 'Berth 4 arrow r2', summary: 'Saved revision 2 of path “Berth 4 arrow”.',
    })
    await expectOneEntry(() => ok(call('editor', 'post', `/paths/${pathId}/revisions/1/restore`, {}), 201), {
      projectId, action: 'restored', targetType: 'revision', summary: 'Restored revision 1 of path “Berth 4 arrow” as revision 3.',
    })
    await expectOneEntry(() => ok(call('editor', 'delete', `/paths/${pathId}`), 204), {
      projectId, action: 'trashed', targetType: 'path', targetId: pathId, targetName: 'Berth 4 arrow',
    })
    await expectOneEntry(() => ok(call('editor', 'post', `/paths/${pathId}/untrash`)), { projectId, action: 'restored', targetType: 'path', targetId: pathId })
    await expectOneEntry(() => ok(call('editor', 'post', `/projects/${projectId}/paths/bulk`, { action: 'tag', ids: [pathId], tags: ['quay'] })), {
      projectId, action: 'changed', targetType: 'path', targetId: pathId, summary: 'Tagged 1 path “quay”.',
    })
  })

  it('probe sets, suites, checks and runs (a run with a token is recorded as via token)', async () => {
    const probes = [{ type: 'ray', origin: [-5, 5], direction: [1, 0] }]
    await expectOneEntry(() => ok(call('editor', 'post', `/projects/${projectId}/probe-sets`, { name: 'Mid row', pathId, revision: 1, probes, sweeps: [] }), 201), {
      projectId, action: 'created', targetType: 'probe-set', targetName: 'Mid row',
    })
    let suiteId = 0
    await expectOneEntry(async () => {
      suiteId = (await ok(call('editor', 'post', `/projects/${projectId}/suites`, { name: 'Berth rows' }), 201)).body.id
    }, { projectId, action: 'created', targetType: 'suite', targetName: 'Berth rows' })
    await expectOneEntry(
      () => ok(call('editor', 'post', `/suites/${suiteId}/checks`, { name: 'Row 5', pathId, revision: 1, probes, sweeps: [], follow: 'latest', tolerance: CHECK_TOLERANCE }), 201),
      { projectId, action: 'created', targetType: 'check', targetName: 'Row 5', summary: 'Kept check “Row 5” in suite “Berth rows”.' },
    )
    const secret = (await ok(call('editor', 'post', '/tokens', { name: 'Berth pipeline', expiresInDays: 7 }), 201)).body.secret as string
    const run = await expectOneEntry(
      () => ok(request(rc.app).post(`/api/v1/suites/${suiteId}/runs`).set('Authorization', `Bearer ${secret}`), 201),
      { teamId: demoTeamId, projectId, actorId: userIds.editor, via: 'token', action: 'ran', targetType: 'run', targetName: 'Berth rows #1' },
    )
    expect(run.summary).toMatch(/^Ran suite “Berth rows”: run 1 (passed|failed) \(\d+ passed, \d+ failed\)\.$/)
    await expectOneEntry(() => ok(call('editor', 'delete', `/suites/${suiteId}`), 204), {
      projectId, action: 'deleted', targetType: 'suite', targetId: suiteId, targetName: 'Berth rows', summary: 'Deleted suite “Berth rows” with its checks and runs.',
    })
  })

  it('audits: start and cancel', async () => {
    const body = {
      name: 'Berth audit', selection: { all: true }, engines: ['newton'], seed: 7,
      generators: { randomRays: 3, sweepSpacing: null, vertexProbes: false, extremumProbes: false, maxProbesPerPath: 3 },
    }
    let auditId = 0
    await expectOneEntry(async () => {
      auditId = (await ok(call('editor', 'post', `/projects/${projectId}/audits`, body), 201)).body.id
    }, { projectId, action: 'ran', targetType: 'audit', targetName: 'Berth audit', summary: 'Started audit “Berth audit” over 1 path against newton.' })
    await expectOneEntry(() => ok(call('editor', 'post', `/audits/${auditId}/cancel`)), { projectId, action: 'cancelled', targetType: 'audit', targetId: auditId })
  })

  it('tokens are personal: no team, no project', async () => {
    const entry = await expectOneEntry(() => ok(call('viewer', 'post', '/tokens', { name: 'Lamp check', expiresInDays: 3 }), 201), {
      teamId: null, projectId: null, actorId: userIds.viewer, action: 'created', targetType: 'token', targetName: 'Lamp check',
    })
    await expectOneEntry(() => ok(call('viewer', 'delete', `/tokens/${entry.targetId}`), 204), {
      teamId: null, action: 'revoked', targetType: 'token', targetId: entry.targetId, summary: 'Revoked API token “Lamp check”.',
    })
  })

  it('deleting a project keeps its entries and names it in a last one', async () => {
    const before = await repo().countBy({ projectId })
    await expectOneEntry(() => ok(call('owner', 'delete', `/projects/${projectId}`), 204), {
      teamId: demoTeamId, projectId, actorId: userIds.owner, action: 'deleted', targetType: 'project', targetName: 'Quay signage, phase 2',
      summary: 'Deleted project “Quay signage, phase 2” with everything in it.',
    })
    expect(await repo().countBy({ projectId })).toBe(before + 1)
    const team = await ok(call('viewer', 'get', `/teams/${demoTeamId}/activity?targetType=project&action=deleted`))
    expect(team.body.items.map((e: { targetName: string }) => e.targetName)).toEqual(['Quay signage, phase 2'])
  })

  it('computations and sign-in add nothing', async () => {
    await expectNoEntry(() => ok(call('viewer', 'post', '/solve/cubic', { coefficients: [1, 0, -1, 0] })))
    await expectNoEntry(() => ok(call('viewer', 'post', '/intersect', { path: 'M0 0H10V10H0Z', probes: [{ type: 'ray', origin: [-1, 5], direction: [1, 0] }] })))
    await expectNoEntry(() => signIn(rc.app, 'viewer@example.com'))
  })
})

describe('failed writes add no entry', () => {
  it('400 on bad input, 403 for a role without the permission, 404 for another team', async () => {
    await expectNoEntry(() => ok(call('editor', 'post', `/teams/${demoTeamId}/projects`, { name: '' }), 400))
    await expectNoEntry(() => ok(call('editor', 'post', `/projects/${iconsId}/paths`, { name: 'Broken', data: 'M0 0 Q' }), 400))
    await expectNoEntry(() => ok(call('viewer', 'post', `/teams/${demoTeamId}/projects`, { name: 'Not mine to make' }), 403))
    await expectNoEntry(() => ok(call('editor', 'delete', `/projects/${iconsId}`), 403))
    await expectNoEntry(() => ok(call('outsider', 'patch', `/projects/${iconsId}`, { name: 'Taken over' }), 404))
    await expectNoEntry(() => ok(as.editor.agent.post(`/api/v1/teams/${demoTeamId}/projects`).send({ name: 'No CSRF token' }), 403))
  })
})

describe('the table is append-only in MariaDB', () => {
  it('refuses UPDATE and DELETE with the trigger’s message and keeps the rows as they were', async () => {
    const [first] = await repo().find({ order: { id: 'ASC' }, take: 1 })
    expect(first).toBeDefined()
    await expect(db.ds.query('UPDATE activity SET summary = ? WHERE id = ?', ['Rewritten.', first.id])).rejects.toThrow(/append-only/)
    await expect(db.ds.query('DELETE FROM activity WHERE id = ?', [first.id])).rejects.toThrow(/append-only/)
    await expect(db.ds.query('DELETE FROM activity')).rejects.toThrow(/append-only/)
    const again = await repo().findOneByOrFail({ id: first.id })
    expect(again.summary).toBe(first.summary)
  })
})

describe('reading the log', () => {
  /** A project of the demo team with entries of known dates, written straight into the table (INSERT is allowed). */
  let datedId: number
  const DATED = [
    ['2025-03-01 09:00:00.000', 'editor', 'created', 'path', 'Lift'],
    ['2025-03-01 23:59:59.999', 'editor', 'changed', 'path', 'Lift'],
    ['2025-03-02 00:00:00.000', 'owner', 'created', 'suite', 'Lift rows'],
    ['2025-03-03 12:00:00.000', 'editor', 'ran', 'run', 'Lift rows #1'],
    ['2025-03-05 08:30:00.000', 'owner', 'deleted', 'path', 'Lift'],
  ] as const

  beforeAll(async () => {
    datedId = (await ok(call('owner', 'post', `/teams/${demoTeamId}/projects`, { name: 'Dated log' }), 201)).body.id
    for (const [at, who, action, targetType, name] of DATED) {
      await db.ds.query(
        `INSERT INTO activity (team_id, project_id, actor_id, actor_name, via, action, target_type, target_id, target_name, summary, created_at)
         VALUES (?, ?, ?, ?, 'session', ?, ?, NULL, ?, ?, ?)`,
        [demoTeamId, datedId, userIds[who], who === 'owner' ? 'Morwenna Quay' : 'Tobias Slipway', action, targetType, name, `${action} ${name}`, at],
      )
    }
  })

  const names = (res: request.Response) => res.body.items.map((e: { summary: string }) => e.summary)

  it('lists newest first with the people of the log, and filters by person, action and kind', async () => {
    const all = await ok(call('viewer', 'get', `/projects/${datedId}/activity`))
    // The project's own "created" entry (written by the route) comes after the dated ones.
    expect(all.body.total).toBe(DATED.length + 1)
    expect(names(all).slice(1)).toEqual(['deleted Lift', 'ran Lift rows #1', 'created Lift rows', 'changed Lift', 'created Lift'])
    expect(all.body.items[1]).toMatchObject({ at: '2025-03-05T08:30:00.000Z', actor: { id: userIds.owner, name: 'Morwenna Quay' }, action: 'deleted', targetType: 'path', projectId: datedId, teamId: demoTeamId })
    expect(all.body.people).toEqual([{ id: userIds.owner, name: 'Morwenna Quay' }, { id: userIds.editor, name: 'Tobias Slipway' }])

    expect(names(await ok(call('viewer', 'get', `/projects/${datedId}/activity?actor=${userIds.editor}`)))).toEqual(['ran Lift rows #1', 'changed Lift', 'created Lift'])
    expect(names(await ok(call('viewer', 'get', `/projects/${datedId}/activity?action=created&targetType=path`)))).toEqual(['created Lift'])
    expect((await ok(call('viewer', 'get', `/projects/${datedId}/activity?targetType=suite`))).body.total).toBe(1)
  })

  it('filters by whole UTC days, both ends included', async () => {
    expect(names(await ok(call('viewer', 'get', `/projects/${datedId}/activity?from=2025-03-01&to=2025-03-01`)))).toEqual(['changed Lift', 'created Lift'])
    expect(names(await ok(call('viewer', 'get', `/projects/${datedId}/activity?from=2025-03-02&to=2025-03-03`)))).toEqual(['ran Lift rows #1', 'created Lift rows'])
    expect(names(await ok(call('viewer', 'get', `/projects/${datedId}/activity?from=2025-03-04&to=2025-03-04`)))).toEqual([])
    expect((await ok(call('viewer', 'get', `/projects/${datedId}/activity?to=2025-03-04`))).body.total).toBe(4)
  })

  it('pages', async () => {
    const p1 = await ok(call('viewer', 'get', `/projects/${datedId}/activity?pageSize=2&page=1&from=2025-01-01&to=2025-12-31`))
    const p3 = await ok(call('viewer', 'get', `/projects/${datedId}/activity?pageSize=2&page=3&from=2025-01-01&to=2025-12-31`))
    expect(p1.body).toMatchObject({ total: 5, page: 1, pageSize: 2 })
    expect(names(p1)).toEqual(['deleted Lift', 'ran Lift rows #1'])
    expect(names(p3)).toEqual(['created Lift'])
  })

  it('answers bad filters 400 in the error shape', async () => {
    for (const q of ['action=painted', 'targetType=glyph', 'from=03/01/2025', 'from=2025-03-05&to=2025-03-01', 'actor=-1', 'pageSize=0']) {
      const res = await ok(call('viewer', 'get', `/projects/${datedId}/activity?${q}`), 400)
      expect(res.body.error.code, q).toBe('validation')
    }
  })

  it('is readable by every member, and 404 to another team', async () => {
    for (const who of ['viewer', 'editor', 'owner'] as const) await ok(call(who, 'get', `/projects/${datedId}/activity`))
    await ok(call('outsider', 'get', `/projects/${datedId}/activity`), 404)
    await ok(call('outsider', 'get', `/teams/${demoTeamId}/activity`), 404)
    const own = await ok(call('outsider', 'get', `/teams/${otherTeamId}/activity`))
    expect(own.body).toMatchObject({ items: [], total: 0, people: [] })
    const team = await ok(call('viewer', 'get', `/teams/${demoTeamId}/activity?pageSize=200`))
    expect(team.body.items.every((e: { teamId: number }) => e.teamId === demoTeamId)).toBe(true)
    expect(team.body.items.some((e: { targetType: string }) => e.targetType === 'token')).toBe(false)
  })
})
