import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm'
import { CreatedAtColumn } from './time-columns'
import { ProjectEntity } from './project.entity'
import { UserEntity } from './user.entity'

export type AuditStatus = 'queued' | 'running' | 'completed' | 'cancelling' | 'cancelled' | 'failed'
export const AUDIT_STATUSES: readonly AuditStatus[] = ['queued', 'running', 'completed', 'cancelling', 'cancelled', 'failed']

/**
 * An audit: closed-form hits compared with numeric engines over a selection of a project's
 * paths, run as queued chunks by the workers. The selection is resolved once, when the audit
 * is created, into the list of revisions it covers, so every chunk sees the same paths.
 */
@Entity('audits')
@Index('IDX_audits_project_created', ['projectId', 'createdAt'])
export class AuditEntity {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number

  @Column({ name: 'project_id', type: 'int', unsigned: true })
  projectId: number

  @Column({ type: 'varchar', length: 120 })
  name: string

  @Column({ type: 'enum', enum: AUDIT_STATUSES, default: 'queued' })
  status: AuditStatus

  /** The core's AuditOptions (engines, generators, seed) as JSON. */
  @Column({ type: 'text' })
  options: string

  /** What was asked for, as JSON: {tag} | {pathIds} | {all: true}. */
  @Column({ type: 'text' })
  selection: string

  /** The revision ids the selection resolved to, in chunk order, as a JSON array. */
  @Column({ type: 'mediumtext' })
  targets: string

  @Column({ name: 'path_count', type: 'int', unsigned: true })
  pathCount: number

  /** Paths per chunk; chunk k covers targets[k·chunkSize, (k+1)·chunkSize). */
  @Column({ name: 'chunk_size', type: 'int', unsigned: true })
  chunkSize: number

  @Column({ name: 'chunk_count', type: 'int', unsigned: true })
  chunkCount: number

  @Column({ name: 'chunks_done', type: 'int', unsigned: true, default: 0 })
  chunksDone: number

  @Column({ name: 'created_by', type: 'int', unsigned: true, nullable: true })
  createdById: number | null

  @CreatedAtColumn()
  createdAt: Date

  @Column({ name: 'started_at', type: 'datetime', precision: 3, nullable: true })
  startedAt: Date | null

  @Column({ name: 'finished_at', type: 'datetime', precision: 3, nullable: true })
  finishedAt: Date | null

  /** The merged AuditAggregate as JSON, once every chunk is in. */
  @Column({ type: 'mediumtext', nullable: true })
  report: string | null

  @Column({ type: 'varchar', length: 1000, nullable: true })
  error: string | null

  @ManyToOne(() => ProjectEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'project_id', foreignKeyConstraintName: 'FK_audits_project' })
  project: ProjectEntity

  @ManyToOne(() => UserEntity, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'created_by', foreignKeyConstraintName: 'FK_audits_created_by' })
  createdBy: UserEntity | null
}
