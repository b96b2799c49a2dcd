import type { DataSource, EntityManager } from 'typeorm'
import type { z } from 'zod'
import type { ProbeInput } from '../../shared/api/compute'
import type {
  newProbeSetSchema,
  ProbeSet,
  ProbeSetSummary,
  ProbeSetSweep,
  updateProbeSetSchema,
} from '../../shared/api/probe-sets'
import { PathEntity } from '../entities/path.entity'
import { ProbeSetEntity } from '../entities/probe-set.entity'
import { RevisionEntity } from '../entities/revision.entity'
import { HttpError, notFound } from '../errors/http-error'

export type ProbeSetInput = z.output<typeof newProbeSetSchema>
export type ProbeSetPatch = z.output<typeof updateProbeSetSchema>

/** MariaDB's error number for a duplicate key (ER_DUP_ENTRY); the only unique key besides the id is the name. */
const DUPLICATE_KEY_ERRNO = 1062

interface Row {
  id: number
  projectId: number
  pathId: number
  pathName: string
  revision: number
  name: string
  description: string
  author: string | null
  createdAt: Date
  updatedAt: Date
}

function baseQuery(m: EntityManager) {
  return m
    .getRepository(ProbeSetEntity)
    .createQueryBuilder('s')
    .innerJoin(PathEntity, 'p', 'p.id = s.pathId')
    .leftJoin('s.author', 'u')
    .select([
      's.id AS id', 's.projectId AS projectId', 's.pathId AS pathId', 'p.name AS pathName', 's.revision AS revision',
      's.name AS name', 's.description AS description', 'u.displayName AS author', 's.createdAt AS createdAt',
      's.updatedAt AS updatedAt',
    ])
}

function toBase(r: Row): Omit<ProbeSetSummary, 'probeCount' | 'sweepCount'> {
  return {
    id: Number(r.id),
    projectId: Number(r.projectId),
    pathId: Number(r.pathId),
    pathName: r.pathName,
    revision: Number(r.revision),
    name: r.name,
    description: r.description,
    author: r.author,
    createdAt: new Date(r.createdAt).toISOString(),
    updatedAt: new Date(r.updatedAt).toISOString(),
  }
}

/** The project's probe sets (of one path when given), newest first, without their probes. */
export async function listProbeSets(ds: DataSource, projectId: number, pathId?: number): Promise<ProbeSetSummary[]> {
  const qb = baseQuery(ds.manager)
    .addSelect('JSON_LENGTH(s.probes)', 'probeCount')
    .addSelect('JSON_LENGTH(s.sweeps)', 'sweepCount')
    .where('s.projectId = :projectId', { projectId })
  if (pathId !== undefined) qb.andWhere('s.pathId = :pathId', { pathId })
  const rows = await qb.orderBy('s.createdAt', 'DESC').addOrderBy('s.id', 'DESC').getRawMany<Row & { probeCount: number; sweepCount: number }>()
  return rows.map((r) => ({ ...toBase(r), probeCount: Number(r.probeCount), sweepCount: Number(r.sweepCount) }))
}

export async function getProbeSet(m: EntityManager, id: number): Promise<ProbeSet> {
  const r = await baseQuery(m)
    .addSelect('s.probes', 'probes')
    .addSelect('s.sweeps', 'sweeps')
    .where('s.id = :id', { id })
    .getRawOne<Row & { probes: string; sweeps: string }>()
  if (!r) throw notFound('That probe set')
  return { ...toBase(r), probes: JSON.parse(r.probes) as ProbeInput[], sweeps: JSON.parse(r.sweeps) as ProbeSetSweep[] }
}

/** Resolves the team of a probe set, for the route layer's role check. */
export async function probeSetTeamId(ds: DataSource, id: number): Promise<number | undefined> {
  const row = (await ds.query('SELECT pr.team_id AS teamId FROM probe_sets s JOIN projects pr ON pr.id = s.project_id WHERE s.id = ?', [id])) as Array<{ teamId: number }>
  return row[0] ? Number(row[0].teamId) : undefined
}

