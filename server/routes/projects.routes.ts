import type { DataSource } from 'typeorm'
import { z } from 'zod'
import { idParam } from '../../shared/api/common'
import {
  createProjectSchema,
  projectListQuerySchema,
  projectPageSchema,
  projectSchema,
  updateProjectSchema,
} from '../../shared/api/projects'
import * as projects from '../services/projects.service'
import type { ApiRegistry } from './api-route'
import { changedDraft, createdDraft, deletedDraft } from './activity-text'

const teamParams = z.object({ teamId: idParam })
const projectParams = z.object({ projectId: idParam })

export function projectRoutes(api: ApiRegistry, ds: DataSource): void {
  api.add({
    method: 'get',
    path: '/teams/:teamId/projects',
    tag: 'projects',
    summary: "List a team's projects, paged, sorted and filtered on the server",
    access: { permission: 'project.read', scope: 'team' },
    params: teamParams,
    query: projectListQuerySchema,
    response: projectPageSchema,
    handler: async ({ params, query }) => projects.listProjects(ds, params.teamId, query),
  })

  api.add({
    method: 'post',
    path: '/teams/:teamId/projects',
    tag: 'projects',
    summary: 'Create a project in a team (editor or owner)',
    access: { permission: 'project.create', scope: 'team' },
    params: teamParams,
    body: createProjectSchema,
    status: 201,
    response: projectSchema,
    handler: async ({ params, body, user }) => projects.createProject(ds, params.teamId, user.id, body),
    activity: ({ result }) => ({ ...createdDraft('project', 'project', result), projectId: result.id }),
  })

  api.add({
    method: 'get',
    path: '/projects/:projectId',
    tag: 'projects',
    summary: 'One project',
    access: { permission: 'project.read', scope: 'project' },
    params: projectParams,
    response: projectSchema,
    handler: async ({ params }) => projects.getProject(ds, params.projectId),
  })

  api.add({
    method: 'patch',
    path: '/projects/:projectId',
    tag: 'projects',
    summary: 'Rename a project or change its description (editor or owner)',
    access: { permission: 'project.update', scope: 'project' },
    params: projectParams,
    body: updateProjectSchema,
    response: projectSchema,
    handler: async ({ params, body }) => projects.updateProject(ds, params.projectId, body),
    activity: ({ result, scoped }) => changedDraft('project', 'project', result, scoped),
  })

  api.add({
    method: 'delete',
    path: '/projects/:projectId',
    tag: 'projects',
    summary: 'Delete a project with everything in it (owner only)',
    access: { permission: 'project.delete', scope: 'project' },
    params: projectParams,
    status: 204,
    handler: async ({ params }) => projects.deleteProject(ds, params.projectId),
    activity: ({ params, scoped }) => deletedDraft('project', 'project', params.projectId, scoped, ' with everything in it'),
  })

}
