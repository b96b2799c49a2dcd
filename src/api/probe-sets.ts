import {
  probeSetListSchema,
  probeSetSchema,
  type NewProbeSet,
  type ProbeSet,
  type ProbeSetSummary,
  type UpdateProbeSet,
} from '../../shared/api'
import { request } from './http'

/** The project's probe sets as summaries (no probes), newest first; only one path's when `pathId` is given. */
export async function listProbeSets(projectId: number, pathId?: number, signal?: AbortSignal): Promise<ProbeSetSummary[]> {
  const result = await request(`/projects/${projectId}/probe-sets`, { query: { pathId }, schema: probeSetListSchema, signal })
  return result.items
}

/** One probe set with its probes and sweeps. */
export function getProbeSet(probeSetId: number, signal?: AbortSignal): Promise<ProbeSet> {
  return request(`/probe-sets/${probeSetId}`, { schema: probeSetSchema, signal })
}

/** Saves a new probe set on a revision of a live path of the project (editor). */
export function createProbeSet(projectId: number, input: NewProbeSet): Promise<ProbeSet> {
  return request(`/projects/${projectId}/probe-sets`, { method: 'POST', body: input, schema: probeSetSchema })
}

/** Replaces the fields given (editor); at least one. */
export function updateProbeSet(probeSetId: number, patch: UpdateProbeSet): Promise<ProbeSet> {
  return request(`/probe-sets/${probeSetId}`, { method: 'PUT', body: patch, schema: probeSetSchema })
}

/** Deletes a probe set (editor). */
export function deleteProbeSet(probeSetId: number): Promise<void> {
  return request(`/probe-sets/${probeSetId}`, { method: 'DELETE' })
}
