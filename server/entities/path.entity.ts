import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm'
import { CreatedAtColumn, UpdatedAtColumn } from './time-columns'
import { ProjectEntity } from './project.entity'

export type FillRule = 'nonzero' | 'evenodd'
export type PathOrigin = 'drawn' | 'svg' | 'font'

@Entity('paths')
@Index('IDX_paths_project_name', ['projectId', 'name'])
@Index('IDX_paths_project_deleted', ['projectId', 'deletedAt'])
export class PathEntity {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number

  @Column({ name: 'project_id', type: 'int', unsigned: true })
  projectId: number

  @Column({ type: 'varchar', length: 200 })
  name: string

  @Column({ name: 'fill_rule', type: 'enum', enum: ['nonzero', 'evenodd'], default: 'nonzero' })
  fillRule: FillRule

  @Column({ type: 'enum', enum: ['drawn', 'svg', 'font'], default: 'drawn' })
  origin: PathOrigin

  @Column({ type: 'varchar', length: 20, default: 'px' })
  units: string

  @Column({ name: 'source_file', type: 'varchar', length: 255, nullable: true })
  sourceFile: string | null

  /** Font metrics of a glyph and similar facts of the source, as JSON. */
  @Column({ type: 'longtext', nullable: true, transformer: { to: (v: unknown) => (v == null ? null : JSON.stringify(v)), from: (v: string | null) => (v == null ? null : JSON.parse(v)) } })
  metadata: Record<string, unknown> | null

  /** Copied from the current revision so the library table sorts without a join. */
  @Column({ name: 'segment_count', type: 'int', unsigned: true, default: 0 })
  segmentCount: number

  @Column({ name: 'warning_count', type: 'int', unsigned: true, default: 0 })
  warningCount: number

  /** Set while the path is in the trash. */
  @Column({ name: 'deleted_at', type: 'datetime', precision: 3, nullable: true })
  deletedAt: Date | null

  @Column({ name: 'current_revision_id', type: 'int', unsigned: true, nullable: true })
  currentRevisionId: number | null

  @CreatedAtColumn()
  createdAt: Date

  @UpdatedAtColumn()
  updatedAt: Date

  @ManyToOne(() => ProjectEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'project_id', foreignKeyConstraintName: 'FK_paths_project' })
  project: ProjectEntity
}
