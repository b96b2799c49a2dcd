import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm'
import { CreatedAtColumn } from './time-columns'

@Entity('teams')
export class TeamEntity {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number

  @Column({ type: 'varchar', length: 120 })
  name: string

  @CreatedAtColumn()
  createdAt: Date
}
