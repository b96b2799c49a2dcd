import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm'
import type { RunVerdict } from '../../shared/api/suites'
import { RunEntity } from './run.entity'

/**
 * One check's verdict in one run. The check's id, name and path are copied and carry no
 * foreign key, so the result outlives a deleted check or a purged path.
 */
@Entity('run_results')
@Index('IDX_run_results_check_run', ['checkId', 'runId'])
@Index('IDX_run_results_run_position', ['runId', 'position'])
export class RunResultEntity {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number

  @Column({ name: 'run_id', type: 'int', unsigned: true })
  runId: number

  /** Order of the result in its run (the checks' order). */
  @Column({ type: 'int', unsigned: true })
  position: number

  @Column({ name: 'check_id', type: 'int', unsigned: true })
  checkId: number

  @Column({ name: 'check_name', type: 'varchar', length: 120 })
  checkName: string

  @Column({ name: 'path_id', type: 'int', unsigned: true })
  pathId: number

  /** The path revision the check ran on. */
  @Column({ type: 'int', unsigned: true })
  revision: number

  @Column({ type: 'enum', enum: ['passed', 'failed'] })
  verdict: RunVerdict

  @Column({ name: 'difference_count', type: 'int', unsigned: true })
  differenceCount: number

  /** The differences as JSON (HitDifference items). */
  @Column({ type: 'longtext' })
  differences: string

  @Column({ type: 'varchar', length: 500, nullable: true })
  error: string | null

  @Column({ name: 'duration_ms', type: 'double' })
  durationMs: number

  @ManyToOne(() => RunEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'run_id', foreignKeyConstraintName: 'FK_run_results_run' })
  run: RunEntity
}
