import { Column, Entity, JoinColumn, ManyToOne, PrimaryColumn } from 'typeorm'
import { CreatedAtColumn } from './time-columns'
import { AuditEntity } from './audit.entity'

/** The aggregate of one chunk of an audit; the key makes a chunk written twice stay one row. */
@Entity('audit_chunks')
export class AuditChunkEntity {
  @PrimaryColumn({ name: 'audit_id', type: 'int', unsigned: true })
  auditId: number

  @PrimaryColumn({ type: 'int', unsigned: true })
  chunk: number

  /** The chunk's AuditAggregate as JSON. */
  @Column({ type: 'mediumtext' })
  aggregate: string

  @CreatedAtColumn()
  createdAt: Date

  @ManyToOne(() => AuditEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'audit_id', foreignKeyConstraintName: 'FK_audit_chunks_audit' })
  audit: AuditEntity
}
