import type { DataSource, EntityManager } from 'typeorm'
import type { z } from 'zod'
import type { ProbeInput } from '../../shared/api/compute'
import type { ProbeSetSweep } from '../../shared/api/probe-sets'
import type { Check, CheckFollow, newCheckSchema, newSuiteSchema, Suite, updateCheckSchema, updateSuiteSchema } from '../../shared/api/suites'
import { SUITE_LIMITS } from '../../shared/api/suites'
import { countCheckLines, listCheckLines } from '../../shared/checks/check-lines'
import type { Hit } from '../../shared/geometry/index'
import { CheckEntity } from '../entities/check.entity'
import { RevisionEntity } from '../entities/revision.entity'
import { SuiteEntity } from '../entities/suite.entity'
import { SuiteWatcherEntity } from '../entities/suite-watcher.entity'
import { HttpError, notFound } from '../errors/http-error'
import { assertPathRevision } from './probe-sets.service'
import { computeLineHits, readCheckRules, runSummariesById, STORED_CHECK_COLUMNS, type StoredCheckRow } from './runs.service'

export type SuiteInput = z.output<typeof newSuiteSchema>
export type SuitePatch = z.output<typeof updateSuiteSchema>
export type CheckInput = z.output<typeof newCheckSchema>
export type CheckPatch = z.output<typeof updateCheckSchema>

/** MariaDB's error number for a duplicate key (ER_DUP_ENTRY); the only unique keys besides the ids are the names. */
const DUPLICATE_KEY_ERRNO = 1062

/** Runs a write; a name taken by a concurrent write (the unique key) is the given 409 too. */
async function guardUniqueName<T>(taken: () => HttpError, write: () => Promise<T>): Promise<T> {
  try {
    return await write()
  } catch (e) {
    if ((e as { driverError?: { errno?: number } }).driverError?.errno === DUPLICATE_KEY_ERRNO) throw taken()
    throw e
  }
}

const suiteNameTaken = (name: string | undefined) => () =>
  new HttpError(409, 'suite_name_taken', `This project has a suite named “${name}” already. Choose another name.`)
const checkNameTaken = (name: string | undefined) => () =>
  new HttpError(409, 'check_name_taken', `This suite has a check named “${name}” already. Choose another name.`)

// ---- Team lookups for the route layer ------------------------------------------------

async function teamIdOf(ds: DataSource, sql: string, id: number): Promise<number | undefined> {
  const row = (await ds.query(sql, [id])) as Array<{ teamId: number }>
  return row[0] ? Number(row[0].teamId) : undefined
}

export const suiteTeamId = (ds: DataSource, id: number) =>
  teamIdOf(ds, 'SELECT pr.team_id AS teamId FROM suites s JOIN projects pr ON pr.id = s.project_id WHERE s.id = ?', id)

export const checkTeamId = (ds: DataSource, id: number) =>
  teamIdOf(ds, 'SELECT pr.team_id AS teamId FROM checks c JOIN suites s ON s.id = c.suite_id JOIN projects pr ON pr.id = s.project_id WHERE c.id = ?', id)

export const runTeamId = (ds: DataSource, id: number) =>
  teamIdOf(ds, 'SELECT pr.team_id AS teamId FROM runs r JOIN suites s ON s.id = r.suite_id JOIN projects pr ON pr.id = s.project_id WHERE r.id = ?', id)

// ---- Suites --------------------------------------------------------------------------

interface SuiteRow {
  id: number
  projectId: number
  name: string
  description: string
  createdAt: Date
  checkCount: number
  watching: number
  lastRunId: number | null
}

async function querySuites(m: EntityManager, where: string, param: number, userId: number, publicUrl: string): Promise<Suite[]> {
  const rows = (await m.query(
    `SELECT s.id AS id, s.project_id AS projectId, s.name AS name, s.description AS description, s.created_at AS createdAt,
      (SELECT COUNT(*) FROM checks c WHERE c.suite_id = s.id) AS checkCount,
      EXISTS (SELECT 1 FROM suite_watchers w WHERE w.suite_id = s.id AND w.user_id = ?) AS watching,
      (SELECT MAX(r.id) FROM runs r WHERE r.suite_id = s.id) AS lastRunId
    FROM suites s WHERE ${where} ORDER BY s.name, s.id`,
    [userId, param],
  )) as SuiteRow[]
  const lastRuns = await runSummariesById(m, rows.flatMap((r) => (r.lastRunId === null ? [] : [Number(r.lastRunId)])), publicUrl)
  return rows.map((r) => ({
    id: Number(r.id),
    projectId: Number(r.projectId),
    name: r.name,
    description: r.description,
    checkCount: Number(r.checkCount),
    watching: Boolean(Number(r.watching)),
    lastRun: r.lastRunId === null ? null : (lastRuns.get(Number(r.lastRunId)) ?? null),
    createdAt: new Date(r.createdAt).toISOString(),
  }))
}

