import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm'
import { CreatedAtColumn, UpdatedAtColumn } from './time-columns'
import { ProjectEntity } from './project.entity'

/** A named group of checks in a project; the name is unique in the project. */
@Entity('suites')
@Index('IDX_suites_project_name', ['projectId', 'name'], { unique: true })
export class SuiteEntity {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number

  @Column({ name: 'project_id', type: 'int', unsigned: true })
  projectId: number

  @Column({ type: 'varchar', length: 120 })
  name: string

  @Column({ type: 'varchar', length: 500, default: '' })
  description: string

  @CreatedAtColumn()
  createdAt: Date

  @UpdatedAtColumn()
  updatedAt: Date

  @ManyToOne(() => ProjectEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'project_id', foreignKeyConstraintName: 'FK_suites_project' })
  project: ProjectEntity
}
