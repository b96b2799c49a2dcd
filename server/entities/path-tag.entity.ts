import { Entity, Index, JoinColumn, ManyToOne, PrimaryColumn } from 'typeorm'
import { PathEntity } from './path.entity'

@Entity('path_tags')
@Index('IDX_path_tags_tag', ['tag'])
export class PathTagEntity {
  @PrimaryColumn({ name: 'path_id', type: 'int', unsigned: true })
  pathId: number

  @PrimaryColumn({ type: 'varchar', length: 40 })
  tag: string

  @ManyToOne(() => PathEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'path_id', foreignKeyConstraintName: 'FK_path_tags_path' })
  path: PathEntity
}
