import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createTestDatabase, type TestDatabase } from '../helpers/test-db'

let db: TestDatabase
beforeAll(async () => {
  db = await createTestDatabase()
})
afterAll(async () => db?.drop())

describe('migrations', () => {
  it('leave the schema exactly as the entities describe it (no drift, no synchronize)', async () => {
    expect(db.ds.options.synchronize).toBe(false)
    const pending = await db.ds.driver.createSchemaBuilder().log()
    expect(pending.upQueries.map((q) => q.query)).toEqual([])
  })

  it('can all be reverted and applied again', async () => {
    for (let i = 0; i < db.ds.migrations.length; i++) await db.ds.undoLastMigration()
    const [{ n }] = (await db.ds.query(
      "SELECT COUNT(*) AS n FROM information_schema.tables WHERE table_schema = DATABASE() AND table_name = 'projects'",
    )) as Array<{ n: number }>
    expect(Number(n)).toBe(0)
    await db.ds.runMigrations()
    const tables = (await db.ds.query('SHOW TABLES')) as Array<Record<string, string>>
    expect(tables.map((t) => Object.values(t)[0]).sort()).toEqual(
      expect.arrayContaining(['memberships', 'path_tags', 'paths', 'projects', 'revisions', 'sessions', 'teams', 'users']),
    )
  })
})
