import type { NextFunction, Request, RequestHandler, Response, Router } from 'express'
import multer from 'multer'
import { z } from 'zod'
import type { Role } from '../../shared/api/common'
import { HttpError, forbidden, notFound, unauthenticated } from '../errors/http-error'
import { type Permission, roleAllows } from '../services/policy'
import type { AuthenticatedUser } from '../middleware/authenticate'
import type { ActivityAction, ActivityTargetType } from '../../shared/api/activity'
import type { NewActivity, ScopedTarget } from '../services/activity.service'

export type Method = 'get' | 'post' | 'put' | 'patch' | 'delete'

/** Where a route finds the team whose role decides: a `teamId`, `projectId`, `pathId`, `probeSetId`, `suiteId`, `checkId`, `runId`, `auditId` or `invitationId` URL parameter. */
export type Scope = 'none' | 'team' | 'project' | 'path' | 'probeSet' | 'suite' | 'check' | 'run' | 'audit' | 'invitation'

const scopeParam = { team: 'teamId', project: 'projectId', path: 'pathId', probeSet: 'probeSetId', suite: 'suiteId', check: 'checkId', run: 'runId', audit: 'auditId', invitation: 'invitationId' } as const
const scopeNoun = { team: 'That team', project: 'That project', path: 'That path', probeSet: 'That probe set', suite: 'That suite', check: 'That check', run: 'That run', audit: 'That audit', invitation: 'That invitation' } as const

export interface RouteContext<P, Q, B> {
  params: P
  query: Q
  body: B
  /** The signed-in person; undefined only on public routes. */
  user: AuthenticatedUser
  /** The caller's role in the route's team (scope team or project). */
  role: Role | undefined
  teamId: number | undefined
  req: Request
  res: Response
}

/** Handlers may return readonly data (the geometry core's results are readonly). */
export type DeepReadonly<T> = T extends (infer U)[] ? readonly DeepReadonly<U>[] : T extends object ? { readonly [K in keyof T]: DeepReadonly<T[K]> } : T

/** What a write route tells the activity log about one successful request. */
export interface ActivityDraft {
  action: ActivityAction
  targetType: ActivityTargetType
  targetId: number | null
  targetName: string
  /** One sentence, e.g. `Renamed path “Ferry” to “Ferry, large”.` */
  summary: string
  /** Default: the team of the route's scope (null for routes without one). */
  teamId?: number | null
  /** Default: the project of the route's scope (null for routes without one). */
  projectId?: number | null
  /** Who acted, for public routes where nobody is signed in (an e-mailed link); default: the signed-in person. */
  actor?: { id: number; name: string }
}

export interface ActivityContext<P, B, R> {
  params: P
  body: B
  /** What the handler answered (undefined for 204 routes). */
  result: R
  /** The signed-in person; undefined on public routes. */
  user: AuthenticatedUser | undefined
  teamId: number | undefined
  /** The row the route's scope parameter names, read before the handler ran (so deletes still know its name). */
  scoped: ScopedTarget | undefined
}

/**
 * Required on every route whose method is not GET: how a successful request is written to
 * the activity log, or `{ none: reason }` for routes that change nothing worth logging.
 */
export type ActivityDeclaration<P = unknown, B = unknown, R = unknown> =
  | { none: string }
  | ((ctx: ActivityContext<P, B, R>) => ActivityDraft | Promise<ActivityDraft>)

interface RouteSpecBase<P extends z.ZodType, Q extends z.ZodType, B extends z.ZodType, R extends z.ZodType> {
  /** Express path below /api/v1, e.g. `/projects/:projectId`. */
  path: string
  summary: string
  description?: string
  tag: string
  /** 'public', or the permission the caller's role must grant. */
  access: 'public' | { permission: Permission; scope: Scope }
  /**
   * CSRF check for cookie sessions on state-changing methods (default true). Only routes
   * that change nothing on the server (pure computations) or that start a session turn it off.
   */
  csrf?: boolean
  params?: P
  query?: Q
  body?: B
  /** Success status (default 200; 204 means no body). */
  status?: number
  response?: R
  /**
   * A multipart upload: multer reads the named file field(s) into memory after the access
   * check; `body` then validates the text fields. Files reach the handler as `req.files`.
   */
  upload?: { field: string; maxFiles: number; maxBytes: number; description: string }
  /** Media type of a non-JSON success response (the handler sends it itself). */
  produces?: string
  /** Express middleware run before access checks and validation (e.g. a rate limiter). */
  middleware?: RequestHandler[]
  /** Error statuses this route can answer besides the common ones. */
  errors?: number[]
  handler: (ctx: RouteContext<z.output<P>, z.output<Q>, z.output<B>>) => Promise<DeepReadonly<z.input<R>> | void>
}

