import { readFileSync } from 'node:fs'
import { createRequire } from 'node:module'
import { join } from 'node:path'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RootcastApp } from '../../server/app'
import { PathEntity } from '../../server/entities/path.entity'
import { RevisionEntity } from '../../server/entities/revision.entity'
import { purgeExpiredTrash } from '../../server/services/library.service'
import { buildTestApp, OUTSIDER, seedTestData, signIn, type SignedIn } from '../helpers/test-app'
import { createTestDatabase, type TestDatabase } from '../helpers/test-db'

let db: TestDatabase
let rc: RootcastApp
let teamId: number
let iconsId: number
let glyphsId: number
const as: Record<'viewer' | 'editor' | 'owner' | 'outsider', SignedIn> = {} as never
const fixture = (name: string) => readFileSync(join(__dirname, 'fixtures', name))
const requireFrom = createRequire(import.meta.url)

beforeAll(async () => {
  db = await createTestDatabase()
  teamId = (await seedTestData(db.ds)).demoTeamId
  rc = buildTestApp(db.ds)
  for (const [who, email] of [['viewer', 'viewer@example.com'], ['editor', 'editor@example.com'], ['owner', 'owner@example.com'], ['outsider', OUTSIDER.email]] as const) {
    as[who] = await signIn(rc.app, email)
  }
  const projects = await as.viewer.agent.get(`/api/v1/teams/${teamId}/projects`)
  iconsId = projects.body.items.find((p: { name: string }) => p.name === 'Wayfinding icons').id
  glyphsId = projects.body.items.find((p: { name: string }) => p.name === 'Headline glyph review').id
})
afterAll(async () => {
  await rc?.close()
  await db?.drop()
})

type Who = 'anonymous' | keyof typeof as
function call(who: Who, method: 'get' | 'post' | 'patch' | 'delete', url: string, body?: object) {
  const client = who === 'anonymous' ? request(rc.app) : as[who].agent
  let req = client[method](`/api/v1${url}`)
  if (who !== 'anonymous') req = req.set('X-CSRF-Token', as[who].csrf)
  return body ? req.send(body) : req
}
async function newPath(name: string, data = 'M0 0H10V10H0Z', extra: object = {}): Promise<number> {
  const res = await call('editor', 'post', `/projects/${iconsId}/paths`, { name, data, ...extra })
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  return res.body.id
}
const pathCount = () => db.ds.getRepository(PathEntity).count()

describe('the seeded demo library', () => {
  it('has a dozen wayfinding icons and Roboto Bold glyphs in font units', async () => {
    const icons = await call('viewer', 'get', `/projects/${iconsId}/paths?pageSize=50`)
    expect(icons.status).toBe(200)
    expect(icons.body.total).toBe(12)
    expect(icons.body.tags).toEqual(expect.arrayContaining(['arrow', 'arc', 'self-intersecting']))
    const pin = icons.body.items.find((p: { name: string }) => p.name === 'Map pin')
    expect(pin).toMatchObject({ origin: 'drawn', fillRule: 'evenodd', revision: 1, revisions: 1 })
    expect(pin.counts.arc).toBeGreaterThanOrEqual(2)
    expect(pin.counts.cubic).toBeGreaterThanOrEqual(4)
    const glyphs = await call('viewer', 'get', `/projects/${glyphsId}/paths?pageSize=50&sort=name`)
    expect(glyphs.body.items.length).toBe(5)
    const r = glyphs.body.items.find((p: { name: string }) => p.name.startsWith('R'))
    expect(r).toMatchObject({ origin: 'font', units: 'font units', sourceFile: 'roboto-latin-700-normal.woff2' })
    // Quadratic outlines stay quadratic; y is flipped, so the glyph stands above the baseline at negative y.
    expect(r.counts.quadratic).toBeGreaterThan(0)
    expect(r.counts.cubic).toBe(0)
    expect(r.bbox[1]).toBeLessThan(-1000)
    expect(r.bbox[3]).toBeLessThanOrEqual(0)
    const detail = await call('viewer', 'get', `/paths/${r.id}`)
    expect(detail.body.metadata).toMatchObject({ unitsPerEm: 2048, family: 'Roboto' })
  })
})

