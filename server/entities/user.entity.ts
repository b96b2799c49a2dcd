import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm'
import { CreatedAtColumn } from './time-columns'

@Entity('users')
@Index('IDX_users_email', ['email'], { unique: true })
export class UserEntity {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number

  @Column({ type: 'varchar', length: 254 })
  email: string

  @Column({ name: 'display_name', type: 'varchar', length: 120 })
  displayName: string

  @Column({ name: 'password_hash', type: 'varchar', length: 100 })
  passwordHash: string

  @CreatedAtColumn()
  createdAt: Date

  @Column({ name: 'last_active_at', type: 'datetime', precision: 3, nullable: true })
  lastActiveAt: Date | null
}
