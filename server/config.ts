import { z } from 'zod'

/** The From address of mail when ROOTCAST_MAIL_FROM is not set. */
export const DEFAULT_MAIL_FROM = 'Rootcast <rootcast@localhost>'

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
  ROOTCAST_SMTP_URL: z
    .url({ protocol: /^smtps?$/, message: 'ROOTCAST_SMTP_URL must be an smtp:// or smtps:// URL' })
    .optional(),
  ROOTCAST_MAIL_FROM: z.string().trim().min(3).max(200).default(DEFAULT_MAIL_FROM),
  ROOTCAST_SMTP_PORT: z.coerce.number().int().min(1).max(65535).default(2525),
  ROOTCAST_REDIS_URL: z.url({ protocol: /^rediss?$/, message: 'ROOTCAST_REDIS_URL must be a redis:// or rediss:// URL' }).optional(),
  ROOTCAST_REDIS_PORT: z.coerce.number().int().min(1).max(65535).default(6380),
  ROOTCAST_AUDIT_THREADS: z.coerce.number().int().min(1).max(256).optional(),
  ROOTCAST_AUDIT_LOCK_SECONDS: z.coerce.number().int().min(1).max(3600).default(10),
  ROOTCAST_QUEUE_PREFIX: z.string().regex(/^[A-Za-z0-9_-]{1,40}$/, 'ROOTCAST_QUEUE_PREFIX is 1 to 40 letters, digits, - or _').default('rootcast'),
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
  /**
   * Outgoing mail: the SMTP server's URL (unset outside production: the local fake on
   * `fakePort` is started instead) and the From address.
   */
  readonly mail: { readonly smtpUrl: string | undefined; readonly from: string; readonly fakePort: number }
  /**
   * Audit jobs: Redis's URL (unset: the private instance on 127.0.0.1:`redisPort` is
   * started), the queue's key prefix in Redis, worker threads per worker process (unset: one
   * per core) and how long a chunk of a crashed worker waits before another worker takes it up.
   */
  readonly audits: {
    readonly redisUrl: string | undefined
    readonly redisPort: number
    readonly queuePrefix: string
    readonly threads: number | undefined
    readonly lockMs: number
  }
}

export class ConfigError extends Error {}

/** A worker process (`npm run worker`) serves no requests, so it needs no session secret. */
export function loadConfig(env: NodeJS.ProcessEnv = process.env, purpose: 'server' | 'worker' = 'server'): Config {
  const parsed = envSchema.safeParse(env)
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`)
    throw new ConfigError(`Invalid configuration:\n  ${lines.join('\n  ')}`)
  }
  const e = parsed.data
  const production = e.NODE_ENV === 'production'
  if (production && purpose === 'server' && !e.SESSION_SECRET) throw new ConfigError('SESSION_SECRET is required in production.')
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
    mail: { smtpUrl: e.ROOTCAST_SMTP_URL, from: e.ROOTCAST_MAIL_FROM, fakePort: e.ROOTCAST_SMTP_PORT },
    audits: {
      redisUrl: e.ROOTCAST_REDIS_URL,
      redisPort: e.ROOTCAST_REDIS_PORT,
      queuePrefix: e.ROOTCAST_QUEUE_PREFIX,
      threads: e.ROOTCAST_AUDIT_THREADS,
      lockMs: e.ROOTCAST_AUDIT_LOCK_SECONDS * 1000,
    },
  }
}
