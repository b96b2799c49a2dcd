import { z } from 'zod'

/**
 * The server's settings, read from the environment once and validated here. Everything
 * else receives the typed `Config` object; nothing else reads process.env for settings.
 */
const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  HOST: z.string().default('127.0.0.1'),
  PORT: z.coerce.number().int().min(1).max(65535).default(5170),
  DATABASE_URL: z.url({ message: 'DATABASE_URL must be a mysql:// or mariadb:// URL' }).optional(),
  SESSION_SECRET: z.string().min(32, 'SESSION_SECRET needs at least 32 characters').optional(),
  ROOTCAST_DEMO_PASSWORD: z.string().min(8).default('rootcast-demo'),
  ROOTCAST_PUBLIC_URL: z.url().optional(),
  ROOTCAST_TRUST_PROXY: z.enum(['0', '1']).default('0'),
  ROOTCAST_LOGIN_MAX_FAILURES: z.coerce.number().int().min(1).max(1000).default(5),
  ROOTCAST_LOGIN_WINDOW_MINUTES: z.coerce.number().int().min(1).max(1440).default(15),
  ROOTCAST_SESSION_DAYS: z.coerce.number().int().min(1).max(365).default(14),
})

export interface Config {
  readonly env: 'development' | 'production' | 'test'
  readonly production: boolean
  readonly host: string
  readonly port: number
  readonly databaseUrl: string | undefined
  readonly sessionSecret: string | undefined
  readonly demoPassword: string
  readonly publicUrl: string
  readonly trustProxy: boolean
  readonly login: { readonly maxFailures: number; readonly windowMs: number }
  readonly sessionMaxAgeMs: number
}

export class ConfigError extends Error {}

export function loadConfig(env: NodeJS.ProcessEnv = process.env): Config {
  const parsed = envSchema.safeParse(env)
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`)
    throw new ConfigError(`Invalid configuration:\n  ${lines.join('\n  ')}`)
  }
  const e = parsed.data
  const production = e.NODE_ENV === 'production'
  if (production && !e.SESSION_SECRET) throw new ConfigError('SESSION_SECRET is required in production.')
  return {
    env: e.NODE_ENV,
    production,
    host: e.HOST,
    port: e.PORT,
    databaseUrl: e.DATABASE_URL,
    sessionSecret: e.SESSION_SECRET,
    demoPassword: e.ROOTCAST_DEMO_PASSWORD,
    publicUrl: e.ROOTCAST_PUBLIC_URL ?? `http://${e.HOST}:${e.PORT}`,
    trustProxy: e.ROOTCAST_TRUST_PROXY === '1',
    login: { maxFailures: e.ROOTCAST_LOGIN_MAX_FAILURES, windowMs: e.ROOTCAST_LOGIN_WINDOW_MINUTES * 60_000 },
    sessionMaxAgeMs: e.ROOTCAST_SESSION_DAYS * 86_400_000,
  }
}
