import { performance } from 'node:perf_hooks'
import type { DataSource, EntityManager } from 'typeorm'
import type { ProbeInput } from '../../shared/api/compute'
import type { ProbeSetSweep } from '../../shared/api/probe-sets'
import type { CheckResult, CheckRunPage, HitDifferenceItem, RunDetail, RunPage, RunSummary, RunVerdict } from '../../shared/api/suites'
import { SUITE_LIMITS } from '../../shared/api/suites'
import { type CheckLine, listCheckLines } from '../../shared/checks/check-lines'
import { compareHits } from '../../shared/checks/compare-hits'
import { type Hit, intersectProbes, parsePathData } from '../../shared/geometry/index'
import { RunEntity, type RunTrigger } from '../entities/run.entity'
import { RunResultEntity } from '../entities/run-result.entity'
import { SuiteEntity } from '../entities/suite.entity'
import { HttpError, notFound } from '../errors/http-error'
import type { Mailer } from './mail.service'
import { writeJunitXml } from './junit-xml'
import { mailRunFailure } from './run-mail'

/** What running a suite needs besides the database: where links point, and the mail. */
export interface RunDeps {
  ds: DataSource
  publicUrl: string
  mailer?: Mailer
}

/** The Suites screen with one run open. */
export function runUrl(publicUrl: string, projectId: number, runId: number): string {
  return `${publicUrl.replace(/\/+$/, '')}/projects/${projectId}/suites?run=${runId}`
}

/** The canvas opened on a check's path with the check's probes. */
export function canvasUrl(publicUrl: string, projectId: number, pathId: number, checkId: number): string {
  return `${publicUrl.replace(/\/+$/, '')}/projects/${projectId}/canvas?paths=${pathId}&check=${checkId}`
}

const iso = (d: Date | string) => new Date(d).toISOString()

// ---- Computing hits ------------------------------------------------------------------

export type LineHits = { ok: true; hits: Hit[][] } | { ok: false; message: string }

/**
 * The hits of every line of a check on stored path data, by the same closed-form core that
 * answers POST /intersect. Data that no longer parses, or a probe the core refuses, is an
 * answer with a message, never an exception: one bad check must not stop a run.
 */
export function computeLineHits(data: string, lines: readonly CheckLine[]): LineHits {
  const parsed = parsePathData(data)
  if (!parsed.ok) return { ok: false, message: `The path data does not parse: ${parsed.error.message}` }
  try {
    const hits = intersectProbes(parsed.path, lines.map((l) => l.probe)) as Hit[][]
    return { ok: true, hits }
  } catch (e) {
    if (e instanceof RangeError) return { ok: false, message: `A probe was refused: ${e.message}` }
    throw e
  }
}

// ---- Reading runs --------------------------------------------------------------------

interface RunRow {
  id: number
  suiteId: number
  projectId: number
  number: number
  verdict: RunVerdict
  passed: number
  failed: number
  trigger: RunTrigger
  byName: string | null
  startedAt: Date
  finishedAt: Date
}

const RUN_COLUMNS = `r.id AS id, r.suite_id AS suiteId, s.project_id AS projectId, r.number AS number, r.verdict AS verdict,
  r.passed AS passed, r.failed AS failed, r.trigger_kind AS \`trigger\`, r.by_name AS byName, r.started_at AS startedAt,
  r.finished_at AS finishedAt`

function toSummary(r: RunRow, publicUrl: string): RunSummary {
  return {
    id: Number(r.id),
    suiteId: Number(r.suiteId),
    number: Number(r.number),
    verdict: r.verdict,
    passed: Number(r.passed),
    failed: Number(r.failed),
    trigger: r.trigger,
    by: r.byName,
    startedAt: iso(r.startedAt),
    finishedAt: iso(r.finishedAt),
    url: runUrl(publicUrl, Number(r.projectId), Number(r.id)),
  }
}

/** Summaries of the runs with these ids, keyed by id (for the suites' last runs). */
export async function runSummariesById(m: EntityManager, ids: number[], publicUrl: string): Promise<Map<number, RunSummary>> {
  if (!ids.length) return new Map()
  const rows = (await m.query(`SELECT ${RUN_COLUMNS} FROM runs r JOIN suites s ON s.id = r.suite_id WHERE r.id IN (?)`, [ids])) as RunRow[]
  return new Map(rows.map((r) => [Number(r.id), toSummary(r, publicUrl)]))
}

/** A suite's runs, newest first, paged. */
export async function listRuns(ds: DataSource, suiteId: number, page: { page: number; pageSize: number }, publicUrl: string): Promise<RunPage> {
  const [{ n }] = (await ds.query('SELECT COUNT(*) AS n FROM runs WHERE suite_id = ?', [suiteId])) as Array<{ n: number }>
  const rows = (await ds.query(
    `SELECT ${RUN_COLUMNS} FROM runs r JOIN suites s ON s.id = r.suite_id WHERE r.suite_id = ? ORDER BY r.number DESC LIMIT ? OFFSET ?`,
    [suiteId, page.pageSize, (page.page - 1) * page.pageSize],
  )) as RunRow[]
  return { items: rows.map((r) => toSummary(r, publicUrl)), total: Number(n), page: page.page, pageSize: page.pageSize }
}