describe('role limits on the library', () => {
  it('lets viewers browse and export but not write; owners alone empty the trash', async () => {
    const id = await newPath('Role probe')
    const codes = async (who: Who) => [
      (await call(who, 'get', `/projects/${iconsId}/paths`)).status,
      (await call(who, 'get', `/paths/${id}`)).status,
      (await call(who, 'get', `/projects/${iconsId}/export.svg?ids=${id}`)).status,
      (await call(who, 'post', `/paths/${id}/revisions`, { data: 'M0 0H5V5Z' })).status,
      (await call(who, 'patch', `/paths/${id}`, { tags: ['probe'] })).status,
      (await call(who, 'post', `/projects/${iconsId}/trash/empty`)).status,
    ]
    expect(await codes('anonymous')).toEqual([401, 401, 401, 401, 401, 401])
    expect(await codes('outsider')).toEqual([404, 404, 404, 404, 404, 404])
    expect(await codes('viewer')).toEqual([200, 200, 200, 403, 403, 403])
    expect(await codes('editor')).toEqual([200, 200, 200, 201, 200, 403])
    expect(await codes('owner')).toEqual([200, 200, 200, 201, 200, 200])
  })
})

describe('revisions', () => {
  it('stores the core analysis, adds revisions instead of overwriting, lists and restores them', async () => {
    const id = await newPath('Bollard cap', 'M0 0H10V10H0Z', { tags: ['harbour'], message: 'First outline' })
    const rev1 = await db.ds.getRepository(RevisionEntity).findOneByOrFail({ pathId: id, number: 1 })
    expect(rev1).toMatchObject({ segmentCount: 4, countLine: 4, bboxMinX: 0, bboxMaxY: 10, message: 'First outline' })
    expect(JSON.parse(rev1.segments!)).toHaveLength(4)
    const second = await call('editor', 'post', `/paths/${id}/revisions`, { data: 'M0 0C0 -5 10 -5 10 0V10H0Z', message: 'Rounded top' })
    expect(second.status).toBe(201)
    expect(second.body).toMatchObject({ revision: 2, revisions: 2, segments: 4, counts: { line: 3, cubic: 1 }, message: 'Rounded top' })
    expect(second.body.bbox[1]).toBeCloseTo(-3.75, 12) // y of the cubic's top at t = ½: −5·¾ (Bernstein weights 3/8 + 3/8)
    expect(await db.ds.getRepository(RevisionEntity).countBy({ pathId: id })).toBe(2)
    expect((await db.ds.getRepository(RevisionEntity).findOneByOrFail({ pathId: id, number: 1 })).data).toBe('M0 0H10V10H0Z')

    const history = await call('viewer', 'get', `/paths/${id}/revisions`)
    expect(history.body.map((r: { number: number }) => r.number)).toEqual([2, 1])
    const one = await call('viewer', 'get', `/paths/${id}/revisions/1`)
    expect(one.body).toMatchObject({ number: 1, data: 'M0 0H10V10H0Z', current: false })

    const restored = await call('editor', 'post', `/paths/${id}/revisions/1/restore`, {})
    expect(restored.status).toBe(201)
    expect(restored.body).toMatchObject({ revision: 3, data: 'M0 0H10V10H0Z', message: 'Restored revision 1' })
  })

  it('refuses bad path data with 400 and writes nothing', async () => {
    const id = await newPath('Keeps its data')
    const before = await db.ds.getRepository(RevisionEntity).countBy({ pathId: id })
    for (const data of ['M0 0 C 1 2 3', 'hello', 'M0 0 L10 10 Q']) {
      const res = await call('editor', 'post', `/paths/${id}/revisions`, { data })
      expect(res.status, data).toBe(400)
      expect(res.body.error.code).toBe('invalid_path')
    }
    expect(await db.ds.getRepository(RevisionEntity).countBy({ pathId: id })).toBe(before)
    const tooLong = await call('editor', 'post', `/paths/${id}/revisions`, { data: 'M0 0' + ' l1 1'.repeat(20_001) })
    expect(tooLong.status).toBe(413)
    expect(tooLong.body.error.code).toBe('limit')
  })

  it('imports all paths or none', async () => {
    const before = await pathCount()
    const bad = await call('editor', 'post', `/projects/${iconsId}/paths/import`, {
      origin: 'svg',
      paths: [{ name: 'Fine', data: 'M0 0H1V1Z' }, { name: 'Broken', data: 'M0 0 C 1' }],
    })
    expect(bad.status).toBe(400)
    expect(bad.body.error.message).toMatch(/Path 2 \(Broken\)/)
    expect(await pathCount()).toBe(before)
    const good = await call('editor', 'post', `/projects/${iconsId}/paths/import`, {
      origin: 'svg',
      paths: [{ name: 'Buoy', data: 'M0 0H1V1Z', sourceFile: 'buoys.svg' }, { name: 'Buoy 2', data: 'M0 0H2V2Z', sourceFile: 'buoys.svg' }],
    })
    expect(good.status).toBe(201)
    expect(good.body.created.map((p: { origin: string; sourceFile: string }) => [p.origin, p.sourceFile])).toEqual([['svg', 'buoys.svg'], ['svg', 'buoys.svg']])
    expect(await pathCount()).toBe(before + 2)
  })
})

