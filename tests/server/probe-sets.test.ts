import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RootcastApp } from '../../server/app'
import { ProbeSetEntity } from '../../server/entities/probe-set.entity'
import { RevisionEntity } from '../../server/entities/revision.entity'
import { UserEntity } from '../../server/entities/user.entity'
import { buildTestApp, OUTSIDER, seedTestData, signIn, type SignedIn } from '../helpers/test-app'
import { createTestDatabase, type TestDatabase } from '../helpers/test-db'

let db: TestDatabase
let rc: RootcastApp
let iconsId: number
let glyphsId: number
let pinId: number
let knotId: number
let glyphRId: number
let editorUserId: number
const as: Record<'viewer' | 'editor' | 'owner' | 'outsider', SignedIn> = {} as never

type Who = 'anonymous' | keyof typeof as
function call(who: Who, method: 'get' | 'post' | 'put' | 'delete', url: string, body?: object) {
  const client = who === 'anonymous' ? request(rc.app) : as[who].agent
  let req = client[method](`/api/v1${url}`)
  if (who !== 'anonymous') req = req.set('X-CSRF-Token', as[who].csrf)
  return body ? req.send(body) : req
}

async function pathIdOf(projectId: number, name: string): Promise<number> {
  const res = await call('viewer', 'get', `/projects/${projectId}/paths?q=${encodeURIComponent(name)}`)
  return res.body.items.find((p: { name: string }) => p.name === name).id
}

const pinRay = { type: 'ray', origin: [12, 9], direction: [1, 0] } as const
const rowSweep = { angle: 0, spacing: 2, count: 4, origin: [0, 3] } as const
const setBody = (name: string, extra: object = {}) => ({ name, pathId: pinId, revision: 1, probes: [pinRay], sweeps: [rowSweep], ...extra })

async function newSet(name: string, extra: object = {}, projectId = iconsId): Promise<number> {
  const res = await call('editor', 'post', `/projects/${projectId}/probe-sets`, setBody(name, extra))
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  return res.body.id
}
async function newPath(name: string): Promise<number> {
  const res = await call('editor', 'post', `/projects/${iconsId}/paths`, { name, data: 'M0 0H10V10H0Z' })
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  return res.body.id
}
const setRow = (id: number) => db.ds.getRepository(ProbeSetEntity).findOneBy({ id })
const setCount = () => db.ds.getRepository(ProbeSetEntity).count()

beforeAll(async () => {
  db = await createTestDatabase()
  const { demoTeamId } = await seedTestData(db.ds)
  rc = buildTestApp(db.ds)
  for (const [who, email] of [['viewer', 'viewer@example.com'], ['editor', 'editor@example.com'], ['owner', 'owner@example.com'], ['outsider', OUTSIDER.email]] as const) {
    as[who] = await signIn(rc.app, email)
  }
  const projects = await call('viewer', 'get', `/teams/${demoTeamId}/projects`)
  iconsId = projects.body.items.find((p: { name: string }) => p.name === 'Wayfinding icons').id
  glyphsId = projects.body.items.find((p: { name: string }) => p.name === 'Headline glyph review').id
  pinId = await pathIdOf(iconsId, 'Map pin')
  knotId = await pathIdOf(iconsId, 'Crossing knot')
  glyphRId = await pathIdOf(glyphsId, 'R (U+0052)')
  editorUserId = (await db.ds.getRepository(UserEntity).findOneByOrFail({ email: 'editor@example.com' })).id
})
afterAll(async () => {
  await rc?.close()
  await db?.drop()
})

