import type { ChildProcess } from 'node:child_process'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RootcastApp } from '../../server/app'
import { createAuditQueue } from '../../server/jobs/audit-queue'
import { spawnWorkerProcess, stopChildProcess } from '../../server/jobs/audit-services'
import { chunkWork, recordChunk } from '../../server/services/audits.service'
import { DEMO_ACCOUNTS, DEMO_PATHS } from '../../server/services/seed.service'
import { AUDIT_REPORT_COLUMNS, auditPaths, type AuditAggregate, type AuditEngine, type AuditOptions } from '../../shared/audit'
import { auditProgress, createTestAuditJobs, waitForAudit, type TestAuditJobs } from '../helpers/test-audits'
import { buildTestApp, OUTSIDER, seedTestData, signIn, type SignedIn } from '../helpers/test-app'
import { createTestDatabase, type TestDatabase } from '../helpers/test-db'
import { freePort } from '../helpers/free-port'

/**
 * Audits as jobs: the API, BullMQ over the throwaway Redis, workers (in this process and as
 * child processes) with their thread pools, and the chunk rows in MariaDB. The demo library
 * ("Wayfinding icons", 12 icons) is cut into chunks of 2 paths, so an audit has 6 chunks.
 */
const CHUNK_SIZE = 2
const ICON_COUNT = DEMO_PATHS.length
const CHUNKS = Math.ceil(ICON_COUNT / CHUNK_SIZE)
const ALL_ENGINES: AuditEngine[] = ['subdivision', 'newton', 'bezier-js', 'mathjs']

/** Small probe counts: the whole library audits in well under a second per engine. */
const smallAudit = (name: string, seed: number, extra: object = {}) => ({
  name,
  selection: { all: true },
  engines: ALL_ENGINES,
  generators: { randomRays: 7, sweepSpacing: 3.5, vertexProbes: true, extremumProbes: true, maxProbesPerPath: 45 },
  seed,
  ...extra,
})
/** Enough rays that a chunk takes a noticeable while on one thread, so a worker can be stopped between chunks. */
const slowAudit = (name: string) => ({
  ...smallAudit(name, 808_017),
  engines: ['newton', 'bezier-js'],
  generators: { randomRays: 5000, sweepSpacing: null, vertexProbes: false, extremumProbes: false, maxProbesPerPath: 5000 },
})

let db: TestDatabase
let rc: RootcastApp
let jobs: TestAuditJobs
let iconsId: number
const as: Record<'viewer' | 'editor' | 'owner' | 'outsider', SignedIn> = {} as never

type Who = 'anonymous' | keyof typeof as
function call(who: Who, method: 'get' | 'post', url: string, body?: object, app = rc) {
  const client = who === 'anonymous' ? request(app.app) : as[who].agent
  let req = client[method](`/api/v1${url}`)
  if (who !== 'anonymous') req = req.set('X-CSRF-Token', as[who].csrf)
  return body ? req.send(body) : req
}

async function startAudit(body: object, who: Who = 'editor'): Promise<number> {
  const res = await call(who, 'post', `/projects/${iconsId}/audits`, body)
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  return res.body.id
}

/** The stored report text, byte for byte. */
async function reportText(auditId: number): Promise<string | null> {
  const [r] = (await db.ds.query('SELECT report FROM audits WHERE id = ?', [auditId])) as Array<{ report: string | null }>
  return r.report
}

async function chunkRows(auditId: number): Promise<number[]> {
  const rows = (await db.ds.query('SELECT chunk FROM audit_chunks WHERE audit_id = ? ORDER BY chunk', [auditId])) as Array<{ chunk: number }>
  return rows.map((r) => Number(r.chunk))
}

/** The icons as the audit reads them: current revisions of the live paths, by id. */
async function iconInputs() {
  const rows = (await db.ds.query(
    'SELECT p.id AS pathId, p.name AS name, r.data AS data FROM paths p JOIN revisions r ON r.id = p.current_revision_id WHERE p.project_id = ? AND p.deleted_at IS NULL ORDER BY p.id',
    [iconsId],
  )) as Array<{ pathId: number; name: string; data: string }>
  return rows.map((r) => ({ pathId: Number(r.pathId), name: r.name, data: r.data }))
}

/** The same audit computed in this process by the core in one pass (no queue, no chunks). */
async function directReport(body: ReturnType<typeof smallAudit>): Promise<AuditAggregate> {
  const options: AuditOptions = { engines: body.engines as AuditEngine[], generators: body.generators, seed: body.seed }
  return auditPaths(await iconInputs(), options)
}

