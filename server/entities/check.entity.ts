import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm'
import { CreatedAtColumn, UpdatedAtColumn } from './time-columns'
import type { CheckFollow } from '../../shared/api/suites'
import { PathEntity } from './path.entity'
import { SuiteEntity } from './suite.entity'

/**
 * Probes and sweeps on a path with the hits the server computed on one revision, kept as
 * expected, and the tolerance a run allows. The name is unique in the suite. Purging the
 * path removes its checks (their past results stay with the runs).
 */
@Entity('checks')
@Index('IDX_checks_suite_name', ['suiteId', 'name'], { unique: true })
export class CheckEntity {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number

  @Column({ name: 'suite_id', type: 'int', unsigned: true })
  suiteId: number

  @Column({ name: 'path_id', type: 'int', unsigned: true })
  pathId: number

  @Column({ type: 'varchar', length: 120 })
  name: string

  /** The number of the path revision the expected hits were computed on. */
  @Column({ type: 'int', unsigned: true })
  revision: number

  @Column({ type: 'enum', enum: ['latest', 'pinned'], default: 'latest' })
  follow: CheckFollow

  /** The probes as JSON, in the computation contract's shape. */
  @Column({ type: 'mediumtext' })
  probes: string

  /** The sweeps as JSON: angle in degrees, spacing, count, origin. */
  @Column({ type: 'mediumtext' })
  sweeps: string

  /** The expected hits as JSON: one list per probe line, probes first, then the sweeps' lines. */
  @Column({ type: 'longtext' })
  expected: string

  @Column({ name: 'tolerance_point', type: 'double' })
  tolerancePoint: number

  @Column({ name: 'tolerance_t', type: 'double' })
  toleranceT: number

  @Column({ name: 'match_kinds', type: 'boolean', default: true })
  matchKinds: boolean

  @Column({ name: 'match_winding', type: 'boolean', default: true })
  matchWinding: boolean

  @CreatedAtColumn()
  createdAt: Date

  @UpdatedAtColumn()
  updatedAt: Date

  @ManyToOne(() => SuiteEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'suite_id', foreignKeyConstraintName: 'FK_checks_suite' })
  suite: SuiteEntity

  @ManyToOne(() => PathEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'path_id', foreignKeyConstraintName: 'FK_checks_path' })
  path: PathEntity
}