describe('role limits on probe sets', () => {
  it('lets viewers read, editors and owners write, and hides them from other teams', async () => {
    const codes = async (who: Who) => {
      const target = await newSet(`Role target for ${who}`)
      const out = [
        (await call(who, 'get', `/projects/${iconsId}/probe-sets`)).status,
        (await call(who, 'get', `/probe-sets/${target}`)).status,
        (await call(who, 'post', `/projects/${iconsId}/probe-sets`, setBody(`Made by ${who}`))).status,
        (await call(who, 'put', `/probe-sets/${target}`, { description: `Changed by ${who}` })).status,
        (await call(who, 'delete', `/probe-sets/${target}`)).status,
      ]
      return { out, left: await setRow(target) }
    }
    for (const who of ['anonymous', 'outsider', 'viewer'] as const) {
      const { out, left } = await codes(who)
      const refused = { anonymous: 401, outsider: 404, viewer: 403 }[who]
      expect(out, who).toEqual(who === 'viewer' ? [200, 200, refused, refused, refused] : [refused, refused, refused, refused, refused])
      // Nothing was written: the target is unchanged and no set was made in the caller's name.
      expect(left?.description, who).toBe('')
      expect(await db.ds.getRepository(ProbeSetEntity).countBy({ name: `Made by ${who}` }), who).toBe(0)
    }
    for (const who of ['editor', 'owner'] as const) {
      const { out, left } = await codes(who)
      expect(out, who).toEqual([200, 200, 201, 200, 204])
      expect(left, who).toBeNull()
      expect(await db.ds.getRepository(ProbeSetEntity).countBy({ name: `Made by ${who}` }), who).toBe(1)
    }
  })

  it('refuses a cookie-session write without the CSRF token', async () => {
    const before = await setCount()
    const res = await as.editor.agent.post(`/api/v1/projects/${iconsId}/probe-sets`).send(setBody('No token'))
    expect(res.status).toBe(403)
    expect(res.body.error.code).toBe('csrf')
    expect(await setCount()).toBe(before)
  })
})

describe('validation', () => {
  it('answers bad shapes with 400 validation, naming the field, and writes nothing', async () => {
    const before = await setCount()
    const tooMany = Array.from({ length: 501 }, (_, i) => ({ type: 'ray', origin: [i, 0], direction: [0, 1] }))
    const cases: Array<[string, object, string]> = [
      ['ray without direction', setBody('Bad 1', { probes: [{ type: 'ray', origin: [0, 0] }] }), 'body.probes.0.direction'],
      ['zero direction', setBody('Bad 2', { probes: [{ type: 'line', origin: [1, 1], direction: [0, 0] }] }), 'body.probes.0.direction'],
      ['segment of one point', setBody('Bad 3', { probes: [{ type: 'segment', from: [2, 2], to: [2, 2] }] }), 'body.probes.0.to'],
      ['unknown probe type', setBody('Bad 4', { probes: [{ type: 'beam', origin: [0, 0], direction: [1, 0] }] }), 'body.probes.0.type'],
      // 500 is below api-route's SIZE_LIMIT_MIN_ITEMS (1000): a shape rule, so 400, not 413.
      ['501 probes', setBody('Bad 5', { probes: tooMany }), 'body.probes'],
      ['51 sweeps', setBody('Bad 6', { sweeps: Array.from({ length: 51 }, () => rowSweep) }), 'body.sweeps'],
      ['2001 lines', setBody('Bad 7', { sweeps: [{ ...rowSweep, count: 2001 }] }), 'body.sweeps.0.count'],
      ['no lines', setBody('Bad 8', { sweeps: [{ ...rowSweep, count: 0 }] }), 'body.sweeps.0.count'],
      ['fractional count', setBody('Bad 9', { sweeps: [{ ...rowSweep, count: 1.5 }] }), 'body.sweeps.0.count'],
      ['zero spacing', setBody('Bad 10', { sweeps: [{ ...rowSweep, spacing: 0 }] }), 'body.sweeps.0.spacing'],
      ['angle over 360', setBody('Bad 11', { sweeps: [{ ...rowSweep, angle: 360.5 }] }), 'body.sweeps.0.angle'],
      ['angle under −360', setBody('Bad 12', { sweeps: [{ ...rowSweep, angle: -361 }] }), 'body.sweeps.0.angle'],
      ['string coordinate', setBody('Bad 13', { sweeps: [{ ...rowSweep, origin: ['0', 3] }] }), 'body.sweeps.0.origin.0'],
      ['blank name', setBody('   '), 'body.name'],
      ['long name', setBody('n'.repeat(121)), 'body.name'],
      ['long description', setBody('Bad 16', { description: 'd'.repeat(501) }), 'body.description'],
      ['unknown field', setBody('Bad 17', { colour: 'coral' }), 'body'],
      ['no probes field', { name: 'Bad 18', pathId: pinId, revision: 1, sweeps: [] }, 'body.probes'],
    ]
    for (const [what, body, path] of cases) {
      const res = await call('editor', 'post', `/projects/${iconsId}/probe-sets`, body)
      expect(res.status, what).toBe(400)
      expect(res.body.error.code, what).toBe('validation')
      expect(res.body.error.details.map((d: { path: string }) => d.path), what).toContain(path)
    }
    expect(await setCount()).toBe(before)
  })

  it('keeps the edge values: exactly 500 probes, 50 sweeps, 2000 lines, ±360 degrees, 120-character names', async () => {
    const probes = Array.from({ length: 500 }, (_, i) => ({ type: 'segment', from: [i, 0], to: [i, 1] }))
    const sweeps = Array.from({ length: 50 }, (_, i) => ({ angle: i % 2 ? 360 : -360, spacing: 0.25, count: 2000, origin: [0, i] }))
    const id = await newSet('e'.repeat(120), { probes, sweeps })
    const row = (await setRow(id))!
    expect(JSON.parse(row.probes)).toHaveLength(500)
    expect(JSON.parse(row.sweeps)[1]).toEqual({ angle: 360, spacing: 0.25, count: 2000, origin: [0, 1] })
  })

  it('refuses an empty change and an unknown field on PUT', async () => {
    const id = await newSet('Unchanged by bad puts')
    for (const body of [{}, { colour: 'coral' }]) {
      const res = await call('editor', 'put', `/probe-sets/${id}`, body)
      expect(res.status, JSON.stringify(body)).toBe(400)
      expect(res.body.error.code).toBe('validation')
    }
    expect((await setRow(id))!.name).toBe('Unchanged by bad puts')
  })
})

