import { z } from 'zod'
import { pointSchema } from './compute'

/** Limits of one audit, shown in the interface too. */
export const AUDIT_LIMITS = {
  nameChars: 120,
  tagChars: 40,
  /** Paths named one by one in a selection. */
  pathIds: 20_000,
  randomRays: 10_000,
  maxProbesPerPath: 10_000,
  /** The seed is a 32-bit unsigned integer (the core's generator takes 32 bits). */
  seedMax: 2 ** 32 - 1,
} as const

/** The numeric engines an audit compares with the closed form (the reference). */
export const auditEngineSchema = z.enum(['subdivision', 'newton', 'bezier-js', 'mathjs']).meta({ id: 'AuditEngine' })
export type AuditEngineName = z.infer<typeof auditEngineSchema>

export const auditStatusSchema = z
  .enum(['queued', 'running', 'completed', 'cancelling', 'cancelled', 'failed'])
  .meta({ id: 'AuditStatus' })
export type AuditStatusName = z.infer<typeof auditStatusSchema>

/** Which paths of the project: those with a tag, a list of ids, or every live path. */
export const auditSelectionSchema = z
  .union([
    z.object({ tag: z.string().trim().min(1, 'Give a tag.').max(AUDIT_LIMITS.tagChars) }).strict(),
    z
      .object({
        pathIds: z
          .array(z.number().int().positive())
          .min(1, 'Select at least one path.')
          .max(AUDIT_LIMITS.pathIds, `An audit names at most ${AUDIT_LIMITS.pathIds} paths one by one; use a tag or the whole library.`),
      })
      .strict(),
    z.object({ all: z.literal(true) }).strict(),
  ])
  .describe('{tag}: the live paths with that tag; {pathIds}: those live paths; {all: true}: every live path of the project')
  .meta({ id: 'AuditSelection' })
export type AuditSelection = z.infer<typeof auditSelectionSchema>

export const auditGeneratorsSchema = z
  .object({
    randomRays: z
      .number()
      .int()
      .min(0)
      .max(AUDIT_LIMITS.randomRays)
      .describe('Rays per path with origin uniform in the bounding box grown by 10% and a uniform direction'),
    sweepSpacing: z.number().positive('A sweep spacing is greater than 0.').nullable().describe('Horizontal lines this far apart across the bounding box (path units); null for none'),
    vertexProbes: z.boolean().describe('A line through every on-curve vertex, at a seeded angle'),
    extremumProbes: z.boolean().describe('Lines tangent at every x- and y-extremum'),
    maxProbesPerPath: z.number().int().min(1).max(AUDIT_LIMITS.maxProbesPerPath).describe('Cap on the probes of one path, applied after generation in a seeded way'),
  })
  .strict()
  .refine((g) => g.randomRays > 0 || g.sweepSpacing !== null || g.vertexProbes || g.extremumProbes, {
    message: 'Turn on at least one probe generator.',
  })
  .meta({ id: 'AuditGenerators' })
export type AuditGeneratorSettings = z.infer<typeof auditGeneratorsSchema>

export const newAuditSchema = z
  .object({
    name: z.string().trim().min(1, 'An audit needs a name.').max(AUDIT_LIMITS.nameChars, `An audit name has at most ${AUDIT_LIMITS.nameChars} characters.`),
    selection: auditSelectionSchema,
    engines: z
      .array(auditEngineSchema)
      .min(1, 'Choose at least one engine to compare with the closed form.')
      .max(auditEngineSchema.options.length)
      .refine((e) => new Set(e).size === e.length, { message: 'Name each engine once.' }),
    generators: auditGeneratorsSchema,
    seed: z.number().int().min(0).max(AUDIT_LIMITS.seedMax).describe('Seed of the probe generators; the same seed gives the same report'),
    subdivisionTolerance: z.number().positive().lt(1).optional().describe('Tolerance of the subdivision engine, relative to the path size'),
  })
  .strict()
  .meta({ id: 'NewAudit' })
export type NewAudit = z.input<typeof newAuditSchema>

export const auditOptionsSchema = z
  .object({
    engines: z.array(auditEngineSchema),
    generators: auditGeneratorsSchema,
    seed: z.number().int(),
    subdivisionTolerance: z.number().optional(),
  })
  .meta({ id: 'AuditOptions' })

