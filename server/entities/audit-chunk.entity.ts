import { Column, CreateDateColumn, Entity, JoinColumn, ManyToOne, PrimaryColumn } from 'typeorm'
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

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  createdAt: Date

  @ManyToOne(() => AuditEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'audit_id', foreignKeyConstraintName: 'FK_audit_chunks_audit' })
  audit: AuditEntity
}
