import type { DataSource } from 'typeorm'
import type { CreateProject, Project, ProjectListQuery, ProjectPage } from '../../shared/api/projects'
import { PathEntity } from '../entities/path.entity'
import { ProjectEntity } from '../entities/project.entity'
import { notFound } from '../errors/http-error'
import { containsPattern } from './sql-like'

interface ProjectRow {
  id: number
  teamId: number
  name: string
  description: string
  createdAt: Date
  updatedAt: Date
  createdBy: string | null
  pathCount: number | string
}

const sortColumns: Record<ProjectListQuery['sort'], string> = {
  name: 'p.name',
  createdAt: 'p.createdAt',
  updatedAt: 'p.updatedAt',
  pathCount: 'pathCount', // the alias of the counting subquery
}

function toProject(r: ProjectRow): Project {
  return {
    id: Number(r.id),
    teamId: Number(r.teamId),
    name: r.name,
    description: r.description,
    pathCount: Number(r.pathCount),
    createdAt: new Date(r.createdAt).toISOString(),
    updatedAt: new Date(r.updatedAt).toISOString(),
    createdBy: r.createdBy,
  }
}

function projectQuery(ds: DataSource) {
  return ds
    .getRepository(ProjectEntity)
    .createQueryBuilder('p')
    .leftJoin('p.createdBy', 'u')
    .select([
      'p.id AS id',
      'p.teamId AS teamId',
      'p.name AS name',
      'p.description AS description',
      'p.createdAt AS createdAt',
      'p.updatedAt AS updatedAt',
      'u.displayName AS createdBy',
    ])
    .addSelect((sub) => sub.select('COUNT(*)').from(PathEntity, 'x').where('x.projectId = p.id'), 'pathCount')
}

export async function listProjects(ds: DataSource, teamId: number, q: ProjectListQuery): Promise<ProjectPage> {
  const base = projectQuery(ds).where('p.teamId = :teamId', { teamId })
  if (q.q) base.andWhere('p.name LIKE :pattern', { pattern: containsPattern(q.q) })
  const total = await base.clone().getCount()
  const order = q.order === 'asc' ? 'ASC' : 'DESC'
  const rows = await base
    .orderBy(sortColumns[q.sort], order)
    .addOrderBy('p.id', order)
    .offset((q.page - 1) * q.pageSize)
    .limit(q.pageSize)
    .getRawMany<ProjectRow>()
  return { items: rows.map(toProject), total, page: q.page, pageSize: q.pageSize }
}

export async function getProject(ds: DataSource, id: number): Promise<Project> {
  const row = await projectQuery(ds).where('p.id = :id', { id }).getRawOne<ProjectRow>()
  if (!row) throw notFound('That project')
  return toProject(row)
}

export async function projectTeamId(ds: DataSource, id: number): Promise<number | undefined> {
  const p = await ds.getRepository(ProjectEntity).findOne({ where: { id }, select: { id: true, teamId: true } })
  return p?.teamId
}

export async function createProject(ds: DataSource, teamId: number, userId: number, input: Required<CreateProject>): Promise<Project> {
  const id = await ds.transaction(async (m) => {
    const saved = await m.getRepository(ProjectEntity).save({
      teamId,
      name: input.name,
      description: input.description,
      createdById: userId,
    })
    return saved.id
  })
  return getProject(ds, id)
}

export async function updateProject(ds: DataSource, id: number, patch: { name?: string; description?: string }): Promise<Project> {
  await ds.transaction(async (m) => {
    const repo = m.getRepository(ProjectEntity)
    const p = await repo.findOne({ where: { id }, lock: { mode: 'pessimistic_write' } })
    if (!p) throw notFound('That project')
    if (patch.name !== undefined) p.name = patch.name
    if (patch.description !== undefined) p.description = patch.description
    await repo.save(p)
  })
  return getProject(ds, id)
}

export async function deleteProject(ds: DataSource, id: number): Promise<void> {
  const r = await ds.getRepository(ProjectEntity).delete({ id })
  if (!r.affected) throw notFound('That project')
}
