import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm'
import { CreatedAtColumn } from './time-columns'
import type { Role } from '../../shared/api/common'
import { TeamEntity } from './team.entity'
import { UserEntity } from './user.entity'

/**
 * An invitation to join a team by e-mail. Only the SHA-256 of the link's secret is kept;
 * the secret itself travels in the mail only. Used once (accepted_at), or revoked.
 */
@Entity('invitations')
@Index('IDX_invitations_hash', ['tokenHash'], { unique: true })
@Index('IDX_invitations_team_email', ['teamId', 'email'])
export class InvitationEntity {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number

  @Column({ name: 'team_id', type: 'int', unsigned: true })
  teamId: number

  /** Lower-cased. */
  @Column({ type: 'varchar', length: 254 })
  email: string

  @Column({ type: 'enum', enum: ['owner', 'editor', 'viewer'] })
  role: Role

  /** Lower-case hex SHA-256 of the link's secret. */
  @Column({ name: 'token_hash', type: 'char', length: 64 })
  tokenHash: string

  @Column({ name: 'invited_by_id', type: 'int', unsigned: true, nullable: true })
  invitedById: number | null

  @Column({ name: 'expires_at', type: 'datetime', precision: 3 })
  expiresAt: Date

  @Column({ name: 'accepted_at', type: 'datetime', precision: 3, nullable: true })
  acceptedAt: Date | null

  @Column({ name: 'accepted_by_id', type: 'int', unsigned: true, nullable: true })
  acceptedById: number | null

  @Column({ name: 'revoked_at', type: 'datetime', precision: 3, nullable: true })
  revokedAt: Date | null

  @CreatedAtColumn()
  createdAt: Date

  @Column({ name: 'last_sent_at', type: 'datetime', precision: 3 })
  lastSentAt: Date

  @ManyToOne(() => TeamEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'team_id', foreignKeyConstraintName: 'FK_invitations_team' })
  team: TeamEntity

  @ManyToOne(() => UserEntity, { onDelete: 'SET NULL', nullable: true })
  @JoinColumn({ name: 'invited_by_id', foreignKeyConstraintName: 'FK_invitations_invited_by' })
  invitedBy: UserEntity | null

  @ManyToOne(() => UserEntity, { onDelete: 'SET NULL', nullable: true })
  @JoinColumn({ name: 'accepted_by_id', foreignKeyConstraintName: 'FK_invitations_accepted_by' })
  acceptedBy: UserEntity | null
}