beforeAll(async () => {
  db = await createTestDatabase()
  const { demoTeamId } = await seedTestData(db.ds)
  jobs = createTestAuditJobs({ chunkSize: CHUNK_SIZE })
  rc = buildTestApp(db.ds, { auditQueue: jobs.queue })
  for (const [who, email] of [['viewer', 'viewer@example.com'], ['editor', 'editor@example.com'], ['owner', 'owner@example.com'], ['outsider', OUTSIDER.email]] as const) {
    as[who] = await signIn(rc.app, email)
  }
  const projects = await call('viewer', 'get', `/teams/${demoTeamId}/projects`)
  iconsId = projects.body.items.find((p: { name: string }) => p.name === 'Wayfinding icons').id
})
afterAll(async () => {
  await jobs?.close()
  await rc?.close()
  await db?.drop()
})

describe('an audit of the demo library with all engines', () => {
  const SEED = 20_251_204
  let first: number
  let again: number
  let otherSeed: number

  beforeAll(async () => {
    const worker = jobs.startWorker(db.ds)
    first = await startAudit(smallAudit('Icons, seed A', SEED))
    again = await startAudit(smallAudit('Icons, seed A again', SEED))
    otherSeed = await startAudit(smallAudit('Icons, seed B', SEED + 1))
    for (const id of [first, again, otherSeed]) await waitForAudit(db.ds, id)
    await worker.close()
  })

  it('answers the queued audit on create, then completes with every chunk stored once', async () => {
    const id = await startAudit(smallAudit('Queued answer', SEED))
    const res = await call('viewer', 'get', `/audits/${id}`)
    expect(res.body).toMatchObject({
      id, projectId: iconsId, status: 'queued', progress: { done: 0, total: CHUNKS }, pathCount: ICON_COUNT,
      engines: ALL_ENGINES, createdBy: DEMO_ACCOUNTS.find((a) => a.role === 'editor')!.displayName, report: null,
      selection: { all: true }, options: { seed: SEED, engines: ALL_ENGINES },
    })
    const done = await call('viewer', 'get', `/audits/${first}`)
    expect(done.body.status).toBe('completed')
    expect(done.body.progress).toEqual({ done: CHUNKS, total: CHUNKS })
    expect(done.body.startedAt).not.toBeNull()
    expect(done.body.finishedAt).not.toBeNull()
    expect(await chunkRows(first)).toEqual([...Array(CHUNKS).keys()])
    expect((await call('editor', 'post', `/audits/${id}/cancel`)).body.status).toBe('cancelled')
  })

  it('gives the report the core computes in one pass, and the same bytes for the same seed', async () => {
    const report = (await call('viewer', 'get', `/audits/${first}`)).body.report as AuditAggregate
    expect(report).toEqual(await directReport(smallAudit('', SEED)))
    expect(report.paths).toBe(ICON_COUNT)
    expect(report.invalidPaths).toBe(0)
    expect(report.engines).toEqual(ALL_ENGINES)
    expect(await reportText(again)).toBe(await reportText(first))
    // The seed matters: another seed draws other rays.
    const other = JSON.parse((await reportText(otherSeed))!) as AuditAggregate
    expect(other.byEngine[0].categories['random-ray']).not.toEqual(report.byEngine[0].categories['random-ray'])
  })

  it('counts consistently: one reference for every engine, each reference hit matched or missed', async () => {
    const report = JSON.parse((await reportText(first))!) as AuditAggregate
    const references = report.byEngine.map((e) => Object.values(e.categories).map((c) => c.referenceHits))
    for (const r of references) expect(r).toEqual(references[0])
    expect(references[0].reduce((a, b) => a + b, 0)).toBeGreaterThan(ICON_COUNT)
    for (const e of report.byEngine) for (const c of Object.values(e.categories)) expect(c.matched + c.missed, e.engine).toBe(c.referenceHits)
  })

  it('exports the report as CSV rows per engine and category, and as a JSON download', async () => {
    const report = JSON.parse((await reportText(first))!) as AuditAggregate
    const csv = await call('viewer', 'get', `/audits/${first}/report.csv`)
    expect(csv.status).toBe(200)
    expect(csv.headers['content-type']).toMatch(/^text\/csv/)
    expect(csv.headers['content-disposition']).toBe('attachment; filename=Icons-seed-A.audit.csv')
    const lines = csv.text.trimEnd().split('\r\n')
    expect(lines[0]).toBe(AUDIT_REPORT_COLUMNS.join(','))
    expect(lines).toHaveLength(1 + ALL_ENGINES.length * 5)
    const newton = report.byEngine.find((e) => e.engine === 'newton')!
    const v = newton.categories.vertex
    expect(lines).toContain(`newton,vertex,${report.probesByCategory.vertex},${v.referenceHits},${v.matched},${v.missed},${v.spurious},${v.wrongWinding},${v.wrongKind}`)

    const json = await call('viewer', 'get', `/audits/${first}/report.json`)
    expect(json.status).toBe(200)
    expect(json.headers['content-disposition']).toContain('Icons-seed-A.audit.json')
    expect(JSON.parse(json.text)).toEqual(report)
  })

  it('lists the project’s audits newest first, without reports', async () => {
    const res = await call('viewer', 'get', `/projects/${iconsId}/audits`)
    expect(res.status).toBe(200)
    const ids = res.body.items.map((a: { id: number }) => a.id)
    expect(ids.indexOf(otherSeed)).toBeLessThan(ids.indexOf(first))
    expect(res.body.items.find((a: { id: number }) => a.id === first)).toMatchObject({ status: 'completed', progress: { done: CHUNKS, total: CHUNKS } })
    expect(res.body.items[0]).not.toHaveProperty('report')
  })
})

