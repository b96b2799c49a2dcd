import { z } from 'zod'
import { pageOf, pageQueryBase } from './common'
import { hitSchema, probeSchema } from './compute'
import { PROBE_SET_LIMITS, probeSetSweepSchema } from './probe-sets'

/** Limits of suites and checks, shown in the interface too. */
export const SUITE_LIMITS = {
  nameChars: 120,
  descriptionChars: 500,
  probes: PROBE_SET_LIMITS.probes,
  sweeps: PROBE_SET_LIMITS.sweeps,
  /** Probe lines of one check: its probes plus every line of its sweeps. */
  lines: 5000,
  checksPerSuite: 200,
  /** Differences kept per check result (the count is always the full one). */
  differencesKept: 1000,
} as const

const name = (what: string) =>
  z
    .string()
    .trim()
    .min(1, `A ${what} needs a name.`)
    .max(SUITE_LIMITS.nameChars, `A ${what} name has at most ${SUITE_LIMITS.nameChars} characters.`)
const description = z
  .string()
  .trim()
  .max(SUITE_LIMITS.descriptionChars, `A description has at most ${SUITE_LIMITS.descriptionChars} characters.`)

const atLeastOneField = { message: 'Give at least one field to change.' }
const someField = (v: Record<string, unknown>) => Object.values(v).some((field) => field !== undefined)

// ---- Runs ----------------------------------------------------------------------------

export const runVerdictSchema = z.enum(['passed', 'failed']).meta({ id: 'RunVerdict' })
export type RunVerdict = z.infer<typeof runVerdictSchema>

export const runSummarySchema = z
  .object({
    id: z.number().int(),
    suiteId: z.number().int(),
    number: z.number().int().describe('1, 2, … within the suite'),
    verdict: runVerdictSchema.describe('passed when every check passed'),
    passed: z.number().int().describe('Checks that passed'),
    failed: z.number().int().describe('Checks that failed'),
    trigger: z.enum(['screen', 'api']).describe('api when the run was asked for with an API token'),
    by: z.string().nullable().describe('Display name of the person who ran it'),
    startedAt: z.string().describe('ISO 8601 time'),
    finishedAt: z.string().describe('ISO 8601 time'),
    url: z.string().describe('The run on the Suites screen'),
  })
  .meta({ id: 'RunSummary' })
export type RunSummary = z.infer<typeof runSummarySchema>

export const hitDifferenceSchema = z
  .object({
    line: z.number().int().describe('Index of the probe line: probes first, then each sweep’s lines in order'),
    lineLabel: z.string().describe('e.g. “probe 2” or “sweep 1, line 14”'),
    kind: z.enum(['missing', 'extra', 'moved', 'kind', 'winding']),
    expected: hitSchema.nullable(),
    actual: hitSchema.nullable(),
    distance: z.number().nullable().describe('Distance between the points of a pair, in path units'),
    tError: z.number().nullable().describe('|Δt| of a pair'),
  })
  .meta({ id: 'HitDifference' })
export type HitDifferenceItem = z.infer<typeof hitDifferenceSchema>

export const checkResultSchema = z
  .object({
    checkId: z.number().int().describe('Kept when the check is deleted later'),
    checkName: z.string().describe('The name the check had at the run'),
    pathId: z.number().int(),
    revision: z.number().int().describe('The path revision the check ran on'),
    verdict: runVerdictSchema,
    differences: z.array(hitDifferenceSchema).describe(`In the order of the lines, at most ${SUITE_LIMITS.differencesKept}`),
    differenceCount: z.number().int().describe('Number of differences found, also those beyond the ones listed'),
    error: z.string().nullable().describe('Why the check could not be computed (it then failed); null normally'),
    durationMs: z.number().describe('Time spent on this check, in milliseconds'),
    canvasUrl: z.string().describe('Opens the canvas on this path and check'),
  })
  .meta({ id: 'CheckResult' })
export type CheckResult = z.infer<typeof checkResultSchema>

export const runDetailSchema = runSummarySchema.extend({ results: z.array(checkResultSchema) }).meta({ id: 'RunDetail' })
export type RunDetail = z.infer<typeof runDetailSchema>

export const runPageSchema = pageOf(runSummarySchema).meta({ id: 'RunPage' })
export type RunPage = z.infer<typeof runPageSchema>

export const runPageQuerySchema = z.object({ page: pageQueryBase.page, pageSize: pageQueryBase.pageSize })

/** One check's result in one run, for the check's trend. */
export const checkRunSchema = z
  .object({
    runId: z.number().int(),
    runNumber: z.number().int(),
    verdict: runVerdictSchema.describe('This check’s verdict in that run'),
    revision: z.number().int(),
    differences: z.number().int().describe('Number of differences'),
    startedAt: z.string().describe('ISO 8601 time of the run'),
    url: z.string(),
  })
  .meta({ id: 'CheckRun' })
