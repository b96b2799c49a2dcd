import type { DataSource } from 'typeorm'
import { z } from 'zod'
import type { ApiRegistry } from './api-route'

export function systemRoutes(api: ApiRegistry, ds: DataSource, openApi: () => unknown): void {
  api.add({
    method: 'get',
    path: '/health',
    tag: 'system',
    summary: 'Liveness and database reachability',
    access: 'public',
    response: z.object({ status: z.literal('ok'), database: z.string().describe('MariaDB server version') }),
    handler: async () => {
      const [row] = (await ds.query('SELECT VERSION() AS v')) as Array<{ v: string }>
      return { status: 'ok' as const, database: row.v }
    },
  })

  api.add({
    method: 'get',
    path: '/openapi.json',
    tag: 'system',
    summary: 'This OpenAPI document, generated from the zod schemas that validate every route',
    access: 'public',
    response: z.record(z.string(), z.unknown()),
    handler: async () => openApi() as Record<string, unknown>,
  })
}