/** The project's suites by name, each with its last run and whether the caller watches it. */
export function listSuites(ds: DataSource, projectId: number, userId: number, publicUrl: string): Promise<Suite[]> {
  return querySuites(ds.manager, 's.project_id = ?', projectId, userId, publicUrl)
}

export async function getSuite(m: EntityManager, suiteId: number, userId: number, publicUrl: string): Promise<Suite> {
  const [suite] = await querySuites(m, 's.id = ?', suiteId, userId, publicUrl)
  if (!suite) throw notFound('That suite')
  return suite
}

/** Names compare as the column's collation does (utf8mb4_unicode_ci: case-insensitive). */
async function assertSuiteNameFree(m: EntityManager, projectId: number, name: string, exceptId?: number): Promise<void> {
  const other = await m.getRepository(SuiteEntity).findOne({ where: { projectId, name }, select: { id: true } })
  if (other && other.id !== exceptId) throw suiteNameTaken(name)()
}

/** Writes a new suite inside a transaction the caller holds (also used by the demo seed); returns its id. */
export async function insertSuiteIn(m: EntityManager, projectId: number, input: SuiteInput): Promise<number> {
  await assertSuiteNameFree(m, projectId, input.name)
  return (await m.getRepository(SuiteEntity).save({ projectId, name: input.name, description: input.description })).id
}

export function createSuite(ds: DataSource, projectId: number, input: SuiteInput, userId: number, publicUrl: string): Promise<Suite> {
  return guardUniqueName(suiteNameTaken(input.name), () =>
    ds.transaction(async (m) => getSuite(m, await insertSuiteIn(m, projectId, input), userId, publicUrl)),
  )
}

export function updateSuite(ds: DataSource, suiteId: number, patch: SuitePatch, userId: number, publicUrl: string): Promise<Suite> {
  return guardUniqueName(suiteNameTaken(patch.name), () =>
    ds.transaction(async (m) => {
      const suite = await m.getRepository(SuiteEntity).findOne({ where: { id: suiteId }, lock: { mode: 'pessimistic_write' } })
      if (!suite) throw notFound('That suite')
      if (patch.name !== undefined) await assertSuiteNameFree(m, suite.projectId, patch.name, suiteId)
      await m.getRepository(SuiteEntity).update({ id: suiteId }, patch)
      return getSuite(m, suiteId, userId, publicUrl)
    }),
  )
}

/** Deletes a suite with its checks, runs and watchers. */
export async function deleteSuite(ds: DataSource, suiteId: number): Promise<void> {
  await ds.transaction(async (m) => {
    const r = await m.getRepository(SuiteEntity).delete({ id: suiteId })
    if (!r.affected) throw notFound('That suite')
  })
}

/** Starts or stops watching; either is idempotent. */
export async function setWatching(ds: DataSource, suiteId: number, userId: number, watching: boolean, publicUrl: string): Promise<Suite> {
  return ds.transaction(async (m) => {
    if (watching) await m.query('INSERT IGNORE INTO suite_watchers (suite_id, user_id) VALUES (?, ?)', [suiteId, userId])
    else await m.getRepository(SuiteWatcherEntity).delete({ suiteId, userId })
    return getSuite(m, suiteId, userId, publicUrl)
  })
}

// ---- Checks --------------------------------------------------------------------------

interface CheckRow extends StoredCheckRow {
  suiteId: number
  pathName: string
  revision: number
  follow: CheckFollow
  createdAt: Date
}

async function queryChecks(m: EntityManager, where: string, id: number): Promise<Check[]> {
  const rows = (await m.query(
    `SELECT ${STORED_CHECK_COLUMNS}, c.suite_id AS suiteId, p.name AS pathName, c.revision AS revision, c.follow AS follow,
      c.created_at AS createdAt
    FROM checks c JOIN paths p ON p.id = c.path_id WHERE ${where} ORDER BY c.id`,
    [id],
  )) as CheckRow[]
  return rows.map((r) => ({
    id: Number(r.id),
    suiteId: Number(r.suiteId),
    name: r.name,
    pathId: Number(r.pathId),
    pathName: r.pathName,
    revision: Number(r.revision),
    follow: r.follow,
    probes: JSON.parse(r.probes) as ProbeInput[],
    sweeps: JSON.parse(r.sweeps) as ProbeSetSweep[],
    expected: JSON.parse(r.expected) as Check['expected'],
    ...readCheckRules(r),
    createdAt: new Date(r.createdAt).toISOString(),
  }))
}

/** A suite's checks in the order they were made (the order a run takes them in). */
export function listChecks(ds: DataSource, suiteId: number): Promise<Check[]> {
  return queryChecks(ds.manager, 'c.suite_id = ?', suiteId)
}

export async function getCheck(m: EntityManager, checkId: number): Promise<Check> {
  const [check] = await queryChecks(m, 'c.id = ?', checkId)
  if (!check) throw notFound('That check')
  return check
}

