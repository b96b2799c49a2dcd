import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm'
import { CreatedAtColumn, UpdatedAtColumn } from './time-columns'
import { PathEntity } from './path.entity'
import { ProjectEntity } from './project.entity'
import { UserEntity } from './user.entity'

/**
 * A saved arrangement of probes and sweeps over a path, made on one of its revisions.
 * Purging the path (or deleting the project) removes its sets.
 */
@Entity('probe_sets')
@Index('IDX_probe_sets_project_name', ['projectId', 'name'], { unique: true })
export class ProbeSetEntity {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number

  @Column({ name: 'project_id', type: 'int', unsigned: true })
  projectId: number

  @Column({ name: 'path_id', type: 'int', unsigned: true })
  pathId: number

  /** The number of the path revision the set was made on. */
  @Column({ type: 'int', unsigned: true })
  revision: number

  @Column({ type: 'varchar', length: 120 })
  name: string

  @Column({ type: 'varchar', length: 500, default: '' })
  description: string

  /** The probes as JSON, in the computation contract's shape. */
  @Column({ type: 'mediumtext' })
  probes: string

  /** The sweeps as JSON: angle in degrees, spacing, count, origin. */
  @Column({ type: 'mediumtext' })
  sweeps: string

  @Column({ name: 'author_id', type: 'int', unsigned: true, nullable: true })
  authorId: number | null

  @CreatedAtColumn()
  createdAt: Date

  @UpdatedAtColumn()
  updatedAt: Date

  @ManyToOne(() => ProjectEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'project_id', foreignKeyConstraintName: 'FK_probe_sets_project' })
  project: ProjectEntity

  @ManyToOne(() => PathEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'path_id', foreignKeyConstraintName: 'FK_probe_sets_path' })
  path: PathEntity

  @ManyToOne(() => UserEntity, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'author_id', foreignKeyConstraintName: 'FK_probe_sets_author' })
  author: UserEntity | null
}