describe('path, revision and name checks', () => {
  it('needs a live path of this project (404 path_not_found) and one of its revisions (400 unknown_revision)', async () => {
    const before = await setCount()
    const foreign = await call('editor', 'post', `/projects/${iconsId}/probe-sets`, setBody('On a glyph', { pathId: glyphRId }))
    expect(foreign.status).toBe(404)
    expect(foreign.body.error.code).toBe('path_not_found')
    const missing = await call('editor', 'post', `/projects/${iconsId}/probe-sets`, setBody('On nothing', { pathId: 2 ** 31 - 1 }))
    expect(missing.status).toBe(404)
    expect(missing.body.error.code).toBe('path_not_found')
    const trashed = await newPath('Trashed buoy')
    expect((await call('editor', 'delete', `/paths/${trashed}`)).status).toBe(204)
    const onTrash = await call('editor', 'post', `/projects/${iconsId}/probe-sets`, setBody('On the trash', { pathId: trashed }))
    expect(onTrash.status).toBe(404)
    expect(onTrash.body.error.code).toBe('path_not_found')
    const future = await call('editor', 'post', `/projects/${iconsId}/probe-sets`, setBody('From the future', { revision: 2 }))
    expect(future.status).toBe(400)
    expect(future.body.error.code).toBe('unknown_revision')
    expect(future.body.error.message).toContain('1 to 1')
    expect(await setCount()).toBe(before)
  })

  it('keeps names unique per project (409 probe_set_name_taken), but not across projects', async () => {
    await newSet('Harbour wall rays')
    for (const name of ['Harbour wall rays', '  Harbour wall rays  ', 'HARBOUR WALL RAYS']) {
      // Trimmed by the schema; compared case-insensitively by the column's utf8mb4_unicode_ci collation.
      const res = await call('editor', 'post', `/projects/${iconsId}/probe-sets`, setBody(name))
      expect(res.status, name).toBe(409)
      expect(res.body.error.code, name).toBe('probe_set_name_taken')
    }
    const other = await call('editor', 'post', `/projects/${glyphsId}/probe-sets`, setBody('Harbour wall rays', { pathId: glyphRId }))
    expect(other.status).toBe(201)
    const second = await newSet('Harbour wall rays, second try')
    const rename = await call('editor', 'put', `/probe-sets/${second}`, { name: 'Harbour wall rays' })
    expect(rename.status).toBe(409)
    expect(rename.body.error.code).toBe('probe_set_name_taken')
    expect((await setRow(second))!.name).toBe('Harbour wall rays, second try')
  })
})