export type CheckRun = z.infer<typeof checkRunSchema>

export const checkRunPageSchema = pageOf(checkRunSchema).meta({ id: 'CheckRunPage' })
export type CheckRunPage = z.infer<typeof checkRunPageSchema>

// ---- Suites --------------------------------------------------------------------------

export const newSuiteSchema = z
  .object({ name: name('suite'), description: description.default('') })
  .strict()
  .meta({ id: 'NewSuite' })
export type NewSuite = z.input<typeof newSuiteSchema>

export const updateSuiteSchema = z
  .object({ name: name('suite'), description })
  .partial()
  .strict()
  .refine(someField, atLeastOneField)
  .meta({ id: 'UpdateSuite' })
export type UpdateSuite = z.input<typeof updateSuiteSchema>

export const suiteSchema = z
  .object({
    id: z.number().int(),
    projectId: z.number().int(),
    name: z.string(),
    description: z.string(),
    checkCount: z.number().int(),
    watching: z.boolean().describe('Whether the caller watches the suite (mail when a run fails)'),
    lastRun: runSummarySchema.nullable(),
    createdAt: z.string().describe('ISO 8601 time'),
  })
  .meta({ id: 'Suite' })
export type Suite = z.infer<typeof suiteSchema>

export const suiteListSchema = z.object({ items: z.array(suiteSchema) }).meta({ id: 'SuiteList' })
export type SuiteList = z.infer<typeof suiteListSchema>

export const watchSchema = z.object({ watching: z.boolean() }).strict().meta({ id: 'Watch' })

// ---- Checks --------------------------------------------------------------------------

export const checkFollowSchema = z.enum(['latest', 'pinned']).meta({
  id: 'CheckFollow',
  description: 'latest: run on the path’s current revision; pinned: always on the revision the expected hits were computed on',
})
export type CheckFollow = z.infer<typeof checkFollowSchema>

export const hitToleranceSchema = z
  .object({
    point: z.number().min(0, 'The point tolerance is at least 0.').describe('Distance in path units'),
    t: z.number().min(0, 'The t tolerance is at least 0.').describe('Difference of the segment parameter t'),
  })
  .strict()
  .meta({ id: 'HitTolerance' })

const checkName = name('check')
const probes = z.array(probeSchema).max(SUITE_LIMITS.probes, `A check has at most ${SUITE_LIMITS.probes} probes.`)
const sweeps = z.array(probeSetSweepSchema).max(SUITE_LIMITS.sweeps, `A check has at most ${SUITE_LIMITS.sweeps} sweeps.`)

export const newCheckSchema = z
  .object({
    name: checkName,
    pathId: z.number().int().positive().describe('A live path of the suite’s project'),
    revision: z.number().int().positive().describe('The path revision to compute the expected hits on (the server computes them)'),
    probes: probes.default([]),
    sweeps: sweeps.default([]),
    follow: checkFollowSchema.default('latest'),
    tolerance: hitToleranceSchema,
    matchKinds: z.boolean().default(true),
    matchWinding: z.boolean().default(true),
  })
  .strict()
  .refine((c) => c.probes.length + c.sweeps.length > 0, { message: 'A check needs at least one probe or sweep.', path: ['probes'] })
  .meta({ id: 'NewCheck' })
export type NewCheck = z.input<typeof newCheckSchema>

export const updateCheckSchema = z
  .object({
    name: checkName,
    follow: checkFollowSchema,
    tolerance: hitToleranceSchema,
    matchKinds: z.boolean(),
    matchWinding: z.boolean(),
    revision: z
      .number()
      .int()
      .positive()
      .describe('Keep the hits of this revision as the new expected hits (the server computes them again)'),
  })
  .partial()
  .strict()
  .refine(someField, atLeastOneField)
  .meta({ id: 'UpdateCheck' })
export type UpdateCheck = z.input<typeof updateCheckSchema>

export const checkSchema = z
  .object({
    id: z.number().int(),
    suiteId: z.number().int(),
    name: z.string(),
    pathId: z.number().int(),
    pathName: z.string().describe('The path’s current name'),
    revision: z.number().int().describe('The revision the expected hits were computed on'),
    follow: checkFollowSchema,
    probes: z.array(probeSchema),
    sweeps: z.array(probeSetSweepSchema),
    expected: z.array(z.array(hitSchema)).describe('One list per probe line: probes first, then each sweep’s lines in order'),
    tolerance: hitToleranceSchema,
    matchKinds: z.boolean(),
    matchWinding: z.boolean(),
    createdAt: z.string().describe('ISO 8601 time'),
  })
  .meta({ id: 'Check' })
export type Check = z.infer<typeof checkSchema>

export const checkListSchema = z.object({ items: z.array(checkSchema) }).meta({ id: 'CheckList' })
export type CheckList = z.infer<typeof checkListSchema>
