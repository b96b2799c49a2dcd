import type { DataSource, EntityManager } from 'typeorm'
import { In } from 'typeorm'
import type {
  BulkAction,
  Bundle,
  DiagnosticItem,
  PathDetail,
  PathListItem,
  PathPage,
  RevisionDetail,
  RevisionSummary,
} from '../../shared/api/library'
import { TRASH_DAYS, pathListQuerySchema } from '../../shared/api/library'
import type { z } from 'zod'
import { PathEntity, type FillRule, type PathOrigin } from '../entities/path.entity'
import { PathTagEntity } from '../entities/path-tag.entity'
import { ProjectEntity } from '../entities/project.entity'
import { RevisionEntity } from '../entities/revision.entity'
import { HttpError, notFound } from '../errors/http-error'
import { containsPattern } from './sql-like'
import { analysePathData, type PathAnalysis } from './path-analysis'

const DAY_MS = 86_400_000

export interface PathInput {
  name: string
  data: string
  fillRule: FillRule
  tags: string[]
  units: string
  sourceFile: string | null
  metadata: Record<string, unknown> | null
}

interface Row {
  id: number
  projectId: number
  name: string
  origin: PathOrigin
  sourceFile: string | null
  units: string
  fillRule: FillRule
  metadata: string | null
  updatedAt: Date
  deletedAt: Date | null
  createdAt: Date
  number: number
  data: string
  message: string
  segmentCount: number
  countLine: number
  countQuadratic: number
  countCubic: number
  countArc: number
  bboxMinX: number | null
  bboxMinY: number | null
  bboxMaxX: number | null
  bboxMaxY: number | null
  diagnostics: string | null
  author: string | null
  revisionCreatedAt: Date
  revisions: number | string
}

/** Analyses path data for storage; bad data is a 400, an oversized path a 413. */
function analyseOrRefuse(data: string, what: string): PathAnalysis {
  const r = analysePathData(data)
  if (!r.ok) throw new HttpError(r.code === 'limit' ? 413 : 400, r.code, `${what}: ${r.message}`)
  return r.analysis
}

function bboxOf(r: Pick<Row, 'bboxMinX' | 'bboxMinY' | 'bboxMaxX' | 'bboxMaxY'>): [number, number, number, number] | null {
  return r.bboxMinX === null || r.bboxMinY === null || r.bboxMaxX === null || r.bboxMaxY === null
    ? null
    : [Number(r.bboxMinX), Number(r.bboxMinY), Number(r.bboxMaxX), Number(r.bboxMaxY)]
}

function countsOf(r: Pick<Row, 'countLine' | 'countQuadratic' | 'countCubic' | 'countArc'>) {
  return { line: Number(r.countLine), quadratic: Number(r.countQuadratic), cubic: Number(r.countCubic), arc: Number(r.countArc) }
}

function parseDiagnostics(text: string | null): DiagnosticItem[] {
  return text ? (JSON.parse(text) as DiagnosticItem[]) : []
}

function baseQuery(m: EntityManager) {
  return m
    .getRepository(PathEntity)
    .createQueryBuilder('p')
    .innerJoin(RevisionEntity, 'r', 'r.id = p.currentRevisionId')
    .leftJoin('r.author', 'u')
    .select([
      'p.id AS id', 'p.projectId AS projectId', 'p.name AS name', 'p.origin AS origin', 'p.sourceFile AS sourceFile',
      'p.units AS units', 'p.fillRule AS fillRule', 'p.metadata AS metadata', 'p.updatedAt AS updatedAt',
      'p.deletedAt AS deletedAt', 'p.createdAt AS createdAt', 'r.number AS number', 'r.data AS data', 'r.message AS message',
      'r.segmentCount AS segmentCount', 'r.countLine AS countLine', 'r.countQuadratic AS countQuadratic',
      'r.countCubic AS countCubic', 'r.countArc AS countArc', 'r.bboxMinX AS bboxMinX', 'r.bboxMinY AS bboxMinY',
      'r.bboxMaxX AS bboxMaxX', 'r.bboxMaxY AS bboxMaxY', 'r.diagnostics AS diagnostics', 'u.displayName AS author',
      'r.createdAt AS revisionCreatedAt',
    ])
    .addSelect((sub) => sub.select('COUNT(*)').from(RevisionEntity, 'rv').where('rv.pathId = p.id'), 'revisions')
}

