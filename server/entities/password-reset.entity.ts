import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm'
import { CreatedAtColumn } from './time-columns'
import { UserEntity } from './user.entity'

/**
 * A password reset link sent by mail. Only the SHA-256 of its token is kept; the token
 * itself is only in the mail. It works once (`usedAt`) and until `expiresAt`.
 */
@Entity('password_resets')
@Index('IDX_password_resets_hash', ['tokenHash'], { unique: true })
@Index('IDX_password_resets_user', ['userId'])
export class PasswordResetEntity {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number

  @Column({ name: 'user_id', type: 'int', unsigned: true })
  userId: number

  /** Lower-case hex SHA-256 of the token. */
  @Column({ name: 'token_hash', type: 'char', length: 64 })
  tokenHash: string

  @CreatedAtColumn()
  createdAt: Date

  @Column({ name: 'expires_at', type: 'datetime', precision: 3 })
  expiresAt: Date

  @Column({ name: 'used_at', type: 'datetime', precision: 3, nullable: true })
  usedAt: Date | null

  @ManyToOne(() => UserEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'user_id', foreignKeyConstraintName: 'FK_password_resets_user' })
  user: UserEntity
}
