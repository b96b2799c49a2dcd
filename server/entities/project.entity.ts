import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm'
import { CreatedAtColumn, UpdatedAtColumn } from './time-columns'
import { TeamEntity } from './team.entity'
import { UserEntity } from './user.entity'

@Entity('projects')
@Index('IDX_projects_team_name', ['teamId', 'name'])
export class ProjectEntity {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number

  @Column({ name: 'team_id', type: 'int', unsigned: true })
  teamId: number

  @Column({ type: 'varchar', length: 120 })
  name: string

  @Column({ type: 'text' })
  description: string

  @Column({ name: 'created_by_id', type: 'int', unsigned: true, nullable: true })
  createdById: number | null

  @CreatedAtColumn()
  createdAt: Date

  @UpdatedAtColumn()
  updatedAt: Date

  @ManyToOne(() => TeamEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'team_id', foreignKeyConstraintName: 'FK_projects_team' })
  team: TeamEntity

  @ManyToOne(() => UserEntity, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'created_by_id', foreignKeyConstraintName: 'FK_projects_created_by' })
  createdBy: UserEntity | null
}
