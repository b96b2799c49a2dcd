import { randomBytes } from 'node:crypto'
import mysql from 'mysql2/promise'
import type { DataSource } from 'typeorm'
import { inject } from 'vitest'
import { createDataSource } from '../../server/data-source'

export interface TestDatabase {
  url: string
  ds: DataSource
  /** Destroys the data source and drops the database. */
  drop(): Promise<void>
}

/** A fresh, migrated database of its own for one test file, on the throwaway server. */
export async function createTestDatabase(): Promise<TestDatabase> {
  const base = new URL(inject('databaseUrl'))
  const name = `${base.pathname.slice(1)}_${randomBytes(5).toString('hex')}`
  const admin = await mysql.createConnection(base.toString())
  await admin.query(`CREATE DATABASE \`${name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`)
  await admin.end()
  const url = new URL(base)
  url.pathname = `/${name}`
  const ds = createDataSource(url.toString())
  await ds.initialize()
  await ds.runMigrations({ transaction: 'each' })
  return {
    url: url.toString(),
    ds,
    drop: async () => {
      if (ds.isInitialized) await ds.destroy()
      const c = await mysql.createConnection(base.toString())
      await c.query(`DROP DATABASE IF EXISTS \`${name}\``)
      await c.end()
    },
  }
}
