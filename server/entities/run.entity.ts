import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm'
import type { RunVerdict } from '../../shared/api/suites'
import { SuiteEntity } from './suite.entity'
import { UserEntity } from './user.entity'

export type RunTrigger = 'screen' | 'api'

/** One execution of a suite, numbered 1, 2, … within it. Rows are only ever added. */
@Entity('runs')
@Index('IDX_runs_suite_number', ['suiteId', 'number'], { unique: true })
export class RunEntity {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number

  @Column({ name: 'suite_id', type: 'int', unsigned: true })
  suiteId: number

  @Column({ type: 'int', unsigned: true })
  number: number

  @Column({ type: 'enum', enum: ['passed', 'failed'] })
  verdict: RunVerdict

  @Column({ type: 'int', unsigned: true })
  passed: number

  @Column({ type: 'int', unsigned: true })
  failed: number

  /** `trigger` is a reserved word in MariaDB, hence the column's name. */
  @Column({ name: 'trigger_kind', type: 'enum', enum: ['screen', 'api'] })
  trigger: RunTrigger

  @Column({ name: 'user_id', type: 'int', unsigned: true, nullable: true })
  userId: number | null

  /** The display name at the time of the run, kept when the person leaves. */
  @Column({ name: 'by_name', type: 'varchar', length: 120, nullable: true })
  byName: string | null

  @Column({ name: 'started_at', type: 'datetime', precision: 3 })
  startedAt: Date

  @Column({ name: 'finished_at', type: 'datetime', precision: 3 })
  finishedAt: Date

  @ManyToOne(() => SuiteEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'suite_id', foreignKeyConstraintName: 'FK_runs_suite' })
  suite: SuiteEntity

  @ManyToOne(() => UserEntity, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'user_id', foreignKeyConstraintName: 'FK_runs_user' })
  user: UserEntity | null
}