describe('audits under the role checks and input rules', () => {
  it('lets viewers read, editors and owners start and cancel, and hides audits from other teams', async () => {
    const target = await startAudit(smallAudit('Role target', 5))
    expect((await call('viewer', 'get', `/projects/${iconsId}/audits`)).status).toBe(200)
    expect((await call('viewer', 'get', `/audits/${target}`)).status).toBe(200)
    expect((await call('viewer', 'post', `/projects/${iconsId}/audits`, smallAudit('By a viewer', 5))).status).toBe(403)
    expect((await call('viewer', 'post', `/audits/${target}/cancel`)).status).toBe(403)
    expect((await call('outsider', 'get', `/audits/${target}`)).status).toBe(404)
    expect((await call('outsider', 'get', `/projects/${iconsId}/audits`)).status).toBe(404)
    expect((await call('outsider', 'post', `/audits/${target}/cancel`)).status).toBe(404)
    expect((await call('anonymous', 'get', `/audits/${target}`)).status).toBe(401)
    expect((await call('owner', 'post', `/audits/${target}/cancel`)).body.status).toBe('cancelled')
    const byOwner = await startAudit(smallAudit('By the owner', 5), 'owner')
    expect((await call('editor', 'post', `/audits/${byOwner}/cancel`)).body.status).toBe('cancelled')
    // A viewer reading a report of an audit that never completed: 409.
    const csv = await call('viewer', 'get', `/audits/${target}/report.csv`)
    expect(csv.status).toBe(409)
    expect(csv.body.error.code).toBe('audit_not_completed')
  })

  it('refuses bad input with 400 and writes nothing', async () => {
    const before = (await db.ds.query('SELECT COUNT(*) AS n FROM audits')) as Array<{ n: number }>
    const bad = async (body: object, code: string) => {
      const res = await call('editor', 'post', `/projects/${iconsId}/audits`, body)
      expect(res.status, JSON.stringify(body)).toBe(400)
      expect(res.body.error.code).toBe(code)
    }
    await bad(smallAudit('No engines', 1, { engines: [] }), 'validation')
    await bad(smallAudit('Twice', 1, { engines: ['newton', 'newton'] }), 'validation')
    await bad(smallAudit('Unknown engine', 1, { engines: ['secant'] }), 'validation')
    await bad(smallAudit('No probes', 1, { generators: { randomRays: 0, sweepSpacing: null, vertexProbes: false, extremumProbes: false, maxProbesPerPath: 10 } }), 'validation')
    await bad(smallAudit('Bad seed', 1.5), 'validation')
    await bad(smallAudit('Two selections', 1, { selection: { all: true, tag: 'arrow' } }), 'validation')
    await bad(smallAudit('No such tag', 1, { selection: { tag: 'no-such-tag' } }), 'empty_selection')
    await bad(smallAudit('Foreign ids', 1, { selection: { pathIds: [999_999] } }), 'unknown_paths')
    const after = (await db.ds.query('SELECT COUNT(*) AS n FROM audits')) as Array<{ n: number }>
    expect(Number(after[0].n)).toBe(Number(before[0].n))
  })

  it('audits a tag or a list of paths, and answers 503 queue_unavailable without a reachable queue', async () => {
    const arrows = DEMO_PATHS.filter((p) => p.tags.includes('arrow')).length
    const byTag = await call('viewer', 'get', `/audits/${await startAudit(smallAudit('Arrows', 3, { selection: { tag: 'arrow' } }))}`)
    expect(byTag.body).toMatchObject({ pathCount: arrows, progress: { done: 0, total: Math.ceil(arrows / CHUNK_SIZE) } })
    const ids = (await iconInputs()).slice(0, 3).map((p) => p.pathId)
    const byIds = await call('viewer', 'get', `/audits/${await startAudit(smallAudit('Three', 3, { selection: { pathIds: [ids[2], ids[0], ids[1], ids[0]] } }))}`)
    expect(byIds.body).toMatchObject({ pathCount: 3, selection: { pathIds: [ids[2], ids[0], ids[1], ids[0]] } })
    for (const id of [byTag.body.id, byIds.body.id]) expect((await call('editor', 'post', `/audits/${id}/cancel`)).status).toBe(200)

    // No queue at all, and a queue whose Redis does not answer (nothing listens on the port).
    const unreachable = createAuditQueue({ redisUrl: `redis://127.0.0.1:${await freePort()}`, callTimeoutMs: 300 })
    for (const auditQueue of [undefined, unreachable]) {
      const app = buildTestApp(db.ds, { auditQueue })
      try {
        const editor = await signIn(app.app, 'editor@example.com')
        const before = (await db.ds.query('SELECT COUNT(*) AS n FROM audits')) as Array<{ n: number }>
        const res = await editor.agent.post(`/api/v1/projects/${iconsId}/audits`).set('X-CSRF-Token', editor.csrf).send(smallAudit('Nowhere to go', 3))
        expect(res.status).toBe(503)
        expect(res.body.error.code).toBe('queue_unavailable')
        const after = (await db.ds.query('SELECT COUNT(*) AS n FROM audits')) as Array<{ n: number }>
        expect(Number(after[0].n), 'the audit that could not be queued is gone').toBe(Number(before[0].n))
      } finally {
        await app.close()
      }
    }
    await unreachable.close()
  })
})

