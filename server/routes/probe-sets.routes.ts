import type { DataSource } from 'typeorm'
import { z } from 'zod'
import { idParam } from '../../shared/api/common'
import {
  newProbeSetSchema,
  probeSetListQuerySchema,
  probeSetListSchema,
  probeSetSchema,
  updateProbeSetSchema,
} from '../../shared/api/probe-sets'
import * as probeSets from '../services/probe-sets.service'
import type { ApiRegistry } from './api-route'
import { changedDraft, createdDraft, deletedDraft } from './activity-text'

const projectParams = z.object({ projectId: idParam })
const probeSetParams = z.object({ probeSetId: idParam })

const read = (scope: 'project' | 'probeSet') => ({ permission: 'library.read', scope }) as const
const write = (scope: 'project' | 'probeSet') => ({ permission: 'probeSet.write', scope }) as const

export function probeSetRoutes(api: ApiRegistry, ds: DataSource): void {
  api.add({
    method: 'get', path: '/projects/:projectId/probe-sets', tag: 'probe-sets',
    summary: "The project's probe sets (of one path when pathId is given), newest first, without their probes",
    access: read('project'), params: projectParams, query: probeSetListQuerySchema, response: probeSetListSchema,
    handler: async ({ params, query }) => ({ items: await probeSets.listProbeSets(ds, params.projectId, query.pathId) }),
  })

  api.add({
    method: 'post', path: '/projects/:projectId/probe-sets', tag: 'probe-sets',
    summary: 'Save probes and sweeps over a revision of a live path of the project',
    description: 'The name is unique in the project (409 `probe_set_name_taken`); a path of another project or in the trash is 404 `path_not_found`; a revision the path does not have is 400 `unknown_revision`.',
    access: write('project'), params: projectParams, body: newProbeSetSchema, status: 201, response: probeSetSchema, errors: [409],
    handler: async ({ params, body, user }) => probeSets.createProbeSet(ds, params.projectId, user.id, body),
    activity: ({ result }) => createdDraft('probe-set', 'probe set', result),
  })

  api.add({
    method: 'get', path: '/probe-sets/:probeSetId', tag: 'probe-sets', summary: 'One probe set with its probes and sweeps',
    access: read('probeSet'), params: probeSetParams, response: probeSetSchema,
    handler: async ({ params }) => probeSets.getProbeSet(ds.manager, params.probeSetId),
  })

  api.add({
    method: 'put', path: '/probe-sets/:probeSetId', tag: 'probe-sets',
    summary: 'Replace the fields given of a probe set; a new path or revision is checked as on create',
    access: write('probeSet'), params: probeSetParams, body: updateProbeSetSchema, response: probeSetSchema, errors: [409],
    handler: async ({ params, body }) => probeSets.updateProbeSet(ds, params.probeSetId, body),
    activity: ({ result, scoped }) => changedDraft('probe-set', 'probe set', result, scoped),
  })

  api.add({
    method: 'delete', path: '/probe-sets/:probeSetId', tag: 'probe-sets', summary: 'Delete a probe set',
    access: write('probeSet'), params: probeSetParams, status: 204,
    handler: async ({ params }) => probeSets.deleteProbeSet(ds, params.probeSetId),
    activity: ({ params, scoped }) => deletedDraft('probe-set', 'probe set', params.probeSetId, scoped),
  })
}
