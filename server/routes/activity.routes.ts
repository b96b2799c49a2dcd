import type { DataSource } from 'typeorm'
import { z } from 'zod'
import { activityPageSchema, activityQuerySchema } from '../../shared/api/activity'
import { idParam } from '../../shared/api/common'
import { listActivity } from '../services/activity.service'
import type { ApiRegistry } from './api-route'

/** The activity log, read-only: every write route appends to it through the route layer. */
export function activityRoutes(api: ApiRegistry, ds: DataSource): void {
  api.add({
    method: 'get', path: '/projects/:projectId/activity', tag: 'activity',
    summary: "Who created, changed, restored, ran or deleted what in the project, newest first, filtered and paged",
    description: 'Filters: `actor` (a user id), `action`, `targetType`, and `from`/`to` days (UTC, both included). `people` lists everyone in this log for the person filter.',
    access: { permission: 'library.read', scope: 'project' }, params: z.object({ projectId: idParam }), query: activityQuerySchema, response: activityPageSchema,
    handler: async ({ params, query }) => listActivity(ds, { projectId: params.projectId }, query),
  })

  api.add({
    method: 'get', path: '/teams/:teamId/activity', tag: 'activity',
    summary: "The team's whole activity log (its projects and the team itself), newest first, filtered and paged",
    access: { permission: 'team.read', scope: 'team' }, params: z.object({ teamId: idParam }), query: activityQuerySchema, response: activityPageSchema,
    handler: async ({ params, query }) => listActivity(ds, { teamId: params.teamId }, query),
  })
}