describe('cancelling and idempotent chunks', () => {
  it('cancels a queued audit: its jobs leave the queue and a late job stores nothing', async () => {
    const id = await startAudit(smallAudit('To cancel', 11))
    expect(await jobs.jobCount(id, CHUNKS)).toBe(CHUNKS)
    const res = await call('editor', 'post', `/audits/${id}/cancel`)
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ status: 'cancelled', progress: { done: 0, total: CHUNKS } })
    expect(res.body.finishedAt).not.toBeNull()
    expect(await jobs.jobCount(id, CHUNKS)).toBe(0)
    expect((await call('editor', 'post', `/audits/${id}/cancel`)).body.error.code).toBe('audit_finished')
    // A chunk job that was already taken (re-added here) finds the audit cancelled and skips.
    await jobs.queue.enqueue(id, 1)
    const worker = jobs.startWorker(db.ds, { threads: 1 })
    const outcome = await new Promise((resolve) => worker.worker.once('completed', (_job, r) => resolve(r)))
    await worker.close()
    expect(outcome).toBe('skipped')
    expect(await chunkRows(id)).toEqual([])
    expect((await auditProgress(db.ds, id)).status).toBe('cancelled')
  })

  it('fails an audit whose chunk fails on every attempt, and says why', async () => {
    const id = await startAudit(smallAudit('Doomed', 13, { selection: { tag: 'quadratic' } }))
    // Options the core refuses (RangeError in the worker thread), as a damaged row would hold.
    const [row] = (await db.ds.query('SELECT options FROM audits WHERE id = ?', [id])) as Array<{ options: string }>
    const options = JSON.parse(row.options)
    await db.ds.query('UPDATE audits SET options = ? WHERE id = ?', [JSON.stringify({ ...options, generators: { ...options.generators, maxProbesPerPath: 0 } }), id])
    const worker = jobs.startWorker(db.ds, { threads: 1 })
    await waitForAudit(db.ds, id, (p) => p.status === 'failed')
    await worker.close()
    const res = await call('viewer', 'get', `/audits/${id}`)
    expect(res.body.status).toBe('failed')
    expect(res.body.error).toMatch(/^Chunk 1 failed: .*maxProbesPerPath/)
    expect(res.body.finishedAt).not.toBeNull()
    expect(await chunkRows(id)).toEqual([])
  })

  it('keeps a chunk stored twice as one row and counts it once', async () => {
    const id = await startAudit(smallAudit('Twice stored', 12))
    await jobs.queue.remove(id, CHUNKS)
    const work = await chunkWork(db.ds, id, 0)
    expect(work?.paths).toHaveLength(CHUNK_SIZE)
    const json = JSON.stringify(auditPaths(work!.paths, work!.options))
    expect(await recordChunk(db.ds, id, 0, json)).toBe('stored')
    expect(await recordChunk(db.ds, id, 0, json)).toBe('stored')
    expect(await chunkRows(id)).toEqual([0])
    expect(await auditProgress(db.ds, id)).toEqual({ status: 'running', done: 1, total: CHUNKS })
    // Once stored, the chunk is no longer work for anyone.
    expect(await chunkWork(db.ds, id, 0)).toBeUndefined()
  })
})