/** A route: GET routes write nothing; every other method must declare its `activity`. */
export type RouteSpec<
  P extends z.ZodType = z.ZodType,
  Q extends z.ZodType = z.ZodType,
  B extends z.ZodType = z.ZodType,
  R extends z.ZodType = z.ZodType,
> = RouteSpecBase<P, Q, B, R> &
  (
    | { method: 'get'; activity?: undefined }
    | { method: Exclude<Method, 'get'>; activity: ActivityDeclaration<z.output<P>, z.output<B>, DeepReadonly<z.input<R>>> }
  )

/** Resolves the team a project, path or probe set belongs to; set by the app so the route layer stays generic. */
export type TeamLookup = (scope: Exclude<Scope, 'none' | 'team'>, id: number) => Promise<number | undefined>
export type MembershipLookup = (userId: number, teamId: number) => Promise<Role | undefined>
/** Reads what a scope parameter names (its name and project) for the activity log. */
export type ScopedLookup = (scope: Exclude<Scope, 'none'>, id: number) => Promise<ScopedTarget | undefined>
/** Appends one entry to the activity log. */
export type ActivityWriter = (entry: NewActivity) => Promise<void>

export interface ApiRegistry {
  readonly routes: RouteSpec[]
  add<P extends z.ZodType, Q extends z.ZodType, B extends z.ZodType, R extends z.ZodType>(
    spec: RouteSpec<P, Q, B, R>,
  ): void
}

/** Arrays whose bound is at least this long are size limits rather than shapes. */
const SIZE_LIMIT_MIN_ITEMS = 1000

export function validationError(error: z.ZodError, where: string): HttpError {
  // A list over a size bound (the contract's 100,000 items) is a limit, answered 413; a
  // short fixed-length list (a point, four coefficients) with extra items is bad shape, 400.
  const overLimit = error.issues.find((i) => i.code === 'too_big' && i.origin === 'array' && Number(i.maximum) >= SIZE_LIMIT_MIN_ITEMS)
  if (overLimit) return new HttpError(413, 'limit', overLimit.message, [{ path: [where, ...overLimit.path.map(String)].join('.') }])
  const flat = error.issues.map((i) => ({ path: [where, ...i.path.map(String)].join('.'), message: i.message }))
  const first = flat[0]
  const message = first ? `${first.message} (${first.path})` : 'The request is not valid.'
  return new HttpError(400, 'validation', message, flat)
}

function parsePart<T extends z.ZodType>(schema: T | undefined, value: unknown, where: string): unknown {
  if (!schema) return value
  const r = schema.safeParse(value)
  if (!r.success) throw validationError(r.error, where)
  return r.data
}

const SAFE_METHODS = new Set(['get', 'head', 'options'])

/** A multer reader for one route's upload, built once when the route is added. */
function uploadReader(u: NonNullable<RouteSpec['upload']>): (req: Request, res: Response) => Promise<void> {
  const handler = multer({ storage: multer.memoryStorage(), limits: { files: u.maxFiles, fileSize: u.maxBytes, fields: 20, fieldSize: 64 * 1024 } }).array(u.field, u.maxFiles)
  return (req, res) => new Promise((resolve, reject) => handler(req, res, (err?: unknown) => (err ? reject(err) : resolve())))
}

/**
 * Writes a successful request's entry, after the handler and outside its transaction (the
 * services own their transactions). The write has happened by then, so a failure here is
 * logged on the server and the request still answers with its result.
 */