interface ResultRow {
  checkId: number
  checkName: string
  pathId: number
  revision: number
  verdict: RunVerdict
  differenceCount: number
  differences: string
  error: string | null
  durationMs: number
}

/** One run with every check's verdict and differences, in the checks' order. */
export async function getRun(m: EntityManager, runId: number, publicUrl: string): Promise<RunDetail> {
  const [run] = (await m.query(`SELECT ${RUN_COLUMNS} FROM runs r JOIN suites s ON s.id = r.suite_id WHERE r.id = ?`, [runId])) as RunRow[]
  if (!run) throw notFound('That run')
  const rows = (await m.query(
    `SELECT check_id AS checkId, check_name AS checkName, path_id AS pathId, revision, verdict, difference_count AS differenceCount,
      differences, error, duration_ms AS durationMs FROM run_results WHERE run_id = ? ORDER BY position`,
    [runId],
  )) as ResultRow[]
  const projectId = Number(run.projectId)
  const results: CheckResult[] = rows.map((r) => ({
    checkId: Number(r.checkId),
    checkName: r.checkName,
    pathId: Number(r.pathId),
    revision: Number(r.revision),
    verdict: r.verdict,
    differences: JSON.parse(r.differences) as HitDifferenceItem[],
    differenceCount: Number(r.differenceCount),
    error: r.error,
    durationMs: Number(r.durationMs),
    canvasUrl: canvasUrl(publicUrl, projectId, Number(r.pathId), Number(r.checkId)),
  }))
  return { ...toSummary(run, publicUrl), results }
}

/** One check's results across runs, newest first, paged: its trend. */
export async function listCheckRuns(ds: DataSource, checkId: number, page: { page: number; pageSize: number }, publicUrl: string): Promise<CheckRunPage> {
  const [{ n }] = (await ds.query('SELECT COUNT(*) AS n FROM run_results WHERE check_id = ?', [checkId])) as Array<{ n: number }>
  const rows = (await ds.query(
    `SELECT rr.run_id AS runId, r.number AS runNumber, rr.verdict AS verdict, rr.revision AS revision,
      rr.difference_count AS differences, r.started_at AS startedAt, s.project_id AS projectId
    FROM run_results rr JOIN runs r ON r.id = rr.run_id JOIN suites s ON s.id = r.suite_id
    WHERE rr.check_id = ? ORDER BY rr.run_id DESC LIMIT ? OFFSET ?`,
    [checkId, page.pageSize, (page.page - 1) * page.pageSize],
  )) as Array<{ runId: number; runNumber: number; verdict: RunVerdict; revision: number; differences: number; startedAt: Date; projectId: number }>
  return {
    items: rows.map((r) => ({
      runId: Number(r.runId),
      runNumber: Number(r.runNumber),
      verdict: r.verdict,
      revision: Number(r.revision),
      differences: Number(r.differences),
      startedAt: iso(r.startedAt),
      url: runUrl(publicUrl, Number(r.projectId), Number(r.runId)),
    })),
    total: Number(n),
    page: page.page,
    pageSize: page.pageSize,
  }
}

// ---- Running a suite -----------------------------------------------------------------

/** A check's stored columns as raw queries read them: JSON as text, flags as 0/1. */
export interface StoredCheckRow {
  id: number
  name: string
  pathId: number
  probes: string
  sweeps: string
  expected: string
  tolerancePoint: number
  toleranceT: number
  matchKinds: number
  matchWinding: number
}

/** The select list of StoredCheckRow, on the table alias `c`. */
export const STORED_CHECK_COLUMNS = `c.id AS id, c.name AS name, c.path_id AS pathId, c.probes AS probes, c.sweeps AS sweeps,
  c.expected AS expected, c.tolerance_point AS tolerancePoint, c.tolerance_t AS toleranceT, c.match_kinds AS matchKinds,
  c.match_winding AS matchWinding`

/** A stored check's tolerance and match rules as numbers and booleans. */
export function readCheckRules(r: StoredCheckRow): { tolerance: { point: number; t: number }; matchKinds: boolean; matchWinding: boolean } {
  return {
    tolerance: { point: Number(r.tolerancePoint), t: Number(r.toleranceT) },
    matchKinds: Boolean(Number(r.matchKinds)),
    matchWinding: Boolean(Number(r.matchWinding)),
  }
}

interface CheckRow extends StoredCheckRow {
  runRevision: number | null
  data: string | null
}

type Evaluation = Omit<CheckResult, 'canvasUrl'>

