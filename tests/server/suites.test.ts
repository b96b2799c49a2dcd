/**
 * Suites, checks and runs through the API: expected hits computed by the server, a run
 * that passes, a new revision that moves the bottom of a path so that a following check
 * fails with named differences while a pinned one passes, JUnit XML read back as XML, per
 * check history, role limits, the seeded suites, mail to watchers and runs with an API token.
 *
 * The test path (invented): a 20 × 10 box whose bottom is the cubic (20,10) → (0,10) with
 * controls (15,14) and (5,14). By the Bernstein form (common practice), the cubic's point at
 * t = ½ is (P0 + 3P1 + 3P2 + P3)/8 = (10, 13); it is symmetric about x = 10. Revision 2 lifts
 * both controls to y = 11, so that point becomes (10, 10.75), and the bottom no longer
 * reaches y = 12.
 */
import request from 'supertest'
import { parse } from 'svgson'
import type { INode } from 'svgson'
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest'
import type { RootcastApp } from '../../server/app'
import { CheckEntity } from '../../server/entities/check.entity'
import { RunEntity } from '../../server/entities/run.entity'
import { RunResultEntity } from '../../server/entities/run-result.entity'
import { SuiteEntity } from '../../server/entities/suite.entity'
import { DEMO_POINT_TOLERANCE, DEMO_T_TOLERANCE } from '../../server/services/demo-suites'
import { DEMO_GLYPH_TEXT } from '../../server/services/seed.service'
import type { Mailer } from '../../server/services/mail.service'
import { buildTestApp, OUTSIDER, seedTestData, signIn, type SignedIn } from '../helpers/test-app'
import { createTestDatabase, type TestDatabase } from '../helpers/test-db'
import { startTestMailbox, type TestMailbox } from '../helpers/test-mail'

/** Not the default public URL (http://HOST:PORT), so links cannot pass on the default. */
const PUBLIC_URL = 'http://rootcast.harbour.test:8123'
const BOX_V1 = 'M0 0H20V10C15 14 5 14 0 10Z'
const BOX_V2 = 'M0 0H20V10C15 11 5 11 0 10Z'
/**
 * Closed-form hits on this small path are within a few ulps of the hand values (coordinates
 * ≤ 20, where an ulp is 2^-48 ≈ 3.6e-15); 1e-12 leaves a wide margin and is still exact enough
 * to tell 13 from anything a wrong root would give.
 */
const HAND_TOLERANCE = 1e-12
/** Tolerances of the test checks: far below the 2.25-unit move of revision 2. */
const CHECK_TOLERANCE = { point: 1e-6, t: 1e-9 }

const probes = [
  // Through both vertical sides at y = 5: unchanged by revision 2.
  { type: 'ray', origin: [-5, 5], direction: [1, 0] },
  // Across the bottom at y = 12: two hits on revision 1, none on revision 2.
  { type: 'ray', origin: [-5, 12], direction: [1, 0] },
] as const
// Vertical lines x = 15, 10, 5 (angle 90°: direction (0, 1), steps along (−1, 0)).
const sweeps = [{ angle: 90, spacing: 5, count: 3, origin: [15, -5] }] as const

let db: TestDatabase
let rc: RootcastApp
let mailbox: TestMailbox
let iconsId: number
let glyphsId: number
let boxId: number
let suiteId: number
let followId: number
let pinnedId: number
let firstRunId: number
let failedRunId: number
const as: Record<'viewer' | 'editor' | 'owner' | 'outsider', SignedIn> = {} as never

type Who = 'anonymous' | keyof typeof as
function call(who: Who, method: 'get' | 'post' | 'put' | 'patch' | 'delete', url: string, body?: object) {
  const client = who === 'anonymous' ? request(rc.app) : as[who].agent
  let req = client[method](`/api/v1${url}`)
  if (who !== 'anonymous') req = req.set('X-CSRF-Token', as[who].csrf)
  return body ? req.send(body) : req
}
async function ok(res: request.Response | Promise<request.Response>, status = 200): Promise<request.Response> {
  const r = await res
  expect(r.status, JSON.stringify(r.body)).toBe(status)
  return r
}
const checkBody = (name: string, extra: object = {}) => ({
  name, pathId: boxId, revision: 1, probes, sweeps, follow: 'latest', tolerance: CHECK_TOLERANCE, ...extra,
})
async function newSuite(name: string, projectId = iconsId): Promise<number> {
  return (await ok(call('editor', 'post', `/projects/${projectId}/suites`, { name }), 201)).body.id
}
async function projectIdOf(teamId: number, name: string): Promise<number> {
  const res = await call('viewer', 'get', `/teams/${teamId}/projects`)
  return res.body.items.find((p: { name: string }) => p.name === name).id
}