/**
 * The hits of the check's lines on a revision of its path, computed here from the stored
 * path data: the expected hits a check keeps never come from the client. 413 `limit` for
 * more lines than a check may have.
 */
async function computeExpected(m: EntityManager, pathId: number, revision: number, probes: ProbeInput[], sweeps: ProbeSetSweep[]): Promise<Hit[][]> {
  const count = countCheckLines(probes, sweeps)
  if (count > SUITE_LIMITS.lines) {
    throw new HttpError(413, 'limit', `The probes and sweeps make ${count} lines; a check has at most ${SUITE_LIMITS.lines}.`)
  }
  const rev = await m.getRepository(RevisionEntity).findOneOrFail({ where: { pathId, number: revision }, select: { data: true } })
  const r = computeLineHits(rev.data, listCheckLines(probes, sweeps))
  if (!r.ok) throw new HttpError(400, 'uncomputable', r.message)
  return r.hits
}

async function assertCheckNameFree(m: EntityManager, suiteId: number, name: string, exceptId?: number): Promise<void> {
  const other = await m.getRepository(CheckEntity).findOne({ where: { suiteId, name }, select: { id: true } })
  if (other && other.id !== exceptId) throw checkNameTaken(name)()
}

/**
 * Writes a new check inside a transaction the caller holds (also used by the demo seed):
 * the path must be a live path of the suite's project and have the revision; the expected
 * hits are computed on that revision. Returns its id.
 */
export async function insertCheckIn(m: EntityManager, suiteId: number, input: CheckInput): Promise<number> {
  const suite = await m.getRepository(SuiteEntity).findOne({ where: { id: suiteId }, lock: { mode: 'pessimistic_write' } })
  if (!suite) throw notFound('That suite')
  if ((await m.getRepository(CheckEntity).countBy({ suiteId })) >= SUITE_LIMITS.checksPerSuite) {
    throw new HttpError(413, 'limit', `A suite has at most ${SUITE_LIMITS.checksPerSuite} checks.`)
  }
  await assertPathRevision(m, suite.projectId, input.pathId, input.revision)
  await assertCheckNameFree(m, suiteId, input.name)
  const expected = await computeExpected(m, input.pathId, input.revision, input.probes, input.sweeps)
  const saved = await m.getRepository(CheckEntity).save({
    suiteId,
    pathId: input.pathId,
    name: input.name,
    revision: input.revision,
    follow: input.follow,
    probes: JSON.stringify(input.probes),
    sweeps: JSON.stringify(input.sweeps),
    expected: JSON.stringify(expected),
    tolerancePoint: input.tolerance.point,
    toleranceT: input.tolerance.t,
    matchKinds: input.matchKinds,
    matchWinding: input.matchWinding,
  })
  return saved.id
}

export function createCheck(ds: DataSource, suiteId: number, input: CheckInput): Promise<Check> {
  return guardUniqueName(checkNameTaken(input.name), () => ds.transaction(async (m) => getCheck(m, await insertCheckIn(m, suiteId, input))))
}

/**
 * Changes the fields given. A `revision` keeps that revision's hits as the new expected
 * hits (computed here, as on create); the probes and sweeps never change.
 */
export function updateCheck(ds: DataSource, checkId: number, patch: CheckPatch): Promise<Check> {
  return guardUniqueName(checkNameTaken(patch.name), () =>
    ds.transaction(async (m) => {
      const check = await m.getRepository(CheckEntity).findOne({ where: { id: checkId }, lock: { mode: 'pessimistic_write' } })
      if (!check) throw notFound('That check')
      if (patch.name !== undefined) await assertCheckNameFree(m, check.suiteId, patch.name, checkId)
      const { tolerance, revision, ...plain } = patch
      const changes: Partial<Pick<CheckEntity, 'name' | 'follow' | 'matchKinds' | 'matchWinding' | 'tolerancePoint' | 'toleranceT' | 'revision' | 'expected'>> = { ...plain }
      if (tolerance) Object.assign(changes, { tolerancePoint: tolerance.point, toleranceT: tolerance.t })
      if (revision !== undefined) {
        const suite = await m.getRepository(SuiteEntity).findOneByOrFail({ id: check.suiteId })
        await assertPathRevision(m, suite.projectId, check.pathId, revision)
        const expected = await computeExpected(m, check.pathId, revision, JSON.parse(check.probes), JSON.parse(check.sweeps))
        Object.assign(changes, { revision, expected: JSON.stringify(expected) })
      }
      await m.getRepository(CheckEntity).update({ id: checkId }, changes)
      return getCheck(m, checkId)
    }),
  )
}

/** Deletes a check; its results in past runs stay. */
export async function deleteCheck(ds: DataSource, checkId: number): Promise<void> {
  await ds.transaction(async (m) => {
    const r = await m.getRepository(CheckEntity).delete({ id: checkId })
    if (!r.affected) throw notFound('That check')
  })
}
