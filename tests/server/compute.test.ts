import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RootcastApp } from '../../server/app'
import { buildTestApp, seedTestData, signIn, type SignedIn } from '../helpers/test-app'
import { createTestDatabase, type TestDatabase } from '../helpers/test-db'

let db: TestDatabase
let rc: RootcastApp
let viewer: SignedIn

beforeAll(async () => {
  db = await createTestDatabase()
  await seedTestData(db.ds)
  rc = buildTestApp(db.ds)
  viewer = await signIn(rc.app, 'viewer@example.com')
})
afterAll(async () => {
  await rc?.close()
  await db?.drop()
})

const post = (url: string, body: unknown) => viewer.agent.post(`/api/v1${url}`).send(body as object)

describe('POST /solve/cubic', () => {
  it("answers Cardano's example, cube and six things equal twenty: t = 2 (Ars Magna, 1545)", async () => {
    const res = await post('/solve/cubic', { coefficients: [1, 0, 6, -20] })
    expect(res.status).toBe(200)
    expect(res.body).toEqual({ degree: 3, identicallyZero: false, discriminant: -4 * 216 - 27 * 400, roots: [{ t: 2, multiplicity: 1 }] })
  })

  it("answers Bombelli's example t³ = 15t + 4 with its three real roots (L'Algebra, 1572)", async () => {
    const res = await post('/solve/cubic', { coefficients: [1, 0, -15, -4] })
    expect(res.body.degree).toBe(3)
    // Δ = −4p³ − 27q² with p = −15, q = −4 (standard algebra): 13500 − 432 = 13068.
    expect(res.body.discriminant).toBe(13068)
    const ts = res.body.roots.map((r: { t: number }) => r.t)
    expect(ts).toHaveLength(3)
    expect(ts[0]).toBeCloseTo(-2 - Math.sqrt(3), 14)
    expect(ts[1]).toBeCloseTo(-2 + Math.sqrt(3), 14)
    expect(ts[2]).toBe(4)
  })

  it('reports multiple roots once, t = 0 exactly when d = 0, and the degenerate degrees', async () => {
    // (t − 1)³ = t³ − 3t² + 3t − 1: one triple root.
    expect((await post('/solve/cubic', { coefficients: [1, -3, 3, -1] })).body.roots).toEqual([{ t: 1, multiplicity: 3 }])
    // t(t − 3)² = t³ − 6t² + 9t: a simple root at exactly 0 and a double root at 3.
    expect((await post('/solve/cubic', { coefficients: [1, -6, 9, 0] })).body.roots).toEqual([
      { t: 0, multiplicity: 1 },
      { t: 3, multiplicity: 2 },
    ])
    expect((await post('/solve/cubic', { coefficients: [0, 0, 0, 0] })).body).toEqual({ degree: 0, identicallyZero: true, discriminant: null, roots: [] })
    expect((await post('/solve/cubic', { coefficients: [0, 0, 0, 7] })).body).toEqual({ degree: 0, identicallyZero: false, discriminant: null, roots: [] })
    expect((await post('/solve/cubic', { coefficients: [0, 0, 4, -2] })).body).toMatchObject({ degree: 1, discriminant: null, roots: [{ t: 0.5, multiplicity: 1 }] })
    const quad = (await post('/solve/cubic', { coefficients: [0, 1, 0, -4] })).body
    expect(quad).toEqual({ degree: 2, identicallyZero: false, discriminant: 16, roots: [{ t: -2, multiplicity: 1 }, { t: 2, multiplicity: 1 }] })
  })

  it('refuses bad input with 400 in the error shape', async () => {
    const bodies: unknown[] = [
      {},
      { coefficients: [1, 2, 3] },
      { coefficients: [1, 2, 3, 4, 5] },
      { coefficients: ['1', 0, 0, 0] },
      { coefficients: [null, 0, 0, 0] },
      { coefficients: [1e400, 0, 0, 0] },
      { coefficients: 'x³' },
    ]
    for (const body of bodies) {
      const res = await post('/solve/cubic', body)
      expect(res.status, JSON.stringify(body)).toBe(400)
      expect(res.body.error.code).toBe('validation')
      expect(typeof res.body.error.message).toBe('string')
    }
    for (const raw of ['{"coefficients":[NaN,0,0,0]}', '{"coefficients":[Infinity,0,0,0]}', '{"coefficients":[1,2']) {
      const res = await viewer.agent.post('/api/v1/solve/cubic').set('Content-Type', 'application/json').send(raw)
      expect(res.status, raw).toBe(400)
      expect(res.body.error.code).toBe('invalid_json')
    }
  })

  it('needs a signed-in caller, and no CSRF token since it changes nothing', async () => {
    expect((await request(rc.app).post('/api/v1/solve/cubic').send({ coefficients: [1, 0, 0, -1] })).status).toBe(401)
    expect((await viewer.agent.post('/api/v1/solve/cubic').send({ coefficients: [1, 0, 0, -1] })).status).toBe(200)
  })
})

const square = 'M0 0 H10 V10 H0 Z'

