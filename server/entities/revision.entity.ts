import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm'
import { PathEntity } from './path.entity'
import { UserEntity } from './user.entity'

/** One saved state of a path. Rows are only ever added, never updated. */
@Entity('revisions')
@Index('IDX_revisions_path_number', ['pathId', 'number'], { unique: true })
export class RevisionEntity {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number

  @Column({ name: 'path_id', type: 'int', unsigned: true })
  pathId: number

  @Column({ type: 'int', unsigned: true })
  number: number

  @Column({ type: 'mediumtext' })
  data: string

  @Column({ type: 'varchar', length: 500, default: '' })
  message: string

  @Column({ name: 'author_id', type: 'int', unsigned: true, nullable: true })
  authorId: number | null

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  createdAt: Date

  @ManyToOne(() => PathEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'path_id', foreignKeyConstraintName: 'FK_revisions_path' })
  path: PathEntity

  @ManyToOne(() => UserEntity, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'author_id', foreignKeyConstraintName: 'FK_revisions_author' })
  author: UserEntity | null
}
