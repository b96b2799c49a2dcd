import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm'
import { CreatedAtColumn } from './time-columns'
import type { Role } from '../../shared/api/common'
import { TeamEntity } from './team.entity'
import { UserEntity } from './user.entity'

@Entity('memberships')
@Index('IDX_memberships_team_user', ['teamId', 'userId'], { unique: true })
export class MembershipEntity {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number

  @Column({ name: 'team_id', type: 'int', unsigned: true })
  teamId: number

  @Column({ name: 'user_id', type: 'int', unsigned: true })
  userId: number

  @Column({ type: 'enum', enum: ['owner', 'editor', 'viewer'] })
  role: Role

  @CreatedAtColumn()
  createdAt: Date

  @ManyToOne(() => TeamEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'team_id', foreignKeyConstraintName: 'FK_memberships_team' })
  team: TeamEntity

  @ManyToOne(() => UserEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'user_id', foreignKeyConstraintName: 'FK_memberships_user' })
  user: UserEntity
}