/** A set (or a check) is made on a live path of its own project, on a revision that path has. */
export async function assertPathRevision(m: EntityManager, projectId: number, pathId: number, revision: number): Promise<void> {
  const path = await m.getRepository(PathEntity).findOne({ where: { id: pathId, projectId }, select: { id: true, deletedAt: true } })
  if (!path || path.deletedAt) throw new HttpError(404, 'path_not_found', 'That path is not in this project, or it is in the trash.')
  if (!(await m.getRepository(RevisionEntity).existsBy({ pathId, number: revision }))) {
    const [{ n }] = (await m.query('SELECT COALESCE(MAX(number), 0) AS n FROM revisions WHERE path_id = ?', [pathId])) as Array<{ n: number }>
    throw new HttpError(400, 'unknown_revision', `That path has no revision ${revision}; its revisions are numbered 1 to ${Number(n)}.`)
  }
}

const nameTaken = (name: string | undefined) =>
  new HttpError(409, 'probe_set_name_taken', `This project has a probe set named “${name}” already. Choose another name.`)

/** Names compare as the column's collation does (utf8mb4_unicode_ci: case-insensitive). */
async function assertNameFree(m: EntityManager, projectId: number, name: string, exceptId?: number): Promise<void> {
  const other = await m.getRepository(ProbeSetEntity).findOne({ where: { projectId, name }, select: { id: true } })
  if (other && other.id !== exceptId) throw nameTaken(name)
}

/** Runs a write; a name taken by a concurrent write (the unique key) is a 409 too. */
async function guardName<T>(name: string | undefined, write: () => Promise<T>): Promise<T> {
  try {
    return await write()
  } catch (e) {
    if ((e as { driverError?: { errno?: number } }).driverError?.errno === DUPLICATE_KEY_ERRNO) throw nameTaken(name)
    throw e
  }
}

/** Writes a new set inside a transaction the caller holds (also used by the demo seed); returns its id. */
export async function insertProbeSetIn(m: EntityManager, projectId: number, authorId: number, input: ProbeSetInput): Promise<number> {
  await assertPathRevision(m, projectId, input.pathId, input.revision)
  await assertNameFree(m, projectId, input.name)
  const saved = await m.getRepository(ProbeSetEntity).save({
    projectId,
    pathId: input.pathId,
    revision: input.revision,
    name: input.name,
    description: input.description,
    probes: JSON.stringify(input.probes),
    sweeps: JSON.stringify(input.sweeps),
    authorId,
  })
  return saved.id
}

export async function createProbeSet(ds: DataSource, projectId: number, authorId: number, input: ProbeSetInput): Promise<ProbeSet> {
  return guardName(input.name, () =>
    ds.transaction(async (m) => getProbeSet(m, await insertProbeSetIn(m, projectId, authorId, input))),
  )
}

/** Replaces the fields given; a new path or revision is checked as on create. */
export async function updateProbeSet(ds: DataSource, id: number, patch: ProbeSetPatch): Promise<ProbeSet> {
  return guardName(patch.name, () =>
    ds.transaction(async (m) => {
      const set = await m.getRepository(ProbeSetEntity).findOne({ where: { id }, lock: { mode: 'pessimistic_write' } })
      if (!set) throw notFound('That probe set')
      if (patch.pathId !== undefined || patch.revision !== undefined) {
        await assertPathRevision(m, set.projectId, patch.pathId ?? set.pathId, patch.revision ?? set.revision)
      }
      if (patch.name !== undefined) await assertNameFree(m, set.projectId, patch.name, id)
      const { probes, sweeps, ...plain } = patch
      await m.getRepository(ProbeSetEntity).update(
        { id },
        { ...plain, ...(probes && { probes: JSON.stringify(probes) }), ...(sweeps && { sweeps: JSON.stringify(sweeps) }) },
      )
      return getProbeSet(m, id)
    }),
  )
}

export async function deleteProbeSet(ds: DataSource, id: number): Promise<void> {
  await ds.transaction(async (m) => {
    const r = await m.getRepository(ProbeSetEntity).delete({ id })
    if (!r.affected) throw notFound('That probe set')
  })
}
