import { describe, expect, it } from 'vitest'
import type { ProbeSet, ProbeSetSummary } from '../../shared/api'
import { ApiRequestError, setCsrfToken } from '../../src/api/http'
import { createProbeSet, deleteProbeSet, getProbeSet, listProbeSets, updateProbeSet } from '../../src/api/probe-sets'
import { errorResponse, isolateClientState, jsonResponse, noContent, stubFetch } from './fetch-stub'
import { PROJECT_ID } from './library-fixtures'

isolateClientState()

/** Invented scenario data: rays on the demo's map pin (path 7 of the Wayfinding icons project). */
const PIN_ID = 7
const pinRays: ProbeSet = {
  id: 31,
  projectId: PROJECT_ID,
  pathId: PIN_ID,
  pathName: 'Map pin',
  revision: 2,
  name: 'Pin rays',
  description: 'From the hole, the body and outside',
  probes: [
    { type: 'ray', origin: [12, 9], direction: [1, 0] },
    { type: 'segment', from: [0, 20], to: [24, 20] },
  ],
  sweeps: [{ angle: -45, spacing: 0.5, count: 12, origin: [2, 2] }],
  author: 'Tobias Slipway',
  createdAt: '2026-11-20T10:00:00.000Z',
  updatedAt: '2026-11-21T09:30:00.000Z',
}
const { probes: _probes, sweeps: _sweeps, ...pinBase } = pinRays
const pinSummary: ProbeSetSummary = { ...pinBase, probeCount: 2, sweepCount: 1 }

async function rejectionOf(promise: Promise<unknown>): Promise<ApiRequestError> {
  const outcome = await promise.then(() => null, (error: unknown) => error)
  expect(outcome).toBeInstanceOf(ApiRequestError)
  return outcome as ApiRequestError
}

describe('probe set API', () => {
  it('lists a project’s sets, with the path filter only when one is given', async () => {
    const { calls } = stubFetch({ [`GET /api/v1/projects/${PROJECT_ID}/probe-sets`]: () => jsonResponse(200, { items: [pinSummary] }) })
    expect(await listProbeSets(PROJECT_ID)).toEqual([pinSummary])
    await listProbeSets(PROJECT_ID, PIN_ID)
    expect(calls.map((c) => c.url)).toEqual([`/api/v1/projects/${PROJECT_ID}/probe-sets`, `/api/v1/projects/${PROJECT_ID}/probe-sets?pathId=${PIN_ID}`])
    expect(calls[0].method).toBe('GET')
  })

  it('reads one set with its probes and sweeps', async () => {
    stubFetch({ 'GET /api/v1/probe-sets/31': () => jsonResponse(200, pinRays) })
    const set = await getProbeSet(31)
    expect(set.probes[1]).toEqual({ type: 'segment', from: [0, 20], to: [24, 20] })
    expect(set.sweeps[0].angle).toBe(-45)
  })

  it('creates with POST and updates with PUT, as JSON with the CSRF token', async () => {
    const { calls } = stubFetch({
      [`POST /api/v1/projects/${PROJECT_ID}/probe-sets`]: () => jsonResponse(201, pinRays),
      'PUT /api/v1/probe-sets/31': () => jsonResponse(200, { ...pinRays, name: 'Pin rays, revised' }),
    })
    setCsrfToken('csrf-probe-7')
    const input = { name: 'Pin rays', pathId: PIN_ID, revision: 2, probes: pinRays.probes, sweeps: pinRays.sweeps }
    expect((await createProbeSet(PROJECT_ID, input)).id).toBe(31)
    expect((await updateProbeSet(31, { name: 'Pin rays, revised' })).name).toBe('Pin rays, revised')
    expect(calls.map((c) => [c.method, c.headers['x-csrf-token'], c.headers['content-type']])).toEqual([
      ['POST', 'csrf-probe-7', 'application/json'],
      ['PUT', 'csrf-probe-7', 'application/json'],
    ])
    expect(calls[0].body).toEqual(input)
    expect(calls[1].body).toEqual({ name: 'Pin rays, revised' })
  })

  it('deletes with DELETE and resolves on 204', async () => {
    const { calls } = stubFetch({ 'DELETE /api/v1/probe-sets/31': () => noContent() })
    await expect(deleteProbeSet(31)).resolves.toBeUndefined()
    expect(calls[0].method).toBe('DELETE')
  })

  it('passes the server’s refusals on with their codes', async () => {
    stubFetch({
      [`POST /api/v1/projects/${PROJECT_ID}/probe-sets`]: () =>
        errorResponse(409, 'probe_set_name_taken', 'This project has a probe set named “Pin rays” already. Choose another name.'),
      'PUT /api/v1/probe-sets/31': () => errorResponse(400, 'unknown_revision', 'That path has no revision 3; its revisions are numbered 1 to 2.'),
    })
    const taken = await rejectionOf(createProbeSet(PROJECT_ID, { name: 'Pin rays', pathId: PIN_ID, revision: 2, probes: [], sweeps: [] }))
    expect([taken.status, taken.code]).toEqual([409, 'probe_set_name_taken'])
    const unknown = await rejectionOf(updateProbeSet(31, { revision: 3 }))
    expect([unknown.status, unknown.code]).toEqual([400, 'unknown_revision'])
  })

  it('refuses an answer that is not a probe set', async () => {
    stubFetch({ 'GET /api/v1/probe-sets/31': () => jsonResponse(200, { ...pinRays, sweeps: [{ angle: 0 }] }) })
    const error = await rejectionOf(getProbeSet(31))
    expect(error.code).toBe('bad_response')
  })
})
