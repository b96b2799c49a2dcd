import { z } from 'zod'
import { apiErrorSchema } from '../shared/api/common'
import type { RouteSpec } from './routes/api-route'

type Json = Record<string, unknown>

const statusText: Record<number, string> = {
  400: 'Bad input: the error shape with code `validation` (or a more specific code)',
  401: 'Not signed in, or the credentials or token are not valid',
  403: 'The role does not allow it, or the CSRF token is missing',
  404: 'No such resource, or not shared with the caller',
  413: 'Over a size limit (code `limit`)',
  429: 'Too many attempts (code `rate_limited`)',
}

/** Express `:name` segments become OpenAPI `{name}` templates. */
export function openApiPath(expressPath: string): string {
  return expressPath.replace(/:([A-Za-z0-9_]+)/g, '{$1}')
}

/**
 * Converts a zod schema to OpenAPI 3.0 JSON Schema, hoisting named schemas (those with a
 * `meta({ id })`) into components so each appears once.
 */
function makeConverter(components: Record<string, Json>) {
  return (schema: z.ZodType, io: 'input' | 'output'): Json => {
    const json = z.toJSONSchema(schema, { target: 'openapi-3.0', io, unrepresentable: 'any' }) as Json
    const defs = (json.definitions ?? json.$defs ?? {}) as Record<string, Json>
    delete json.definitions
    delete json.$defs
    delete json.$schema
    const fix = (node: unknown): unknown => {
      if (Array.isArray(node)) return node.map(fix)
      if (node && typeof node === 'object') {
        const out: Json = {}
        for (const [k, v] of Object.entries(node)) {
          out[k] = k === '$ref' && typeof v === 'string' ? v.replace(/^#\/(definitions|\$defs)\//, '#/components/schemas/') : fix(v)
        }
        return out
      }
      return node
    }
    for (const [name, def] of Object.entries(defs)) {
      // An input and an output variant of one schema can differ (defaults); keep both apart.
      const key = io === 'input' && components[name] && JSON.stringify(components[name]) !== JSON.stringify(fix(def)) ? `${name}Input` : name
      components[key] = fix(def) as Json
    }
    return fix(json) as Json
  }
}

function parametersOf(schema: z.ZodType | undefined, where: 'path' | 'query', convert: ReturnType<typeof makeConverter>) {
  if (!schema) return []
  const json = convert(schema, 'input')
  const props = (json.properties ?? {}) as Record<string, Json>
  const required = new Set((json.required ?? []) as string[])
  return Object.entries(props).map(([name, s]) => ({
    name,
    in: where,
    required: where === 'path' || required.has(name),
    ...(s.description ? { description: s.description } : {}),
    schema: s,
  }))
}

function requestBodyOf(r: RouteSpec, convert: ReturnType<typeof makeConverter>): Json {
  if (r.upload) {
    const fields = r.body ? convert(r.body, 'input') : { type: 'object', properties: {} }
    const file = { type: 'string', format: 'binary' }
    const schema = {
      ...fields,
      properties: {
        ...((fields.properties ?? {}) as Json),
        [r.upload.field]: r.upload.maxFiles > 1 ? { type: 'array', items: file, maxItems: r.upload.maxFiles, description: r.upload.description } : { ...file, description: r.upload.description },
      },
      required: [...((fields.required ?? []) as string[]), r.upload.field],
    }
    return { requestBody: { required: true, content: { 'multipart/form-data': { schema } } } }
  }
  return r.body ? { requestBody: { required: true, content: { 'application/json': { schema: convert(r.body, 'input') } } } } : {}
}

export function buildOpenApiDocument(routes: readonly RouteSpec[], info: { version: string }): Json {
  const components: Record<string, Json> = {}
  const convert = makeConverter(components)
  const errorRef = { $ref: '#/components/schemas/ApiError' }
  convert(apiErrorSchema, 'output')
  const paths: Record<string, Record<string, Json>> = {}
  for (const r of routes) {
    const p = `/api/v1${openApiPath(r.path)}`
    const status = r.status ?? 200
    const responses: Json = {
      [status]: r.produces
        ? { description: 'Success: a file', content: { [r.produces]: { schema: { type: 'string', format: 'binary' } } } }
        : status === 204 || !r.response
          ? { description: 'Done; no content' }
          : { description: 'Success', content: { 'application/json': { schema: convert(r.response, 'output') } } },
    }
    const errors = new Set<number>([...(r.errors ?? [])])
    if (r.body || r.query || r.params) errors.add(400)
    if (r.access !== 'public') {
      errors.add(401)
      if (r.access.scope !== 'none' || (r.csrf !== false && r.method !== 'get')) errors.add(403)
      if (r.access.scope !== 'none') errors.add(404)
    }
    for (const e of [...errors].sort()) {
      responses[e] = { description: statusText[e] ?? 'Error', content: { 'application/json': { schema: errorRef } } }
    }
    const op: Json = {
      operationId: `${r.method}${openApiPath(r.path).replace(/[{}]/g, '').split('/').map((x) => x.charAt(0).toUpperCase() + x.slice(1)).join('')}`,
      summary: r.summary,
      ...(r.description ? { description: r.description } : {}),
      tags: [r.tag],
      parameters: [...parametersOf(r.params, 'path', convert), ...parametersOf(r.query, 'query', convert)],
      ...requestBodyOf(r, convert),
      responses,
      security: r.access === 'public' ? [] : [{ session: [] }, { bearer: [] }],
      'x-rootcast-permission': r.access === 'public' ? 'public' : r.access.permission,
    }
    paths[p] = { ...(paths[p] ?? {}), [r.method]: op }
  }
  return {
    openapi: '3.0.3',
    info: {
      title: 'Rootcast API',
      version: info.version,
      description:
        'Closed-form intersections of rays, lines and segments with SVG paths, and the team workspace around them. ' +
        'Cookie sessions must send X-CSRF-Token on state-changing requests; pipelines use a bearer token.',
    },
    servers: [{ url: '/' }],
    paths,
    components: {
      schemas: components,
      securitySchemes: {
        session: { type: 'apiKey', in: 'cookie', name: 'rootcast.sid' },
        bearer: { type: 'http', scheme: 'bearer', description: 'A personal API token' },
      },
    },
  }
}
