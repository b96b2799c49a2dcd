import { z } from 'zod'

/** The computation contract's limits. */
export const COMPUTE_LIMITS = {
  /** Segments per path after normalisation. */
  segments: 20_000,
  /** Probes or points per request. */
  items: 100_000,
  /** Characters of path data (the 2 MB body limit bounds it anyway). */
  pathChars: 2_000_000,
} as const

/** A finite IEEE-754 double: JSON numbers only, no strings, NaN or infinities. */
const finite = z.number({ message: 'Expected a finite number.' }).refine(Number.isFinite, 'Expected a finite number.')
export const pointSchema = z.tuple([finite, finite]).meta({ id: 'Point', description: '[x, y] in the path’s own coordinates (y down, as in SVG)' })

const nonZero = (v: [number, number]) => v[0] !== 0 || v[1] !== 0

export const probeSchema = z
  .discriminatedUnion('type', [
    z.object({
      type: z.literal('ray'),
      origin: pointSchema,
      direction: pointSchema.refine(nonZero, 'A ray needs a non-zero direction.'),
    }),
    z.object({
      type: z.literal('line'),
      origin: pointSchema,
      direction: pointSchema.refine(nonZero, 'A line needs a non-zero direction.'),
    }),
    z
      .object({ type: z.literal('segment'), from: pointSchema, to: pointSchema })
      .refine((p) => p.from[0] !== p.to[0] || p.from[1] !== p.to[1], { message: 'A segment probe needs two different end points.', path: ['to'] }),
  ])
  .meta({ id: 'Probe' })
export type ProbeInput = z.infer<typeof probeSchema>

const pathData = z
  .string({ message: 'Give the path as SVG path data (a string).' })
  .max(COMPUTE_LIMITS.pathChars, `Path data has at most ${COMPUTE_LIMITS.pathChars} characters.`)
  .describe('SVG path data, the d attribute: M L H V C S Q T A Z, absolute and relative')

export const solveCubicRequestSchema = z
  .object({ coefficients: z.tuple([finite, finite, finite, finite]).describe('[a, b, c, d] of a·t³ + b·t² + c·t + d') })
  .meta({ id: 'SolveCubicRequest' })

export const solveCubicResponseSchema = z
  .object({
    degree: z.union([z.literal(0), z.literal(1), z.literal(2), z.literal(3)]),
    identicallyZero: z.boolean(),
    discriminant: z.number().nullable(),
    roots: z.array(z.object({ t: z.number(), multiplicity: z.union([z.literal(1), z.literal(2), z.literal(3)]) })),
  })
  .meta({ id: 'SolveCubicResponse' })

export const intersectRequestSchema = z
  .object({
    path: pathData,
    probes: z.array(probeSchema).max(COMPUTE_LIMITS.items, `At most ${COMPUTE_LIMITS.items} probes per request.`),
  })
  .meta({ id: 'IntersectRequest' })
export type IntersectRequest = z.infer<typeof intersectRequestSchema>

export const hitSchema = z
  .object({
    segment: z.number().int(),
    t: z.number(),
    s: z.number(),
    point: z.tuple([z.number(), z.number()]),
    kind: z.enum(['crossing', 'tangent', 'overlap']),
    winding: z.union([z.literal(-1), z.literal(0), z.literal(1)]),
    sEnd: z.number().optional(),
    tEnd: z.number().optional(),
  })
  .meta({ id: 'Hit' })

export const intersectResponseSchema = z
  .object({
    segments: z.number().int().describe('Number of segments after normalisation'),
    results: z.array(z.object({ hits: z.array(hitSchema) })).describe('results[i] answers probes[i]'),
  })
  .meta({ id: 'IntersectResponse' })

export const containsRequestSchema = z
  .object({
    path: pathData,
    points: z.array(pointSchema).max(COMPUTE_LIMITS.items, `At most ${COMPUTE_LIMITS.items} points per request.`),
    fillRule: z.enum(['nonzero', 'evenodd']).default('nonzero'),
  })
  .meta({ id: 'ContainsRequest' })

export const containsResponseSchema = z
  .object({
    results: z.array(z.object({ inside: z.boolean(), winding: z.number().int(), onBoundary: z.boolean() })),
  })
  .meta({ id: 'ContainsResponse' })