/** One check on the revision it follows: its differences from the expected hits, or why it could not run. */
function evaluateCheck(c: CheckRow): Evaluation {
  const started = performance.now()
  const base = { checkId: Number(c.id), checkName: c.name, pathId: Number(c.pathId), revision: Number(c.runRevision ?? 0) }
  const finish = (differences: HitDifferenceItem[], error: string | null): Evaluation => ({
    ...base,
    verdict: differences.length === 0 && error === null ? 'passed' : 'failed',
    differences: differences.slice(0, SUITE_LIMITS.differencesKept),
    differenceCount: differences.length,
    error,
    durationMs: performance.now() - started,
  })
  if (c.data === null) return finish([], 'The revision this check runs on is missing.')
  const lines = listCheckLines(JSON.parse(c.probes) as ProbeInput[], JSON.parse(c.sweeps) as ProbeSetSweep[])
  const expected = JSON.parse(c.expected) as Hit[][]
  if (expected.length !== lines.length) return finish([], `The check keeps ${expected.length} lists of expected hits for ${lines.length} probe lines.`)
  const actual = computeLineHits(c.data, lines)
  if (!actual.ok) return finish([], actual.message)
  const { tolerance, ...rules } = readCheckRules(c)
  const differences: HitDifferenceItem[] = []
  lines.forEach((line, i) => {
    for (const d of compareHits(expected[i], actual.hits[i], tolerance, rules)) differences.push({ line: i, lineLabel: line.label, ...d } as HitDifferenceItem)
  })
  return finish(differences, null)
}

/**
 * Runs every check of a suite now, on the revision each follows (the path's current one, or
 * the pinned one), and records the run with the next number of the suite. The hits are
 * computed before the transaction; the transaction locks the suite row so that concurrent
 * runs get distinct numbers. A failed run mails the suite's watchers afterwards; mail that
 * cannot be sent is logged and never fails the run. 409 `suite_empty` for a suite without checks.
 */
export async function runSuite(deps: RunDeps, suiteId: number, by: { id: number; displayName: string }, trigger: RunTrigger): Promise<RunDetail> {
  const { ds, publicUrl } = deps
  const startedAt = new Date()
  const checks = (await ds.query(
    `SELECT ${STORED_CHECK_COLUMNS}, r.number AS runRevision, r.data AS data
    FROM checks c JOIN paths p ON p.id = c.path_id
    LEFT JOIN revisions r ON r.path_id = c.path_id
      AND r.id = CASE WHEN c.follow = 'latest' THEN p.current_revision_id
        ELSE (SELECT rv.id FROM revisions rv WHERE rv.path_id = c.path_id AND rv.number = c.revision) END
    WHERE c.suite_id = ? ORDER BY c.id`,
    [suiteId],
  )) as CheckRow[]
  if (!checks.length) throw new HttpError(409, 'suite_empty', 'This suite has no checks yet. Add a check before running it.')
  const results = checks.map(evaluateCheck)
  const finishedAt = new Date()
  const failed = results.filter((r) => r.verdict === 'failed').length
  const runId = await ds.transaction(async (m) => {
    const suite = await m.getRepository(SuiteEntity).findOne({ where: { id: suiteId }, lock: { mode: 'pessimistic_write' } })
    if (!suite) throw notFound('That suite')
    const [{ n }] = (await m.query('SELECT COALESCE(MAX(number), 0) AS n FROM runs WHERE suite_id = ?', [suiteId])) as Array<{ n: number }>
    const run = await m.getRepository(RunEntity).save({
      suiteId,
      number: Number(n) + 1,
      verdict: failed ? 'failed' : 'passed',
      passed: results.length - failed,
      failed,
      trigger,
      userId: by.id,
      byName: by.displayName,
      startedAt,
      finishedAt,
    })
    // One row per insert: a result's differences can be large, and one statement must fit the server's packet limit.
    for (const [position, r] of results.entries()) {
      await m.getRepository(RunResultEntity).insert({
        runId: run.id,
        position,
        checkId: r.checkId,
        checkName: r.checkName,
        pathId: r.pathId,
        revision: r.revision,
        verdict: r.verdict,
        differenceCount: r.differenceCount,
        differences: JSON.stringify(r.differences),
        error: r.error?.slice(0, 500) ?? null,
        durationMs: r.durationMs,
      })
    }
    return run.id
  })
  const detail = await getRun(ds.manager, runId, publicUrl)
  if (detail.verdict === 'failed' && deps.mailer) {
    const mailer = deps.mailer
    mailRunFailure(ds, mailer, detail).catch((e: unknown) => console.error(`[rootcast] mail for run ${runId} of suite ${suiteId} failed:`, e))
  }
  return detail
}

/** A run as JUnit XML, with the suite's name and the run's number for naming the download. */
export async function getRunJunitXml(ds: DataSource, runId: number, publicUrl: string): Promise<{ xml: string; baseName: string }> {
  const run = await getRun(ds.manager, runId, publicUrl)
  const [names] = (await ds.query('SELECT s.name AS suite, pr.name AS project FROM suites s JOIN projects pr ON pr.id = s.project_id WHERE s.id = ?', [run.suiteId])) as Array<{ suite: string; project: string }>
  return { xml: writeJunitXml(run, names), baseName: `${names.suite}-run-${run.number}.junit` }
}
