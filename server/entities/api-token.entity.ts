import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm'
import { CreatedAtColumn } from './time-columns'
import { UserEntity } from './user.entity'

/**
 * A personal API token for pipelines. Only the SHA-256 of the secret is kept; the secret
 * itself is shown once, in the answer that creates it. Deleting the person removes them.
 */
@Entity('api_tokens')
@Index('IDX_api_tokens_hash', ['tokenHash'], { unique: true })
@Index('IDX_api_tokens_user_created', ['userId', 'createdAt'])
export class ApiTokenEntity {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number

  @Column({ name: 'user_id', type: 'int', unsigned: true })
  userId: number

  @Column({ type: 'varchar', length: 80 })
  name: string

  /** Lower-case hex SHA-256 of the whole secret. */
  @Column({ name: 'token_hash', type: 'char', length: 64 })
  tokenHash: string

  /** The first characters of the secret, for recognising a token in the list. */
  @Column({ type: 'varchar', length: 10 })
  prefix: string

  @CreatedAtColumn()
  createdAt: Date

  @Column({ name: 'expires_at', type: 'datetime', precision: 3 })
  expiresAt: Date

  @Column({ name: 'last_used_at', type: 'datetime', precision: 3, nullable: true })
  lastUsedAt: Date | null

  @Column({ name: 'revoked_at', type: 'datetime', precision: 3, nullable: true })
  revokedAt: Date | null

  @ManyToOne(() => UserEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'user_id', foreignKeyConstraintName: 'FK_api_tokens_user' })
  user: UserEntity
}