async function tagsOf(m: EntityManager, pathIds: number[]): Promise<Map<number, string[]>> {
  const map = new Map<number, string[]>()
  if (!pathIds.length) return map
  const rows = await m.getRepository(PathTagEntity).find({ where: { pathId: In(pathIds) }, order: { tag: 'ASC' } })
  for (const t of rows) map.set(t.pathId, [...(map.get(t.pathId) ?? []), t.tag])
  return map
}

function toListItem(r: Row, tags: string[]): PathListItem {
  return {
    id: Number(r.id),
    projectId: Number(r.projectId),
    name: r.name,
    tags,
    origin: r.origin,
    sourceFile: r.sourceFile,
    units: r.units,
    fillRule: r.fillRule,
    revision: Number(r.number),
    revisions: Number(r.revisions),
    segments: Number(r.segmentCount),
    counts: countsOf(r),
    warnings: parseDiagnostics(r.diagnostics).length,
    bbox: bboxOf(r),
    data: r.data,
    updatedAt: new Date(r.updatedAt).toISOString(),
    deletedAt: r.deletedAt ? new Date(r.deletedAt).toISOString() : null,
  }
}

const sortColumns = { name: 'p.name', updatedAt: 'p.updatedAt', segments: 'p.segmentCount', warnings: 'p.warningCount', origin: 'p.origin' } as const

/** Paths older than this in the trash are gone for good; they are never listed or restored. */
function trashCutoff(now = Date.now()): Date {
  return new Date(now - TRASH_DAYS * DAY_MS)
}

export async function listPaths(ds: DataSource, projectId: number, q: z.output<typeof pathListQuerySchema>): Promise<PathPage> {
  const m = ds.manager
  const qb = baseQuery(m).where('p.projectId = :projectId', { projectId })
  if (q.trash === '1') qb.andWhere('p.deletedAt IS NOT NULL AND p.deletedAt >= :cutoff', { cutoff: trashCutoff() })
  else qb.andWhere('p.deletedAt IS NULL')
  if (q.q) qb.andWhere('p.name LIKE :pattern', { pattern: containsPattern(q.q) })
  if (q.origin) qb.andWhere('p.origin = :origin', { origin: q.origin })
  if (q.warnings === 'with') qb.andWhere('p.warningCount > 0')
  if (q.warnings === 'without') qb.andWhere('p.warningCount = 0')
  if (q.tag) qb.andWhere('EXISTS (SELECT 1 FROM path_tags pt WHERE pt.path_id = p.id AND pt.tag = :tag)', { tag: q.tag })
  const total = await qb.clone().getCount()
  const order = q.order === 'asc' ? 'ASC' : 'DESC'
  const rows = await qb
    .orderBy(sortColumns[q.sort], order)
    .addOrderBy('p.id', order)
    .offset((q.page - 1) * q.pageSize)
    .limit(q.pageSize)
    .getRawMany<Row>()
  const tags = await tagsOf(m, rows.map((r) => Number(r.id)))
  const allTags = (await m.query(
    'SELECT DISTINCT t.tag FROM path_tags t JOIN paths p ON p.id = t.path_id WHERE p.project_id = ? AND p.deleted_at IS NULL ORDER BY t.tag',
    [projectId],
  )) as Array<{ tag: string }>
  return { items: rows.map((r) => toListItem(r, tags.get(Number(r.id)) ?? [])), total, page: q.page, pageSize: q.pageSize, tags: allTags.map((t) => t.tag) }
}