describe('create, read, list, update, delete', () => {
  it('stores what was sent, as MariaDB rows, and reads it back', async () => {
    const probes = [pinRay, { type: 'line', origin: [0, 15], direction: [1, 0.5] }, { type: 'segment', from: [3, 3], to: [21, 21] }]
    const sweeps = [{ angle: -30, spacing: 0.75, count: 12, origin: [4, 4] }]
    const res = await call('editor', 'post', `/projects/${iconsId}/probe-sets`, { name: '  Pin audit  ', description: ' Three kinds ', pathId: pinId, revision: 1, probes, sweeps })
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    const row = (await setRow(res.body.id))!
    expect(row).toMatchObject({ projectId: iconsId, pathId: pinId, revision: 1, name: 'Pin audit', description: 'Three kinds', authorId: editorUserId })
    expect(JSON.parse(row.probes)).toEqual(probes)
    expect(JSON.parse(row.sweeps)).toEqual(sweeps)
    expect(res.body).toMatchObject({ id: row.id, projectId: iconsId, pathId: pinId, pathName: 'Map pin', revision: 1, name: 'Pin audit', author: 'Tobias Slipway', probes, sweeps })
    expect(res.body.createdAt).toBe(row.createdAt.toISOString())

    const got = await call('viewer', 'get', `/probe-sets/${row.id}`)
    expect(got.status).toBe(200)
    expect(got.body).toEqual(res.body)
  })

  it('lists summaries with counts, newest first, filtered by path', async () => {
    const onKnot = await newSet('Knot listing A', { pathId: knotId, probes: [pinRay, pinRay], sweeps: [] })
    const onKnotLater = await newSet('Knot listing B', { pathId: knotId })
    const all = await call('viewer', 'get', `/projects/${iconsId}/probe-sets`)
    expect(all.status).toBe(200)
    const ids = all.body.items.map((s: { id: number }) => s.id)
    expect(ids).toEqual(expect.arrayContaining([onKnot, onKnotLater]))
    expect(new Set(all.body.items.map((s: { pathId: number }) => s.pathId))).toContain(pinId)
    // Newest first: by creation time, then by id for sets made in the same millisecond.
    const times = all.body.items.map((s: { createdAt: string; id: number }) => [Date.parse(s.createdAt), s.id])
    for (let i = 1; i < times.length; i++) expect(times[i - 1][0] > times[i][0] || (times[i - 1][0] === times[i][0] && times[i - 1][1] > times[i][1]), `item ${i}`).toBe(true)
    expect(await db.ds.getRepository(ProbeSetEntity).countBy({ projectId: iconsId })).toBe(all.body.items.length)

    const knot = await call('viewer', 'get', `/projects/${iconsId}/probe-sets?pathId=${knotId}`)
    expect(knot.body.items.every((s: { pathId: number }) => s.pathId === knotId)).toBe(true)
    expect(knot.body.items.map((s: { name: string }) => s.name)).toEqual(['Knot listing B', 'Knot listing A', 'Knot scanlines'])
    const a = knot.body.items.find((s: { id: number }) => s.id === onKnot)
    expect(a).toMatchObject({ name: 'Knot listing A', pathName: 'Crossing knot', probeCount: 2, sweepCount: 0, author: 'Tobias Slipway' })
    expect(a).not.toHaveProperty('probes')
    const bad = await call('viewer', 'get', `/projects/${iconsId}/probe-sets?pathId=none`)
    expect(bad.status).toBe(400)
  })

  it('replaces only the fields given, and checks a new path or revision', async () => {
    const pathId = await newPath('Mooring post')
    const id = await newSet('Mooring rays', { pathId, description: 'Kept' })
    const newProbes = [{ type: 'segment', from: [0, 5], to: [10, 5] }]
    const res = await call('owner', 'put', `/probe-sets/${id}`, { name: 'Mooring segment', probes: newProbes })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    let row = (await setRow(id))!
    expect(row).toMatchObject({ name: 'Mooring segment', description: 'Kept', pathId, revision: 1, authorId: editorUserId })
    expect(JSON.parse(row.probes)).toEqual(newProbes)
    expect(JSON.parse(row.sweeps)).toEqual([rowSweep])

    const tooFar = await call('editor', 'put', `/probe-sets/${id}`, { revision: 2 })
    expect(tooFar.status).toBe(400)
    expect(tooFar.body.error.code).toBe('unknown_revision')
    expect((await call('editor', 'post', `/paths/${pathId}/revisions`, { data: 'M0 0H12V12H0Z' })).status).toBe(201)
    expect((await call('editor', 'put', `/probe-sets/${id}`, { revision: 2, sweeps: [] })).status).toBe(200)
    row = (await setRow(id))!
    expect(row.revision).toBe(2)
    expect(JSON.parse(row.sweeps)).toEqual([])
    // Moving to the pin keeps revision 2, which the pin does not have.
    const move = await call('editor', 'put', `/probe-sets/${id}`, { pathId: pinId })
    expect(move.status).toBe(400)
    expect(move.body.error.code).toBe('unknown_revision')
    const away = await call('editor', 'put', `/probe-sets/${id}`, { pathId: glyphRId, revision: 1 })
    expect(away.status).toBe(404)
    expect(away.body.error.code).toBe('path_not_found')
    expect((await setRow(id))!.pathId).toBe(pathId)
  })

  it('deletes a set, and a second delete finds nothing', async () => {
    const id = await newSet('Short-lived')
    expect((await call('editor', 'delete', `/probe-sets/${id}`)).status).toBe(204)
    expect(await setRow(id)).toBeNull()
    expect((await call('editor', 'get', `/probe-sets/${id}`)).status).toBe(404)
    expect((await call('editor', 'delete', `/probe-sets/${id}`)).status).toBe(404)
  })

  it('keeps a set while its path is in the trash and removes it when the path is purged', async () => {
    const pathId = await newPath('Capstan')
    const id = await newSet('Capstan rays', { pathId })
    expect((await call('editor', 'delete', `/paths/${pathId}`)).status).toBe(204)
    expect((await call('viewer', 'get', `/probe-sets/${id}`)).status).toBe(200)
    expect((await call('owner', 'delete', `/paths/${pathId}/purge`)).status).toBe(204)
    expect(await setRow(id)).toBeNull()
    expect((await call('viewer', 'get', `/probe-sets/${id}`)).status).toBe(404)
  })
})