describe('trash', () => {
  it('moves to the trash, restores, and lets only owners delete for good', async () => {
    const id = await newPath('Driftwood')
    expect((await call('editor', 'delete', `/paths/${id}`)).status).toBe(204)
    const live = await call('viewer', 'get', `/projects/${iconsId}/paths?q=Driftwood`)
    expect(live.body.total).toBe(0)
    const trash = await call('viewer', 'get', `/projects/${iconsId}/paths?q=Driftwood&trash=1`)
    expect(trash.body.items[0]).toMatchObject({ id, deletedAt: expect.any(String) })
    expect((await call('editor', 'post', `/paths/${id}/revisions`, { data: 'M0 0H1V1Z' })).status).toBe(409)
    expect((await call('editor', 'post', `/paths/${id}/untrash`)).status).toBe(200)
    expect((await call('editor', 'delete', `/paths/${id}/purge`)).status).toBe(403)
    expect((await call('owner', 'delete', `/paths/${id}/purge`)).status).toBe(409)
    await call('editor', 'delete', `/paths/${id}`)
    expect((await call('editor', 'delete', `/paths/${id}/purge`)).status).toBe(403)
    expect((await call('owner', 'delete', `/paths/${id}/purge`)).status).toBe(204)
    expect(await db.ds.getRepository(PathEntity).findOneBy({ id })).toBeNull()
    expect(await db.ds.getRepository(RevisionEntity).countBy({ pathId: id })).toBe(0)
  })

  it('keeps trashed paths for 30 days only', async () => {
    const id = await newPath('Old rope')
    await call('editor', 'delete', `/paths/${id}`)
    await db.ds.query('UPDATE paths SET deleted_at = NOW(3) - INTERVAL 31 DAY WHERE id = ?', [id])
    expect((await call('viewer', 'get', `/projects/${iconsId}/paths?q=Old%20rope&trash=1`)).body.total).toBe(0)
    const res = await call('editor', 'post', `/paths/${id}/untrash`)
    expect(res.status).toBe(410)
    expect(res.body.error.code).toBe('expired')
    expect(await purgeExpiredTrash(db.ds)).toBeGreaterThanOrEqual(1)
    expect(await db.ds.getRepository(PathEntity).findOneBy({ id })).toBeNull()
  })
})

