import { activityPageSchema, type ActivityPage, type ActivityQuery } from '../../shared/api'
import { request } from './http'

/** One page of a project's activity log, newest first, with the people for the person filter. */
export function listProjectActivity(projectId: number, query: ActivityQuery, signal?: AbortSignal): Promise<ActivityPage> {
  return request(`/projects/${projectId}/activity`, { query: { ...query }, schema: activityPageSchema, signal })
}