describe('POST /intersect', () => {
  it('answers a ray across a closed square with two crossings whose windings sum to the winding number', async () => {
    const res = await post('/intersect', { path: square, probes: [{ type: 'ray', origin: [5, 5], direction: [1, 0] }, { type: 'line', origin: [-1, 5], direction: [1, 0] }] })
    expect(res.status).toBe(200)
    expect(res.body.segments).toBe(4)
    const [ray, line] = res.body.results
    expect(ray.hits).toHaveLength(1)
    // Right edge (segment 1) runs downwards: tangent (0, 10); direction (1, 0): 1·10 − 0·0 > 0 → +1.
    expect(ray.hits[0]).toMatchObject({ segment: 1, t: 0.5, s: 5, point: [10, 5], kind: 'crossing', winding: 1 })
    expect(line.hits.map((h: { s: number }) => h.s)).toEqual([1, 11])
    expect(line.hits.map((h: { winding: number }) => h.winding)).toEqual([-1, 1])
  })

  it('reports a straight piece along the probe as one overlap', async () => {
    const res = await post('/intersect', { path: square, probes: [{ type: 'line', origin: [-5, 0], direction: [1, 0] }] })
    const hits = res.body.results[0].hits
    expect(hits).toHaveLength(1)
    expect(hits[0]).toMatchObject({ segment: 0, kind: 'overlap', s: 5, sEnd: 15, t: 0, tEnd: 1 })
  })

  it('refuses bad probes and bad path data with 400', async () => {
    const cases: Array<[unknown, string]> = [
      [{ path: square, probes: [{ type: 'ray', origin: [0, 0], direction: [0, 0] }] }, 'validation'],
      [{ path: square, probes: [{ type: 'segment', from: [1, 1], to: [1, 1] }] }, 'validation'],
      [{ path: square, probes: [{ type: 'beam', origin: [0, 0], direction: [1, 0] }] }, 'validation'],
      [{ path: square, probes: [{ type: 'ray', origin: [0, '0'], direction: [1, 0] }] }, 'validation'],
      [{ path: square }, 'validation'],
      [{ probes: [] }, 'validation'],
      [{ path: 'M0 0 C 1 2 3', probes: [] }, 'invalid_path'],
      [{ path: 'M0 0 L 10 10 Q', probes: [] }, 'invalid_path'],
      [{ path: 'hello', probes: [] }, 'invalid_path'],
    ]
    for (const [body, code] of cases) {
      const res = await post('/intersect', body)
      expect(res.status, JSON.stringify(body)).toBe(400)
      expect(res.body.error.code, JSON.stringify(body)).toBe(code)
    }
  })

  it('enforces the limits with 413 limit: probes per request, segments per path, body size', async () => {
    const many = Array.from({ length: 100_001 }, () => ({ type: 'line', origin: [0, 1], direction: [1, 0] }))
    const tooMany = await post('/intersect', { path: square, probes: many })
    expect(tooMany.status).toBe(413)
    expect(tooMany.body.error.code).toBe('limit')
    const longPath = 'M0 0' + ' l1 1'.repeat(20_001)
    const tooLong = await post('/intersect', { path: longPath, probes: [] })
    expect(tooLong.status).toBe(413)
    expect(tooLong.body.error.message).toMatch(/20001 segments/)
    const huge = await post('/intersect', { path: 'M0 0' + ' L1 1'.repeat(450_000), probes: [] })
    expect(huge.status).toBe(413)
    expect(huge.body.error.code).toBe('limit')
  })
})

describe('POST /contains', () => {
  // A square with a square hole drawn the same way round: nonzero fills the hole, evenodd does not.
  const framed = 'M0 0 H30 V30 H0 Z M10 10 H20 V20 H10 Z'
  it('applies the fill rules to the winding number', async () => {
    const points = [[15, 15], [5, 5], [40, 5], [30, 15]]
    const nz = await post('/contains', { path: framed, points })
    expect(nz.status).toBe(200)
    expect(nz.body.results.map((r: { winding: number }) => Math.abs(r.winding))).toEqual([2, 1, 0, expect.any(Number)])
    expect(nz.body.results.map((r: { inside: boolean }) => r.inside).slice(0, 3)).toEqual([true, true, false])
    expect(nz.body.results[3].onBoundary).toBe(true)
    const eo = await post('/contains', { path: framed, points, fillRule: 'evenodd' })
    expect(eo.body.results.map((r: { inside: boolean }) => r.inside).slice(0, 3)).toEqual([false, true, false])
  })

  it('treats an open subpath as closed, as SVG fills it', async () => {
    const res = await post('/contains', { path: 'M0 0 L10 0 L10 10 L0 10', points: [[5, 5]] })
    expect(res.body.results[0]).toMatchObject({ inside: true, onBoundary: false })
    expect(Math.abs(res.body.results[0].winding)).toBe(1)
  })

  it('refuses a bad fill rule and bad points', async () => {
    for (const body of [
      { path: square, points: [[1, 1]], fillRule: 'winding' },
      { path: square, points: [[1]] },
      { path: square, points: [[1, 'x']] },
    ]) {
      const res = await post('/contains', body)
      expect(res.status, JSON.stringify(body)).toBe(400)
      expect(res.body.error.code).toBe('validation')
    }
  })
})
