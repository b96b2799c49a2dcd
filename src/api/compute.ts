import { intersectResponseSchema, type IntersectRequest } from '../../shared/api'
import { request } from './http'

/** Hits of each probe on a path, solved by the server (the computation contract's /intersect). */
export function intersect(input: IntersectRequest, signal?: AbortSignal) {
  return request('/intersect', { method: 'POST', body: input, schema: intersectResponseSchema, signal })
}