export async function getPathDetail(m: EntityManager, pathId: number): Promise<PathDetail> {
  const r = await baseQuery(m).where('p.id = :pathId', { pathId }).getRawOne<Row>()
  if (!r) throw notFound('That path')
  const tags = (await tagsOf(m, [pathId])).get(pathId) ?? []
  return {
    ...toListItem(r, tags),
    metadata: r.metadata ? (JSON.parse(r.metadata) as Record<string, unknown>) : null,
    diagnostics: parseDiagnostics(r.diagnostics),
    message: r.message,
    author: r.author,
    createdAt: new Date(r.createdAt).toISOString(),
  }
}

/** Resolves the team of a path, for the route layer's role check. */
export async function pathTeamId(ds: DataSource, pathId: number): Promise<number | undefined> {
  const row = (await ds.query('SELECT pr.team_id AS teamId FROM paths p JOIN projects pr ON pr.id = p.project_id WHERE p.id = ?', [pathId])) as Array<{ teamId: number }>
  return row[0] ? Number(row[0].teamId) : undefined
}

async function writeRevision(m: EntityManager, pathId: number, number: number, data: string, a: PathAnalysis, message: string, authorId: number): Promise<void> {
  const rev = await m.getRepository(RevisionEntity).save({
    pathId,
    number,
    data,
    message,
    authorId,
    segments: JSON.stringify(a.path.segments),
    segmentCount: a.segments,
    countLine: a.counts.line,
    countQuadratic: a.counts.quadratic,
    countCubic: a.counts.cubic,
    countArc: a.counts.arc,
    bboxMinX: a.bbox?.[0] ?? null,
    bboxMinY: a.bbox?.[1] ?? null,
    bboxMaxX: a.bbox?.[2] ?? null,
    bboxMaxY: a.bbox?.[3] ?? null,
    diagnostics: JSON.stringify(a.diagnostics),
  })
  await m.getRepository(PathEntity).update({ id: pathId }, { currentRevisionId: rev.id, segmentCount: a.segments, warningCount: a.diagnostics.length })
}

async function setTags(m: EntityManager, pathId: number, tags: string[]): Promise<void> {
  await m.getRepository(PathTagEntity).delete({ pathId })
  const unique = [...new Set(tags.map((t) => t.trim()))]
  if (unique.length) await m.getRepository(PathTagEntity).insert(unique.map((tag) => ({ pathId, tag })))
}

async function insertPath(m: EntityManager, projectId: number, userId: number, origin: PathOrigin, input: PathInput, a: PathAnalysis, message: string): Promise<number> {
  const path = await m.getRepository(PathEntity).save({
    projectId,
    name: input.name,
    fillRule: input.fillRule,
    origin,
    units: input.units,
    sourceFile: input.sourceFile,
    metadata: input.metadata,
  })
  await writeRevision(m, path.id, 1, input.data, a, message, userId)
  await setTags(m, path.id, input.tags)
  return path.id
}

async function touchProject(m: EntityManager, projectId: number): Promise<void> {
  await m.getRepository(ProjectEntity).update({ id: projectId }, { updatedAt: new Date() })
}

/** Creates paths all together or not at all; every one is analysed before anything is written. */
export async function createPaths(ds: DataSource, projectId: number, userId: number, origin: PathOrigin, inputs: PathInput[], message: string): Promise<PathListItem[]> {
  const ids = await ds.transaction((m) => createPathsIn(m, projectId, userId, origin, inputs, message))
  return Promise.all(ids.map(async (id) => toPlainItem(await getPathDetail(ds.manager, id))))
}

/** createPaths inside a transaction the caller holds; returns the new ids. */
export async function createPathsIn(m: EntityManager, projectId: number, userId: number, origin: PathOrigin, inputs: PathInput[], message: string): Promise<number[]> {
  const analyses = inputs.map((p, i) => analyseOrRefuse(p.data, inputs.length > 1 ? `Path ${i + 1} (${p.name})` : p.name))
  const out: number[] = []
  for (let i = 0; i < inputs.length; i++) out.push(await insertPath(m, projectId, userId, origin, inputs[i], analyses[i], message))
  await touchProject(m, projectId)
  return out
}

