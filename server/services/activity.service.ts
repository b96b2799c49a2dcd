import type { DataSource } from 'typeorm'
import {
  ACTIVITY_LIMITS,
  type ActivityAction,
  type ActivityEntry,
  type ActivityPage,
  type ActivityQuery,
  type ActivityTargetType,
  type ActivityVia,
} from '../../shared/api/activity'
import { ActivityEntity } from '../entities/activity.entity'

/** One entry to append; the log is append-only, so this is all the service ever writes. */
export interface NewActivity {
  teamId: number | null
  projectId: number | null
  actorId: number | null
  actorName: string
  via: ActivityVia
  action: ActivityAction
  targetType: ActivityTargetType
  targetId: number | null
  targetName: string
  summary: string
}

/** What a route's scope parameter names, read before the write (a delete would remove it). */
export interface ScopedTarget {
  id: number
  name: string
  /** The project it belongs to; null for a team. */
  projectId: number | null
}

export type ScopedKind = 'team' | 'project' | 'path' | 'probeSet' | 'suite' | 'check' | 'run' | 'audit' | 'invitation'

/** SQL reading `name` and `projectId` of one row of each scope kind. */
const scopedSql: Record<ScopedKind, string> = {
  team: 'SELECT name, NULL AS projectId FROM teams WHERE id = ?',
  project: 'SELECT name, id AS projectId FROM projects WHERE id = ?',
  path: 'SELECT name, project_id AS projectId FROM paths WHERE id = ?',
  probeSet: 'SELECT name, project_id AS projectId FROM probe_sets WHERE id = ?',
  suite: 'SELECT name, project_id AS projectId FROM suites WHERE id = ?',
  check: 'SELECT c.name, s.project_id AS projectId FROM checks c JOIN suites s ON s.id = c.suite_id WHERE c.id = ?',
  run: "SELECT CONCAT(s.name, ' #', r.number) AS name, s.project_id AS projectId FROM runs r JOIN suites s ON s.id = r.suite_id WHERE r.id = ?",
  audit: 'SELECT name, project_id AS projectId FROM audits WHERE id = ?',
  invitation: 'SELECT email AS name, NULL AS projectId FROM invitations WHERE id = ?',
}

/** The name and project of what a scope parameter names; undefined when there is no such row. */
export async function describeScoped(ds: DataSource, kind: ScopedKind, id: number): Promise<ScopedTarget | undefined> {
  const [row] = (await ds.query(scopedSql[kind], [id])) as Array<{ name: string; projectId: number | string | null }>
  return row ? { id, name: row.name, projectId: row.projectId === null ? null : Number(row.projectId) } : undefined
}

/** Cuts text to a column's length, marking the cut with an ellipsis. */
function clip(text: string, max: number): string {
  return text.length <= max ? text : `${text.slice(0, max - 1)}…`
}

/** Appends one entry to the log. */
export async function recordActivity(ds: DataSource, entry: NewActivity): Promise<void> {
  await ds.getRepository(ActivityEntity).insert({
    ...entry,
    actorName: clip(entry.actorName, ACTIVITY_LIMITS.actorNameChars),
    targetName: clip(entry.targetName, ACTIVITY_LIMITS.targetNameChars),
    summary: clip(entry.summary, ACTIVITY_LIMITS.summaryChars),
  })
}

function toEntry(e: ActivityEntity): ActivityEntry {
  return {
    id: e.id,
    at: e.createdAt.toISOString(),
    actor: { id: e.actorId, name: e.actorName },
    via: e.via,
    action: e.action,
    targetType: e.targetType,
    targetId: e.targetId,
    targetName: e.targetName,
    summary: e.summary,
    teamId: e.teamId,
    projectId: e.projectId,
  }
}

const DAY_MS = 86_400_000

/**
 * One page of a team's or a project's log, newest first, with the filters of the query
 * (dates are whole UTC days, both ends included) and everyone who appears in the log.
 */
export async function listActivity(
  ds: DataSource,
  of: { teamId: number } | { projectId: number },
  query: ActivityQuery,
): Promise<ActivityPage> {
  const scopeColumn = 'teamId' in of ? 'team_id' : 'project_id'
  const scopeId = 'teamId' in of ? of.teamId : of.projectId
  const qb = ds.getRepository(ActivityEntity).createQueryBuilder('a').where(`a.${scopeColumn} = :scopeId`, { scopeId })
  if (query.actor !== undefined) qb.andWhere('a.actor_id = :actor', { actor: query.actor })
  if (query.action !== undefined) qb.andWhere('a.action = :action', { action: query.action })
  if (query.targetType !== undefined) qb.andWhere('a.target_type = :targetType', { targetType: query.targetType })
  if (query.from !== undefined) qb.andWhere('a.created_at >= :from', { from: new Date(`${query.from}T00:00:00Z`) })
  if (query.to !== undefined) qb.andWhere('a.created_at < :to', { to: new Date(Date.parse(`${query.to}T00:00:00Z`) + DAY_MS) })
  const [rows, total] = await qb
    .orderBy('a.createdAt', 'DESC')
    .addOrderBy('a.id', 'DESC')
    .skip((query.page - 1) * query.pageSize)
    .take(query.pageSize)
    .getManyAndCount()

  // The newest name of each person in this log, for the person filter.
  const peopleRows = (await ds.query(
    `SELECT a.actor_id AS id, a.actor_name AS name FROM activity a
     JOIN (SELECT MAX(id) AS id FROM activity WHERE ${scopeColumn} = ? AND actor_id IS NOT NULL GROUP BY actor_id) latest ON latest.id = a.id`,
    [scopeId],
  )) as Array<{ id: number | string; name: string }>
  const people = peopleRows.map((p) => ({ id: Number(p.id), name: String(p.name) })).sort((x, y) => x.name.localeCompare(y.name))

  return { items: rows.map(toEntry), total, page: query.page, pageSize: query.pageSize, people }
}
