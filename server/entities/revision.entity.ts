import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm'
import { CreatedAtColumn } from './time-columns'
import { PathEntity } from './path.entity'
import { UserEntity } from './user.entity'

/** One saved state of a path. Rows are only ever added, never updated. */
@Entity('revisions')
@Index('IDX_revisions_path_number', ['pathId', 'number'], { unique: true })
export class RevisionEntity {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number

  @Column({ name: 'path_id', type: 'int', unsigned: true })
  pathId: number

  @Column({ type: 'int', unsigned: true })
  number: number

  @Column({ type: 'mediumtext' })
  data: string

  /** The normalised segments as JSON (tuples: 4 line, 6 quadratic, 8 cubic, 12 arc). */
  @Column({ type: 'mediumtext', nullable: true })
  segments: string | null

  @Column({ name: 'segment_count', type: 'int', unsigned: true, default: 0 })
  segmentCount: number

  @Column({ name: 'count_line', type: 'int', unsigned: true, default: 0 })
  countLine: number

  @Column({ name: 'count_quadratic', type: 'int', unsigned: true, default: 0 })
  countQuadratic: number

  @Column({ name: 'count_cubic', type: 'int', unsigned: true, default: 0 })
  countCubic: number

  @Column({ name: 'count_arc', type: 'int', unsigned: true, default: 0 })
  countArc: number

  @Column({ name: 'bbox_min_x', type: 'double', nullable: true })
  bboxMinX: number | null

  @Column({ name: 'bbox_min_y', type: 'double', nullable: true })
  bboxMinY: number | null

  @Column({ name: 'bbox_max_x', type: 'double', nullable: true })
  bboxMaxX: number | null

  @Column({ name: 'bbox_max_y', type: 'double', nullable: true })
  bboxMaxY: number | null

  /** The core's diagnostics of this revision, as JSON. */
  @Column({ type: 'mediumtext', nullable: true })
  diagnostics: string | null

  @Column({ type: 'varchar', length: 500, default: '' })
  message: string

  @Column({ name: 'author_id', type: 'int', unsigned: true, nullable: true })
  authorId: number | null

  @CreatedAtColumn()
  createdAt: Date

  @ManyToOne(() => PathEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'path_id', foreignKeyConstraintName: 'FK_revisions_path' })
  path: PathEntity

  @ManyToOne(() => UserEntity, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'author_id', foreignKeyConstraintName: 'FK_revisions_author' })
  author: UserEntity | null
}