function toPlainItem(d: PathDetail): PathListItem {
  const { metadata: _m, diagnostics: _d, message: _msg, author: _a, createdAt: _c, ...item } = d
  return item
}

export async function updatePath(ds: DataSource, pathId: number, patch: { name?: string; tags?: string[]; fillRule?: FillRule }): Promise<PathDetail> {
  return ds.transaction(async (m) => {
    const p = await m.getRepository(PathEntity).findOne({ where: { id: pathId }, lock: { mode: 'pessimistic_write' } })
    if (!p) throw notFound('That path')
    if (patch.name !== undefined) p.name = patch.name
    if (patch.fillRule !== undefined) p.fillRule = patch.fillRule
    await m.getRepository(PathEntity).save(p)
    if (patch.tags !== undefined) await setTags(m, pathId, patch.tags)
    return getPathDetail(m, pathId)
  })
}

/** Saving never overwrites: it adds the next revision under a row lock on the path. */
export async function addRevision(ds: DataSource, pathId: number, userId: number, data: string, message: string): Promise<PathDetail> {
  const a = analyseOrRefuse(data, 'The path data')
  return ds.transaction(async (m) => {
    const p = await m.getRepository(PathEntity).findOne({ where: { id: pathId }, lock: { mode: 'pessimistic_write' } })
    if (!p) throw notFound('That path')
    if (p.deletedAt) throw new HttpError(409, 'in_trash', 'Restore the path from the trash before changing it.')
    const [{ n }] = (await m.query('SELECT COALESCE(MAX(number), 0) AS n FROM revisions WHERE path_id = ?', [pathId])) as Array<{ n: number }>
    await writeRevision(m, pathId, Number(n) + 1, data, a, message, userId)
    await m.getRepository(PathEntity).update({ id: pathId }, { updatedAt: new Date() })
    await touchProject(m, p.projectId)
    return getPathDetail(m, pathId)
  })
}

function toRevisionSummary(r: RevisionEntity & { author?: { displayName: string } | null }): RevisionSummary {
  return {
    number: r.number,
    message: r.message,
    author: r.author?.displayName ?? null,
    createdAt: r.createdAt.toISOString(),
    segments: r.segmentCount,
    counts: countsOf(r),
    bbox: bboxOf(r),
    warnings: parseDiagnostics(r.diagnostics).length,
  }
}

export async function listRevisions(ds: DataSource, pathId: number): Promise<RevisionSummary[]> {
  const revs = await ds.getRepository(RevisionEntity).find({ where: { pathId }, relations: { author: true }, order: { number: 'DESC' } })
  return revs.map(toRevisionSummary)
}

export async function getRevision(ds: DataSource, pathId: number, number: number): Promise<RevisionDetail> {
  const r = await ds.getRepository(RevisionEntity).findOne({ where: { pathId, number }, relations: { author: true } })
  if (!r) throw notFound('That revision')
  const p = await ds.getRepository(PathEntity).findOneByOrFail({ id: pathId })
  return { ...toRevisionSummary(r), data: r.data, diagnostics: parseDiagnostics(r.diagnostics), current: p.currentRevisionId === r.id }
}

export async function restoreRevision(ds: DataSource, pathId: number, number: number, userId: number, message?: string): Promise<PathDetail> {
  const r = await ds.getRepository(RevisionEntity).findOneBy({ pathId, number })
  if (!r) throw notFound('That revision')
  return addRevision(ds, pathId, userId, r.data, message ?? `Restored revision ${number}`)
}

export async function trashPaths(m: EntityManager, projectId: number, ids: number[]): Promise<number> {
  const r = await m
    .createQueryBuilder()
    .update(PathEntity)
    .set({ deletedAt: () => 'CURRENT_TIMESTAMP(3)' })
    .where('id IN (:...ids) AND project_id = :projectId AND deleted_at IS NULL', { ids, projectId })
    .execute()
  return r.affected ?? 0
}

