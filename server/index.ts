import 'reflect-metadata'
import { randomBytes } from 'node:crypto'
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import type { Server } from 'node:http'
import { join } from 'node:path'
import { ROOT_DIR, createApp } from './app'
import { type Config, loadConfig } from './config'
import { createDataSource } from './data-source'
import { startAuditServices } from './jobs/audit-services'
import { startMariadb, type MariadbInstance } from './scripts/mariadb'
import { describeInstance } from './scripts/private-service'
import { startServerMail } from './scripts/smtp-fake'
import { DEMO_ACCOUNTS, seedDemo } from './services/seed.service'

export const DATA_DIR = join(ROOT_DIR, '.data')
export const DEFAULT_DB_PORT = 3307

/** Outside production a session secret is generated once and kept in the data folder. */
function sessionSecretFor(config: Config): string {
  if (config.sessionSecret) return config.sessionSecret
  const file = join(DATA_DIR, 'session-secret')
  if (existsSync(file)) return readFileSync(file, 'utf8').trim()
  mkdirSync(DATA_DIR, { recursive: true })
  const secret = randomBytes(32).toString('base64url')
  writeFileSync(file, secret + '\n', { mode: 0o600 })
  return secret
}

export interface StartOptions {
  clientDir?: string
  log?: (line: string) => void
  /** Start one audit worker process beside the server (default true). */
  auditWorker?: boolean
}

/** config → database → migrations → demo seed → listen; resolves with a stop function. */
export async function startServer(opts: StartOptions = {}): Promise<{ server: Server; stop: () => Promise<void> }> {
  const log = opts.log ?? ((l: string) => console.log(`[rootcast] ${l}`))
  const config = loadConfig()
  // First, so that production without ROOTCAST_SMTP_URL is refused before anything starts.
  const mail = await startServerMail(config, log)
  let mariadb: MariadbInstance | undefined
  let url = config.databaseUrl
  if (!url) {
    const port = Number(process.env.ROOTCAST_DB_PORT ?? DEFAULT_DB_PORT)
    mariadb = await startMariadb({ dataDir: join(DATA_DIR, 'mariadb'), port, database: 'rootcast' })
    log(describeInstance('MariaDB', mariadb, port, '.data/mariadb'))
    url = mariadb.url
  }
  const ds = createDataSource(url)
  await ds.initialize()
  const ran = await ds.runMigrations({ transaction: 'each' })
  if (ran.length) log(`applied migrations: ${ran.map((m) => m.name).join(', ')}`)
  if (!config.production && (await seedDemo(ds, config.demoPassword))) log('seeded the demo team "Harbour Type Workshop"')
  const audits = await startAuditServices({ config, dataDir: DATA_DIR, databaseUrl: url, worker: opts.auditWorker, log })

  const rc = createApp({ config, dataSource: ds, sessionSecret: sessionSecretFor(config), clientDir: opts.clientDir, mailer: mail.mailer, mailbox: mail.fake, auditQueue: audits.queue })
  const server = await new Promise<Server>((resolve, reject) => {
    const s = rc.app.listen(config.port, config.host, () => resolve(s))
    s.on('error', reject)
  })
  log(`serving on ${config.publicUrl}`)
  if (!config.production) {
    const pw = process.env.ROOTCAST_DEMO_PASSWORD ? '(the password in ROOTCAST_DEMO_PASSWORD)' : 'rootcast-demo'
    log(`demo sign-in: ${DEMO_ACCOUNTS.map((a) => a.email).join(', ')}, password ${pw}`)
  }

  let stopping: Promise<void> | undefined
  const stop = () =>
    (stopping ??= (async () => {
      await new Promise<void>((r) => {
        server.close(() => r())
        server.closeAllConnections()
      })
      await rc.close()
      await audits.stop()
      await ds.destroy()
      await mail.stop()
      if (mariadb?.startedHere) {
        log('stopping MariaDB')
        await mariadb.stop()
      }
    })())
  return { server, stop }
}

/** Runs the server until SIGINT or SIGTERM, then shuts everything down in order. */
export async function runUntilSignal(opts: StartOptions = {}): Promise<void> {
  process.on('unhandledRejection', (reason) => console.error('[rootcast] unhandled rejection:', reason))
  const { stop } = await startServer(opts)
  const onSignal = (sig: string) => {
    console.log(`[rootcast] ${sig}: shutting down`)
    stop().then(
      () => process.exit(0),
      (err) => {
        console.error(err)
        process.exit(1)
      },
    )
  }
  // `on`, not `once`: a repeated signal (tsx relays one to its child when the first seems
  // lost) must not find Node's default handler, which would end the shutdown half-way.
  process.on('SIGINT', () => onSignal('SIGINT'))
  process.on('SIGTERM', () => onSignal('SIGTERM'))
}

const isMain = process.argv[1] && import.meta.url.endsWith(process.argv[1].replace(/\\/g, '/'))
if (isMain) {
  runUntilSignal({ clientDir: join(ROOT_DIR, 'dist') }).catch((err) => {
    console.error(`[rootcast] could not start: ${err instanceof Error ? err.message : String(err)}`)
    process.exit(1)
  })
}
