import { CreateDateColumn, UpdateDateColumn } from 'typeorm'

/**
 * The `created_at` and `updated_at` columns every table with times has: datetime(3) with a
 * database default (TypeORM's own default would be CURRENT_TIMESTAMP(6) and drift from the
 * migrations), `updated_at` also refreshed by MariaDB on every update.
 */
export function CreatedAtColumn(): PropertyDecorator {
  return CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
}

export function UpdatedAtColumn(): PropertyDecorator {
  return UpdateDateColumn({
    name: 'updated_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
    onUpdate: 'CURRENT_TIMESTAMP(3)',
  })
}