export async function trashPath(ds: DataSource, pathId: number): Promise<void> {
  await ds.transaction(async (m) => {
    const p = await m.getRepository(PathEntity).findOneBy({ id: pathId })
    if (!p) throw notFound('That path')
    if (p.deletedAt) throw new HttpError(409, 'in_trash', 'That path is in the trash already.')
    await trashPaths(m, p.projectId, [pathId])
  })
}

export async function untrashPath(ds: DataSource, pathId: number): Promise<PathDetail> {
  return ds.transaction(async (m) => {
    const p = await m.getRepository(PathEntity).findOne({ where: { id: pathId }, lock: { mode: 'pessimistic_write' } })
    if (!p) throw notFound('That path')
    if (!p.deletedAt) throw new HttpError(409, 'not_in_trash', 'That path is not in the trash.')
    if (p.deletedAt < trashCutoff()) throw new HttpError(410, 'expired', `Paths stay in the trash for ${TRASH_DAYS} days; this one is gone.`)
    await m.getRepository(PathEntity).update({ id: pathId }, { deletedAt: null })
    return getPathDetail(m, pathId)
  })
}

export async function purgePath(ds: DataSource, pathId: number): Promise<void> {
  const p = await ds.getRepository(PathEntity).findOneBy({ id: pathId })
  if (!p) throw notFound('That path')
  if (!p.deletedAt) throw new HttpError(409, 'not_in_trash', 'Move the path to the trash first; only the trash is emptied for good.')
  await ds.getRepository(PathEntity).delete({ id: pathId })
}

export async function emptyTrash(ds: DataSource, projectId: number): Promise<number> {
  const r = await ds.query('DELETE FROM paths WHERE project_id = ? AND deleted_at IS NOT NULL', [projectId])
  return Number((r as { affectedRows?: number }).affectedRows ?? 0)
}

/** Removes paths that have been in the trash longer than the retention period. */
export async function purgeExpiredTrash(ds: DataSource): Promise<number> {
  const r = await ds.query('DELETE FROM paths WHERE deleted_at IS NOT NULL AND deleted_at < ?', [trashCutoff()])
  return Number((r as { affectedRows?: number }).affectedRows ?? 0)
}

async function livePathsOf(m: EntityManager, projectId: number, ids: number[]): Promise<PathEntity[]> {
  const paths = await m.getRepository(PathEntity).find({ where: { id: In(ids), projectId } })
  const found = new Set(paths.map((p) => p.id))
  const missing = ids.filter((id) => !found.has(id))
  if (missing.length) throw new HttpError(404, 'not_found', `Paths ${missing.join(', ')} are not in this project.`)
  return paths
}

export async function bulkAction(ds: DataSource, projectId: number, userId: number, action: BulkAction, targetTeamOk: (projectId: number) => Promise<boolean>): Promise<number> {
  return ds.transaction(async (m) => {
    const paths = await livePathsOf(m, projectId, [...new Set(action.ids)])
    if (action.action === 'trash') return trashPaths(m, projectId, paths.map((p) => p.id))
    if (action.action === 'tag' || action.action === 'untag') {
      for (const p of paths) {
        const current = (await tagsOf(m, [p.id])).get(p.id) ?? []
        const next = action.action === 'tag' ? [...current, ...action.tags] : current.filter((t) => !action.tags.includes(t))
        await setTags(m, p.id, next)
      }
      return paths.length
    }
    if (!(await targetTeamOk(action.targetProjectId))) throw new HttpError(404, 'not_found', 'The target project does not exist or you cannot add paths to it.')
    for (const p of paths) {
      const d = await getPathDetail(m, p.id)
      const a = analyseOrRefuse(d.data, d.name)
      await insertPath(m, action.targetProjectId, userId, p.origin, { name: d.name, data: d.data, fillRule: d.fillRule, tags: d.tags, units: d.units, sourceFile: d.sourceFile, metadata: d.metadata }, a, `Copied from project ${projectId}`)
    }
    await touchProject(m, action.targetProjectId)
    return paths.length
  })
}