describe('resuming after a crash or a restart', () => {
  let child: ChildProcess | undefined
  let childLog = ''
  afterAll(async () => {
    if (child) await stopChildProcess(child, 1000)
  })

  it('finishes an audit whose worker process was killed mid-way, with one row per chunk and the uninterrupted report', async () => {
    const id = await startAudit(slowAudit('Killed worker'))
    child = spawnWorkerProcess(
      {
        ...process.env,
        NODE_ENV: 'test',
        DATABASE_URL: db.url,
        ROOTCAST_REDIS_URL: jobs.redisUrl,
        ROOTCAST_QUEUE_PREFIX: jobs.prefix,
        ROOTCAST_AUDIT_THREADS: '1',
        ROOTCAST_AUDIT_LOCK_SECONDS: '1',
      },
      'pipe',
    )
    child.stdout?.on('data', (d) => (childLog += d))
    child.stderr?.on('data', (d) => (childLog += d))
    const exited = new Promise((r) => child!.once('exit', r))
    await waitForAudit(db.ds, id, (p) => p.done >= 1, 60_000).catch((e) => {
      throw new Error(`${e.message}\nworker output:\n${childLog}`)
    })
    child.kill('SIGKILL')
    await exited
    child = undefined
    const atKill = await auditProgress(db.ds, id)
    expect(atKill.status, 'the worker was killed before the audit was over').toBe('running')
    expect(atKill.done).toBeLessThan(CHUNKS)

    const worker = jobs.startWorker(db.ds)
    await waitForAudit(db.ds, id)
    expect(await chunkRows(id)).toEqual([...Array(CHUNKS).keys()])

    const uninterrupted = await startAudit(slowAudit('Uninterrupted'))
    await waitForAudit(db.ds, uninterrupted)
    await worker.close()
    expect(await reportText(id)).toBe(await reportText(uninterrupted))
  })

  it('shows the progress to a restarted server, whose queue still holds the jobs', async () => {
    const id = await startAudit(smallAudit('Across a restart', 31))
    // Two chunks done before the restart, by hand (as a worker would).
    for (const chunk of [0, 1]) {
      const work = (await chunkWork(db.ds, id, chunk))!
      await recordChunk(db.ds, id, chunk, JSON.stringify(auditPaths(work.paths, work.options)))
    }
    await rc.close()
    await jobs.queue.close()

    const restartedQueue = createAuditQueue({ redisUrl: jobs.redisUrl, prefix: jobs.prefix, chunkSize: CHUNK_SIZE })
    const restarted = buildTestApp(db.ds, { auditQueue: restartedQueue })
    try {
      const viewer = await signIn(restarted.app, 'viewer@example.com')
      const seen = await viewer.agent.get(`/api/v1/audits/${id}`)
      expect(seen.body).toMatchObject({ status: 'running', progress: { done: 2, total: CHUNKS } })
      const worker = jobs.startWorker(db.ds)
      await waitForAudit(db.ds, id)
      await worker.close()
      const done = await viewer.agent.get(`/api/v1/audits/${id}`)
      expect(done.body).toMatchObject({ status: 'completed', progress: { done: CHUNKS, total: CHUNKS } })
      expect(done.body.report).toEqual(await directReport(smallAudit('', 31)))
    } finally {
      await restarted.close()
      await restartedQueue.close()
      rc = buildTestApp(db.ds, { auditQueue: jobs.queue })
    }
  })
})