describe('tags, bulk actions, paging and sorting', () => {
  it('tags and untags in bulk, filters by tag, sorts by segments', async () => {
    const a = await newPath('Pontoon A', 'M0 0H10V10H0Z')
    const b = await newPath('Pontoon B', 'M0 0H10L5 8Z')
    const tagged = await call('editor', 'post', `/projects/${iconsId}/paths/bulk`, { action: 'tag', ids: [a, b], tags: ['pontoon'] })
    expect(tagged.body.affected).toBe(2)
    const list = await call('viewer', 'get', `/projects/${iconsId}/paths?tag=pontoon&sort=segments&order=asc`)
    expect(list.body.items.map((p: { name: string }) => p.name)).toEqual(['Pontoon B', 'Pontoon A'])
    expect(list.body.tags).toContain('pontoon')
    await call('editor', 'post', `/projects/${iconsId}/paths/bulk`, { action: 'untag', ids: [b], tags: ['pontoon'] })
    expect((await call('viewer', 'get', `/projects/${iconsId}/paths?tag=pontoon`)).body.total).toBe(1)
    const paged = await call('viewer', 'get', `/projects/${iconsId}/paths?q=Pontoon&pageSize=1&page=2&sort=name`)
    expect(paged.body).toMatchObject({ total: 2, page: 2 })
    expect(paged.body.items[0].name).toBe('Pontoon B')
    const knots = await call('viewer', 'get', `/projects/${iconsId}/paths?warnings=with`)
    expect(knots.body.items.every((p: { warnings: number }) => p.warnings > 0)).toBe(true)
  })

  it('copies paths to another project of the team, never to another team', async () => {
    const id = await newPath('Gangway')
    const target = (await call('editor', 'post', `/teams/${teamId}/projects`, { name: 'Copy target' })).body.id
    const copied = await call('editor', 'post', `/projects/${iconsId}/paths/bulk`, { action: 'copy', ids: [id], targetProjectId: target })
    expect(copied.body.affected).toBe(1)
    expect((await call('viewer', 'get', `/projects/${target}/paths`)).body.items[0].name).toBe('Gangway')
    const foreign = (await call('outsider', 'post', `/teams/${(await call('outsider', 'get', '/teams')).body[0].id}/projects`, { name: 'Not yours' })).body.id
    const refused = await call('editor', 'post', `/projects/${iconsId}/paths/bulk`, { action: 'copy', ids: [id], targetProjectId: foreign })
    expect(refused.status).toBe(404)
    expect((await call('outsider', 'get', `/projects/${foreign}/paths`)).body.total).toBe(0)
  })
})

describe('export and bundles', () => {
  it('exports chosen paths as one SVG file', async () => {
    const a = await newPath('Export <one> & "two"', 'M0 0H10V10H0Z')
    const b = await newPath('Export two', 'M20 0L30 10', { fillRule: 'evenodd' })
    const res = await call('viewer', 'get', `/projects/${iconsId}/export.svg?ids=${a},${b}`)
    expect(res.status).toBe(200)
    expect(res.headers['content-type']).toMatch(/image\/svg\+xml/)
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="?[\w.-]+\.svg"?$/)
    const text = res.text ?? String(res.body)
    expect(text).toContain('viewBox="0 0 30 10"')
    expect(text).toContain('d="M0 0H10V10H0Z"')
    expect(text).toContain('fill-rule="evenodd"')
    expect(text).toContain('Export &lt;one&gt; &amp; &quot;two&quot;')
  })

  it('round-trips a bundle with every revision into another project', async () => {
    const id = await newPath('Lighthouse', 'M0 0H4V20H0Z', { tags: ['tower'] })
    await call('editor', 'post', `/paths/${id}/revisions`, { data: 'M0 0H4V24H0Z', message: 'Taller' })
    const exported = await call('viewer', 'get', `/projects/${iconsId}/bundle?ids=${id}`)
    expect(exported.status).toBe(200)
    const bundle = JSON.parse(exported.text)
    expect(bundle).toMatchObject({ format: 'rootcast-bundle', version: 1, project: { name: 'Wayfinding icons' } })
    expect(bundle.paths[0].revisions.map((r: { data: string }) => r.data)).toEqual(['M0 0H4V20H0Z', 'M0 0H4V24H0Z'])
    const target = (await call('editor', 'post', `/teams/${teamId}/projects`, { name: 'Bundle target' })).body.id
    const imported = await call('editor', 'post', `/projects/${target}/bundle`, bundle)
    expect(imported.status).toBe(201)
    expect(imported.body.created[0]).toMatchObject({ name: 'Lighthouse', tags: ['tower'], revision: 2, revisions: 2 })
    const wrong = await call('editor', 'post', `/projects/${target}/bundle`, { ...bundle, version: 2 })
    expect(wrong.status).toBe(400)
  })
})