function escapeXml(text: string): string {
  return text.replace(/[<>&"']/g, (c) => ({ '<': '&lt;', '>': '&gt;', '&': '&amp;', '"': '&quot;', "'": '&apos;' })[c]!)
}

async function exportedPaths(ds: DataSource, projectId: number, ids: number[] | undefined): Promise<PathDetail[]> {
  const rows = await ds.getRepository(PathEntity).find({
    where: ids ? { projectId, id: In(ids) } : { projectId },
    order: { name: 'ASC' },
    select: { id: true, deletedAt: true },
  })
  const live = rows.filter((p) => !p.deletedAt)
  if (ids && live.length !== new Set(ids).size) throw new HttpError(404, 'not_found', 'Some of those paths are not in this project.')
  return Promise.all(live.map((p) => getPathDetail(ds.manager, p.id)))
}

/** The chosen paths as one SVG document, each a <path> with its id, name and fill rule. */
export async function exportSvg(ds: DataSource, projectId: number, ids: number[] | undefined): Promise<string> {
  const paths = await exportedPaths(ds, projectId, ids)
  const boxes = paths.map((p) => p.bbox).filter((b): b is [number, number, number, number] => b !== null)
  const [x0, y0, x1, y1] = boxes.length
    ? [Math.min(...boxes.map((b) => b[0])), Math.min(...boxes.map((b) => b[1])), Math.max(...boxes.map((b) => b[2])), Math.max(...boxes.map((b) => b[3]))]
    : [0, 0, 1, 1]
  const body = paths
    .map((p) => `  <path id="path-${p.id}" data-name="${escapeXml(p.name)}" fill-rule="${p.fillRule}" d="${escapeXml(p.data)}"><title>${escapeXml(p.name)}</title></path>`)
    .join('\n')
  return `<?xml version="1.0" encoding="UTF-8"?>\n<svg xmlns="http://www.w3.org/2000/svg" viewBox="${x0} ${y0} ${x1 - x0 || 1} ${y1 - y0 || 1}">\n${body}\n</svg>\n`
}

export async function exportBundle(ds: DataSource, projectId: number, ids: number[] | undefined): Promise<Bundle> {
  const project = await ds.getRepository(ProjectEntity).findOneByOrFail({ id: projectId })
  const paths = await exportedPaths(ds, projectId, ids)
  const out: Bundle['paths'] = []
  for (const p of paths) {
    const revs = await ds.getRepository(RevisionEntity).find({ where: { pathId: p.id }, order: { number: 'ASC' } })
    out.push({
      name: p.name,
      tags: p.tags,
      origin: p.origin,
      sourceFile: p.sourceFile,
      units: p.units,
      fillRule: p.fillRule,
      metadata: p.metadata,
      revisions: revs.map((r) => ({ number: r.number, data: r.data, message: r.message, createdAt: r.createdAt.toISOString() })),
    })
  }
  return { format: 'rootcast-bundle', version: 1, exportedAt: new Date().toISOString(), project: { name: project.name, description: project.description }, paths: out }
}

/** Imports a bundle's paths with their whole history, in one transaction. */
export async function importBundle(ds: DataSource, projectId: number, userId: number, bundle: Bundle): Promise<PathListItem[]> {
  const checked = bundle.paths.map((p, i) => ({
    p,
    analyses: [...p.revisions].sort((a, b) => a.number - b.number).map((r) => ({ r, a: analyseOrRefuse(r.data, `Path ${i + 1} (${p.name}), revision ${r.number}`) })),
  }))
  const ids = await ds.transaction(async (m) => {
    const out: number[] = []
    for (const { p, analyses } of checked) {
      const path = await m.getRepository(PathEntity).save({ projectId, name: p.name, fillRule: p.fillRule, origin: p.origin, units: p.units, sourceFile: p.sourceFile, metadata: p.metadata })
      let n = 0
      for (const { r, a } of analyses) await writeRevision(m, path.id, ++n, r.data, a, r.message, userId)
      await setTags(m, path.id, p.tags)
      out.push(path.id)
    }
    await touchProject(m, projectId)
    return out
  })
  return Promise.all(ids.map(async (id) => toPlainItem(await getPathDetail(ds.manager, id))))
}
