import { existsSync, readFileSync } from 'node:fs'
import { createRequire } from 'node:module'
import { dirname, join, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import express, { type NextFunction, type Request, type Response } from 'express'
import { ipKeyGenerator, rateLimit } from 'express-rate-limit'
import session from 'express-session'
import MySQLStoreFactory from 'express-mysql-session'
import helmet from 'helmet'
import multer from 'multer'
import mysql from 'mysql2'
import type { DataSource } from 'typeorm'
import type { Config } from './config'
import { HttpError } from './errors/http-error'
import { authenticate } from './middleware/authenticate'
import { buildOpenApiDocument } from './openapi'
import { createApiRegistry, type ApiRegistry } from './routes/api-route'
import { authRoutes } from './routes/auth.routes'
import { accountRoutes } from './routes/account.routes'
import { teamRoutes } from './routes/team.routes'
import { invitationTeamId } from './services/invitations.service'
import { computeRoutes } from './routes/compute.routes'
import { libraryRoutes } from './routes/library.routes'
import { probeSetRoutes } from './routes/probe-sets.routes'
import { projectRoutes } from './routes/projects.routes'
import { systemRoutes } from './routes/system.routes'
import { suiteRoutes } from './routes/suites.routes'
import { checkTeamId, runTeamId, suiteTeamId } from './services/suites.service'
import { auditRoutes } from './routes/audits.routes'
import type { AuditQueue } from './jobs/audit-queue'
import { auditTeamId } from './services/audits.service'
import { tokenRoutes } from './routes/tokens.routes'
import { devMailRoutes } from './routes/dev-mail.routes'
import type { Mailbox, Mailer } from './services/mail.service'
import { roleInTeam } from './services/auth.service'
import { projectTeamId } from './services/projects.service'
import { pathTeamId } from './services/library.service'
import { probeSetTeamId } from './services/probe-sets.service'
import { describeScoped, recordActivity } from './services/activity.service'
import { activityRoutes } from './routes/activity.routes'

const here = dirname(fileURLToPath(import.meta.url))
export const ROOT_DIR = join(here, '..')
const swaggerUiDir = dirname(createRequire(import.meta.url).resolve('swagger-ui-dist/package.json'))
export const SESSION_COOKIE = 'rootcast.sid'
/** The computation contract's request limit. */
export const JSON_LIMIT = '2mb'

export interface AppDeps {
  config: Config
  dataSource: DataSource
  sessionSecret: string
  /** Folder of the built client; served when it exists. */
  clientDir?: string
  /** Outgoing mail; without one, nothing is mailed. */
  mailer?: Mailer
  /** The local SMTP fake's messages; when given, GET /dev/mail lists them. */
  mailbox?: Mailbox
  /** The audit job queue; without one, starting an audit answers 503 `queue_unavailable`. */
  auditQueue?: AuditQueue
}

export interface RootcastApp {
  app: express.Express
  registry: ApiRegistry
  apiRouter: express.Router
  /** Releases the session store's pool and timers (the data source is the caller's). */
  close(): Promise<void>
}

function readPackageVersion(): string {
  return (JSON.parse(readFileSync(join(ROOT_DIR, 'package.json'), 'utf8')) as { version: string }).version
}

export function createApp(deps: AppDeps): RootcastApp {
  const { config, dataSource: ds } = deps
  const app = express()
  app.disable('x-powered-by')
  app.set('trust proxy', config.trustProxy ? 1 : false)
  app.set('query parser', 'extended')

  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          // Konva exports canvases as data: and blob: images.
          'img-src': ["'self'", 'data:', 'blob:'],
          'upgrade-insecure-requests': config.production ? [] : null,
        },
      },
      strictTransportSecurity: config.production,
    }),
  )

  // Sessions live in MariaDB (table `sessions`, created by a migration) and survive restarts.
  const MySQLStore = MySQLStoreFactory(session as never)
  const pool = mysql.createPool({ uri: ds.options.type === 'mariadb' ? (ds.options as { url: string }).url : '', connectionLimit: 4 })
  const store = new MySQLStore({ createDatabaseTable: false, clearExpired: true, checkExpirationInterval: 15 * 60_000 }, pool)

  const api = express.Router()
  api.use(express.json({ limit: JSON_LIMIT }))
  api.use(
    session({
      name: SESSION_COOKIE,
      secret: deps.sessionSecret,
      store,
      resave: false,
      saveUninitialized: false,
      rolling: true,
      cookie: { httpOnly: true, sameSite: 'lax', secure: config.production, maxAge: config.sessionMaxAgeMs },
    }),
  )
  api.use(authenticate(ds))

  const loginLimiter = rateLimit({
    windowMs: config.login.windowMs,
    limit: config.login.maxFailures,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    keyGenerator: (req) => `${ipKeyGenerator(req.ip ?? '')}|${String(req.body?.email ?? '').trim().toLowerCase()}`,
    handler: (_req, _res, next) =>
      next(new HttpError(429, 'rate_limited', 'Too many failed sign-in attempts. Wait a few minutes and try again.')),
  })

  const teamLookups = { project: projectTeamId, path: pathTeamId, probeSet: probeSetTeamId, suite: suiteTeamId, check: checkTeamId, run: runTeamId, audit: auditTeamId, invitation: invitationTeamId } as const
  const registry = createApiRegistry(api, {
    teamOf: (scope, id) => teamLookups[scope](ds, id),
    membership: (userId, teamId) => roleInTeam(ds, userId, teamId),
    describeScoped: (scope, id) => describeScoped(ds, scope, id),
    recordActivity: (entry) => recordActivity(ds, entry),
  })
  authRoutes(registry, ds, loginLimiter)
  accountRoutes(registry, { ds, publicUrl: config.publicUrl, mailer: deps.mailer, limits: config.login })
  teamRoutes(registry, { ds, publicUrl: config.publicUrl, mailer: deps.mailer })
  projectRoutes(registry, ds)
  computeRoutes(registry)
  libraryRoutes(registry, ds)
  probeSetRoutes(registry, ds)
  tokenRoutes(registry, ds)
  suiteRoutes(registry, { ds, publicUrl: config.publicUrl, mailer: deps.mailer })
  if (deps.mailbox) devMailRoutes(registry, deps.mailbox)
  auditRoutes(registry, ds, deps.auditQueue)
  activityRoutes(registry, ds)
  let openApi: unknown
  systemRoutes(registry, ds, () => (openApi ??= buildOpenApiDocument(registry.routes, { version: readPackageVersion() })))

  api.use((req: Request) => {
    throw new HttpError(404, 'not_found', `There is no API route ${req.method} ${req.baseUrl}${req.path}.`)
  })
  app.use('/api/v1', api)

  // The API reference, rendered by swagger-ui from the same document.
  app.use('/api/docs/assets', express.static(swaggerUiDir, { index: false }))
  app.get('/api/docs/start.js', (_req, res) => res.sendFile(join(here, 'docs', 'start.js')))
  app.get('/api/docs', (_req, res) => res.sendFile(join(here, 'docs', 'api-docs.html')))
  app.use('/api', (req: Request) => {
    throw new HttpError(404, 'not_found', `There is no API route ${req.method} ${req.originalUrl}.`)
  })

  const clientDir = deps.clientDir && resolve(deps.clientDir)
  if (clientDir && existsSync(join(clientDir, 'index.html'))) {
    app.use(express.static(clientDir, { index: false, maxAge: '1h' }))
    app.get('/{*splat}', (_req, res) => res.sendFile('index.html', { root: clientDir }))
  }

  app.use((req: Request, _res: Response, next: NextFunction) =>
    next(new HttpError(404, 'not_found', `Nothing is served at ${req.path}.`)),
  )
  app.use(errorHandler)

  return {
    app,
    registry,
    apiRouter: api,
    close: async () => {
      await store.close()
      await pool.promise().end()
    },
  }
}