describe('SVG and font previews', () => {
  it('previews an SVG file: shapes become path data with transforms and viewBox composed in; writes nothing', async () => {
    const before = await pathCount()
    const res = await as.editor.agent
      .post(`/api/v1/projects/${iconsId}/imports/svg/preview`)
      .set('X-CSRF-Token', as.editor.csrf)
      .attach('files', fixture('harbour-signs.svg'), 'harbour-signs.svg')
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    const file = res.body.files[0]
    expect(file.ok).toBe(true)
    expect(file.paths.map((p: { name: string }) => p.name).sort()).toEqual(['bollard', 'jetty', 'quay-plate'])
    const plate = file.paths.find((p: { name: string }) => p.name === 'quay-plate')
    // viewBox 0 0 48 24 in 96×48: scale 2; translate(24 0) then x = 2 → (2 + 24)·2 = 52; width 20·2 = 40.
    expect(plate.bbox).toEqual([52, 4, 92, 44])
    expect(plate.counts.arc).toBe(4)
    expect(file.paths.find((p: { name: string }) => p.name === 'bollard').fillRule).toBe('evenodd')
    expect(JSON.stringify(res.body)).not.toContain('alert')
    expect(await pathCount()).toBe(before)
  })

  it('refuses what must be refused with a clear 4xx, and imports nothing', async () => {
    const before = await pathCount()
    const bomb = `<?xml version="1.0"?><!DOCTYPE lolz [<!ENTITY lol "lol"><!ENTITY lol2 "&lol;&lol;&lol;&lol;&lol;&lol;&lol;&lol;&lol;&lol;">]><svg xmlns="http://www.w3.org/2000/svg"><text>&lol2;</text></svg>`
    const png = Buffer.from('89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000a49444154789c6300010000050001', 'hex')
    const cases: Array<[Buffer, string, number]> = [
      [Buffer.from(bomb), 'bomb.svg', 400],
      [png, 'photo.svg', 400],
      [Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"><path d="M0 0' + ' l1 1'.repeat(20_001) + '"/></svg>'), 'long.svg', 400],
    ]
    for (const [buf, name, status] of cases) {
      const res = await as.editor.agent.post(`/api/v1/projects/${iconsId}/imports/svg/preview`).set('X-CSRF-Token', as.editor.csrf).attach('files', buf, name)
      expect(res.status, name).toBe(status)
      expect(res.body.error.message, name).toContain(name)
    }
    const big = Buffer.alloc(50 * 1024 * 1024, 0x20)
    const huge = await as.editor.agent.post(`/api/v1/projects/${iconsId}/imports/svg/preview`).set('X-CSRF-Token', as.editor.csrf).attach('files', big, 'huge.svg')
    expect(huge.status).toBe(413)
    expect(huge.body.error.code).toBe('limit')
    const viewer = await as.viewer.agent.post(`/api/v1/projects/${iconsId}/imports/svg/preview`).set('X-CSRF-Token', as.viewer.csrf).attach('files', fixture('harbour-signs.svg'), 'x.svg')
    expect(viewer.status).toBe(403)
    expect(await pathCount()).toBe(before)
  })

  it('previews glyphs of a TTF font (DejaVu Sans from the npm package dejavu-fonts-ttf) and refuses a truncated one', async () => {
    const ttf = readFileSync(requireFrom.resolve('dejavu-fonts-ttf/ttf/DejaVuSans.ttf'))
    const res = await as.editor.agent
      .post(`/api/v1/projects/${iconsId}/imports/font/preview`)
      .set('X-CSRF-Token', as.editor.csrf)
      .field('text', 'Ab')
      .attach('file', ttf, 'DejaVuSans.ttf')
    expect(res.status, JSON.stringify(res.body).slice(0, 300)).toBe(200)
    expect(res.body.font).toMatchObject({ family: 'DejaVu Sans', format: 'TTF', outlines: 'quadratic', unitsPerEm: 2048 })
    expect(res.body.glyphs.map((g: { codePoint: number }) => g.codePoint)).toEqual([0x41, 0x62])
    expect(res.body.glyphs[0].counts.quadratic + res.body.glyphs[0].counts.line).toBeGreaterThan(0)
    const truncated = await as.editor.agent
      .post(`/api/v1/projects/${iconsId}/imports/font/preview`)
      .set('X-CSRF-Token', as.editor.csrf)
      .field('text', 'A')
      .attach('file', ttf.subarray(0, 1000), 'DejaVuSans.ttf')
    expect(truncated.status).toBe(400)
    expect(truncated.body.error.code).toBe('invalid_font')
  })
})