describe('the seeded probe sets', () => {
  /** (j + 0.5)·spacing / spacing − 0.5 is j up to a few ulps of |j| ≤ 20 (≈ 1e-14); 1e-9 leaves margin. */
  const PIXEL_INDEX_TOLERANCE = 1e-9

  it('has the rows at 16 ppem for each glyph, and at 12 ppem for a', async () => {
    const list = await call('viewer', 'get', `/projects/${glyphsId}/probe-sets`)
    const seeded = list.body.items.filter((s: { author: string | null; name: string }) => s.name.includes(' · rows at '))
    expect(seeded.map((s: { name: string }) => s.name).sort()).toEqual(
      ['& · rows at 16 ppem', '8 · rows at 16 ppem', 'R · rows at 16 ppem', 'a · rows at 12 ppem', 'a · rows at 16 ppem', 'g · rows at 16 ppem'],
    )
    for (const summary of seeded) expect(summary, summary.name).toMatchObject({ revision: 1, probeCount: 0, sweepCount: 1, author: 'Tobias Slipway' })

    // R of Roboto Bold (npm @fontsource/roboto, unitsPerEm 2048) as the seed stores it: y flipped, baseline at 0.
    const rev = await db.ds.getRepository(RevisionEntity).findOneByOrFail({ pathId: glyphRId, number: 1 })
    expect([rev.bboxMinX, rev.bboxMinY, rev.bboxMaxX, rev.bboxMaxY]).toEqual([130, -1456, 1265, 0])
    // By hand: 16 ppem → 2048 / 16 = 128 units per pixel; pixel centres at −(k + 0.5)·128.
    // −1456 / 128 = −11.375, so the top centre inside is −10.5·128 = −1344 (−11.5·128 = −1472 is above the box);
    // the bottom one is −0.5·128 = −64 (+64 is below maxY 0); (−64 + 1344) / 128 + 1 = 11 rows.
    const r = await call('viewer', 'get', `/probe-sets/${seeded.find((s: { name: string }) => s.name.startsWith('R ')).id}`)
    expect(r.body).toMatchObject({ pathId: glyphRId, pathName: 'R (U+0052)', probes: [] })
    expect(r.body.sweeps).toEqual([{ angle: 0, spacing: 128, count: 11, origin: [0, -1344] }])

    // Every seeded glyph set: each row is a pixel centre inside the stored bounds, and the rows
    // one step beyond either end fall outside them.
    for (const summary of seeded) {
      const set = (await call('viewer', 'get', `/probe-sets/${summary.id}`)).body
      const ppem = Number(/at (\d+) ppem/.exec(set.name)![1])
      const [sweep] = set.sweeps
      expect(sweep.spacing, set.name).toBe(2048 / ppem)
      const { bboxMinY, bboxMaxY } = await db.ds.getRepository(RevisionEntity).findOneByOrFail({ pathId: set.pathId, number: 1 })
      const top = sweep.origin[1]
      const bottom = top + (sweep.count - 1) * sweep.spacing
      expect(top, set.name).toBeGreaterThanOrEqual(bboxMinY!)
      expect(top - sweep.spacing, set.name).toBeLessThan(bboxMinY!)
      expect(bottom, set.name).toBeLessThanOrEqual(bboxMaxY!)
      expect(bottom + sweep.spacing, set.name).toBeGreaterThan(bboxMaxY!)
      const index = top / sweep.spacing - 0.5
      expect(Math.abs(index - Math.round(index)), set.name).toBeLessThan(PIXEL_INDEX_TOLERANCE)
    }
  })

  it('has pin rays from the hole, the body and outside, and the knot rows at 24 px', async () => {
    const list = await call('viewer', 'get', `/projects/${iconsId}/probe-sets`)
    const byName = (name: string) => list.body.items.find((s: { name: string }) => s.name === name)
    const pin = (await call('viewer', 'get', `/probe-sets/${byName('Pin rays').id}`)).body
    expect(pin).toMatchObject({ pathId: pinId, revision: 1, sweeps: [] })
    expect(pin.probes).toEqual([
      { type: 'ray', origin: [12, 9], direction: [1, 0] },
      { type: 'ray', origin: [12, 15], direction: [0, -1] },
      { type: 'ray', origin: [0, 20], direction: [1, 0] },
    ])
    // The knot's loops are y = 12 − 30·t(1 − t)(1 − 2t) (the Bernstein form of its control
    // ordinates 12, 2, 22, 12), extreme at t = (3 ∓ √3)/6: y = 12 ∓ 5/√3 ≈ 9.113 and 14.887.
    const knotRev = await db.ds.getRepository(RevisionEntity).findOneByOrFail({ pathId: knotId, number: 1 })
    expect(knotRev.bboxMinY).toBeCloseTo(12 - 5 / Math.sqrt(3), 12)
    expect(knotRev.bboxMaxY).toBeCloseTo(12 + 5 / Math.sqrt(3), 12)
    // One unit per pixel: centres at k + 0.5, so 9.5, 10.5, …, 14.5, six rows.
    const knot = (await call('viewer', 'get', `/probe-sets/${byName('Knot scanlines').id}`)).body
    expect(knot).toMatchObject({ pathId: knotId, revision: 1, probes: [] })
    expect(knot.sweeps).toEqual([{ angle: 0, spacing: 1, count: 6, origin: [0, 9.5] }])
  })
})
