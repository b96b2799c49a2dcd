import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm'
import { ProjectEntity } from './project.entity'

export type FillRule = 'nonzero' | 'evenodd'
export type PathOrigin = 'drawn' | 'svg' | 'font'

@Entity('paths')
@Index('IDX_paths_project_name', ['projectId', 'name'])
export class PathEntity {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number

  @Column({ name: 'project_id', type: 'int', unsigned: true })
  projectId: number

  @Column({ type: 'varchar', length: 200 })
  name: string

  @Column({ name: 'fill_rule', type: 'enum', enum: ['nonzero', 'evenodd'], default: 'nonzero' })
  fillRule: FillRule

  @Column({ type: 'enum', enum: ['drawn', 'svg', 'font'], default: 'drawn' })
  origin: PathOrigin

  @Column({ type: 'varchar', length: 20, default: 'px' })
  units: string

  @Column({ name: 'current_revision_id', type: 'int', unsigned: true, nullable: true })
  currentRevisionId: number | null

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  createdAt: Date

  @UpdateDateColumn({
    name: 'updated_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
    onUpdate: 'CURRENT_TIMESTAMP(3)',
  })
  updatedAt: Date

  @ManyToOne(() => ProjectEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'project_id', foreignKeyConstraintName: 'FK_paths_project' })
  project: ProjectEntity
}