/** The five entities of XML 1.0 and numeric references (svgson leaves them as written). */
function decodeXml(text: string): string {
  const named: Record<string, string> = { amp: '&', lt: '<', gt: '>', quot: '"', apos: "'" }
  return text.replace(/&(#\d+|#x[0-9a-f]+|amp|lt|gt|quot|apos);/gi, (_, e: string) =>
    e[0] === '#' ? String.fromCodePoint(e[1] === 'x' ? parseInt(e.slice(2), 16) : Number(e.slice(1))) : named[e])
}
/** JUnit XML as a tree: svgson reads only an <svg> root, so the document is wrapped in one after its prologue. */
async function readJunit(xml: string): Promise<INode> {
  expect(xml.startsWith('<?xml version="1.0" encoding="UTF-8"?>\n')).toBe(true)
  // Every & starts an entity or character reference: nothing was left unescaped.
  expect(xml).not.toMatch(/&(?!(#\d+|#x[0-9a-f]+|amp|lt|gt|quot|apos);)/i)
  const root = await parse(`<svg>${xml.replace(/^<\?xml[^>]*\?>/, '')}</svg>`)
  const elements = root.children.filter((n) => n.type === 'element')
  expect(elements.map((n) => n.name)).toEqual(['testsuites'])
  return elements[0]
}
const childElements = (node: INode, name: string) => node.children.filter((n) => n.type === 'element' && n.name === name)
const textOf = (node: INode) => decodeXml(node.children.map((n) => n.value).join(''))

beforeAll(async () => {
  db = await createTestDatabase()
  const { demoTeamId } = await seedTestData(db.ds)
  mailbox = await startTestMailbox()
  rc = buildTestApp(db.ds, { env: { ROOTCAST_PUBLIC_URL: PUBLIC_URL }, mailer: mailbox.mailer })
  for (const [who, email] of [['viewer', 'viewer@example.com'], ['editor', 'editor@example.com'], ['owner', 'owner@example.com'], ['outsider', OUTSIDER.email]] as const) {
    as[who] = await signIn(rc.app, email)
  }
  iconsId = await projectIdOf(demoTeamId, 'Wayfinding icons')
  glyphsId = await projectIdOf(demoTeamId, 'Headline glyph review')
  boxId = (await ok(call('editor', 'post', `/projects/${iconsId}/paths`, { name: 'Box with a cubic bottom', data: BOX_V1 }), 201)).body.id
})
afterAll(async () => {
  await rc?.close()
  await mailbox?.stop()
  await db?.drop()
})

describe('a suite whose checks pass, then fail after a revision moves a point', () => {
  it('computes the expected hits on the server, from the stored revision', async () => {
    suiteId = await newSuite('Box regression')
    const follow = (await ok(call('editor', 'post', `/suites/${suiteId}/checks`, checkBody('Box follows latest')), 201)).body
    followId = follow.id
    pinnedId = (await ok(call('editor', 'post', `/suites/${suiteId}/checks`, checkBody('Box pinned to 1', { follow: 'pinned' })), 201)).body.id
    expect(follow).toMatchObject({ suiteId, pathId: boxId, pathName: 'Box with a cubic bottom', revision: 1, follow: 'latest', tolerance: CHECK_TOLERANCE, matchKinds: true, matchWinding: true })
    // Probes first, then the sweep's three lines.
    expect(follow.expected.map((hits: unknown[]) => hits.length)).toEqual([2, 2, 2, 2, 2])
    // The sides at y = 5: segment 3 (the closing line, upwards: winding −1) and segment 1 (downwards: +1).
    expect(follow.expected[0].map((h: { segment: number; winding: number; point: number[] }) => [h.segment, h.winding, h.point])).toEqual([[3, -1, [0, 5]], [1, 1, [20, 5]]])
    // Line x = 10 meets the top at (10, 0) and the cubic at t = ½, (10, 13).
    const [top, bottom] = follow.expected[3]
    expect(top).toMatchObject({ segment: 0, point: [10, 0], kind: 'crossing' })
    expect(bottom.segment).toBe(2)
    expect(Math.abs(bottom.t - 0.5)).toBeLessThanOrEqual(HAND_TOLERANCE)
    expect(Math.abs(bottom.point[1] - 13)).toBeLessThanOrEqual(HAND_TOLERANCE)
    // The same hits as the public computation answers for the same data.
    const lines = [...probes, ...[15, 10, 5].map((x) => ({ type: 'line', origin: [x, -5], direction: [0, 1] }))]
    const computed = await ok(call('viewer', 'post', '/intersect', { path: BOX_V1, probes: lines }))
    expect(follow.expected).toEqual(computed.body.results.map((r: { hits: unknown[] }) => r.hits))
    expect(JSON.parse((await db.ds.getRepository(CheckEntity).findOneByOrFail({ id: followId })).expected)).toEqual(follow.expected)
  })

  it('never takes expected hits from the client', async () => {
    const res = await call('editor', 'post', `/suites/${suiteId}/checks`, checkBody('Client hits', { expected: [[]] }))
    expect(res.status).toBe(400)
    expect(await db.ds.getRepository(CheckEntity).countBy({ name: 'Client hits' })).toBe(0)
  })

  it('passes run 1 on revision 1', async () => {
    const run = (await ok(call('editor', 'post', `/suites/${suiteId}/runs`), 201)).body
    firstRunId = run.id
    expect(run).toMatchObject({ suiteId, number: 1, verdict: 'passed', passed: 2, failed: 0, trigger: 'screen', by: 'Tobias Slipway' })
    expect(run.url).toBe(`${PUBLIC_URL}/projects/${iconsId}/suites?run=${run.id}`)
    expect(run.results.map((r: { checkName: string; verdict: string; revision: number; differences: unknown[] }) => [r.checkName, r.verdict, r.revision, r.differences.length]))
      .toEqual([['Box follows latest', 'passed', 1, 0], ['Box pinned to 1', 'passed', 1, 0]])
    expect(run.results[0].canvasUrl).toBe(`${PUBLIC_URL}/projects/${iconsId}/canvas?paths=${boxId}&check=${followId}`)
    const row = await db.ds.getRepository(RunEntity).findOneByOrFail({ id: run.id })
    expect(row).toMatchObject({ number: 1, verdict: 'passed', trigger: 'screen', byName: 'Tobias Slipway' })
    expect(await db.ds.getRepository(RunResultEntity).countBy({ runId: run.id })).toBe(2)
  })

  it('fails the following check after revision 2, naming moved and missing hits, while the pinned one passes', async () => {
    await ok(call('owner', 'put', `/suites/${suiteId}/watch`, { watching: true }))
    await ok(call('editor', 'post', `/paths/${boxId}/revisions`, { data: BOX_V2, message: 'Flatter bottom' }), 201)
    const run = (await ok(call('editor', 'post', `/suites/${suiteId}/runs`), 201)).body
    failedRunId = run.id
    expect(run).toMatchObject({ number: 2, verdict: 'failed', passed: 1, failed: 1 })
    const [follow, pinned] = run.results
    expect(pinned).toMatchObject({ checkId: pinnedId, verdict: 'passed', revision: 1, differences: [] })
    expect(follow).toMatchObject({ checkId: followId, verdict: 'failed', revision: 2, error: null, differenceCount: 5 })
    expect(follow.differences.map((d: { line: number; lineLabel: string; kind: string }) => [d.line, d.lineLabel, d.kind])).toEqual([
      [1, 'probe 2', 'missing'],
      [1, 'probe 2', 'missing'],
      [2, 'sweep 1, line 1', 'moved'],
      [3, 'sweep 1, line 2', 'moved'],
      [4, 'sweep 1, line 3', 'moved'],
    ])
    // On x = 10 the bottom rose from (10, 13) to (10, 10.75): moved by 2.25 at the same t = ½.
    const middle = follow.differences[3]
    expect(Math.abs(middle.distance - 2.25)).toBeLessThanOrEqual(HAND_TOLERANCE)
    expect(middle.tError).toBeLessThanOrEqual(HAND_TOLERANCE)
    expect(Math.abs(middle.actual.point[1] - 10.75)).toBeLessThanOrEqual(HAND_TOLERANCE)
    expect(follow.differences[0]).toMatchObject({ actual: null, distance: null, tError: null, expected: { segment: 2 } })
  })

  it('mails the watcher with the verdict and the link to the run', async () => {
    const subject = `Rootcast: suite “Box regression” failed (run 2)`
    const mail = await mailbox.waitForMessage((m) => m.subject === subject)
    expect(mail.to).toEqual(['owner@example.com'])
    expect(mail.text).toContain(`${PUBLIC_URL}/projects/${iconsId}/suites?run=${failedRunId}`)
    expect(mail.text).toContain('- Box follows latest (revision 2): failed, 2 missing, 3 moved')
    expect(mail.text).toContain(`${PUBLIC_URL}/projects/${iconsId}/canvas?paths=${boxId}&check=${followId}`)
    expect(mail.text).not.toContain('Box pinned to 1')
    // The editor ran the suite but does not watch it.
    expect(mailbox.fake.messages().filter((m) => m.subject === subject).flatMap((m) => m.to)).toEqual(['owner@example.com'])
  })

  it('serves the failed run as JUnit XML: one testcase per check, one failure', async () => {
    const res = await ok(call('viewer', 'get', `/runs/${failedRunId}/junit.xml`))
    expect(res.headers['content-type']).toMatch(/^application\/xml/)
    const suites = await readJunit(res.text)
    expect(suites.attributes).toMatchObject({ tests: '2', failures: '1', errors: '0' })
    const [suite] = childElements(suites, 'testsuite')
    expect(childElements(suites, 'testsuite')).toHaveLength(1)
    expect(suite.attributes).toMatchObject({ name: 'Box regression', tests: '2', failures: '1', errors: '0', skipped: '0' })
    expect(suite.attributes.timestamp).toMatch(/^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d$/)
    const cases = childElements(suite, 'testcase')
    expect(cases.map((c) => [c.attributes.classname, c.attributes.name])).toEqual([
      ['rootcast.Wayfinding icons.Box regression', 'Box follows latest'],
      ['rootcast.Wayfinding icons.Box regression', 'Box pinned to 1'],
    ])
    for (const c of cases) expect(Number(c.attributes.time)).toBeGreaterThanOrEqual(0)
    const failures = cases.map((c) => childElements(c, 'failure'))
    expect(failures.map((f) => f.length)).toEqual([1, 0])
    const [failure] = failures[0]
    expect(failure.attributes).toMatchObject({ type: 'HitMismatch', message: '2 missing, 3 moved' })
    const body = textOf(failure)
    expect(body).toContain('sweep 1, line 2: moved')
    expect(body).toContain('probe 2: missing')
    expect(body).toContain(`${PUBLIC_URL}/projects/${iconsId}/canvas?paths=${boxId}&check=${followId}`)
  })

  it('escapes names in the XML: a check named with markup reads back as written', async () => {
    const odd = await newSuite('Odd <names> & "quotes"')
    const name = `Bowl <R> & 'tail' "1.0"`
    await ok(call('editor', 'post', `/suites/${odd}/checks`, checkBody(name)), 201)
    const run = (await ok(call('editor', 'post', `/suites/${odd}/runs`), 201)).body
    const suites = await readJunit((await ok(call('viewer', 'get', `/runs/${run.id}/junit.xml`))).text)
    const [suite] = childElements(suites, 'testsuite')
    expect(decodeXml(suite.attributes.name)).toBe('Odd <names> & "quotes"')
    const [testcase] = childElements(suite, 'testcase')
    expect(decodeXml(testcase.attributes.name)).toBe(name)
    // A dot inside a name would add a level to the class name.
    expect(decodeXml(testcase.attributes.classname)).toBe('rootcast.Wayfinding icons.Odd <names> & "quotes"')
  })

  it('keeps per-check history, newest first', async () => {
    const follow = (await ok(call('viewer', 'get', `/checks/${followId}/runs`))).body
    expect(follow.total).toBe(2)
    expect(follow.items.map((r: { runNumber: number; verdict: string; revision: number; differences: number }) => [r.runNumber, r.verdict, r.revision, r.differences]))
      .toEqual([[2, 'failed', 2, 5], [1, 'passed', 1, 0]])
    expect(follow.items[0].url).toBe(`${PUBLIC_URL}/projects/${iconsId}/suites?run=${failedRunId}`)
    const pinned = (await ok(call('viewer', 'get', `/checks/${pinnedId}/runs?pageSize=1`))).body
    expect(pinned).toMatchObject({ total: 2, page: 1, pageSize: 1 })
    expect(pinned.items.map((r: { runId: number; verdict: string }) => [r.runId, r.verdict])).toEqual([[failedRunId, 'passed']])
  })

  it('lists the runs newest first, paged, and shows the last one on the suite', async () => {
    const page = (await ok(call('viewer', 'get', `/suites/${suiteId}/runs?page=2&pageSize=1`))).body
    expect(page).toMatchObject({ total: 2, page: 2, pageSize: 1 })
    expect(page.items.map((r: { id: number }) => r.id)).toEqual([firstRunId])
    const suite = (await ok(call('owner', 'get', `/suites/${suiteId}`))).body
    expect(suite).toMatchObject({ name: 'Box regression', checkCount: 2, watching: true, lastRun: { id: failedRunId, number: 2, verdict: 'failed' } })
    expect((await ok(call('editor', 'get', `/suites/${suiteId}`))).body.watching).toBe(false)
  })

  it('passes again once the following check keeps revision 2 as expected; the change is stored', async () => {
    const check = (await ok(call('editor', 'patch', `/checks/${followId}`, { revision: 2 }))).body
    expect(check.revision).toBe(2)
    expect(check.expected.map((hits: unknown[]) => hits.length)).toEqual([2, 0, 2, 2, 2])
    const run = (await ok(call('editor', 'post', `/suites/${suiteId}/runs`), 201)).body
    expect(run).toMatchObject({ number: 3, verdict: 'passed', passed: 2, failed: 0 })
    expect((await db.ds.getRepository(CheckEntity).findOneByOrFail({ id: followId })).revision).toBe(2)
  })

  it('keeps a deleted check’s results in the runs it was part of', async () => {
    const scratch = await newSuite('Scratch suite')
    const checkId = (await ok(call('editor', 'post', `/suites/${scratch}/checks`, checkBody('Soon gone')), 201)).body.id
    const run = (await ok(call('editor', 'post', `/suites/${scratch}/runs`), 201)).body
    await ok(call('editor', 'delete', `/checks/${checkId}`), 204)
    expect(await db.ds.getRepository(CheckEntity).findOneBy({ id: checkId })).toBeNull()
    const again = (await ok(call('viewer', 'get', `/runs/${run.id}`))).body
    expect(again.results.map((r: { checkId: number; checkName: string }) => [r.checkId, r.checkName])).toEqual([[checkId, 'Soon gone']])
    // Now empty, the suite cannot run.
    const empty = await call('editor', 'post', `/suites/${scratch}/runs`)
    expect([empty.status, empty.body.error.code]).toEqual([409, 'suite_empty'])
    await ok(call('editor', 'delete', `/suites/${scratch}`), 204)
    expect(await db.ds.getRepository(RunEntity).countBy({ suiteId: scratch })).toBe(0)
    expect(await db.ds.getRepository(RunResultEntity).countBy({ runId: run.id })).toBe(0)
  })
})

describe('validation', () => {
  it('refuses bad checks with the right status and code, writing nothing', async () => {
    const before = await db.ds.getRepository(CheckEntity).count()
    const glyphPath = (await ok(call('viewer', 'get', `/projects/${glyphsId}/paths`))).body.items[0].id
    const cases: Array<[string, object, number, string]> = [
      ['no probe or sweep', checkBody('Bad 1', { probes: [], sweeps: [] }), 400, 'validation'],
      ['negative tolerance', checkBody('Bad 2', { tolerance: { point: -1, t: 0 } }), 400, 'validation'],
      ['unknown follow', checkBody('Bad 3', { follow: 'newest' }), 400, 'validation'],
      ['path of another project', checkBody('Bad 4', { pathId: glyphPath }), 404, 'path_not_found'],
      ['revision the path lacks', checkBody('Bad 5', { revision: 9 }), 400, 'unknown_revision'],
      ['more lines than a check may have', checkBody('Bad 6', { sweeps: [{ ...sweeps[0], count: 2000 }, { ...sweeps[0], count: 2000 }, { ...sweeps[0], count: 1001 }] }), 413, 'limit'],
      ['a name taken in the suite', checkBody('Box pinned to 1'), 409, 'check_name_taken'],
    ]
    for (const [what, body, status, code] of cases) {
      const res = await call('editor', 'post', `/suites/${suiteId}/checks`, body)
      expect([res.status, res.body.error?.code], what).toEqual([status, code])
    }
    expect(await db.ds.getRepository(CheckEntity).count()).toBe(before)
  })

  it('keeps suite names unique in a project, case-insensitively', async () => {
    const res = await call('editor', 'post', `/projects/${iconsId}/suites`, { name: 'box REGRESSION' })
    expect([res.status, res.body.error.code]).toEqual([409, 'suite_name_taken'])
    const patch = await call('editor', 'patch', `/suites/${suiteId}`, {})
    expect(patch.status).toBe(400)
  })
})

describe('role limits', () => {
  it('lets viewers read and watch but not write or run; hides suites from other teams; wants a sign-in', async () => {
    const codes = async (who: Who) => [
      (await call(who, 'get', `/projects/${iconsId}/suites`)).status,
      (await call(who, 'get', `/suites/${suiteId}`)).status,
      (await call(who, 'get', `/suites/${suiteId}/checks`)).status,
      (await call(who, 'get', `/checks/${followId}`)).status,
      (await call(who, 'get', `/suites/${suiteId}/runs`)).status,
      (await call(who, 'get', `/runs/${failedRunId}`)).status,
      (await call(who, 'get', `/runs/${failedRunId}/junit.xml`)).status,
      (await call(who, 'put', `/suites/${suiteId}/watch`, { watching: false })).status,
      (await call(who, 'post', `/projects/${iconsId}/suites`, { name: `Made by ${who}` })).status,
      (await call(who, 'patch', `/suites/${suiteId}`, { description: `Changed by ${who}` })).status,
      (await call(who, 'post', `/suites/${suiteId}/checks`, checkBody(`Check by ${who}`))).status,
      (await call(who, 'patch', `/checks/${followId}`, { name: `Renamed by ${who}` })).status,
      (await call(who, 'post', `/suites/${suiteId}/runs`)).status,
      (await call(who, 'delete', `/checks/${pinnedId}`)).status,
      (await call(who, 'delete', `/suites/${suiteId}`)).status,
    ]
    const runsBefore = await db.ds.getRepository(RunEntity).countBy({ suiteId })
    expect(await codes('viewer')).toEqual([200, 200, 200, 200, 200, 200, 200, 200, 403, 403, 403, 403, 403, 403, 403])
    expect(await codes('outsider')).toEqual(Array(15).fill(404))
    expect(await codes('anonymous')).toEqual(Array(15).fill(401))
    expect(await db.ds.getRepository(RunEntity).countBy({ suiteId })).toBe(runsBefore)
    expect(await db.ds.getRepository(SuiteEntity).findOneByOrFail({ id: suiteId })).toMatchObject({ name: 'Box regression', description: '' })
    expect(await db.ds.getRepository(SuiteEntity).countBy({ name: 'Made by viewer' })).toBe(0)
    expect(await db.ds.getRepository(CheckEntity).countBy({ suiteId })).toBe(2)
  })
})

describe('the seeded suites', () => {
  it('pass as seeded, watched by the owner', async () => {
    const glyphSuites = (await ok(call('owner', 'get', `/projects/${glyphsId}/suites`))).body.items
    const iconSuites = (await ok(call('owner', 'get', `/projects/${iconsId}/suites`))).body.items
    const glyphRows = glyphSuites.find((s: { name: string }) => s.name === 'Glyph rows')
    const iconRays = iconSuites.find((s: { name: string }) => s.name === 'Icon rays')
    // One check per glyph of the demo text, each from its 16 ppem probe set.
    expect(glyphRows).toMatchObject({ checkCount: [...DEMO_GLYPH_TEXT].length, watching: true, lastRun: null })
    expect(iconRays).toMatchObject({ checkCount: 1, watching: true })
    const checks = (await ok(call('viewer', 'get', `/suites/${glyphRows.id}/checks`))).body.items
    for (const c of checks) {
      expect(c.name, c.name).toMatch(/ · rows at 16 ppem$/)
      expect(c, c.name).toMatchObject({ follow: 'latest', tolerance: { point: DEMO_POINT_TOLERANCE, t: DEMO_T_TOLERANCE }, matchKinds: true, matchWinding: true })
      expect(c.expected.length, c.name).toBe(c.sweeps[0].count)
    }
    // The Pin rays set's description: 2 crossings from the hole, 3 from the body, 2 from outside.
    const [pin] = (await ok(call('viewer', 'get', `/suites/${iconRays.id}/checks`))).body.items
    expect(pin.expected.map((hits: unknown[]) => hits.length)).toEqual([2, 3, 2])
    for (const id of [glyphRows.id, iconRays.id]) {
      const run = (await ok(call('editor', 'post', `/suites/${id}/runs`), 201)).body
      expect(run, JSON.stringify(run.results.filter((r: { verdict: string }) => r.verdict !== 'passed'))).toMatchObject({ verdict: 'passed', failed: 0 })
    }
    expect((await ok(call('editor', 'get', `/projects/${glyphsId}/suites`))).body.items[0].watching).toBe(false)
  })
})

describe('runs with an API token', () => {
  it('records a bearer-token run as triggered by the API, under the token owner’s role', async () => {
    const token = await ok(call('editor', 'post', '/tokens', { name: 'Box pipeline', expiresInDays: 7 }), 201)
    const run = await ok(request(rc.app).post(`/api/v1/suites/${suiteId}/runs`).set('Authorization', `Bearer ${token.body.secret}`), 201)
    expect(run.body).toMatchObject({ verdict: 'passed', trigger: 'api', by: 'Tobias Slipway' })
    expect((await db.ds.getRepository(RunEntity).findOneByOrFail({ id: run.body.id })).trigger).toBe('api')
    const junit = await ok(request(rc.app).get(`/api/v1/runs/${run.body.id}/junit.xml`).set('Authorization', `Bearer ${token.body.secret}`))
    expect((await readJunit(junit.text)).attributes).toMatchObject({ tests: '2', failures: '0' })
    const viewerToken = await ok(call('viewer', 'post', '/tokens', { name: 'Viewer pipeline', expiresInDays: 7 }), 201)
    const refused = await request(rc.app).post(`/api/v1/suites/${suiteId}/runs`).set('Authorization', `Bearer ${viewerToken.body.secret}`)
    expect(refused.status).toBe(403)
  })
})

describe('mail that cannot be sent', () => {
  it('is logged and never fails the run', async () => {
    const broken: Mailer = { send: async () => { throw new Error('SMTP relay refused the connection') }, close: () => {} }
    const app = buildTestApp(db.ds, { env: { ROOTCAST_PUBLIC_URL: PUBLIC_URL }, mailer: broken })
    const logged = vi.spyOn(console, 'error').mockImplementation(() => {})
    try {
      const editor = await signIn(app.app, 'editor@example.com')
      const failing = await newSuite('Fails on purpose')
      await ok(editor.agent.put(`/api/v1/suites/${failing}/watch`).set('X-CSRF-Token', editor.csrf).send({ watching: true }))
      // Expected on revision 1; the box is on revision 2 now, so this check fails.
      await ok(call('editor', 'post', `/suites/${failing}/checks`, checkBody('Expects the old bottom')), 201)
      const run = await editor.agent.post(`/api/v1/suites/${failing}/runs`).set('X-CSRF-Token', editor.csrf)
      expect(run.status).toBe(201)
      expect(run.body.verdict).toBe('failed')
      await vi.waitFor(() => expect(logged).toHaveBeenCalledWith(expect.stringContaining(`mail for run ${run.body.id}`), expect.any(Error)))
    } finally {
      logged.mockRestore()
      await app.close()
    }
  })
})
