import {
  projectPageSchema,
  projectSchema,
  type CreateProject,
  type Project,
  type ProjectListQuery,
  type ProjectPage,
  type UpdateProject,
} from '../../shared/api'
import { request } from './http'

/** One page of a team's projects, paged, sorted and filtered by the server. */
export function listProjects(teamId: number, query: ProjectListQuery, signal?: AbortSignal): Promise<ProjectPage> {
  return request(`/teams/${teamId}/projects`, {
    query: { ...query, q: query.q?.trim() || undefined },
    schema: projectPageSchema,
    signal,
  })
}

/** Creates a project in a team (editor or owner). */
export function createProject(teamId: number, input: CreateProject): Promise<Project> {
  return request(`/teams/${teamId}/projects`, { method: 'POST', body: input, schema: projectSchema })
}

export function getProject(projectId: number): Promise<Project> {
  return request(`/projects/${projectId}`, { schema: projectSchema })
}

/** Renames a project or changes its description (editor or owner). */
export function updateProject(projectId: number, patch: UpdateProject): Promise<Project> {
  return request(`/projects/${projectId}`, { method: 'PATCH', body: patch, schema: projectSchema })
}

/** Deletes a project with its library (owner only). */
export function deleteProject(projectId: number): Promise<void> {
  return request(`/projects/${projectId}`, { method: 'DELETE' })
}
