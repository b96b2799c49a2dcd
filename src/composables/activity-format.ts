import type { RouteLocationRaw } from 'vue-router'
import type { ActivityAction, ActivityEntry, ActivityTargetType } from '../../shared/api'

/** How the Activity screen names each action (past tense, as the log reads). */
export const ACTION_LABELS: Record<ActivityAction, string> = {
  created: 'Created', changed: 'Changed', restored: 'Restored', trashed: 'Trashed', purged: 'Deleted for good',
  deleted: 'Deleted', imported: 'Imported', ran: 'Ran', cancelled: 'Cancelled', invited: 'Invited',
  resent: 'Resent', revoked: 'Revoked', joined: 'Joined', removed: 'Removed', reset: 'Reset',
}

/** How the Activity screen names each kind of target. */
export const TARGET_TYPE_LABELS: Record<ActivityTargetType, string> = {
  project: 'Project', path: 'Path', revision: 'Revision', 'probe-set': 'Probe set', suite: 'Suite', check: 'Check',
  run: 'Run', audit: 'Audit', token: 'Token', invitation: 'Invitation', member: 'Member', account: 'Account', team: 'Team',
}

/** Actions after which the target no longer exists, so there is nothing to open. */
const GONE: ReadonlySet<ActivityAction> = new Set(['deleted', 'purged', 'removed', 'revoked'])

/**
 * The screen that shows an entry's target, or null where there is none (or it is gone):
 * a path opens in the library's detail drawer, revisions the library, suites and checks the
 * Suites tab, a run itself on the Suites tab, an audit itself on the Audits tab.
 */
export function activityTargetLink(entry: Pick<ActivityEntry, 'action' | 'targetType' | 'targetId' | 'projectId'>): RouteLocationRaw | null {
  if (entry.projectId === null || entry.targetId === null || GONE.has(entry.action)) return null
  const params = { id: String(entry.projectId) }
  switch (entry.targetType) {
    case 'project':
    case 'revision':
      return { name: 'project-library', params }
    case 'path':
      return { name: 'project-library', params, query: { path: String(entry.targetId) } }
    case 'suite':
    case 'check':
      return { name: 'project-suites', params }
    case 'run':
      return { name: 'project-suites', params, query: { run: String(entry.targetId) } }
    case 'audit':
      return { name: 'project-audits', params, query: { audit: String(entry.targetId) } }
    default:
      return null
  }
}