async function writeActivity(
  declare: (ctx: ActivityContext<unknown, unknown, unknown>) => ActivityDraft | Promise<ActivityDraft>,
  ctx: ActivityContext<unknown, unknown, unknown>,
  via: 'session' | 'token' | undefined,
  write: ActivityWriter,
  route: string,
): Promise<void> {
  try {
    const draft = await declare(ctx)
    const actor = draft.actor ?? (ctx.user ? { id: ctx.user.id, name: ctx.user.displayName } : undefined)
    if (!actor) throw new Error('no actor: a public route must name one')
    await write({
      teamId: draft.teamId !== undefined ? draft.teamId : (ctx.teamId ?? null),
      projectId: draft.projectId !== undefined ? draft.projectId : (ctx.scoped?.projectId ?? null),
      actorId: actor.id,
      actorName: actor.name,
      via: ctx.user ? (via ?? 'session') : 'link',
      action: draft.action,
      targetType: draft.targetType,
      targetId: draft.targetId,
      targetName: draft.targetName,
      summary: draft.summary,
    })
  } catch (err) {
    console.error(`[rootcast] activity of ${route} was not recorded:`, err)
  }
}

/**
 * Mounts routes on an Express router and keeps their specs for the OpenAPI document, so
 * the document and the validation come from the same zod schemas.
 */
export function createApiRegistry(
  router: Router,
  lookups: { teamOf: TeamLookup; membership: MembershipLookup; describeScoped: ScopedLookup; recordActivity: ActivityWriter },
): ApiRegistry {
  const routes: RouteSpec[] = []
  return {
    routes,
    add(spec) {
      // The type requires it; this catches specs built around the type (casts, plain JS).
      const declared = (spec as { activity?: ActivityDeclaration }).activity
      if (spec.method !== 'get' && !declared) {
        throw new Error(`${String(spec.method).toUpperCase()} ${spec.path} declares no activity: say what the log records, or { none: reason }.`)
      }
      routes.push(spec as unknown as RouteSpec)
      const activity = spec.method === 'get' ? undefined : declared
      const logs = typeof activity === 'function' ? activity : undefined
      const checkCsrf = spec.csrf !== false && !SAFE_METHODS.has(spec.method)
      const readUpload = spec.upload ? uploadReader(spec.upload) : undefined
      router[spec.method](spec.path, ...(spec.middleware ?? []), async (req: Request, res: Response, _next: NextFunction) => {
        const user = req.auth?.user
        let role: Role | undefined
        let teamId: number | undefined
        if (spec.access !== 'public') {
          if (!user) throw unauthenticated()
          if (checkCsrf && req.auth?.via === 'session') req.auth.assertCsrf(req)
          const { permission, scope } = spec.access
          if (scope !== 'none') {
            const id = Number(req.params[scopeParam[scope]])
            if (!Number.isInteger(id) || id <= 0) throw notFound(scopeNoun[scope])
            teamId = scope === 'team' ? id : await lookups.teamOf(scope, id)
            role = teamId === undefined ? undefined : await lookups.membership(user.id, teamId)
            if (!role) throw notFound(scopeNoun[scope])
            if (!roleAllows(role, permission)) throw forbidden()
          }
        }
        if (readUpload) await readUpload(req, res)
        const params = parsePart(spec.params, req.params, 'params')
        const query = parsePart(spec.query, req.query, 'query')
        const body = parsePart(spec.body, req.body ?? {}, 'body')
        const scopeKind = spec.access === 'public' ? 'none' : spec.access.scope
        const scoped = logs && scopeKind !== 'none' ? await lookups.describeScoped(scopeKind, Number(req.params[scopeParam[scopeKind]])) : undefined
        const result = await spec.handler({
          params, query, body, user: user as AuthenticatedUser, role, teamId, req, res,
        } as never)
        if (logs) await writeActivity(logs, { params, body, result, user, teamId, scoped }, req.auth?.via, lookups.recordActivity, `${spec.method.toUpperCase()} ${spec.path}`)
        if (res.headersSent) return
        const status = spec.status ?? 200
        if (status === 204) res.status(204).end()
        else res.status(status).json(result)
      })
    },
  }
}