export const auditSummarySchema = z
  .object({
    id: z.number().int(),
    projectId: z.number().int(),
    name: z.string(),
    status: auditStatusSchema,
    progress: z.object({ done: z.number().int().describe('Chunks stored'), total: z.number().int().describe('Chunks of the audit') }),
    pathCount: z.number().int(),
    engines: z.array(auditEngineSchema),
    createdBy: z.string().nullable().describe('Display name of the person who started it'),
    createdAt: z.string().describe('ISO 8601 time'),
    startedAt: z.string().nullable().describe('When the first chunk was taken up'),
    finishedAt: z.string().nullable(),
    error: z.string().nullable().describe('Why a failed audit failed'),
  })
  .meta({ id: 'AuditSummary' })
export type AuditSummary = z.infer<typeof auditSummarySchema>

export const auditListSchema = z.object({ items: z.array(auditSummarySchema) }).meta({ id: 'AuditList' })
export type AuditList = z.infer<typeof auditListSchema>

export const probeCategorySchema = z.enum(['random-ray', 'sweep', 'vertex', 'extremum']).meta({ id: 'ProbeCategory' })

const count = z.number().int()
const perCategory = <T extends z.ZodType>(item: T) =>
  z.object({ 'random-ray': item, sweep: item, vertex: item, extremum: item })

export const auditCountsSchema = z
  .object({
    referenceHits: count.describe('Roots of the closed form'),
    matched: count.describe('Reference roots with an engine root within the matching window'),
    missed: count.describe('Reference roots with no engine root within the window'),
    spurious: count.describe('Engine roots left over after the pairing'),
    wrongWinding: count,
    wrongKind: count,
  })
  .meta({ id: 'AuditCounts' })

export const auditWorstCaseSchema = z
  .object({
    pathId: z.number().int(),
    pathName: z.string(),
    probeIndex: z.number().int(),
    probe: z.union([
      z.object({ type: z.enum(['ray', 'line']), origin: pointSchema, direction: pointSchema }),
      z.object({ type: z.literal('segment'), from: pointSchema, to: pointSchema }),
    ]),
    category: probeCategorySchema,
    segment: z.number().int(),
    tReference: z.number().nullable(),
    tEngine: z.number().nullable(),
    error: z.number().describe('Relative to the path size'),
    kind: z.enum(['missed', 'spurious', 'error']),
  })
  .meta({ id: 'AuditWorstCase' })

/** The merged aggregate of shared/audit (its AuditAggregate type), stored once every chunk is in. */
export const auditReportSchema = z
  .object({
    version: z.literal(1),
    engines: z.array(auditEngineSchema),
    paths: count,
    invalidPaths: count,
    probes: count,
    probesByCategory: perCategory(count),
    pairs: count.describe('Probe × segment pairs given to the engines'),
    overlapPairs: count,
    skippedSegments: count.describe('Arc segments, which the engines do not take'),
    byEngine: z.array(
      z.object({
        engine: auditEngineSchema,
        categories: perCategory(auditCountsSchema),
        pointErrorHistogram: z.array(count).describe('Matched roots by relative point error: exactly 0, < 1e-17, the decades up to 1e-1, ≥ 1'),
        tErrorHistogram: z.array(count).describe('Matched roots by |Δt|, in the same bins'),
        scatter: z.array(z.tuple([z.number(), z.number()])).describe('[tangency angle in degrees, log10 relative point error] of a seeded sample'),
        scatterKeys: z.array(z.number()),
        worst: z.array(auditWorstCaseSchema),
      }),
    ),
  })
  .describe('Counts per engine and probe category, error histograms, a scatter sample and the worst cases')
  .meta({ id: 'AuditReport' })
export type AuditReport = z.infer<typeof auditReportSchema>

export const auditSchema = auditSummarySchema
  .extend({
    selection: auditSelectionSchema,
    options: auditOptionsSchema,
    report: auditReportSchema.nullable().describe('Present once the audit has completed'),
  })
  .meta({ id: 'Audit' })
export type Audit = z.infer<typeof auditSchema>
