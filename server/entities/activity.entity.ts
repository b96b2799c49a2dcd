import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm'
import { CreatedAtColumn } from './time-columns'
import type { ActivityAction, ActivityTargetType, ActivityVia } from '../../shared/api/activity'
import { UserEntity } from './user.entity'

/**
 * One entry of the append-only activity log. MariaDB triggers refuse UPDATE and DELETE on the
 * table (migration 1764979400000). team_id and project_id have no foreign keys on purpose: a
 * cascade would have to delete entries, and the entries of a deleted project are kept. The
 * actor's key is set to NULL when the account goes (foreign-key actions do not fire triggers
 * in MariaDB); actor_name keeps who it was.
 */
@Entity('activity')
@Index('IDX_activity_team_created', ['teamId', 'createdAt'])
@Index('IDX_activity_project_created', ['projectId', 'createdAt'])
export class ActivityEntity {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number

  /** Null for personal entries (tokens, account) that belong to no team. */
  @Column({ name: 'team_id', type: 'int', unsigned: true, nullable: true })
  teamId: number | null

  @Column({ name: 'project_id', type: 'int', unsigned: true, nullable: true })
  projectId: number | null

  @Column({ name: 'actor_id', type: 'int', unsigned: true, nullable: true })
  actorId: number | null

  @Column({ name: 'actor_name', type: 'varchar', length: 120 })
  actorName: string

  @Column({ type: 'enum', enum: ['session', 'token', 'link'] })
  via: ActivityVia

  /** Kept as text (checked by the API schema) so a new action needs no table change. */
  @Column({ type: 'varchar', length: 24 })
  action: ActivityAction

  @Column({ name: 'target_type', type: 'varchar', length: 24 })
  targetType: ActivityTargetType

  @Column({ name: 'target_id', type: 'int', unsigned: true, nullable: true })
  targetId: number | null

  @Column({ name: 'target_name', type: 'varchar', length: 200 })
  targetName: string

  @Column({ type: 'varchar', length: 500 })
  summary: string

  @CreatedAtColumn()
  createdAt: Date

  @ManyToOne(() => UserEntity, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'actor_id', foreignKeyConstraintName: 'FK_activity_actor' })
  actor: UserEntity | null
}
