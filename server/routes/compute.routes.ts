import { COMPUTE_LIMITS, containsRequestSchema, containsResponseSchema, intersectRequestSchema, intersectResponseSchema, solveCubicRequestSchema, solveCubicResponseSchema } from '../../shared/api/compute'
import { containsPoints, intersectProbes, parsePathData, solveCubic } from '../../shared/geometry/index'
import type { NormalisedPath } from '../../shared/geometry/index'
import { HttpError } from '../errors/http-error'
import type { ApiRegistry } from './api-route'

/** Parses path data for a computation, refusing bad data (400) and oversized paths (413). */
export function parsePathForCompute(data: string): NormalisedPath {
  const parsed = parsePathData(data)
  if (!parsed.ok) throw new HttpError(400, parsed.error.code, parsed.error.message, parsed.error.position === undefined ? undefined : [{ position: parsed.error.position }])
  if (parsed.path.segments.length > COMPUTE_LIMITS.segments) {
    throw new HttpError(413, 'limit', `The path has ${parsed.path.segments.length} segments after normalisation; the limit is ${COMPUTE_LIMITS.segments}.`)
  }
  return parsed.path
}

/**
 * The computation routes of the public contract. They change nothing on the server, so
 * they need no CSRF token; every signed-in role may call them.
 */
export function computeRoutes(api: ApiRegistry): void {
  const access = { permission: 'signedIn', scope: 'none' } as const

  api.add({
    method: 'post',
    path: '/solve/cubic',
    tag: 'compute',
    summary: 'Real roots of a·t³ + b·t² + c·t + d = 0 in closed form',
    description: 'Cardano’s formula where there is one real root, the trigonometric form where there are three; distinct roots ascending with multiplicity.',
    access,
    csrf: false,
    body: solveCubicRequestSchema,
    response: solveCubicResponseSchema,
    handler: async ({ body }) => {
      const [a, b, c, d] = body.coefficients
      return solveCubic(a, b, c, d)
    },
    activity: { none: 'A pure computation: nothing is stored.' },
  })

  api.add({
    method: 'post',
    path: '/intersect',
    tag: 'compute',
    summary: 'Where rays, lines and segments meet an SVG path',
    description: `Hits sorted by s per probe. At most ${COMPUTE_LIMITS.segments} segments per path and ${COMPUTE_LIMITS.items} probes per request.`,
    access,
    csrf: false,
    body: intersectRequestSchema,
    response: intersectResponseSchema,
    errors: [413],
    handler: async ({ body }) => {
      const path = parsePathForCompute(body.path)
      const results = intersectProbes(path, body.probes).map((hits) => ({ hits }))
      return { segments: path.segments.length, results }
    },
    activity: { none: 'A pure computation: nothing is stored.' },
  })

  api.add({
    method: 'post',
    path: '/contains',
    tag: 'compute',
    summary: 'Whether points are inside a path under the nonzero or even-odd fill rule',
    access,
    csrf: false,
    body: containsRequestSchema,
    response: containsResponseSchema,
    errors: [413],
    handler: async ({ body }) => {
      const path = parsePathForCompute(body.path)
      return { results: containsPoints(path, body.points, body.fillRule) }
    },
    activity: { none: 'A pure computation: nothing is stored.' },
  })
}