/** The one error path: the contract's error shape, never a stack trace. */
export function errorHandler(err: unknown, req: Request, res: Response, _next: NextFunction): void {
  let e: HttpError
  const anyErr = err as { type?: string; status?: number; expose?: boolean; message?: string }
  if (err instanceof HttpError) e = err
  else if (anyErr?.type === 'entity.parse.failed') e = new HttpError(400, 'invalid_json', 'The request body is not valid JSON.')
  else if (anyErr?.type === 'entity.too.large') e = new HttpError(413, 'limit', `The request body is larger than the limit of ${JSON_LIMIT}.`)
  else if (err instanceof multer.MulterError)
    e = err.code === 'LIMIT_FILE_SIZE' || err.code === 'LIMIT_FILE_COUNT'
      ? new HttpError(413, 'limit', err.code === 'LIMIT_FILE_SIZE' ? 'A file is larger than the upload limit.' : 'Too many files in one upload.')
      : new HttpError(400, 'bad_upload', `The upload is not valid: ${err.message}.`)
  else if (anyErr?.type === 'charset.unsupported' || anyErr?.type === 'encoding.unsupported')
    e = new HttpError(415, 'unsupported_encoding', 'Send JSON in UTF-8.')
  else if (typeof anyErr?.status === 'number' && anyErr.status >= 400 && anyErr.status < 500 && anyErr.expose)
    e = new HttpError(anyErr.status, 'bad_request', anyErr.message ?? 'The request is not valid.')
  else {
    console.error(`[rootcast] ${req.method} ${req.originalUrl} failed:`, err)
    e = new HttpError(500, 'internal', 'Something went wrong on the server. The error has been logged.')
  }
  if (res.headersSent) return
  res.status(e.status).json({ error: { code: e.code, message: e.message, ...(e.details ? { details: e.details } : {}) } })
}
