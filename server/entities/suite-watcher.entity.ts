import { Entity, JoinColumn, ManyToOne, PrimaryColumn } from 'typeorm'
import { CreatedAtColumn } from './time-columns'
import { SuiteEntity } from './suite.entity'
import { UserEntity } from './user.entity'

/** A person who gets mail when a run of the suite fails. */
@Entity('suite_watchers')
export class SuiteWatcherEntity {
  @PrimaryColumn({ name: 'suite_id', type: 'int', unsigned: true })
  suiteId: number

  @PrimaryColumn({ name: 'user_id', type: 'int', unsigned: true })
  userId: number

  @CreatedAtColumn()
  createdAt: Date

  @ManyToOne(() => SuiteEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'suite_id', foreignKeyConstraintName: 'FK_suite_watchers_suite' })
  suite: SuiteEntity

  @ManyToOne(() => UserEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'user_id', foreignKeyConstraintName: 'FK_suite_watchers_user' })
  user: UserEntity
}
